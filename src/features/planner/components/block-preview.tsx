import type { GridBlock } from '@shared/quilt';

const fills = ['#2F4B7C', '#F7F3EA'];

/** The finished block drawn to scale, with the seam line around it. */
export function BlockPreview({ block, label }: { block: GridBlock; label: string }) {
  const { width, height } = block.finished;
  const seam = block.seam;
  const W = width + 2 * seam;
  const H = height + 2 * seam;
  let y = seam;
  const rows: { y: number; h: number; cells: { x: number; w: number }[] }[] = [];
  const byRow = new Map<number, typeof block.patches>();
  for (const p of block.patches) byRow.set(p.row, [...(byRow.get(p.row) ?? []), p]);
  for (const [, patches] of [...byRow.entries()].sort((a, b) => a[0] - b[0])) {
    let x = seam;
    const h = patches[0]!.finished.height;
    rows.push({
      y,
      h,
      cells: patches
        .sort((a, b) => a.col - b.col)
        .map((p) => {
          const cell = { x, w: p.finished.width };
          x += p.finished.width;
          return cell;
        }),
    });
    y += h;
  }
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={label} className="h-auto w-full max-w-64 rounded bg-linen-deep">
      {rows.map((r, ri) =>
        r.cells.map((c, ci) => (
          <rect
            key={`${ri}-${ci}`}
            x={c.x}
            y={r.y}
            width={c.w}
            height={r.h}
            fill={fills[(ri + ci) % 2 === 0 ? 0 : 1]}
            stroke="#2B2118"
            strokeWidth={W / 200}
          />
        )),
      )}
      <rect
        x={seam / 2}
        y={seam / 2}
        width={W - seam}
        height={H - seam}
        fill="none"
        stroke="#B5462F"
        strokeWidth={W / 150}
        strokeDasharray={`${W / 40} ${W / 60}`}
      />
    </svg>
  );
}
