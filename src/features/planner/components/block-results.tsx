import { Card } from '@/components/ui/card';
import { formatYards } from './yards';
import { BlockPreview } from './block-preview';
import type { BlockPlan } from './block-plan';
import type { LengthFormat } from './units';

const th = 'py-2 pr-4 text-left';
const td = 'py-2 pr-4 align-top';

export function BlockResults({ plan, count, fmt }: { plan: BlockPlan; count: number; fmt: LengthFormat }) {
  const size = (s: { width: number; height: number }) => `${fmt(s.width)} × ${fmt(s.height)}`;
  return (
    <div className="space-y-6">
      <Card title="Sizes">
        <div className="flex flex-wrap items-center gap-6">
          {plan.grid && <BlockPreview block={plan.grid} label={`Preview of a ${size(plan.finished)} finished block`} />}
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-lg">
            <dt className="font-semibold">Unfinished</dt>
            <dd data-testid="unfinished-size">{size(plan.unfinished)}</dd>
            <dt className="font-semibold">Finished</dt>
            <dd>{size(plan.finished)}</dd>
          </dl>
        </div>
      </Card>
      {plan.grid && (
        <Card title="Each patch">
          <details open={plan.grid.patches.length <= 9}>
            <summary className="min-h-11 cursor-pointer font-semibold text-indigo">
              {plan.grid.patches.length} patches: cut, finished and visible sizes
            </summary>
            <div>
              <table className="stack-table w-full">
                <thead>
                  <tr className="border-b-2 border-walnut/20">
                    <th className={th}>Row, column</th>
                    <th className={th}>Cut</th>
                    <th className={th}>Finished</th>
                    <th className={th}>Shows in the unfinished block</th>
                  </tr>
                </thead>
                <tbody>
                  {plan.grid.patches.map((p) => (
                    <tr key={`${p.row}-${p.col}`} className="border-b border-walnut/10">
                      <td data-label="Row, column" className={td}>
                        {p.row + 1}, {p.col + 1}
                      </td>
                      <td data-label="Cut" className={td}>
                        {size(p.cut)}
                      </td>
                      <td data-label="Finished" className={td}>
                        {size(p.finished)}
                      </td>
                      <td data-label="Shows in the block" className={td}>
                        {size(p.visibleInUnfinished)}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </details>
        </Card>
      )}
      {plan.recipe && plan.recipe.stripSets.length > 0 && (
        <Card title={`Strip sets for ${count} ${count === 1 ? 'block' : 'blocks'}`}>
          <ol className="list-decimal space-y-3 pl-6">
            {plan.recipe.stripSets.map((s, i) => (
              <li key={i}>
                Sew strips {s.strips.map((st) => fmt(st.width)).join(' + ')} side by side: the strip set is {fmt(s.sewnWidth)}{' '}
                wide. Make <strong>{s.stripSets}</strong> strip {s.stripSets === 1 ? 'set' : 'sets'} the width of fabric, then
                sub-cut {s.subCuts.map((c) => `${c.total} at ${fmt(c.height)}`).join(', ')}.
              </li>
            ))}
          </ol>
          <h3 className="mt-6 text-xl font-semibold">Strips to cut for the strip sets</h3>
          <ul className="mt-2 space-y-1">
            {plan.recipe.stripsToCut.map((st, i) => (
              <li key={i}>
                <strong>{st.count}</strong> {st.count === 1 ? 'strip' : 'strips'} {fmt(st.width)} × WOF
                {st.role ? ` (${st.role})` : ''} — {formatYards(st.yards)}
              </li>
            ))}
          </ul>
        </Card>
      )}
      <CutList plan={plan} count={count} fmt={fmt} collapsed={Boolean(plan.recipe?.stripSets.length)} />
    </div>
  );
}

function CutList({ plan, count, fmt, collapsed }: { plan: BlockPlan; count: number; fmt: LengthFormat; collapsed: boolean }) {
  const size = (s: { width: number; height: number }) => `${fmt(s.width)} × ${fmt(s.height)}`;
  return (
    <Card title={collapsed ? 'Or cut patch by patch' : `Cut list for ${count}`}>
      <details open={!collapsed}>
        <summary className="min-h-11 cursor-pointer font-semibold text-indigo">
          {collapsed ? 'Show the patch-by-patch cut list' : 'Pieces, strips and yardage'}
        </summary>
        <div>
          <table className="stack-table w-full">
            <thead>
              <tr className="border-b-2 border-walnut/20">
                <th className={th}>Piece</th>
                <th className={th}>Size</th>
                <th className={th}>How many</th>
              </tr>
            </thead>
            <tbody>
              {plan.cuts.map((c, i) => (
                <tr key={i} className="border-b border-walnut/10">
                  <td className={td}>
                    <span className="font-semibold sm:font-normal">{c.what}</span>
                    {c.note && <span className="block text-base text-walnut-soft">{c.note}</span>}
                  </td>
                  <td data-label="Size" className={td}>
                    {size(c)}
                  </td>
                  <td data-label="How many" className={td}>
                    {c.count}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <h3 className="mt-6 text-xl font-semibold">Strips across the width of fabric ({fmt(plan.strips.wof)})</h3>
        <ul className="mt-2 space-y-1">
          {plan.strips.rows.map((r) => (
            <li key={r.stripWidth}>
              <strong>{r.strips}</strong> {r.strips === 1 ? 'strip' : 'strips'} {fmt(r.stripWidth)} wide, sub-cut at{' '}
              {r.pieces.map((p) => `${fmt(p.subCut)} (${p.perStrip} per strip)`).join(', ')} — {formatYards(r.yards)}
            </li>
          ))}
        </ul>
        <p className="mt-3 text-lg">
          Fabric in all: <strong data-testid="total-yards">{formatYards(plan.strips.totals.yards)}</strong>, rounded up to the
          next ⅛ yard.
        </p>
      </details>
    </Card>
  );
}
