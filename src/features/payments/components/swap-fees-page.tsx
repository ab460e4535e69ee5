import { useParams } from 'react-router';
import { formatMoney, paymentKindLabels, type FeeLine } from '@shared/schemas/payments';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { useSwapFees } from '@/entities/payment/api/get-swap-fees';
import { FeeStandingBadge } from '@/entities/payment/components/fee-standing';
import { SwapFeesPanel } from '@/entities/payment/components/swap-fees-panel';
import { useSwapCheckout } from '../api/start-checkout';
import { PaymentsOffNote, TestModeNote } from './test-mode-note';

const explain: Record<'entry' | 'postage', string> = {
  entry: 'Asked of every member who signs up for this swap.',
  postage: 'Asked only of members who send their blocks by post, to mail the returned blocks back.',
};

const payable = (l: FeeLine) => l.standing === 'owed' || l.standing === 'failed';

/** A swap's fees: what the caller owes and pays online; officers also see who has paid. */
export function SwapFeesPage() {
  const swapId = Number(useParams().swapId);
  const fees = useSwapFees(swapId, { pollWhilePending: true });
  const checkout = useSwapCheckout(swapId);
  if (fees.isPending) return <Loading label="Loading the swap’s fees…" />;
  if (fees.isError) return <QueryError error={fees.error} what="the swap’s fees" />;
  const { mine, currency, enabled, testMode } = fees.data;
  const due = mine.filter(payable);
  const total = due.reduce((sum, l) => sum + l.amount, 0);
  const hasFees = fees.data.fees.entry > 0 || fees.data.fees.postage > 0;
  return (
    <div className="space-y-6">
      <Card title="Your fees for this swap">
        {!hasFees ? (
          <p>This swap asks no fee.</p>
        ) : (
          <>
            <ul className="divide-y divide-walnut/10">
              {mine.map((l) => (
                <li key={l.kind} className="flex flex-wrap items-center justify-between gap-3 py-3">
                  <div>
                    <p className="font-semibold">
                      {paymentKindLabels[l.kind]}: {formatMoney(l.amount, currency)}
                    </p>
                    <p className="text-walnut-soft">{explain[l.kind as 'entry' | 'postage']}</p>
                  </div>
                  <FeeStandingBadge standing={l.standing} />
                </li>
              ))}
            </ul>
            {mine.some((l) => l.standing === 'failed') && (
              <p className="mt-2 text-walnut-soft">Your last try did not go through; nothing was charged. You can try again.</p>
            )}
            {mine.some((l) => l.standing === 'pending') && (
              <p className="mt-2 text-walnut-soft">
                A payment is waiting for the payment service to confirm it. This page updates when it does.
              </p>
            )}
            {due.length > 0 && enabled && (
              <div className="mt-4 space-y-3">
                {testMode && <TestModeNote />}
                <Button
                  onClick={() => checkout.mutate(undefined)}
                  pending={checkout.isPending}
                  pendingLabel="Opening the payment page…"
                >
                  Pay {formatMoney(total, currency)} online
                </Button>
                {checkout.isError && (
                  <Alert tone="error" title="The payment page did not open.">
                    {checkout.error instanceof ApiError ? checkout.error.message : 'Please try again.'}
                  </Alert>
                )}
              </div>
            )}
            {due.length > 0 && !enabled && (
              <div className="mt-4">
                <PaymentsOffNote />
              </div>
            )}
          </>
        )}
      </Card>
      <SwapFeesPanel swapId={swapId} hasFees={hasFees} />
    </div>
  );
}
