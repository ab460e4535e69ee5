import { useWatch, type UseFormReturn } from 'react-hook-form';
import { blockKindLabels, blockSizes } from '@shared/schemas/blocks';
import { formatInZone } from '@/lib/dates';
import { sizeText } from '@/lib/lengths';
import { useCuttingPlan } from '../../hooks/use-cutting-plan';
import { zonedLocalToIso } from '../../hooks/zoned-time';
import { CuttingPlanView } from '../cutting-plan-view';
import type { Units } from '@shared/schemas/auth';
import { lengthBack, parseBlock, type SetupValues } from './setup-values';

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="grid gap-1 border-b border-walnut/10 py-2 sm:grid-cols-[14rem_1fr]">
      <dt className="font-semibold">{label}</dt>
      <dd>{children}</dd>
    </div>
  );
}

/** Everything entered, read back in words, with the cutting plan for one block. */
export function StepReview({ form, timeZone, units }: { form: UseFormReturn<SetupValues>; timeZone: string; units: Units }) {
  const v = useWatch({ control: form.control }) as SetupValues;
  const { spec, problem } = parseBlock(v.block, units);
  const roles = v.colourRules.map((r) => r.role).filter(Boolean);
  const { plan } = useCuttingPlan(spec, 1, roles, units);
  const when = (local: string) => {
    const iso = zonedLocalToIso(local, timeZone);
    return iso ? formatInZone(iso, timeZone) : 'not set';
  };
  let size = problem ?? '';
  try {
    if (spec) size = `${sizeText(blockSizes(spec).unfinished, units)} unfinished`;
  } catch (error) {
    size = (error as Error).message;
  }
  return (
    <div className="space-y-6">
      <dl>
        <Row label="Title">{v.title || <em>not set</em>}</Row>
        <Row label="Block">
          {blockKindLabels[v.block.kind]} · {size}
        </Row>
        <Row label="Tolerance">
          ± {lengthBack(v.tolerance, units)} on each side; diagonals within {lengthBack(v.squareness, units)} of each other
        </Row>
        <Row label="Fabrics">
          {v.colourRules
            .filter((r) => r.role)
            .map((r) => `${r.role}${r.note ? ` (${r.note})` : ''}`)
            .join(' · ') || 'none named'}
        </Row>
        <Row label="Blocks per member">{v.quotaMin === v.quotaMax ? v.quotaMin : `${v.quotaMin} to ${v.quotaMax}`}</Row>
        <Row label="Fees">
          {[
            v.fees.entry.trim() && `entry ${v.fees.entry.trim()} ${v.fees.currency.toUpperCase()}`,
            v.fees.postage.trim() && `return postage ${v.fees.postage.trim()} ${v.fees.currency.toUpperCase()}`,
          ]
            .filter(Boolean)
            .join(' · ') || 'none'}
        </Row>
        <Row label="Sign-up closes">{when(v.signupCloses)}</Row>
        <Row label="Blocks due">{when(v.due)}</Row>
        <Row label="Mode">
          {v.mode === 'gift'
            ? `Gift to ${v.recipientKind === 'name' ? v.giftRecipientName || 'a recipient not named yet' : 'a guild member'}`
            : 'Return to the makers'}
        </Row>
      </dl>
      {plan && (
        <section>
          <h3 className="mb-2 text-xl font-semibold text-indigo-deep">Cutting for one block</h3>
          <CuttingPlanView plan={plan} units={units} />
        </section>
      )}
    </div>
  );
}
