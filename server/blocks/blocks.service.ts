/** A block's life between pledge and return: sewn, handed in, received, trimmed. */
import type { Transaction } from 'sequelize';
import type { HandInInput } from '@shared/schemas/blocks';
import type { BlocksQuery, BlockState, SwapState } from '@shared/schemas/swaps';
import type { BlockDto } from '@shared/swap-types';
import { isBlockStateBefore } from '@shared/vocabulary';
import { Block, type Swap } from '../db/models';
import { ConflictError, ForbiddenError, NotFoundError } from '../http/errors';
import type { Reply } from '../http/route';
import type { AppDeps } from '../deps';
import { blockDto, blockDtos, type BlockViewer } from './block-dto';
import { idempotent } from './idempotency';
import { findBlockWithSwap, swapBlocks } from './blocks.queries';
import { preparedPoolQuery } from '../db/prepared';
import { buildFromRow } from '../db/model-columns';
import { applyStep } from './step-log';

type Deps = Pick<AppDeps, 'events' | 'sequelize' | 'pool'>;

/**
 * A block to change, as the route's policy read and locked it, with the transaction it is locked
 * in: the service works on this instance and never reads the block again.
 */
export interface LockedBlock {
  block: Block;
  swap: Swap;
  transaction: Transaction;
}

/** The block, locked for a change of its state, and its swap, in one query (for changes outside a block route). */
export async function lockedBlock(deps: Pick<AppDeps, 'pool'>, blockId: number, transaction: Transaction): Promise<LockedBlock> {
  const found = await findBlockWithSwap(deps.pool, blockId, { transaction, lockForChange: true });
  if (!found) throw new NotFoundError('That block does not exist.');
  return { ...found, transaction };
}

export function assertSwapIn(swap: Swap, states: readonly SwapState[], doing: string) {
  if (states.includes(swap.state)) return;
  throw new ConflictError(
    `Blocks can be ${doing} only while the swap is ${states.join(' or ')}; it is ${swap.state} now.`,
    'swap_state',
  );
}

/** The domain event for a block that moved from `from`, to emit after commit. */
export function blockChanged(
  deps: Pick<AppDeps, 'events'>,
  { block, swap }: Pick<LockedBlock, 'block' | 'swap'>,
  actorId: number,
  from: BlockState,
) {
  return () =>
    deps.events.emit('block.changed', {
      swapId: swap.id,
      guildId: swap.guildId,
      actorId,
      blockId: block.id,
      makerId: block.makerId,
      from,
      to: block.state,
    });
}

/** The block's answer as it is after the change, read in the change's transaction. */
async function answer(deps: Deps, { block, swap, transaction }: LockedBlock, after?: () => void, status = 200) {
  return { status, body: await blockDto(deps, block, swap, { transaction }), after };
}

/**
 * Marks a pledged block sewn (the maker says so, or a photo of it was posted). Already sewn or
 * further along: nothing changes. The photo upload calls it inside its own transaction and emits
 * the returned event after commit.
 */
export async function markBlockSewn(deps: Deps, locked: LockedBlock, actorId: number): Promise<(() => void) | undefined> {
  const { block, swap, transaction } = locked;
  assertSwapIn(swap, ['signup', 'sewing', 'collecting'], 'marked sewn');
  if (block.state !== 'pledged') return undefined;
  await applyStep(transaction, block, { state: 'sewn', sewnAt: new Date() }, { action: 'sewn', byId: actorId });
  return blockChanged(deps, locked, actorId, 'pledged');
}

export async function markSewn(deps: Deps, locked: LockedBlock, actorId: number): Promise<Reply<BlockDto>> {
  return answer(deps, locked, await markBlockSewn(deps, locked, actorId));
}

/**
 * Hands a locked block in, unless the coordinator has taken it in already (`refusal` says so); a
 * block handed in before keeps its first hand-in time. Answers the state it came from.
 */
export async function handInLocked(
  deps: Deps,
  { block, swap, transaction }: LockedBlock,
  actorId: number,
  input: HandInInput,
  refusal: string,
): Promise<BlockState> {
  assertSwapIn(swap, ['signup', 'sewing', 'collecting'], 'handed in');
  if (!isBlockStateBefore(block.state, 'received')) throw new ConflictError(refusal, 'already_received');
  const from = block.state;
  const now = new Date();
  await applyStep(
    transaction,
    block,
    {
      state: 'handed_in',
      handInHow: input.how,
      handInNote: input.note || null,
      handedInAt: block.handedInAt ?? now,
      sewnAt: block.sewnAt ?? now,
    },
    { action: 'handed_in', byId: actorId },
  );
  return from;
}

/** The maker hands a block in, at a meeting or by post (with an optional tracking note). */
export async function handIn(deps: Deps, locked: LockedBlock, actorId: number, input: HandInInput): Promise<Reply<BlockDto>> {
  const refusal = 'The coordinator has already received this block, so its hand-in cannot change.';
  const from = await handInLocked(deps, locked, actorId, input, refusal);
  return answer(deps, locked, from !== 'handed_in' ? blockChanged(deps, locked, actorId, from) : undefined);
}

/** A coordinator takes a block in. Repeating it changes nothing; a measured block cannot be received again. */
export function receive(deps: Deps, locked: LockedBlock, actorId: number, clientId?: string): Promise<Reply<BlockDto>> {
  const { block, swap, transaction } = locked;
  return idempotent(
    deps.sequelize,
    transaction,
    { clientId, userId: actorId, blockId: block.id, action: 'received' },
    async () => {
      assertSwapIn(swap, ['sewing', 'collecting'], 'received');
      if (block.state === 'received') return answer(deps, locked);
      if (!isBlockStateBefore(block.state, 'received')) {
        throw new ConflictError(`This block is already ${block.state}; there is nothing to receive.`, 'already_received');
      }
      const from = block.state;
      const now = new Date();
      await applyStep(
        transaction,
        block,
        { state: 'received', receivedAt: now, receivedById: actorId, sewnAt: block.sewnAt ?? now },
        { action: 'received', byId: actorId },
      );
      return answer(deps, locked, blockChanged(deps, locked, actorId, from));
    },
  );
}

/** A coordinator records that a `trim` block was cut down to size; it then counts as accepted. */
export async function markTrimmed(deps: Deps, locked: LockedBlock, actorId: number): Promise<Reply<BlockDto>> {
  const { block, swap, transaction } = locked;
  assertSwapIn(swap, ['collecting', 'sorting'], 'marked trimmed');
  if (swap.distributionConfirmedAt)
    throw new ConflictError('The return of blocks is already confirmed.', 'distribution_confirmed');
  if (block.state !== 'measured' || block.verdict !== 'trim') {
    throw new ConflictError('Only a measured block with the verdict “Trim to size” can be marked trimmed.', 'not_trim');
  }
  if (block.trimmed) return answer(deps, locked);
  await applyStep(transaction, block, { trimmed: true, trimmedAt: new Date() }, { action: 'trimmed', byId: actorId });
  return answer(deps, locked, blockChanged(deps, locked, actorId, 'measured'));
}

/** One block as the policy read it (with its swap). */
export function getBlock(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  { block, swap }: { block: Block; swap: Swap },
  viewer: BlockViewer,
): Promise<BlockDto> {
  return blockDto(deps, block, swap, { viewer });
}

/**
 * Blocks of a swap. `maker=me` (or the caller's own id) and `recipient=me` (blocks coming to the
 * caller) are open to every member; anyone else's blocks, or all of them, only to officers.
 */
export async function listBlocks(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  swap: Swap,
  viewer: BlockViewer,
  query: BlocksQuery,
): Promise<BlockDto[]> {
  const makerId = query.maker === 'me' ? viewer.userId : query.maker;
  const mine = makerId === viewer.userId || (query.recipient === 'me' && makerId === undefined);
  if (!viewer.canManage && !mine) throw new ForbiddenError('Members see their own blocks: ask for maker=me or recipient=me.');
  const rows = await preparedPoolQuery<Record<string, unknown>>(deps.pool, swapBlocks(), {
    swapId: swap.id,
    makerId: makerId ?? null,
    toMe: query.recipient === 'me',
    userId: viewer.userId,
  });
  const blocks = rows.map((row) => buildFromRow(Block, row));
  return blockDtos(deps, blocks, swap, { viewer });
}
