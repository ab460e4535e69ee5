import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';

/**
 * Marks a block received. Sent from the offline queue: the clientId makes a resend harmless, and a
 * lapsed session is reported to the queue instead of leaving the intake view.
 */
export const postReceived = (blockId: number, clientId: string) =>
  api.post<BlockDto>(`/blocks/${blockId}/received`, { clientId }, { allowUnauthenticated: true });
