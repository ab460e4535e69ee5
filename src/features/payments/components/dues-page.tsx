import { Link, useParams } from 'react-router';
import { formatMoney } from '@shared/schemas/payments';
import { Button, buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import { FeeStandingBadge } from '@/entities/payment/components/fee-standing';
import { useGuildDues } from '../api/get-guild-dues';
import { useDuesCheckout } from '../api/start-checkout';
import { DuesSettingsForm } from './dues-settings-form';
import { PaymentsOffNote, TestModeNote } from './test-mode-note';

/** The guild's dues: the caller's own standing and Pay; for admins, the settings and everyone's standing. */
export function DuesPage() {
  const guildId = Number(useParams().guildId);
  const dues = useGuildDues(guildId);
  const checkout = useDuesCheckout(guildId);
  if (dues.isPending) return <Loading label="Loading the guild’s dues…" />;
  if (dues.isError) return <QueryError error={dues.error} what="the guild’s dues" />;
  const d = dues.data;
  const canPay = d.dues && (d.mine === 'owed' || d.mine === 'failed');
  return (
    <div className="space-y-6">
      <Card title="Your dues">
        {!d.dues ? (
          <p>The guild asks for no dues at the moment.</p>
        ) : (
          <div className="space-y-4">
            <div className="flex flex-wrap items-center justify-between gap-3">
              <p className="text-xl">
                {d.dues.year} dues: <strong>{formatMoney(d.dues.amount, d.currency)}</strong>
              </p>
              <FeeStandingBadge standing={d.mine} />
            </div>
            {d.mine === 'failed' && <p className="text-walnut-soft">Your last try did not go through; nothing was charged.</p>}
            {canPay && d.enabled && (
              <>
                {d.testMode && <TestModeNote />}
                <Button onClick={() => checkout.mutate()} pending={checkout.isPending} pendingLabel="Opening the payment page…">
                  Pay {formatMoney(d.dues.amount, d.currency)} online
                </Button>
              </>
            )}
            {canPay && !d.enabled && <PaymentsOffNote />}
            {checkout.isError && (
              <Alert tone="error" title="The payment page did not open.">
                {checkout.error instanceof ApiError ? checkout.error.message : 'Please try again.'}
              </Alert>
            )}
          </div>
        )}
        <p className="mt-4">
          <Link to={paths.myPayments} className="text-indigo underline underline-offset-4">
            All your payments and receipts
          </Link>
        </p>
      </Card>

      {d.members && (
        <>
          <Card
            title="Dues and currency"
            actions={
              <Link className={buttonClass('secondary')} to={paths.guildPayments(guildId)}>
                Every payment
              </Link>
            }
          >
            <DuesSettingsForm guildId={guildId} currency={d.currency} dues={d.dues} />
          </Card>
          {d.dues && (
            <Card title={`Who has paid ${d.dues.year} dues`}>
              <p className="mb-2 text-walnut-soft">
                {d.members.filter((m) => m.standing === 'paid').length} of {d.members.length} members have paid.
              </p>
              <ul className="divide-y divide-walnut/10">
                {d.members.map((m) => (
                  <li key={m.userId} className="flex flex-wrap items-center justify-between gap-2 py-2">
                    <span className="font-semibold">{m.displayName}</span>
                    <FeeStandingBadge standing={m.standing} />
                  </li>
                ))}
              </ul>
            </Card>
          )}
        </>
      )}
    </div>
  );
}
