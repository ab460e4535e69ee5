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
