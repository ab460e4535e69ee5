import type { FinishingPlan } from '@shared/design/finishing-plan';
import { SafetyCautions } from '@/components/ui/safety-cautions';
import { len, sizeText, yards } from '@/lib/lengths';

/** The finished size, the cut list and the yardage for what goes round the blocks. */
export function FinishingList({ plan, compact = false }: { plan: FinishingPlan; compact?: boolean }) {
  return (
    <div className="space-y-4">
      <p className="text-xl">
        Finished top: <strong>{sizeText(plan.finished)}</strong>
        {plan.layout.empty > 0 && (
          <span className="block text-base text-walnut-soft">
            {plan.layout.empty} empty {plan.layout.empty === 1 ? 'cell is' : 'cells are'} counted at full block size.
          </span>
        )}
      </p>
      <div className="overflow-x-auto">
        <table className="w-full text-left">
          <caption className="text-left font-semibold">Cut list (sizes include the seam allowance)</caption>
          <thead>
            <tr className="border-b border-walnut/30">
              <th scope="col" className="py-1 pr-3">
                Piece
              </th>
              <th scope="col" className="py-1 pr-3">
                Cut
              </th>
              <th scope="col" className="py-1">
                Size
              </th>
            </tr>
          </thead>
          <tbody>
            {plan.cutList.map((r) => (
              <tr key={r.label} className="border-b border-walnut/10 align-top">
                <td className="py-1 pr-3">
                  {r.label}
                  {r.joinedStrips > 1 && r.part !== 'binding' && (
                    <span className="block text-base text-walnut-soft">each joined from {r.joinedStrips} strips</span>
                  )}
                </td>
                <td className="py-1 pr-3">{r.count}</td>
                <td className="py-1">{r.part === 'binding' ? `${len(r.cut.height)} × width of fabric` : sizeText(r.cut)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full text-left">
          <caption className="text-left font-semibold">Fabric (rounded up to ⅛ yd, 42″ usable width)</caption>
          <tbody>
            {plan.fabric.map((f) => (
              <tr key={f.label} className="border-b border-walnut/10">
                <th scope="row" className="py-1 pr-3 font-normal">
                  {f.label}
                </th>
                <td className="py-1">{yards(f.yards)}</td>
              </tr>
            ))}
            <tr className="border-b border-walnut/10">
              <th scope="row" className="py-1 pr-3 font-normal">
                Batting
              </th>
              <td className="py-1">{sizeText(plan.batting)}</td>
            </tr>
          </tbody>
        </table>
      </div>
      {!compact && <SafetyCautions topics={['cutting', 'pressing']} />}
    </div>
  );
}
