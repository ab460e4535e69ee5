import { useSearchParams, useParams } from 'react-router';
import {
  formatMoney,
  paymentKindLabels,
  paymentKinds,
  paymentStatuses,
  paymentStatusLabels,
  type GuildPaymentDto,
  type PaymentKind,
  type PaymentStatus,
  type PaymentTotals,
} from '@shared/schemas/payments';
import { Button, buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { SelectField } from '@/components/ui/fields';
import { EmptyState, Loading, PageHeader, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { FeeStandingBadge } from '@/entities/payment/components/fee-standing';
import { guildPaymentsCsvUrl, useGuildPayments, type PaymentFilters } from '../api/get-guild-payments';
import { useRefundPayment } from '../api/refund-payment';

const shortDate = (iso: string) =>
  new Date(iso).toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' });

/** Filters live in the URL, so a filtered view can be bookmarked and shared with the next treasurer. */
function useFilters(): [PaymentFilters, (next: PaymentFilters) => void] {
  const [params, setParams] = useSearchParams();
  const status = params.get('status');
  const kind = params.get('kind');
  const filters: PaymentFilters = {
    status: (paymentStatuses as readonly string[]).includes(status ?? '') ? (status as PaymentStatus) : undefined,
    kind: (paymentKinds as readonly string[]).includes(kind ?? '') ? (kind as PaymentKind) : undefined,
    swapId: Number(params.get('swap')) > 0 ? Number(params.get('swap')) : undefined,
    year: Number(params.get('year')) >= 2000 ? Number(params.get('year')) : undefined,
  };
  const set = (next: PaymentFilters) => {
    const p = new URLSearchParams();
    if (next.status) p.set('status', next.status);
    if (next.kind) p.set('kind', next.kind);
    if (next.swapId) p.set('swap', String(next.swapId));
    if (next.year) p.set('year', String(next.year));
    setParams(p, { replace: true });
  };
  return [filters, set];
}

function Totals({ t, currency }: { t: PaymentTotals; currency: string }) {
  return (
    <span>
      {formatMoney(t.paid, currency)} paid{t.refunded ? `, ${formatMoney(t.refunded, currency)} refunded` : ''}
      {t.pending ? `, ${formatMoney(t.pending, currency)} waiting` : ''}
    </span>
  );
}

function PaymentRow({ p, guildId }: { p: GuildPaymentDto; guildId: number }) {
  const refund = useRefundPayment(guildId);
  const canRefund = p.status === 'paid' && (!p.refundRequestedAt || p.refundError);
  return (
    <li className="grid gap-2 py-3 sm:grid-cols-[1fr_auto] sm:items-center">
      <div>
        <p className="font-semibold">
          {p.displayName} · {formatMoney(p.amount, p.currency)}
        </p>
        <p className="text-walnut-soft">
          {paymentKindLabels[p.kind]}
          {p.swapTitle ? ` — ${p.swapTitle}` : ''}
          {p.year ? ` ${p.year}` : ''} · started {shortDate(p.createdAt)}
          {p.paidAt ? ` · paid ${shortDate(p.paidAt)}` : ''}
          {p.refundedAt ? ` · refunded ${shortDate(p.refundedAt)}` : ''}
        </p>
        {p.statusReason && p.status === 'failed' && <p className="text-walnut-soft">{p.statusReason}</p>}
        {p.refundRequestedAt && !p.refundError && p.status === 'paid' && (
          <p className="text-walnut-soft">Refund asked for; waiting for the payment service.</p>
        )}
        {p.refundError && <p className="font-semibold text-madder-deep">Refund not made: {p.refundError}</p>}
        {refund.isError && (
          <p role="alert" className="font-semibold text-madder-deep">
            {refund.error instanceof ApiError ? refund.error.message : 'The refund was not asked for. Please try again.'}
          </p>
        )}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <FeeStandingBadge standing={p.status} />
        {canRefund && (
          <Button
            variant="secondary"
            pending={refund.isPending}
            pendingLabel="Asking for the refund…"
            onClick={() => {
              if (
                window.confirm(
                  `Refund ${formatMoney(p.amount, p.currency)} to ${p.displayName}? The payment service returns it to their card.`,
                )
              )
                refund.mutate(p.id);
            }}
          >
            {p.refundError ? 'Try the refund again' : 'Refund'}
          </Button>
        )}
      </div>
    </li>
  );
}

/** The treasurer's view: every payment of the guild with filters, totals per swap and per year, CSV. */
export function TreasurerPage() {
  const guildId = Number(useParams().guildId);
  const [filters, setFilters] = useFilters();
  const list = useGuildPayments(guildId, filters);
  const thisYear = new Date().getFullYear();
  const years = Array.from({ length: 6 }, (_, i) => thisYear + 1 - i);
  return (
    <div className="space-y-6">
      <PageHeader
        title="Payments"
        lead="Every payment members started through Blockpost. A payment counts as paid only once the payment service has confirmed it."
        actions={
          <a className={buttonClass('secondary')} href={guildPaymentsCsvUrl(guildId, filters)} download>
            Download as CSV
          </a>
        }
      />
      <Card title="Show">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <SelectField
            label="State"
            value={filters.status ?? ''}
            onChange={(e) => setFilters({ ...filters, status: (e.target.value || undefined) as PaymentStatus | undefined })}
            options={[
              { value: '', label: 'Any state' },
              ...paymentStatuses.map((s) => ({ value: s, label: paymentStatusLabels[s] })),
            ]}
          />
          <SelectField
            label="What for"
            value={filters.kind ?? ''}
            onChange={(e) => setFilters({ ...filters, kind: (e.target.value || undefined) as PaymentKind | undefined })}
            options={[
              { value: '', label: 'Dues and fees' },
              ...paymentKinds.map((k) => ({ value: k, label: paymentKindLabels[k] })),
            ]}
          />
          <SelectField
            label="Swap"
            value={filters.swapId ? String(filters.swapId) : ''}
            onChange={(e) => setFilters({ ...filters, swapId: Number(e.target.value) || undefined })}
            options={[
              { value: '', label: 'Any swap' },
              ...(list.data?.totals.bySwap ?? []).map((s) => ({ value: String(s.swapId), label: s.title })),
            ]}
          />
          <SelectField
            label="Year"
            value={filters.year ? String(filters.year) : ''}
            onChange={(e) => setFilters({ ...filters, year: Number(e.target.value) || undefined })}
            options={[{ value: '', label: 'Any year' }, ...years.map((y) => ({ value: String(y), label: String(y) }))]}
          />
        </div>
      </Card>
      {list.isPending && <Loading label="Loading payments…" />}
      {list.isError && <QueryError error={list.error} what="the payments" />}
      {list.data && (
        <>
          <Card title="Totals">
            <p className="mb-3">
              All shown: <Totals t={list.data.totals.all} currency={list.data.currency} /> ({list.data.totals.all.count} payments)
            </p>
            <div className="grid gap-4 sm:grid-cols-2">
              <div>
                <h3 className="text-xl font-semibold">Per swap</h3>
                {list.data.totals.bySwap.length === 0 ? (
                  <p className="text-walnut-soft">No swap fees.</p>
                ) : (
                  <ul>
                    {list.data.totals.bySwap.map((s) => (
                      <li key={s.swapId}>
                        <strong>{s.title}</strong>: <Totals t={s} currency={list.data.currency} />
                      </li>
                    ))}
                  </ul>
                )}
              </div>
              <div>
                <h3 className="text-xl font-semibold">Per year</h3>
                <ul>
                  {list.data.totals.byYear.map((y) => (
                    <li key={y.year}>
                      <strong>{y.year}</strong>: <Totals t={y} currency={list.data.currency} />
                    </li>
                  ))}
                </ul>
              </div>
            </div>
          </Card>
          <Card title="Payments">
            {list.data.payments.length === 0 ? (
              <EmptyState title="No payments match.">Change the filters above to see more.</EmptyState>
            ) : (
              <ul className="divide-y divide-walnut/10">
                {list.data.payments.map((p) => (
                  <PaymentRow key={p.id} p={p} guildId={guildId} />
                ))}
              </ul>
            )}
          </Card>
          <Alert tone="info" title="Refunds">
            Cancelling a swap refunds everyone’s paid fees for it, and a member who withdraws before sign-up closes gets theirs
            back, without you doing anything. Use Refund for anything else.
          </Alert>
        </>
      )}
    </div>
  );
}
