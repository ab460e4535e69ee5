import type { ResolveAnswerDto, ResolveBody } from '@shared/schemas/intake';
import { api } from '@/lib/api-client';

/** Asks the server which block a scanned reference or typed short code names (it checks the signature). */
export const resolveBlock = (body: ResolveBody, signal?: AbortSignal) =>
  api.post<ResolveAnswerDto>('/intake/resolve', body, { signal });
