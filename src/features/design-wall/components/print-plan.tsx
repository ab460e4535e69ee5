import type { FinishingPlan } from '@shared/design/finishing-plan';
import { len, sizeText } from '@/lib/lengths';
import type { Layout } from '../lib/layout';
import { FinishingList } from './finishing-list';

/** The one-page plan: only the printer sees it. */
export function PrintPlan({
  title,
  layout,
  plan,
  printUrl,
}: {
  title: string;
  layout: Layout;
  plan: FinishingPlan;
  printUrl: string | null;
}) {
  return (
    <section className="hidden print:block" aria-hidden="true">
      <h1 className="text-2xl font-bold">{title}: design wall</h1>
      <p>
        Finished top {sizeText(plan.finished)} · {layout.columns} × {layout.rows} blocks
        {layout.sashing > 0 ? `, ${len(layout.sashing)} sashing` : ''}
        {layout.borders.length ? `, ${layout.borders.length} ${layout.borders.length === 1 ? 'border' : 'borders'}` : ''}
      </p>
      {printUrl && <img src={printUrl} alt="" className="my-2 max-h-[55vh] w-auto" />}
      <FinishingList plan={plan} compact />
    </section>
  );
}
