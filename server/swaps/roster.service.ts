/**
 * The roster: every member's progress and each of their blocks, built from four queries run side by
 * side (sign-ups with names, blocks, photos, latest photo estimates) whatever the size of the swap.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { BlockState } from '@shared/schemas/swaps';
import type { RosterBlockDto, RosterCounts, RosterDto, RosterRowDto, VerdictName } from '@shared/swap-types';
import { Swap } from '../db/models';
import { photosBySwap } from '../blocks/photo-refs';
import { latestPhotoEstimatesBySwap } from '../photo-estimates/estimate-dto';

const ORDER: readonly BlockState[] = ['pledged', 'sewn', 'handed_in', 'received', 'measured', 'returned'];
const reached = (state: BlockState, step: BlockState) => ORDER.indexOf(state) >= ORDER.indexOf(step);

interface SignupRow {
  user_id: number;
  display_name: string;
  email: string;
  blocks: number;
  mailing_address: string | null;
}

interface BlockRow {
  id: number;
  maker_id: number;
  sequence: number;
  state: BlockState;
  verdict: VerdictName | null;
  trimmed: boolean;
  recipient_id: number | null;
  hand_in_how: 'in-person' | 'post' | null;
  hand_in_note: string | null;
}

const emptyCounts = (): RosterCounts => ({
  pledged: 0, sewn: 0, handedIn: 0, received: 0, measured: 0, returned: 0,
  verdicts: { true: 0, trim: 0, short: 0, skewed: 0 },
});

function count(into: RosterCounts & { accepted: number }, b: BlockRow) {
  into.pledged += 1;
  if (reached(b.state, 'sewn')) into.sewn += 1;
  if (reached(b.state, 'handed_in')) into.handedIn += 1;
  if (reached(b.state, 'received')) into.received += 1;
  if (reached(b.state, 'measured')) into.measured += 1;
  if (b.state === 'returned') into.returned += 1;
  if (b.verdict && reached(b.state, 'measured')) into.verdicts[b.verdict] += 1;
  if (reached(b.state, 'measured') && (b.verdict === 'true' || (b.verdict === 'trim' && b.trimmed))) into.accepted += 1;
}

export interface RosterData extends RosterDto {
  rows: (RosterRowDto & { email: string })[];
}

/**
 * Rows for every member with an active sign-up, sorted by name; addresses only when `withAddresses`.
 * Inside a transaction the queries run one after another on its connection: taking more connections
 * from the pool while the transaction holds locks could starve the pool.
 */
export async function buildRoster(swap: Swap, opts: { withAddresses: boolean; transaction?: Transaction }): Promise<RosterData> {
  const sequelize = Swap.sequelize!;
  const { transaction } = opts;
  const readers = [
    () => sequelize.query<SignupRow>(
      `SELECT s.user_id, u.display_name, u.email, s.blocks, u.mailing_address
         FROM signups s JOIN users u ON u.id = s.user_id
        WHERE s.swap_id = $swapId AND s.status = 'active'
        ORDER BY lower(u.display_name), u.id`,
      { bind: { swapId: swap.id }, type: QueryTypes.SELECT, transaction },
    ),
    () => sequelize.query<BlockRow>(
      `SELECT id, maker_id, sequence, state, verdict, trimmed, recipient_id, hand_in_how, hand_in_note
         FROM blocks WHERE swap_id = $swapId ORDER BY maker_id, sequence`,
      { bind: { swapId: swap.id }, type: QueryTypes.SELECT, transaction },
    ),
    () => photosBySwap(sequelize, swap.id, transaction),
    () => latestPhotoEstimatesBySwap(sequelize, swap.id, transaction),
  ] as const;
  const [signups, blocks, photos, estimates] = transaction
    ? [await readers[0](), await readers[1](), await readers[2](), await readers[3]()]
    : await Promise.all([readers[0](), readers[1](), readers[2](), readers[3]()]);

  const byMaker = new Map<number, BlockRow[]>();
  for (const b of blocks) byMaker.set(b.maker_id, [...(byMaker.get(b.maker_id) ?? []), b]);

  const totals = { ...emptyCounts(), accepted: 0, members: signups.length };
  const rows = signups.map((s) => {
    const own = byMaker.get(s.user_id) ?? [];
    const counts = { ...emptyCounts(), accepted: 0 };
    for (const b of own) {
      count(counts, b);
      count(totals, b);
    }
    const rosterBlocks: RosterBlockDto[] = own.map((b) => ({
      id: b.id,
      sequence: b.sequence,
      state: b.state,
      verdict: reached(b.state, 'measured') ? b.verdict : null,
      trimmed: b.trimmed,
      recipientId: b.recipient_id,
      handIn: b.hand_in_how ? { how: b.hand_in_how, note: b.hand_in_note } : null,
      photos: photos.get(b.id) ?? [],
      // Beside the ruler verdict, never in it: an estimate from a photo decides nothing.
      photoEstimate: estimates.get(b.id) ?? null,
    }));
    return {
      userId: s.user_id,
      displayName: s.display_name,
      email: s.email,
      ...counts,
      owed: Math.max(0, counts.pledged - counts.handedIn),
      blocks: rosterBlocks,
      ...(opts.withAddresses ? { mailingAddress: s.mailing_address } : {}),
    };
  });
  return {
    swap: { id: swap.id, state: swap.state, unfinished: { width: swap.unfinishedWidth, height: swap.unfinishedHeight }, title: swap.title, mode: swap.mode },
    totals,
    rows,
  };
}

/** The roster as the API answers it: e-mail addresses stay out of it. */
export async function getRoster(swap: Swap, opts: { withAddresses: boolean; transaction?: Transaction }): Promise<RosterDto> {
  const data = await buildRoster(swap, opts);
  return { ...data, rows: data.rows.map(({ email: _email, ...row }) => row) };
}
