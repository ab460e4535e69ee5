import { Link } from 'react-router';
import { formatMoney, paymentKindLabels } from '@shared/schemas/payments';
import { Card } from '@/components/ui/card';
import { EmptyState, Loading, PageHeader, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { FeeStandingBadge } from '@/entities/payment/components/fee-standing';
import { useMyPayments } from '../api/get-my-payments';

const when = (iso: string) => new Date(iso).toLocaleDateString(undefined, { day: 'numeric', month: 'long', year: 'numeric' });

/** The caller's own payments across every guild; receipts arrive by e-mail. */
export function MyPaymentsPage() {
  const payments = useMyPayments(undefined, true);
  return (
    <div className="space-y-6">
      <PageHeader
        title="Your payments"
        lead="Dues and swap fees you paid through Blockpost. A receipt is e-mailed for each payment and each refund."
      />
      {payments.isPending && <Loading label="Loading your payments…" />}
      {payments.isError && <QueryError error={payments.error} what="your payments" />}
      {payments.data && payments.data.length === 0 && (
        <EmptyState title="No payments yet.">
          When a guild asks for dues or a swap fee, you can pay it from the guild’s or the swap’s page.
        </EmptyState>
      )}
      {payments.data && payments.data.length > 0 && (
        <Card>
          <ul className="divide-y divide-walnut/10">
            {payments.data.map((p) => (
              <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
                <div>
                  <p className="font-semibold">
                    {formatMoney(p.amount, p.currency)} · {paymentKindLabels[p.kind]}
                    {p.year ? ` ${p.year}` : ''}
                  </p>
                  <p className="text-walnut-soft">
                    {p.swapId && p.swapTitle ? (
                      <Link className="text-indigo underline underline-offset-4" to={paths.swapFees(p.guildId, p.swapId)}>
                        {p.swapTitle}
                      </Link>
                    ) : (
                      <Link className="text-indigo underline underline-offset-4" to={paths.guildDues(p.guildId)}>
                        {p.guildName}
                      </Link>
                    )}{' '}
                    · {p.paidAt ? `paid ${when(p.paidAt)}` : `started ${when(p.createdAt)}`}
                    {p.refundedAt ? ` · refunded ${when(p.refundedAt)}` : ''}
                    {p.refundOnItsWay ? ' · refund on its way' : ''}
                  </p>
                </div>
                <FeeStandingBadge standing={p.status} />
              </li>
            ))}
          </ul>
        </Card>
      )}
    </div>
  );
}
