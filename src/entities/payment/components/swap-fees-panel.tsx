import { formatMoney, paymentKindLabels } from '@shared/schemas/payments';
import { Card } from '@/components/ui/card';
import { useSwapFees } from '../api/get-swap-fees';
import { FeeStandingBadge } from './fee-standing';

/**
 * For officers beside a swap's roster or board: who has paid the swap's fees. Shows nothing when the
 * swap asks no fee or the caller may not see everyone's standing.
 */
export function SwapFeesPanel({ swapId, hasFees }: { swapId: number; hasFees: boolean }) {
  const fees = useSwapFees(swapId, { enabled: hasFees });
  const members = fees.data?.members;
  if (!fees.data || !members) return null;
  const { entry, postage } = fees.data.fees;
  const paid = (kind: 'entry' | 'postage') => members.filter((m) => m[kind] === 'paid').length;
  const askedPostage = members.filter((m) => m.postage !== 'not_owed').length;
  return (
    <Card title="Who has paid">
      <p className="mb-3 text-walnut-soft">
        {entry > 0 && (
          <span>
            {paymentKindLabels.entry} {formatMoney(entry, fees.data.currency)}: {paid('entry')} of {members.length} paid.{' '}
          </span>
        )}
        {postage > 0 && (
          <span>
            {paymentKindLabels.postage} {formatMoney(postage, fees.data.currency)}: {paid('postage')} of {askedPostage} who post
            their blocks paid.
          </span>
        )}
      </p>
      {members.length === 0 ? (
        <p>Nobody has signed up yet.</p>
      ) : (
        <ul className="divide-y divide-walnut/10">
          {members.map((m) => (
            <li key={m.userId} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span className="font-semibold">{m.displayName}</span>
              <span className="flex flex-wrap gap-2">
                {entry > 0 && (
                  <span className="inline-flex items-center gap-1">
                    <span className="sr-only">{paymentKindLabels.entry}:</span>
                    <span aria-hidden="true" className="text-walnut-soft">
                      Entry
                    </span>
                    <FeeStandingBadge standing={m.entry} />
                  </span>
                )}
                {postage > 0 && m.postage !== 'not_owed' && (
                  <span className="inline-flex items-center gap-1">
                    <span className="sr-only">{paymentKindLabels.postage}:</span>
                    <span aria-hidden="true" className="text-walnut-soft">
                      Postage
                    </span>
                    <FeeStandingBadge standing={m.postage} />
                  </span>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
