/**
 * The roster: every member's progress and each of their blocks (with photos and the latest photo
 * estimate), read in a single query whatever the size of the swap.
 */
import { blockStateRank, type BlockState } from '@shared/vocabulary';
import type { RosterBlockDto, RosterCounts, RosterDto, RosterRowDto } from '@shared/swap-types';
import type { VerdictsVisibleTo } from '@shared/schemas/guilds';
import type { Swap } from '../db/models';
import type { AppDeps } from '../deps';
import { photoRef } from '../blocks/photo-refs';
import { latestEstimateDto, type LatestEstimateRow } from '../blocks/latest-estimate';
import { ROSTER_CHUNKS } from './board.queries';
import { rosterForMember, viewerSeesAllVerdicts, type VerdictViewer } from '../blocks/verdict-visibility';

// A rank lookup rather than two searches of the list of states.
const reached = (state: BlockState, step: BlockState) => blockStateRank[state] >= blockStateRank[step];

type HandInHow = 'in-person' | 'post';

/** A block as the roster query writes it (board.queries.ts ROSTER_ARRAY): positions, not keys. */
type BlockTuple = [
  id: number,
  sequence: number,
  state: BlockState,
  verdict: RosterBlockDto['verdict'],
  trimmed: boolean,
  acceptedByDecision: boolean,
  handInHow: HandInHow | null,
  handInNote: string | null,
  photoIds: number[] | null,
  estimate: LatestEstimateRow | null,
];

/** A member with an active sign-up, as the roster query writes it; `blocks` is null before any is pledged. */
export type MemberTuple = [
  userId: number,
  displayName: string,
  email: string,
  pledge: number,
  mailingAddress: string | null,
  blocks: BlockTuple[] | null,
];

/** The members of a roster read in chunks (ROSTER_CHUNKS, ROSTER_WITH_SWAP): each chunk the text of a JSON array. */
export function membersFromChunks(chunks: string[]): MemberTuple[] {
  return chunks.flatMap((chunk) => JSON.parse(chunk) as MemberTuple[]);
}

type Tally = RosterCounts & { accepted: number };

// One literal with every field: a tally made by spreading another object has a slow shape, and
// adding to its fields took most of the roster's shaping time.
const emptyTally = (): Tally => ({
  pledged: 0,
  sewn: 0,
  handedIn: 0,
  received: 0,
  measured: 0,
  returned: 0,
  verdicts: { true: 0, trim: 0, short: 0, skewed: 0 },
  accepted: 0,
});
const SEWN = blockStateRank.sewn;
const HANDED_IN = blockStateRank.handed_in;
const RECEIVED = blockStateRank.received;
const MEASURED = blockStateRank.measured;

/** Adds one block to a member's counts, looking its state's rank up once. */
function count(into: Tally, b: Pick<RosterBlockDto, 'state' | 'verdict' | 'trimmed' | 'acceptedByDecision'>) {
  const rank = blockStateRank[b.state];
  into.pledged += 1;
  if (rank < SEWN) return;
  into.sewn += 1;
  if (rank < HANDED_IN) return;
  into.handedIn += 1;
  if (rank < RECEIVED) return;
  into.received += 1;
  if (rank < MEASURED) return;
  into.measured += 1;
  if (b.state === 'returned') into.returned += 1;
  const { verdict } = b;
  if (verdict === 'true') into.verdicts.true += 1;
  else if (verdict === 'trim') into.verdicts.trim += 1;
  else if (verdict === 'short') into.verdicts.short += 1;
  else if (verdict === 'skewed') into.verdicts.skewed += 1;
  if (verdict === 'true' || (verdict === 'trim' && b.trimmed) || b.acceptedByDecision) into.accepted += 1;
}

/** Adds a member's counts (or `times` blocks alike) to the swap's totals, so each block is counted once. */
function addTally(into: Tally, from: Tally, times = 1) {
  into.pledged += from.pledged * times;
  into.sewn += from.sewn * times;
  into.handedIn += from.handedIn * times;
  into.received += from.received * times;
  into.measured += from.measured * times;
  into.returned += from.returned * times;
  into.accepted += from.accepted * times;
  into.verdicts.true += from.verdicts.true * times;
  into.verdicts.trim += from.verdicts.trim * times;
  into.verdicts.short += from.verdicts.short * times;
  into.verdicts.skewed += from.verdicts.skewed * times;
}

export interface RosterData extends RosterDto {
  rows: (RosterRowDto & { email: string; verdicts: RosterCounts['verdicts']; accepted: number })[];
}

/** Rows for every member with an active sign-up, sorted by name; addresses only when `withAddresses`. */
export async function buildRoster(
  deps: Pick<AppDeps, 'pool'>,
  swap: Swap,
  opts: { withAddresses: boolean; members?: MemberTuple[] },
): Promise<RosterData> {
  // Members already read (with the swap by the GET route, with the change by the board fan-out) are
  // used as they are. Otherwise a named statement on the plain pool: PostgreSQL keeps its plan.
  const members =
    opts.members ??
    membersFromChunks(
      (
        await deps.pool.query<{ members: string }>({
          name: 'roster-chunks',
          text: ROSTER_CHUNKS,
          values: [swap.id],
        })
      ).rows.map((r) => r.members),
    );
  const totals = emptyTally();
  const rows = rosterRows(members, opts.withAddresses, totals);
  return { swap: swapSummary(swap), totals: { ...totals, members: members.length }, rows };
}

/** A group of a swap's blocks as ROSTER_PART_POSITIONAL counts them, and how many blocks it holds. */
type TallyTuple = [
  state: BlockState,
  verdict: RosterBlockDto['verdict'],
  trimmed: boolean,
  acceptedByDecision: boolean,
  blocks: number,
];

/** ROSTER_PART_POSITIONAL's one row. */
export interface RosterPartRow {
  roster: MemberTuple[];
  members: number;
  tallies: TallyTuple[];
}

/**
 * The rows of the members ROSTER_PART_POSITIONAL was asked for that still have an active sign-up
 * (sorted by name, without addresses) and the swap's totals, as `buildRoster` would give them, from
 * the row the statement answered: for a board change, which sends only the rows it touched.
 */
export function rosterPartFrom(swap: Swap, { roster, members, tallies }: RosterPartRow): RosterData {
  const totals = emptyTally();
  for (const [state, verdict, trimmed, acceptedByDecision, blocks] of tallies) {
    const group = emptyTally();
    count(group, { state, verdict, trimmed, acceptedByDecision });
    addTally(totals, group, blocks);
  }
  return {
    swap: swapSummary(swap),
    totals: { ...totals, members },
    rows: rosterRows(roster, false, emptyTally()),
  };
}

function swapSummary(swap: Swap): RosterDto['swap'] {
  return {
    id: swap.id,
    state: swap.state,
    unfinished: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
    title: swap.title,
    mode: swap.mode,
  };
}

/** Each member's row from the query's tuples; every block is also counted into `totals`. */
function rosterRows(members: MemberTuple[], withAddresses: boolean, totals: Tally): RosterData['rows'] {
  return members.map(([userId, displayName, email, , mailingAddress, own]) => {
    const counts = emptyTally();
    const blocks = (own ?? []).map(
      ([
        id,
        sequence,
        state,
        verdict,
        trimmed,
        acceptedByDecision,
        handInHow,
        handInNote,
        photoIds,
        estimate,
      ]): RosterBlockDto => {
        const block: RosterBlockDto = {
          id,
          sequence,
          state,
          verdict: reached(state, 'measured') ? verdict : null,
          trimmed,
          acceptedByDecision,
          handIn: handInHow ? { how: handInHow, note: handInNote } : null,
          photos: (photoIds ?? []).map((photoId) => photoRef(photoId)),
          // Beside the ruler verdict, never in it: an estimate from a photo decides nothing.
          photoEstimate: estimate ? latestEstimateDto(estimate) : null,
        };
        count(counts, { state, verdict, trimmed, acceptedByDecision });
        return block;
      },
    );
    addTally(totals, counts);
    return {
      userId,
      displayName,
      email,
      ...counts,
      owed: Math.max(0, counts.pledged - counts.handedIn),
      blocks,
      ...(withAddresses ? { mailingAddress } : {}),
    };
  });
}

/**
 * The roster as the API answers it: e-mail addresses stay out of it. With a `viewer` who does not see
 * every maker's verdicts (a member, while the guild keeps them to its officers), other makers' rows
 * come without their verdicts.
 */
export async function getRoster(
  deps: Pick<AppDeps, 'pool'>,
  swap: Swap,
  opts: { withAddresses: boolean; viewer?: VerdictViewer; members?: MemberTuple[]; verdictsVisibleTo?: VerdictsVisibleTo },
): Promise<RosterDto> {
  const data = await buildRoster(deps, swap, opts);
  const roster = { ...data, rows: data.rows.map(({ email: _email, ...row }): RosterRowDto => row) };
  const { viewer } = opts;
  if (!viewer || (await viewerSeesAllVerdicts(viewer, swap.guildId, opts.verdictsVisibleTo))) return roster;
  return rosterForMember(roster, viewer.userId);
}
