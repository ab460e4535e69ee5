import { Fragment, useState, type FormEvent } from 'react';
import { useParams, useSearchParams } from 'react-router';
import {
  mailCategories,
  mailCategoryInfo,
  mailStatuses,
  mailStatusLabels,
  type AnyMailCategory,
  type MailLogQuery,
  type MailMessageDto,
  type MailStatus,
} from '@shared/schemas/notifications';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/fields';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { relativeTime } from '@/lib/dates';
import { useMailLog } from '../api/get-mail-log';
import { useMailMessage } from '../api/get-mail-message';
import { MailStatusBadge } from './mail-status';

const categoryLabel = (c: AnyMailCategory) => (c === 'account' ? 'Account (invitations, resets)' : mailCategoryInfo[c].label);
const when = (iso: string) =>
  new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

function readQuery(params: URLSearchParams): MailLogQuery & { page: number } {
  const status = params.get('status');
  const category = params.get('category');
  return {
    status: mailStatuses.includes(status as MailStatus) ? (status as MailStatus) : undefined,
    category: [...mailCategories, 'account'].includes(category ?? '') ? (category as AnyMailCategory) : undefined,
    q: params.get('q') ?? undefined,
    page: Math.max(1, Number(params.get('page')) || 1),
  };
}

/** The guild's e-mail history for its admins: who was sent what, and what went wrong. */
export function MailLogPage() {
  const guildId = Number(useParams().guildId);
  const [params, setParams] = useSearchParams();
  const query = readQuery(params);
  const log = useMailLog(guildId, query);
  const [search, setSearch] = useState(query.q ?? '');
  const [open, setOpen] = useState<number | null>(null);

  const change = (patch: Partial<Record<'status' | 'category' | 'q' | 'page', string | undefined>>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch))
      if (v) next.set(k, v);
      else next.delete(k);
    if (!('page' in patch)) next.delete('page');
    setParams(next, { replace: true });
    setOpen(null);
  };
  const onSearch = (e: FormEvent) => {
    e.preventDefault();
    change({ q: search.trim() || undefined });
  };

  const counts = log.data?.counts;
  const statusOptions = [
    { value: '', label: 'Every status' },
    ...mailStatuses.map((s) => ({ value: s, label: counts ? `${mailStatusLabels[s]} (${counts[s]})` : mailStatusLabels[s] })),
  ];
  const categoryOptions = [
    { value: '', label: 'Every kind' },
    ...[...mailCategories, 'account' as const].map((c) => ({ value: c, label: categoryLabel(c) })),
  ];
  const pages = log.data ? Math.max(1, Math.ceil(log.data.total / log.data.pageSize)) : 1;

  return (
    <div className="space-y-6">
      <Card title="E-mail history">
        <p className="mb-4 max-w-3xl text-walnut-soft">
          Every e-mail Blockpost sent, or meant to send, to members of this guild. Addresses are shown to guild admins only.
        </p>
        <form
          onSubmit={onSearch}
          className="mb-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-[1fr_1fr_1.5fr_auto] lg:items-end"
          role="search"
          aria-label="Filter the e-mail history"
        >
          <SelectField
            label="Status"
            options={statusOptions}
            value={query.status ?? ''}
            onChange={(e) => change({ status: e.target.value || undefined })}
          />
          <SelectField
            label="Kind of e-mail"
            options={categoryOptions}
            value={query.category ?? ''}
            onChange={(e) => change({ category: e.target.value || undefined })}
          />
          <TextField
            label="Name, address or subject"
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            maxLength={100}
          />
          <Button type="submit" variant="secondary">
            Search
          </Button>
        </form>

        {log.isPending && <Loading label="Loading the e-mail history…" />}
        {log.isError && <QueryError error={log.error} what="the e-mail history" />}
        {log.data && log.data.messages.length === 0 && (
          <EmptyState title="No e-mails match.">
            {query.status || query.category || query.q ? 'Try another filter.' : 'Nothing has been sent for this guild yet.'}
          </EmptyState>
        )}
        {log.data && log.data.messages.length > 0 && (
          <>
            <p className="mb-2 text-walnut-soft" aria-live="polite">
              {log.data.total} e-mail{log.data.total === 1 ? '' : 's'}
              {pages > 1 ? `, page ${query.page} of ${pages}` : ''}
            </p>
            <div className="overflow-x-auto">
              {/* On a phone each row stacks into a card; from 640 px it is a table again. */}
              <table className="w-full border-collapse text-left max-sm:block sm:min-w-[44rem]">
                <caption className="sr-only">E-mails sent to members of this guild, newest first</caption>
                <thead className="max-sm:sr-only">
                  <tr className="border-b-2 border-walnut/20">
                    <th scope="col" className="py-2 pr-4">
                      When
                    </th>
                    <th scope="col" className="py-2 pr-4">
                      To
                    </th>
                    <th scope="col" className="py-2 pr-4">
                      Subject
                    </th>
                    <th scope="col" className="py-2 pr-4">
                      Status
                    </th>
                    <th scope="col" className="py-2">
                      <span className="sr-only">Details</span>
                    </th>
                  </tr>
                </thead>
                <tbody className="max-sm:block">
                  {log.data.messages.map((m) => (
                    <Fragment key={m.id}>
                      <MessageRow message={m} open={open === m.id} onToggle={() => setOpen(open === m.id ? null : m.id)} />
                      {open === m.id && <MessageDetails guildId={guildId} message={m} />}
                    </Fragment>
                  ))}
                </tbody>
              </table>
            </div>
            {pages > 1 && (
              <nav aria-label="Pages" className="mt-4 flex flex-wrap items-center gap-3">
                <Button variant="secondary" disabled={query.page <= 1} onClick={() => change({ page: String(query.page - 1) })}>
                  Newer
                </Button>
                <Button
                  variant="secondary"
                  disabled={query.page >= pages}
                  onClick={() => change({ page: String(query.page + 1) })}
                >
                  Older
                </Button>
              </nav>
            )}
          </>
        )}
      </Card>
    </div>
  );
}

function MessageRow({ message: m, open, onToggle }: { message: MailMessageDto; open: boolean; onToggle: () => void }) {
  return (
    <tr className="border-b border-walnut/10 align-top max-sm:block max-sm:py-3">
      <td className="py-3 pr-4 whitespace-nowrap max-sm:block max-sm:py-0.5">
        {when(m.createdAt)}
        <span className="block text-base text-walnut-soft">{relativeTime(m.createdAt)}</span>
      </td>
      <td className="py-3 pr-4 max-sm:block max-sm:py-0.5">
        <span className="block font-semibold">{m.recipient.displayName ?? 'Former member'}</span>
        <span className="block break-all text-base">{m.recipient.email}</span>
      </td>
      <td className="py-3 pr-4 max-sm:block max-sm:py-0.5">
        {m.subject}
        <span className="block text-base text-walnut-soft">{categoryLabel(m.category)}</span>
      </td>
      <td className="py-3 pr-4 max-sm:block max-sm:py-0.5">
        <MailStatusBadge status={m.status} />
        {m.reason && <span className="mt-1 block max-w-xs text-base">{m.reason}</span>}
        {m.attempts > 1 && <span className="block text-base text-walnut-soft">{m.attempts} attempts</span>}
      </td>
      <td className="py-3 text-right max-sm:block max-sm:py-0.5 max-sm:text-left">
        <Button variant="quiet" aria-expanded={open} onClick={onToggle}>
          {open ? 'Hide' : 'Show'}
          <span className="sr-only"> the e-mail to {m.recipient.email}</span>
        </Button>
      </td>
    </tr>
  );
}

function MessageDetails({ guildId, message }: { guildId: number; message: MailMessageDto }) {
  const detail = useMailMessage(guildId, message.id);
  return (
    <tr className="border-b border-walnut/10 bg-linen max-sm:block">
      <td colSpan={5} className="p-4 max-sm:block max-sm:px-2">
        <dl className="mb-3 grid gap-x-6 gap-y-1 sm:grid-cols-[auto_1fr]">
          <dt className="font-semibold">Recorded</dt>
          <dd>{when(message.createdAt)}</dd>
          <dt className="font-semibold">Sent</dt>
          <dd>{message.sentAt ? when(message.sentAt) : 'Not sent'}</dd>
          <dt className="font-semibold">Attempts</dt>
          <dd>{message.attempts}</dd>
        </dl>
        {detail.isPending && <Loading label="Loading the e-mail…" />}
        {detail.isError && <QueryError error={detail.error} what="the e-mail" />}
        {detail.data && (
          // Focusable, so the scrolling text can be read by keyboard too.
          <pre
            tabIndex={0}
            aria-label={`Text of the e-mail to ${message.recipient.email}`}
            className="max-h-96 overflow-auto whitespace-pre-wrap break-words rounded-lg border border-walnut/15 bg-card p-4 font-body text-base"
          >
            {detail.data.text}
          </pre>
        )}
      </td>
    </tr>
  );
}
