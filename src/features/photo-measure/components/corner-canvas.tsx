import { useEffect, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { Point } from '@shared/quilt';
import { MARKS, type CornerMarks } from '../hooks/use-corner-marks';
import { Magnifier } from './magnifier';

const TAP_SLOP = 8; // CSS pixels a tap may wander and still place a mark
const HIT_RADIUS = 22; // CSS pixels: a 44 px target

interface Drag {
  index: number;
  pointerId: number;
  /** the handle's offset from the pointer, so the mark does not jump under the finger */
  offset: Point;
}

const groupClass = {
  reference: { line: 'stroke-indigo fill-indigo/15', dot: 'fill-indigo stroke-white', text: 'fill-indigo-deep' },
  block: { line: 'stroke-madder fill-madder/10', dot: 'fill-madder stroke-white', text: 'fill-madder-deep' },
} as const;

/**
 * The photo with the eight marks drawn over it in SVG (viewBox in photo pixels). Tap or click to
 * place the next mark; drag a handle to move it (mouse, pen or finger), with a magnifier while
 * dragging; or focus a handle and nudge it with the arrow keys (Shift for 10 pixels).
 */
export function CornerCanvas({
  src,
  alt,
  width,
  height,
  marks,
}: {
  src: string;
  alt: string;
  width: number;
  height: number;
  marks: CornerMarks;
}) {
  const frame = useRef<HTMLDivElement>(null);
  const svg = useRef<SVGSVGElement>(null);
  const image = useRef<HTMLImageElement>(null);
  const [scale, setScale] = useState(1); // photo pixels per CSS pixel as shown
  const [drag, setDrag] = useState<Drag | null>(null);
  const [nudged, setNudged] = useState(false);
  const tap = useRef<{ x: number; y: number; pointerId: number } | null>(null);

  useEffect(() => {
    const el = frame.current;
    if (!el) return;
    const measure = () => el.clientWidth > 0 && setScale(width / el.clientWidth);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    return () => observer.disconnect();
  }, [width]);

  const toPhoto = (e: { clientX: number; clientY: number }): Point => {
    const box = svg.current!.getBoundingClientRect();
    return [((e.clientX - box.left) * width) / box.width, ((e.clientY - box.top) * height) / box.height];
  };

  const startDrag = (index: number) => (e: PointerEvent<SVGGElement>) => {
    e.stopPropagation();
    e.preventDefault();
    const p = marks.points[index]!;
    const at = toPhoto(e);
    svg.current?.setPointerCapture(e.pointerId);
    marks.select(index);
    setNudged(false);
    setDrag({ index, pointerId: e.pointerId, offset: [p[0] - at[0], p[1] - at[1]] });
  };

  const onPointerDown = (e: PointerEvent<SVGSVGElement>) => {
    if (e.button !== 0) return;
    tap.current = { x: e.clientX, y: e.clientY, pointerId: e.pointerId };
  };

  const onPointerMove = (e: PointerEvent<SVGSVGElement>) => {
    if (!drag || e.pointerId !== drag.pointerId) return;
    const at = toPhoto(e);
    marks.move(drag.index, [at[0] + drag.offset[0], at[1] + drag.offset[1]]);
  };

  const onPointerUp = (e: PointerEvent<SVGSVGElement>) => {
    if (drag && e.pointerId === drag.pointerId) {
      setDrag(null);
      return;
    }
    const start = tap.current;
    tap.current = null;
    if (start && start.pointerId === e.pointerId && Math.hypot(e.clientX - start.x, e.clientY - start.y) <= TAP_SLOP) {
      marks.place(toPhoto(e));
      setNudged(false);
    }
  };

  const onCancel = () => {
    tap.current = null;
    setDrag(null);
  };

  const onKeyDown = (index: number) => (e: KeyboardEvent<SVGGElement>) => {
    const step = e.shiftKey ? 10 : 1;
    const moves: Record<string, Point> = {
      ArrowLeft: [-step, 0],
      ArrowRight: [step, 0],
      ArrowUp: [0, -step],
      ArrowDown: [0, step],
    };
    const by = moves[e.key];
    if (by) {
      e.preventDefault();
      marks.nudge(index, by[0], by[1]);
      setNudged(true);
    } else if (e.key === 'Escape') {
      setNudged(false);
    }
  };

  const loupeIndex = drag?.index ?? (nudged ? marks.selected : null);
  const loupePoint = loupeIndex !== null ? marks.points[loupeIndex] : null;
  const r = HIT_RADIUS * scale;

  return (
    <div ref={frame} className="relative select-none overflow-hidden rounded-lg bg-walnut/10 ring-1 ring-walnut/20">
      <img ref={image} src={src} alt={alt} width={width} height={height} draggable={false} className="block h-auto w-full" />
      <svg
        ref={svg}
        viewBox={`0 0 ${width} ${height}`}
        // One finger on the photo places and drags marks rather than scrolling (SVG shapes inside do not
        // take their own touch-action, so it is set here); two fingers still zoom.
        className={`absolute inset-0 h-full w-full touch-pinch-zoom ${marks.next !== null ? 'cursor-crosshair' : ''}`}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={onPointerUp}
        onPointerCancel={onCancel}
        onLostPointerCapture={() => setDrag(null)}
        role="group"
        aria-label={`Marks on the photo. ${marks.next !== null ? `Next to place: ${MARKS[marks.next]!.label}.` : 'All eight corners are placed.'}`}
      >
        {(['reference', 'block'] as const).map((group) => {
          const pts = marks.points
            .slice(group === 'reference' ? 0 : 4, group === 'reference' ? 4 : 8)
            .filter((p): p is Point => p !== null);
          if (pts.length < 2) return null;
          const list = pts.map((p) => p.join(',')).join(' ');
          const cls = `${groupClass[group].line} pointer-events-none`;
          return pts.length === 4 ? (
            <polygon key={group} points={list} className={cls} strokeWidth={2} vectorEffect="non-scaling-stroke" />
          ) : (
            <polyline
              key={group}
              points={list}
              className={`${cls} fill-none`}
              strokeWidth={2}
              strokeDasharray="6 4"
              vectorEffect="non-scaling-stroke"
            />
          );
        })}
        {marks.points.map((p, i) => {
          if (!p) return null;
          const mark = MARKS[i]!;
          const look = groupClass[mark.group];
          const chosen = marks.selected === i;
          // The short name drawn beside the mark (R1 … B4) starts its spoken name too.
          const short = `${mark.group === 'reference' ? 'R' : 'B'}${(i % 4) + 1}`;
          return (
            <g
              key={i}
              role="button"
              tabIndex={0}
              aria-label={`${short}: ${mark.label}, at ${Math.round(p[0])}, ${Math.round(p[1])}. Arrow keys move it; Shift moves 10 pixels.`}
              aria-pressed={chosen}
              className="cursor-grab outline-none"
              onPointerDown={startDrag(i)}
              onFocus={() => marks.select(i)}
              onBlur={() => setNudged(false)}
              onKeyDown={onKeyDown(i)}
            >
              <circle cx={p[0]} cy={p[1]} r={r} className="fill-transparent" />
              {chosen && (
                <circle
                  cx={p[0]}
                  cy={p[1]}
                  r={r * 0.75}
                  className="fill-none stroke-weld"
                  strokeWidth={3}
                  vectorEffect="non-scaling-stroke"
                />
              )}
              <circle
                cx={p[0]}
                cy={p[1]}
                r={5 * scale}
                className={look.dot}
                strokeWidth={1.5}
                vectorEffect="non-scaling-stroke"
              />
              <text
                x={p[0] + 9 * scale}
                y={p[1] - 9 * scale}
                fontSize={14 * scale}
                fontWeight={700}
                className={`${look.text} pointer-events-none stroke-white`}
                strokeWidth={3}
                paintOrder="stroke"
                vectorEffect="non-scaling-stroke"
              >
                {short}
              </text>
            </g>
          );
        })}
      </svg>
      {loupePoint && loupeIndex !== null && (
        <Magnifier image={image} point={loupePoint} shownScale={scale} label={MARKS[loupeIndex]!.label} />
      )}
    </div>
  );
}
