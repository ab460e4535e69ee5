import type { IntakeBlockDto } from '@shared/schemas/intake';
import { isBlockStateBefore } from '@shared/vocabulary';

/**
 * Newer wins: our own queued changes may be ahead of the server's answer (they have not been sent
 * yet), so of the device's copy of a block and the server's, the state further along is kept, with
 * its verdict. Returns what to lay over the server's copy (nothing when the server is as far or further).
 */
export function pickNewer(local: IntakeBlockDto, server: IntakeBlockDto): Partial<IntakeBlockDto> {
  return isBlockStateBefore(server.state, local.state) ? { state: local.state, verdict: local.verdict } : {};
}
