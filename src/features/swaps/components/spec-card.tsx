import { blockKindLabels } from '@shared/schemas/blocks';
import type { SwapDto } from '@shared/swap-types';
import { Card } from '@/components/ui/card';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import { useCuttingPlan } from '../hooks/use-cutting-plan';
import { BlockPreview } from './block-preview';
import { CuttingPlanView } from './cutting-plan-view';
import { Deadline } from './deadline';
import { len, sizeText } from '@/lib/lengths';

/** The block spec: drawing, sizes, tolerance, colour rules, dates and the cut list for one block. */
export function SpecCard({ swap }: { swap: SwapDto }) {
  const roles = swap.colourRules.map((r) => r.role);
  const units = unitsFor(useMe().data, swap.guildId);
  const { plan, problem } = useCuttingPlan(swap.block, 1, roles, units);
  const tz = swap.guild.timeZone;
  return (
    <Card title="The block">
      <div className="grid gap-6 md:grid-cols-[18rem_1fr]">
        <BlockPreview spec={swap.block} roles={roles} units={units} />
        <div className="space-y-3">
          {swap.description && <p className="whitespace-pre-line">{swap.description}</p>}
          <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[auto_1fr]">
            <dt className="font-semibold">Kind</dt>
            <dd>{blockKindLabels[swap.block.kind]}</dd>
            <dt className="font-semibold">Unfinished</dt>
            <dd>{sizeText(swap.unfinished, units)} (cut edge to cut edge)</dd>
            <dt className="font-semibold">Finished</dt>
            <dd>
              {sizeText(swap.finished, units)} in the quilt, with {len(swap.seam, units)} seams
            </dd>
            <dt className="font-semibold">Tolerance</dt>
            <dd>
              ± {len(swap.tolerance, units)} on each side; diagonals within {len(swap.squareness, units)} of each other
            </dd>
            <dt className="font-semibold">Blocks each</dt>
            <dd>{swap.quota.min === swap.quota.max ? swap.quota.min : `${swap.quota.min} to ${swap.quota.max}`}</dd>
            <dt className="font-semibold">Afterwards</dt>
            <dd>
              {swap.mode === 'gift'
                ? `Every block goes to ${swap.giftRecipient?.name ?? 'the recipient'}`
                : 'Each maker gets back as many blocks as they had accepted, made by others'}
            </dd>
          </dl>
          {swap.colourRules.length > 0 && (
            <div>
              <h3 className="font-semibold">Fabrics</h3>
              <ul className="list-disc pl-6">
                {swap.colourRules.map((r) => (
                  <li key={r.role}>
                    <span className="font-semibold">{r.role}</span>
                    {r.note && `: ${r.note}`}
                  </li>
                ))}
              </ul>
            </div>
          )}
          <div className="space-y-1">
            <Deadline
              label="Sign-up closes"
              iso={swap.signupClosesAt}
              timeZone={tz}
              over={!['draft', 'signup'].includes(swap.state)}
              overLabel="Sign-up closed"
            />
            <Deadline
              label="Blocks due"
              iso={swap.dueAt}
              timeZone={tz}
              over={['sorting', 'complete', 'cancelled'].includes(swap.state)}
              overLabel="Blocks were due"
            />
          </div>
        </div>
      </div>
      <div className="mt-6">
        {plan ? (
          <CuttingPlanView plan={plan} units={units} showYardage={false} />
        ) : (
          problem && <p className="text-madder-deep">{problem}</p>
        )}
      </div>
    </Card>
  );
}
