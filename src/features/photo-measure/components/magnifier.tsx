import { useEffect, useRef, type RefObject } from 'react';
import type { Point } from '@shared/quilt';

const SIZE = 176; // CSS pixels, the canvas's side
const ZOOM = 4; // against the photo as shown on screen

/**
 * A zoomed loupe of the photo around a point, with a cross-hair on it, so a corner can be placed to
 * a pixel even under a finger. It sits in the corner of the photo away from the point.
 */
export function Magnifier({
  image,
  point,
  shownScale,
  label,
}: {
  image: RefObject<HTMLImageElement | null>;
  point: Point;
  shownScale: number;
  label: string;
}) {
  const canvas = useRef<HTMLCanvasElement>(null);
  const ratio = typeof window === 'undefined' ? 1 : Math.min(2, window.devicePixelRatio || 1);

  useEffect(() => {
    const ctx = canvas.current?.getContext('2d');
    const img = image.current;
    if (!ctx || !img || !img.complete) return;
    const side = (SIZE / ZOOM) * shownScale; // photo pixels covered by the loupe
    const px = SIZE * ratio;
    ctx.imageSmoothingEnabled = false;
    ctx.fillStyle = '#2b2118';
    ctx.fillRect(0, 0, px, px);
    ctx.drawImage(img, point[0] - side / 2, point[1] - side / 2, side, side, 0, 0, px, px);
    // The cross-hair: dark under light, so it shows on any fabric.
    for (const [colour, width] of [
      ['#2b2118', 3 * ratio],
      ['#fffdf8', 1 * ratio],
    ] as const) {
      ctx.strokeStyle = colour;
      ctx.lineWidth = width;
      ctx.beginPath();
      ctx.moveTo(px / 2, 0);
      ctx.lineTo(px / 2, px * 0.42);
      ctx.moveTo(px / 2, px * 0.58);
      ctx.lineTo(px / 2, px);
      ctx.moveTo(0, px / 2);
      ctx.lineTo(px * 0.42, px / 2);
      ctx.moveTo(px * 0.58, px / 2);
      ctx.lineTo(px, px / 2);
      ctx.stroke();
    }
  }, [image, point, shownScale, ratio]);

  const onLeft = point[0] / (image.current?.naturalWidth || 1) > 0.5;
  return (
    <figure
      className={`pointer-events-none absolute top-2 ${onLeft ? 'left-2' : 'right-2'} m-0 rounded-lg bg-walnut p-1 shadow-lg`}
    >
      <canvas
        ref={canvas}
        width={SIZE * ratio}
        height={SIZE * ratio}
        className="block h-32 w-32 rounded sm:h-44 sm:w-44"
        aria-hidden="true"
      />
      <figcaption className="px-1 text-center text-sm text-linen">{label}</figcaption>
    </figure>
  );
}
