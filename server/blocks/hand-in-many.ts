/** A maker hands several of their blocks in at once: all of them, or none if one cannot be. */
import type { HandInManyInput } from '@shared/schemas/blocks';
import type { BlockDto } from '@shared/swap-types';
import type { Block, Swap } from '../db/models';
import { ValidationError } from '../http/errors';
import type { AppDeps } from '../deps';
import { blockDtos } from './block-dto';
import { handInLocked, lockedBlock } from './blocks.service';

type Deps = Pick<AppDeps, 'events' | 'sequelize' | 'pool'>;

/**
 * Marks each chosen block handed in, the same way one block is; blocks already handed in keep their
 * first hand-in time. Every block must be the caller's own, in this swap, and not taken in yet.
 */
export async function handInMany(deps: Deps, swap: Swap, actorId: number, input: HandInManyInput): Promise<BlockDto[]> {
  const ids = [...new Set(input.blockIds)].sort((a, b) => a - b);
  const { dtos, changes } = await deps.sequelize.transaction(async (transaction) => {
    const done: Block[] = [];
    const changes: { blockId: number; from: Block['state'] }[] = [];
    // Locked in id order, so two overlapping requests cannot wait on each other.
    for (const id of ids) {
      const { block, swap: own } = await lockedBlock(deps, id, transaction);
      // Someone else's block, or one of another swap, is a mistake in the list, not a matter of rights.
      if (own.id !== swap.id || block.makerId !== actorId) {
        throw new ValidationError('Choose only your own blocks of this swap.', {
          blockIds: `Block ${id} is not one of your blocks in this swap.`,
        });
      }
      const refusal = `Block ${block.sequence} has already been taken in, so its hand-in cannot change.`;
      const from = await handInLocked(deps, { block, swap: own, transaction }, actorId, input, refusal);
      if (from !== 'handed_in') changes.push({ blockId: id, from });
      done.push(block);
    }
    return { dtos: await blockDtos(deps, done, swap, { transaction }), changes };
  });
  for (const c of changes) {
    deps.events.emit('block.changed', {
      swapId: swap.id,
      guildId: swap.guildId,
      actorId,
      blockId: c.blockId,
      makerId: actorId,
      from: c.from,
      to: 'handed_in',
    });
  }
  return dtos;
}
