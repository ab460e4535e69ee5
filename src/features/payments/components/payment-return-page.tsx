import { Link, useSearchParams } from 'react-router';
import { formatMoney } from '@shared/schemas/payments';
import { buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { safeNext } from '@/lib/paths';
import { useMyPayments } from '../api/get-my-payments';

/**
 * Where the payment page sends people back. Coming back proves nothing: the page waits for the
 * payment service's confirmation (the webhook) and says what it knows meanwhile.
 */
export function PaymentReturnPage() {
  const [params] = useSearchParams();
  const session = params.get('session_id') ?? undefined;
  const back = safeNext(params.get('back'));
  const cancelled = params.get('cancelled') === '1' || !session || !/^[\w-]{1,255}$/.test(session);
  const payments = useMyPayments(session, !cancelled, !cancelled);
  const backLink = (
    <Link className={buttonClass('secondary')} to={back}>
      Back to where you were
    </Link>
  );
  if (cancelled) {
    return (
      <Card title="No payment made">
        <p className="mb-4">You came back without paying. Nothing was charged; you can pay any time later.</p>
        {backLink}
      </Card>
    );
  }
  if (payments.isPending) return <Loading label="Checking your payment…" />;
  if (payments.isError) return <QueryError error={payments.error} what="your payment" />;
  const rows = payments.data;
  const total = rows.reduce((sum, p) => sum + p.amount, 0);
  const money = rows[0] ? formatMoney(total, rows[0].currency) : '';
  const state =
    rows.length === 0
      ? 'unknown'
      : rows.every((p) => p.status === 'paid' || p.status === 'refunded')
        ? 'paid'
        : rows.some((p) => p.status === 'pending')
          ? 'pending'
          : 'failed';
  return (
    <Card title="Your payment">
      <div className="space-y-4" aria-live="polite">
        {state === 'paid' && (
          <Alert tone="success" title={`${money} paid. Thank you.`}>
            The payment service has confirmed it. A receipt is on its way by e-mail.
          </Alert>
        )}
        {state === 'pending' && (
          <Alert tone="info" title="Waiting for the payment service to confirm…">
            This usually takes a few seconds. This page updates by itself; you can also leave it, and the payment still counts
            once it is confirmed.
          </Alert>
        )}
        {state === 'failed' && (
          <Alert tone="warning" title="The payment did not go through.">
            Nothing was charged. You can try again from the page you came from.
          </Alert>
        )}
        {state === 'unknown' && (
          <Alert tone="warning" title="We could not find this payment.">
            It may belong to another account. Check your payments list.
          </Alert>
        )}
        {backLink}
      </div>
    </Card>
  );
}
