import type { Units } from '@shared/schemas/auth';
import type { CuttingPlan } from '../hooks/use-cutting-plan';
import { len, yards } from '@/lib/lengths';

const th = 'py-2 pr-4 text-left font-semibold';
const td = 'py-2 pr-4 align-top';

/** The cut list, the strip-set recipe (grid blocks) and the yardage of a cutting plan; lengths in the viewer's unit. */
export function CuttingPlanView({ plan, units, showYardage = true }: { plan: CuttingPlan; units: Units; showYardage?: boolean }) {
  if (plan.freeText !== undefined) {
    return (
      <div className="space-y-2">
        {plan.notes.map((n) => (
          <p key={n}>{n}</p>
        ))}
        <pre className="whitespace-pre-wrap rounded-lg bg-linen p-4 font-body">{plan.freeText}</pre>
        {plan.blocks > 1 && (
          <p className="font-semibold">
            Make {plan.blocks} blocks: multiply every count by {plan.blocks}.
          </p>
        )}
      </div>
    );
  }
  return (
    <div className="space-y-6">
      <div className="relative">
        <table className="stack-table w-full border-collapse">
          <caption className="mb-2 text-left font-semibold">
            Cut list for {plan.blocks} block{plan.blocks === 1 ? '' : 's'} (cut sizes, seam allowance included)
          </caption>
          <thead>
            <tr className="border-b-2 border-walnut/20">
              <th scope="col" className={th}>
                Fabric
              </th>
              <th scope="col" className={th}>
                Piece
              </th>
              <th scope="col" className={th}>
                Cut size
              </th>
              <th scope="col" className={`${th} text-right`}>
                How many
              </th>
            </tr>
          </thead>
          <tbody>
            {plan.cuts.map((c, i) => (
              <tr key={i} className="border-b border-walnut/10">
                <td data-label="Fabric" className={td}>
                  {c.fabric}
                </td>
                <td data-label="Piece" className={td}>
                  {c.what}
                </td>
                <td data-label="Cut size" className={td}>
                  {len(c.width, units)} × {len(c.height, units)}
                </td>
                <td data-label="How many" className={`${td} text-right font-semibold`}>
                  {c.count}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      {plan.stripSets.length > 0 && (
        <div>
          <h3 className="text-xl font-semibold text-indigo-deep">Strip-set recipe</h3>
          <ol className="mt-2 list-decimal space-y-3 pl-6">
            {plan.stripSets.map((set, i) => (
              <li key={i}>
                Sew strips {set.strips.map((s) => `${len(s.width, units)}${s.role ? ` ${s.role}` : ''}`).join(' + ')} cut across
                the width of fabric (sewn width {len(set.sewnWidth, units)}). Make {set.stripSets} strip set
                {set.stripSets === 1 ? '' : 's'}; sub-cut{' '}
                {set.subCuts.map((c) => `${c.total} × ${len(c.height, units)}`).join(' and ')}.
              </li>
            ))}
          </ol>
        </div>
      )}

      {showYardage && plan.fabrics.length > 0 && (
        <div>
          <h3 className="text-xl font-semibold text-indigo-deep">Fabric to buy or pull</h3>
          <ul className="mt-2 space-y-1">
            {plan.fabrics.map((f) => (
              <li key={f.fabric}>
                <span className="font-semibold">{f.fabric}:</span> {yards(f.yards)} — {f.strips} strip{f.strips === 1 ? '' : 's'}{' '}
                across a {len(plan.wof, units)} width of fabric (
                {[...new Set(f.stripWidths)].map((w) => len(w, units)).join(', ')} wide)
              </li>
            ))}
          </ul>
          <p className="mt-1 text-base text-walnut-soft">
            Rounded up to the next ⅛ yd; allow a little more for squaring up the cut end.
          </p>
        </div>
      )}
      {plan.notes.length > 0 && (
        <ul className="list-disc space-y-1 pl-6 text-walnut-soft">
          {plan.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
