/** CSV exports of the roster and the confirmed return, built with csv-stringify. */
import { stringify } from 'csv-stringify/sync';
import { instantToWallTime } from '@shared/schemas/sewdays';
import { VERDICTS, VERDICT_LABELS, blockStateLabels } from '@shared/vocabulary';
import type { Swap } from '../db/models';
import type { AppDeps } from '../deps';
import { ConflictError } from '../http/errors';
import { confirmedTransfers } from '../distribution/distribution.service';
import { buildRoster } from '../board/roster.service';

// A cell starting with = + - @ (or tab/CR) runs as a formula in spreadsheets; a leading ' keeps it text.
function safeCell(value: unknown): string | number {
  if (typeof value === 'number') return value;
  const text = value == null ? '' : String(value);
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

export function csv(header: string[], rows: (string | number | null | undefined)[][]): string {
  // A byte-order mark so spreadsheet programs read names such as “Ibáñez” as UTF-8.
  return '\uFEFF' + stringify([header, ...rows.map((r) => r.map(safeCell))], { record_delimiter: 'windows' });
}

/**
 * An instant as the guild's wall-clock time, "2027-01-16 10:00", the way a spreadsheet reads a date
 * and time; empty when there is none. Exports of a guild speak its time zone, as its pages and mail do.
 */
export function csvWallTime(instant: Date | string | null | undefined, timeZone: string): string {
  return instant == null ? '' : instantToWallTime(new Date(instant), timeZone).replace('T', ' ');
}

/** "Harvest Stripes" → "harvest-stripes", for file names. */
export function slug(title: string): string {
  const s = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, ''); // runs are single hyphens by now
  return s.slice(0, 60) || 'swap';
}

export async function rosterCsv(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  swap: Swap,
): Promise<{ fileName: string; body: string }> {
  const roster = await buildRoster(deps, swap, { withAddresses: true });
  const header = [
    'Member',
    'E-mail',
    'Pledged',
    'Sewn',
    'Handed in',
    'Received',
    'Measured',
    'Still owed',
    ...VERDICTS.map((v) => VERDICT_LABELS[v].label),
    'Accepted',
    'Returned',
    'Blocks',
    'Mailing address',
  ];
  const rows = roster.rows.map((r) => [
    r.displayName,
    r.email,
    r.pledged,
    r.sewn,
    r.handedIn,
    r.received,
    r.measured,
    r.owed,
    ...VERDICTS.map((v) => r.verdicts[v]),
    r.accepted,
    r.returned,
    r.blocks
      .map(
        (b) =>
          `#${b.sequence} ${blockStateLabels[b.state]}${b.verdict ? ` (${VERDICT_LABELS[b.verdict].label}${b.trimmed ? ', trimmed' : ''}${b.acceptedByDecision ? ', accepted by decision' : ''})` : ''}`,
      )
      .join('; '),
    r.mailingAddress ?? '',
  ]);
  return { fileName: `${slug(swap.title)}-swap-${swap.id}-roster.csv`, body: csv(header, rows) };
}

export async function distributionCsv(swap: Swap): Promise<{ fileName: string; body: string }> {
  if (!swap.distributionConfirmedAt) {
    throw new ConflictError(
      'The return of blocks is not confirmed yet; plan and confirm it first.',
      'distribution_not_confirmed',
    );
  }
  const transfers = await confirmedTransfers(swap);
  const rows = transfers.map((t) => [t.from, t.to, t.count, t.blocks]);
  return {
    fileName: `${slug(swap.title)}-swap-${swap.id}-distribution.csv`,
    body: csv(['From (maker)', 'To (recipient)', 'Blocks', 'Block numbers'], rows),
  };
}
