import { gridBlock } from '@shared/quilt';
import type { Units } from '@shared/schemas/auth';
import { blockSizes, type BlockSpec } from '@shared/schemas/blocks';
import { sizeText } from '@/lib/lengths';

// Fabric roles are drawn in dye colours and always named in the legend, never by colour alone.
// Pale-sounding roles get the undyed colour so the drawing reads the way the coordinator meant.
const DYES = [
  { fill: 'fill-indigo', swatch: 'bg-indigo' },
  { fill: 'fill-madder', swatch: 'bg-madder' },
  { fill: 'fill-weld', swatch: 'bg-weld' },
  { fill: 'fill-lichen', swatch: 'bg-lichen' },
  { fill: 'fill-plum', swatch: 'bg-plum' },
];
const UNDYED = { fill: 'fill-linen-deep', swatch: 'bg-linen-deep' };
const PALE = /light|pale|background|sky|cream|white|ivory|low volume|neutral|corner/i;

/** A colour for each fabric name: pale names undyed, the rest dyes in order. */
export function roleColours(names: string[]): { fill: string; swatch: string }[] {
  let next = 0;
  let undyedUsed = false;
  return names.map((n) => {
    if (PALE.test(n) && !undyedUsed) {
      undyedUsed = true;
      return UNDYED;
    }
    return DYES[next++ % DYES.length]!;
  });
}
const SCALE = 20;

function roleIndex(roles: string[], role: string | undefined, fallback: number) {
  if (!role) return fallback;
  const i = roles.indexOf(role);
  return i >= 0 ? i : fallback;
}

type Shape = { key: string; points?: string; x?: number; y?: number; w?: number; h?: number; fill: number };

function shapesFor(spec: BlockSpec, W: number, H: number, roles: string[]): Shape[] {
  const poly = (key: string, pts: [number, number][], fill: number): Shape => ({
    key,
    points: pts.map(([x, y]) => `${x * SCALE},${y * SCALE}`).join(' '),
    fill,
  });
  switch (spec.kind) {
    case 'grid': {
      const g = gridBlock({
        columns: spec.columns,
        rows: spec.rows,
        seam: spec.seam ?? 0.25,
        ...(spec.roles ? { roles: spec.roles } : {}),
      });
      const xs = [0];
      const ys = [0];
      g.patches.filter((p) => p.row === 0).forEach((p) => xs.push(xs.at(-1)! + p.visibleInUnfinished.width));
      g.patches.filter((p) => p.col === 0).forEach((p) => ys.push(ys.at(-1)! + p.visibleInUnfinished.height));
      return g.patches.map((p) => ({
        key: `${p.row}-${p.col}`,
        x: xs[p.col]! * SCALE,
        y: ys[p.row]! * SCALE,
        w: p.visibleInUnfinished.width * SCALE,
        h: p.visibleInUnfinished.height * SCALE,
        fill: roleIndex(roles, p.role, (p.row + p.col) % 2 === 0 ? 0 : 1),
      }));
    }
    case 'hst':
      return [
        poly(
          'a',
          [
            [0, 0],
            [W, 0],
            [0, H],
          ],
          0,
        ),
        poly(
          'b',
          [
            [W, 0],
            [W, H],
            [0, H],
          ],
          1,
        ),
      ];
    case 'qst':
      return [
        poly(
          't',
          [
            [0, 0],
            [W, 0],
            [W / 2, H / 2],
          ],
          0,
        ),
        poly(
          'r',
          [
            [W, 0],
            [W, H],
            [W / 2, H / 2],
          ],
          1,
        ),
        poly(
          'b',
          [
            [W, H],
            [0, H],
            [W / 2, H / 2],
          ],
          0,
        ),
        poly(
          'l',
          [
            [0, H],
            [0, 0],
            [W / 2, H / 2],
          ],
          1,
        ),
      ];
    case 'flying-geese':
      return [
        { key: 'sky', x: 0, y: 0, w: W * SCALE, h: H * SCALE, fill: 1 },
        poly(
          'goose',
          [
            [0, H],
            [W / 2, 0],
            [W, H],
          ],
          0,
        ),
      ];
    case 'square-in-square':
      return [
        { key: 'corners', x: 0, y: 0, w: W * SCALE, h: H * SCALE, fill: 1 },
        poly(
          'centre',
          [
            [W / 2, 0],
            [W, H / 2],
            [W / 2, H],
            [0, H / 2],
          ],
          0,
        ),
      ];
    case 'custom':
      return [{ key: 'plain', x: 0, y: 0, w: W * SCALE, h: H * SCALE, fill: 0 }];
  }
}

function legendNames(spec: BlockSpec, roles: string[]): string[] {
  if (spec.kind === 'grid') return spec.roles ? [...new Set(spec.roles.flat())] : [];
  if (spec.kind === 'flying-geese') return [roles[0] ?? 'Goose', roles[1] ?? 'Sky'];
  if (spec.kind === 'square-in-square') return [roles[0] ?? 'Centre', roles[1] ?? 'Corners'];
  if (spec.kind === 'custom') return [];
  return [roles[0] ?? 'Light', roles[1] ?? 'Dark'];
}

/**
 * The block drawn to scale at its unfinished size, with the seam line (the finished edge) dashed a
 * seam allowance in from the cut edge — the same motif as the cards. Sizes are written in the viewer's
 * unit.
 */
export function BlockPreview({
  spec,
  roles = [],
  units = 'in',
  className = '',
}: {
  spec: BlockSpec;
  roles?: string[];
  units?: Units;
  className?: string;
}) {
  let sizes;
  try {
    sizes = blockSizes(spec);
  } catch {
    return null;
  }
  const { unfinished: U, seam } = sizes;
  const shapes = shapesFor(spec, U.width, U.height, spec.kind === 'grid' && spec.roles ? [...new Set(spec.roles.flat())] : roles);
  const names = legendNames(spec, roles);
  const colours = roleColours(names.length ? names : ['light', 'dark']);
  const fillOf = (i: number) => colours[i % colours.length]!.fill;
  const label = `Preview of the block: ${sizeText(U, units)} unfinished, ${sizeText(sizes.finished, units)} finished${names.length ? `; fabrics ${names.join(', ')}` : ''}.`;
  return (
    <figure className={className}>
      <svg
        viewBox={`-4 -4 ${U.width * SCALE + 8} ${U.height * SCALE + 8}`}
        role="img"
        aria-label={label}
        className="h-auto w-full max-w-72"
      >
        {shapes.map((s) =>
          s.points ? (
            <polygon key={s.key} points={s.points} className={`${fillOf(s.fill)} stroke-walnut/40`} strokeWidth={1} />
          ) : (
            <rect
              key={s.key}
              x={s.x}
              y={s.y}
              width={s.w}
              height={s.h}
              className={`${fillOf(s.fill)} stroke-walnut/40`}
              strokeWidth={1}
            />
          ),
        )}
        <rect
          x={0}
          y={0}
          width={U.width * SCALE}
          height={U.height * SCALE}
          fill="none"
          className="stroke-walnut"
          strokeWidth={2}
        />
        <rect
          x={seam * SCALE}
          y={seam * SCALE}
          width={(U.width - 2 * seam) * SCALE}
          height={(U.height - 2 * seam) * SCALE}
          fill="none"
          className="stroke-card"
          strokeWidth={2}
          strokeDasharray="6 5"
        />
      </svg>
      <figcaption className="mt-2 text-base text-walnut-soft">
        Solid edge: cut size {sizeText(U, units)}. Dashed line: seam line, finished size {sizeText(sizes.finished, units)}.
        {names.length > 0 && (
          <span className="mt-1 flex flex-wrap gap-3">
            {names.map((n, i) => (
              <span key={n} className="inline-flex items-center gap-1.5">
                <span
                  aria-hidden="true"
                  className={`inline-block h-4 w-4 rounded-sm ring-1 ring-walnut/30 ${colours[i]!.swatch}`}
                />
                {n}
              </span>
            ))}
          </span>
        )}
      </figcaption>
    </figure>
  );
}
