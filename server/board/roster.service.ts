/**
 * The roster: every member's progress and each of their blocks (with photos and the latest photo
 * estimate), read in a single query whatever the size of the swap.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { BlockState } from '@shared/schemas/swaps';
import type { RosterBlockDto, RosterCounts, RosterDto, RosterRowDto } from '@shared/swap-types';
import { Swap } from '../db/models';
import { hasPhotosTable, photoRef } from '../blocks/photo-refs';
import { latestEstimateDto, type LatestEstimateRow } from '../blocks/latest-estimate';

const ORDER: readonly BlockState[] = ['pledged', 'sewn', 'handed_in', 'received', 'measured', 'returned'];
// Asked a dozen times per block: a lookup rather than two searches of ORDER.
const RANK = Object.fromEntries(ORDER.map((state, i) => [state, i])) as Record<BlockState, number>;
const reached = (state: BlockState, step: BlockState) => RANK[state] >= RANK[step];

/** A block as the roster query returns it: the answer's plain fields, the rest still to shape. */
interface BlockJson extends Pick<RosterBlockDto, 'id' | 'sequence' | 'state' | 'verdict' | 'trimmed' | 'recipientId'> {
  handInHow: 'in-person' | 'post' | null;
  handInNote: string | null;
  photoIds: number[];
  estimate: LatestEstimateRow | null;
}

interface SignupRow {
  user_id: number;
  display_name: string;
  email: string;
  blocks: number;
  mailing_address: string | null;
  /** the member's blocks by sequence, each with its photos and latest photo estimate */
  own: BlockJson[];
}

/**
 * One row per active sign-up, sorted by name, carrying the member's blocks as a JSON array: one query
 * and one connection whatever the size of the swap, and JSON is quicker to read than a row per block.
 */
function rosterSql(withPhotos: boolean) {
  const photoIds = withPhotos ? 'ARRAY(SELECT p.id FROM photos p WHERE p.block_id = b.id ORDER BY p.created_at, p.id)' : "'{}'::int[]";
  return `SELECT s.user_id, u.display_name, u.email, s.blocks, u.mailing_address,
         coalesce((
           SELECT json_agg(json_build_object(
                    'id', b.id, 'sequence', b.sequence, 'state', b.state, 'verdict', b.verdict, 'trimmed', b.trimmed,
                    'recipientId', b.recipient_id, 'handInHow', b.hand_in_how, 'handInNote', b.hand_in_note,
                    'photoIds', ${photoIds},
                    'estimate', (SELECT row_to_json(latest) FROM (
                                   SELECT e.id, e.block_id, e.verdict, e.width, e.height, e.expected_error, e.borderline, e.created_at
                                     FROM photo_estimates e WHERE e.block_id = b.id
                                    ORDER BY e.created_at DESC, e.id DESC LIMIT 1) latest)
                  ) ORDER BY b.sequence)
             FROM blocks b WHERE b.swap_id = s.swap_id AND b.maker_id = s.user_id), '[]') AS own
    FROM signups s JOIN users u ON u.id = s.user_id
   WHERE s.swap_id = $swapId AND s.status = 'active'
   ORDER BY lower(u.display_name), u.id`;
}

const emptyCounts = (): RosterCounts => ({
  pledged: 0, sewn: 0, handedIn: 0, received: 0, measured: 0, returned: 0,
  verdicts: { true: 0, trim: 0, short: 0, skewed: 0 },
});

function count(into: RosterCounts & { accepted: number }, b: Pick<BlockJson, 'state' | 'verdict' | 'trimmed'>) {
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

/** Rows for every member with an active sign-up, sorted by name; addresses only when `withAddresses`. */
export async function buildRoster(swap: Swap, opts: { withAddresses: boolean; transaction?: Transaction }): Promise<RosterData> {
  const sequelize = Swap.sequelize!;
  const { transaction } = opts;
  const withPhotos = await hasPhotosTable(sequelize, transaction);
  const signups = await sequelize.query<SignupRow>(rosterSql(withPhotos), { bind: { swapId: swap.id }, type: QueryTypes.SELECT, transaction });

  const totals = { ...emptyCounts(), accepted: 0, members: signups.length };
  const rows = signups.map((s) => {
    const counts = { ...emptyCounts(), accepted: 0 };
    for (const b of s.own) {
      count(counts, b);
      count(totals, b);
    }
    const rosterBlocks: RosterBlockDto[] = s.own.map((b) => ({
      id: b.id,
      sequence: b.sequence,
      state: b.state,
      verdict: reached(b.state, 'measured') ? b.verdict : null,
      trimmed: b.trimmed,
      recipientId: b.recipientId,
      handIn: b.handInHow ? { how: b.handInHow, note: b.handInNote } : null,
      photos: b.photoIds.map((id) => photoRef(id)),
      // Beside the ruler verdict, never in it: an estimate from a photo decides nothing.
      photoEstimate: b.estimate ? latestEstimateDto(b.estimate) : null,
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
