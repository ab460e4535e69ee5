/** What the swap API answers; lengths are numbers of inches, dates ISO 8601 strings. */
import type { BlockSpec } from './schemas/blocks';
import type { BlockState, SwapMode, SwapState } from './schemas/swaps';
import type { Role } from './schemas/guilds';
import type { LatestPhotoEstimateDto } from './schemas/photo-estimates';
import type { Verdict } from './vocabulary';

/** The verdict of a measurement; its words, glyph and order are in shared/vocabulary.ts. */
export type VerdictName = Verdict;
export type MeasurementSource = 'ruler' | 'maker' | 'photo';

export interface SizeDto {
  width: number;
  height: number;
}

export interface SwapSummaryDto {
  id: number;
  guildId: number;
  title: string;
  state: SwapState;
  mode: SwapMode;
  unfinished: SizeDto;
  signupClosesAt: string;
  dueAt: string;
  quota: { min: number; max: number };
  /** members with an active sign-up, and blocks they pledged */
  signups: number;
  pledged: number;
  /** the caller's pledge, 0 when not signed up */
  myPledge: number;
}

export interface SwapDto extends SwapSummaryDto {
  description: string;
  block: BlockSpec;
  seam: number;
  finished: SizeDto;
  tolerance: number;
  squareness: number;
  colourRules: { role: string; note: string }[];
  signupReminderDays: number;
  dueReminderDays: number;
  giftRecipient: { userId: number | null; name: string } | null;
  /** In the guild currency's minor unit; 0 is no fee. */
  fees: { entry: number; postage: number };
  createdBy: { id: number; displayName: string } | null;
  createdAt: string;
  updatedAt: string;
  distributionConfirmedAt: string | null;
  /** true while state is signup and the close date has not passed */
  signupOpen: boolean;
  guild: { id: number; name: string; timeZone: string };
  myRole: Role;
  canManage: boolean;
}

export interface SwapTransitionDto {
  id: number;
  from: SwapState | null;
  to: SwapState;
  by: { id: number; displayName: string } | null;
  at: string;
  reason: string | null;
}

/** What a move of the swap would do, shown before the coordinator confirms it. */
export interface TransitionPreviewDto {
  to: SwapState;
  /** people who will be e-mailed because of the move */
  emails: number;
  /** blocks pledged and not handed in yet */
  owedBlocks: number;
  /** what is unusual about the move now; `move_refused` when the move cannot be made at all */
  warnings: { code: string; message: string }[];
}

export interface SignupDto {
  swapId: number;
  userId: number;
  blocks: number;
  status: 'active' | 'withdrawn';
}

export interface PhotoRefDto {
  id: number;
  thumbUrl: string;
  url: string;
}

export interface MeasurementDto {
  id: number;
  blockId: number;
  source: MeasurementSource;
  measuredBy: { id: number; displayName: string } | null;
  width: number;
  height: number;
  diagonals: [number, number] | null;
  verdict: VerdictName;
  deviations: { width: number; height: number; diagonal?: number };
  note: string | null;
  at: string;
  /** set when the measurement was undone; it stays in the history, and no longer decides the verdict */
  withdrawnAt: string | null;
}

export interface BlockDto {
  id: number;
  swapId: number;
  maker: { id: number; displayName: string };
  sequence: number;
  state: BlockState;
  /** verdict of the latest ruler measurement; absent when the guild keeps other makers' verdicts to its officers */
  verdict?: VerdictName | null;
  /** verdict, trimmed, accepted, decision, latest and photoEstimate are all absent together in that case */
  trimmed?: boolean;
  /** true once the block counts for the return: true to size, trimmed, or accepted by decision */
  accepted?: boolean;
  /** an officer accepted this off-size block anyway: why, who and when */
  decision?: { reason: string; by: { id: number; displayName: string } | null; at: string } | null;
  handIn: { how: 'in-person' | 'post'; note: string | null } | null;
  recipient: { id: number | null; displayName: string } | null;
  times: {
    sewn: string | null;
    handedIn: string | null;
    received: string | null;
    measured: string | null;
    returned: string | null;
    trimmed: string | null;
  };
  latest?: { ruler: MeasurementDto | null; maker: MeasurementDto | null };
  photos: PhotoRefDto[];
  /** the latest estimate from a photo, kept apart from the ruler verdict */
  photoEstimate?: LatestPhotoEstimateDto | null;
}

export interface RosterBlockDto {
  id: number;
  sequence: number;
  state: BlockState;
  /** verdict, trimmed, acceptedByDecision and the photo estimate are absent when the guild keeps other makers' verdicts to its officers */
  verdict?: VerdictName | null;
  trimmed?: boolean;
  /** an officer accepted it anyway, with a reason (the block's own answer says why) */
  acceptedByDecision?: boolean;
  handIn: { how: 'in-person' | 'post'; note: string | null } | null;
  photos: PhotoRefDto[];
  /** the latest estimate from a photo, kept apart from the ruler verdict */
  photoEstimate?: LatestPhotoEstimateDto | null;
}

export interface VerdictCounts {
  true: number;
  trim: number;
  short: number;
  skewed: number;
}

export interface RosterCounts {
  pledged: number;
  sewn: number;
  handedIn: number;
  received: number;
  measured: number;
  returned: number;
  verdicts: VerdictCounts;
}

/** A member's row; `verdicts` and `accepted` are absent when the guild keeps other makers' verdicts to its officers. */
export interface RosterRowDto extends Omit<RosterCounts, 'verdicts'> {
  verdicts?: VerdictCounts;
  userId: number;
  displayName: string;
  /** pledged blocks not handed in yet */
  owed: number;
  /** blocks accepted for the return (true, or trimmed) */
  accepted?: number;
  blocks: RosterBlockDto[];
  /** only for coordinators and admins */
  mailingAddress?: string | null;
}

export interface RosterDto {
  swap: { id: number; state: SwapState; unfinished: SizeDto; title: string; mode: SwapMode };
  totals: RosterCounts & { accepted: number; members: number };
  rows: RosterRowDto[];
}

export interface TransferDto {
  from: number;
  to: number | null;
  count: number;
  fromName: string;
  toName: string;
}

export interface DistributionPlanDto {
  mode: SwapMode;
  transfers: TransferDto[];
  shortfall: { id: number; displayName: string; missing: number }[];
  /** makers and how many of their blocks are accepted */
  makers: { id: number; displayName: string; accepted: number }[];
  acceptedTotal: number;
  /** blocks left out: not arrived, not measured, runs short, out of square, or awaiting a trim */
  leftOut: { pending: number; rejected: number; untrimmed: number };
}

/** A person in the return; `id` is null only for a named gift recipient who is not a member. */
export interface ReturnPersonDto {
  id: number | null;
  displayName: string;
}

/** One recipient's bundle for hand-out night; `code` is the short code on the block's label. */
export interface DistributionByRecipientDto {
  recipient: ReturnPersonDto;
  blocks: { id: number; maker: { id: number; displayName: string }; code: string }[];
}

export interface DistributionByMakerDto {
  maker: { id: number; displayName: string };
  blocks: { id: number; recipient: ReturnPersonDto; code: string }[];
}

export interface DistributionResultDto {
  swapId: number;
  confirmedAt: string;
  transfers: TransferDto[];
  blocksReturned: number;
}
