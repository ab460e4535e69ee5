import { useParams } from 'react-router';
import { blockKindLabels } from '@shared/schemas/blocks';
import type { SwapDto } from '@shared/swap-types';
import { Button } from '@/components/ui/button';
import { Loading, QueryError } from '@/components/ui/page';
import { SafetyCautions } from '@/components/ui/safety-cautions';
import { formatInZone } from '@/lib/dates';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import { useSwap } from '@/entities/swap/api/get-swap';
import { cuttingPlan, useCuttingPlan } from '../hooks/use-cutting-plan';
import { BlockPreview } from './block-preview';
import { CuttingPlanView } from './cutting-plan-view';
import { len, sizeText, yards } from '@/lib/lengths';

/** Block counts for the yardage table: the quota's ends and a few between. */
function counts(min: number, max: number): number[] {
  const picks = new Set([min, max, 1, 2, 4, 6, 8, 12].filter((n) => n >= min && n <= max));
  return [...picks].sort((a, b) => a - b).slice(0, 6);
}

function YardageTable({ swap }: { swap: SwapDto }) {
  const roles = swap.colourRules.map((r) => r.role);
  const columns = counts(swap.quota.min, swap.quota.max);
  let plans;
  try {
    plans = columns.map((n) => cuttingPlan(swap.block, n, roles));
  } catch {
    return null;
  }
  const fabrics = [...new Set(plans.flatMap((p) => p.fabrics.map((f) => f.fabric)))];
  if (fabrics.length === 0) return null;
  return (
    <table className="stack-table w-full border-collapse text-left">
      <caption className="mb-2 text-left text-xl font-semibold text-indigo-deep">Yardage by number of blocks</caption>
      <thead>
        <tr className="border-b-2 border-walnut/30">
          <th scope="col" className="py-1 pr-3">
            Fabric
          </th>
          {columns.map((n) => (
            <th key={n} scope="col" className="py-1 pr-3 text-right">
              {n} block{n === 1 ? '' : 's'}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {fabrics.map((f) => (
          <tr key={f} className="border-b border-walnut/15">
            <th scope="row" className="py-1 pr-3 font-semibold">
              {f}
            </th>
            {plans.map((p, i) => (
              <td
                key={columns[i]}
                data-label={`${columns[i]} block${columns[i] === 1 ? '' : 's'}`}
                className="py-1 pr-3 text-right"
              >
                {yards(p.fabrics.find((x) => x.fabric === f)?.yards ?? 0)}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** One printable page a coordinator can hand out: spec, cut list, yardage, tolerance and dates. */
export function SwapSheetPage() {
  const swap = useSwap(Number(useParams().swapId));
  const roles = swap.data?.colourRules.map((r) => r.role) ?? [];
  const me = useMe();
  const units = unitsFor(me.data, swap.data?.guildId);
  const { plan } = useCuttingPlan(swap.data?.block ?? null, 1, roles, units);
  if (swap.isPending) return <Loading />;
  if (swap.isError) return <QueryError error={swap.error} what="the swap" />;
  const s = swap.data;
  const tz = s.guild.timeZone;
  return (
    <article className="space-y-6 rounded-card bg-card p-6 ring-1 ring-walnut/10 print:p-0 print:text-[11pt] print:ring-0">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <p className="text-walnut-soft">{s.guild.name} · block swap</p>
          <h2 className="text-3xl font-bold text-indigo-deep">{s.title}</h2>
        </div>
        <Button className="print:hidden" onClick={() => window.print()}>
          Print this sheet
        </Button>
      </div>
      {s.description && <p className="whitespace-pre-line">{s.description}</p>}
      <div className="grid gap-6 sm:grid-cols-[14rem_1fr] print:grid-cols-[12rem_1fr]">
        <BlockPreview spec={s.block} roles={roles} units={units} />
        <dl className="grid content-start gap-x-6 gap-y-1 sm:grid-cols-[auto_1fr]">
          <dt className="font-semibold">Block</dt>
          <dd>{blockKindLabels[s.block.kind]}</dd>
          <dt className="font-semibold">Unfinished size</dt>
          <dd>{sizeText(s.unfinished, units)}</dd>
          <dt className="font-semibold">Finished size</dt>
          <dd>
            {sizeText(s.finished, units)} ({len(s.seam, units)} seams)
          </dd>
          <dt className="font-semibold">Tolerance</dt>
          <dd>
            ± {len(s.tolerance, units)} each side; diagonals within {len(s.squareness, units)}
          </dd>
          <dt className="font-semibold">Blocks each</dt>
          <dd>{s.quota.min === s.quota.max ? s.quota.min : `${s.quota.min} to ${s.quota.max}`}</dd>
          <dt className="font-semibold">Sign-up closes</dt>
          <dd>{formatInZone(s.signupClosesAt, tz)}</dd>
          <dt className="font-semibold">Blocks due</dt>
          <dd>{formatInZone(s.dueAt, tz)}</dd>
          {s.colourRules.map((r) => (
            <div key={r.role} className="contents">
              <dt className="font-semibold">{r.role}</dt>
              <dd>{r.note || '—'}</dd>
            </div>
          ))}
        </dl>
      </div>
      {plan && <CuttingPlanView plan={plan} units={units} showYardage={false} />}
      <YardageTable swap={s} />
      <SafetyCautions topics={['cutting', 'pressing']} className="print:break-inside-avoid" />
      <p className="text-base text-walnut-soft">
        Times are {tz} time. Measure your block before handing it in: {sizeText(s.unfinished, units)} from cut edge to cut edge.
      </p>
    </article>
  );
}
