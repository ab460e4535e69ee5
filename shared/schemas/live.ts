import { z } from 'zod';

/** Ids in socket payloads arrive as JSON numbers; strings and fractions are refused. */
export const socketId = z.number({ error: 'Expected a numeric id.' }).int('Expected a whole-number id.').positive('Expected a positive id.');

export const boardRefSchema = z.object({ swapId: socketId }).strict();
export type BoardRef = z.infer<typeof boardRefSchema>;

export const chatRoomRefSchema = z.object({ roomId: socketId }).strict();
export type ChatRoomRef = z.infer<typeof chatRoomRefSchema>;

export const swapParamsSchema = z.object({ swapId: z.coerce.number({ error: 'Expected a number.' }).int().positive('Expected a positive id.') });

export const activityQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(100).default(20),
});

export const blockStates = ['pledged', 'sewn', 'handed_in', 'received', 'measured', 'returned'] as const;
export type BlockState = (typeof blockStates)[number];
export const verdicts = ['true', 'trim', 'short', 'skewed'] as const;
export type Verdict = (typeof verdicts)[number];
export type MeasurementSource = 'ruler' | 'maker' | 'photo';

/** One block on the roster, as GET /api/swaps/:swapId/roster gives it. */
export interface RosterBlock {
  id: number;
  sequence: number;
  state: BlockState;
  verdict: Verdict | null;
  /** How the latest measurement was taken; 'photo' marks an estimate from a photo. */
  source?: MeasurementSource | null;
}

export interface RosterRow {
  userId: number;
  displayName: string;
  pledged: number;
  sewn: number;
  handedIn: number;
  received: number;
  measured: number;
  owed: number;
  blocks: RosterBlock[];
}

export interface RosterTotals {
  pledged: number;
  sewn: number;
  handedIn: number;
  received: number;
  measured: number;
  verdicts: Record<Verdict, number>;
}

export interface Roster {
  swap: { id: number; state: string; unfinished: { width: number; height: number }; title?: string; guildId?: number };
  totals: RosterTotals;
  rows: RosterRow[];
}
