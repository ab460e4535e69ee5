import type { DesignBlockDto, Rotation } from '@shared/schemas/designs';
import type { Shape } from '../lib/block-drawing';
import { drawingLightness, greyOf } from '../lib/value-view';

const turnClass: Record<Rotation, string> = { 0: '', 90: 'rotate-90', 180: 'rotate-180', 270: '-rotate-90' };

/** A block's picture: its newest photo, or the swap's drawing when it has none; grey in the value view. */
export function TileFace({
  block,
  rotation,
  shapes,
  valueView,
  greyUrl,
}: {
  block: DesignBlockDto;
  rotation: Rotation;
  shapes: Shape[];
  valueView: boolean;
  greyUrl?: string;
}) {
  const lightness = block.colour ? block.colour.meanLab[0] : block.photo ? null : drawingLightness(shapes);
  return (
    <span className="relative block h-full w-full overflow-hidden">
      <span className={`block h-full w-full ${turnClass[rotation]}`}>
        {block.photo ? (
          <img
            src={valueView && greyUrl ? greyUrl : block.photo.thumbUrl}
            alt=""
            draggable={false}
            className={`h-full w-full object-cover ${valueView && !greyUrl ? 'grayscale' : ''}`}
          />
        ) : (
          <svg viewBox="0 0 100 100" preserveAspectRatio="none" className="h-full w-full" aria-hidden="true">
            {shapes.map((s, i) => (
              <polygon
                key={i}
                points={s.points.map(([x, y]) => `${x * 100},${y * 100}`).join(' ')}
                fill={valueView ? greyOf(s.fill) : s.fill}
              />
            ))}
          </svg>
        )}
      </span>
      {valueView && (
        <span className="absolute inset-x-0 bottom-0 bg-walnut/85 px-1 text-center text-sm font-semibold leading-5 text-white">
          L* {lightness === null ? '…' : Math.round(lightness)}
        </span>
      )}
    </span>
  );
}

/** How lightness readings are described in words. */
export function lightnessWords(L: number): string {
  if (L < 35) return 'dark';
  if (L < 65) return 'medium';
  return 'light';
}
