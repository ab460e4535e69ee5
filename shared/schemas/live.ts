import { z } from 'zod';
import { bodyId, idParam } from './ids';

/** Ids in socket payloads arrive as JSON numbers; strings and fractions are refused. */
export const socketId = bodyId();

export const boardRefSchema = z.object({ swapId: socketId }).strict();
export type BoardRef = z.infer<typeof boardRefSchema>;

export const chatRoomRefSchema = z.object({ roomId: socketId }).strict();
export type ChatRoomRef = z.infer<typeof chatRoomRefSchema>;

export const swapParamsSchema = z.object({ swapId: idParam });

export const activityQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(100).default(20),
  /** the id of the oldest line already shown; the answer holds the lines before it */
  before: z.coerce.number().int().min(-2147483648).max(2147483647).optional(),
});
