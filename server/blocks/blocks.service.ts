/** A block's life between pledge and return: sewn, handed in, received, trimmed. */
import type { Transaction } from 'sequelize';
import type { HandInInput } from '@shared/schemas/blocks';
import type { BlockState, BlocksQuery, SwapState } from '@shared/schemas/swaps';
import type { BlockDto } from '@shared/swap-types';
import { Block, Swap } from '../db/models';
import { ConflictError, ForbiddenError, NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { blockDto, blockDtos, type BlockViewer } from './block-dto';
import { idempotent, type Answer } from './idempotency';
import { findBlockWithSwap } from './blocks.queries';
import { recordStep, snapshotOf } from './step-log';

type Deps = Pick<AppDeps, 'events' | 'sequelize'>;

const ORDER: readonly BlockState[] = ['pledged', 'sewn', 'handed_in', 'received', 'measured', 'returned'];
const before = (a: BlockState, b: BlockState) => ORDER.indexOf(a) < ORDER.indexOf(b);

/**
 * The block, locked for a change of its state, and its swap, in one query. NO KEY UPDATE, the lock an UPDATE takes
 * anyway, still serialises changes to the block but lets rows that merely reference it (a measurement,
 * an activity line, a photo) be inserted meanwhile.
 */
export async function lockedBlock(blockId: number, transaction: Transaction): Promise<{ block: Block; swap: Swap }> {
  const found = await findBlockWithSwap(blockId, { transaction, lockForChange: true });
  if (!found) throw new NotFoundError('That block does not exist.');
  return found;
}

export function assertSwapIn(swap: Swap, states: readonly SwapState[], doing: string) {
  if (states.includes(swap.state)) return;
  throw new ConflictError(
    `Blocks can be ${doing} only while the swap is ${states.join(' or ')}; it is ${swap.state} now.`,
    'swap_state',
  );
}

function changed(deps: Deps, swap: Swap, block: Block, actorId: number, from: BlockState) {
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

/**
 * Marks a pledged block sewn (the maker says so, or a photo of it was posted). Already sewn or
 * further along: nothing changes. Exported for the photo upload, which calls it inside its own
 * transaction and emits the returned event after commit.
 */
export async function markBlockSewn(
  deps: Deps,
  blockId: number,
  actorId: number,
  transaction: Transaction,
): Promise<{ block: Block; swap: Swap; after?: () => void }> {
  const { block, swap } = await lockedBlock(blockId, transaction);
  assertSwapIn(swap, ['signup', 'sewing', 'collecting'], 'marked sewn');
  if (block.state !== 'pledged') return { block, swap };
  const was = snapshotOf(block);
  await block.update({ state: 'sewn', sewnAt: new Date() }, { transaction });
  await recordStep(transaction, { blockId, action: 'sewn', byId: actorId, before: was });
  return { block, swap, after: changed(deps, swap, block, actorId, 'pledged') };
}

export async function markSewn(deps: Deps, blockId: number, actorId: number): Promise<BlockDto> {
  const { dto, after } = await deps.sequelize.transaction(async (transaction) => {
    const { block, swap, after: emit } = await markBlockSewn(deps, blockId, actorId, transaction);
    return { dto: await blockDto(block, swap, transaction), after: emit };
  });
  after?.();
  return dto;
}

/** The maker hands a block in, at a meeting or by post (with an optional tracking note). */
export async function handIn(deps: Deps, blockId: number, actorId: number, input: HandInInput): Promise<BlockDto> {
  const { dto, after } = await deps.sequelize.transaction(async (transaction) => {
    const { block, swap } = await lockedBlock(blockId, transaction);
    assertSwapIn(swap, ['signup', 'sewing', 'collecting'], 'handed in');
    if (!before(block.state, 'received')) {
      throw new ConflictError(
        'The coordinator has already received this block, so its hand-in cannot change.',
        'already_received',
      );
    }
    const from = block.state;
    const now = new Date();
    const was = snapshotOf(block);
    await block.update(
      {
        state: 'handed_in',
        handInHow: input.how,
        handInNote: input.note || null,
        handedInAt: block.handedInAt ?? now,
        sewnAt: block.sewnAt ?? now,
      },
      { transaction },
    );
    await recordStep(transaction, { blockId, action: 'handed_in', byId: actorId, before: was });
    return {
      dto: await blockDto(block, swap, transaction),
      after: from !== 'handed_in' ? changed(deps, swap, block, actorId, from) : undefined,
    };
  });
  after?.();
  return dto;
}

/** A coordinator takes a block in. Repeating it changes nothing; a measured block cannot be received again. */
export function receive(deps: Deps, blockId: number, actorId: number, clientId?: string): Promise<Answer<BlockDto>> {
  return idempotent(deps, { clientId, userId: actorId, blockId, action: 'received' }, async (transaction) => {
    const { block, swap } = await lockedBlock(blockId, transaction);
    assertSwapIn(swap, ['sewing', 'collecting'], 'received');
    if (block.state === 'received') return { status: 200, body: await blockDto(block, swap, transaction) };
    if (!before(block.state, 'received')) {
      throw new ConflictError(`This block is already ${block.state}; there is nothing to receive.`, 'already_received');
    }
    const from = block.state;
    const now = new Date();
    const was = snapshotOf(block);
    await block.update(
      { state: 'received', receivedAt: now, receivedById: actorId, sewnAt: block.sewnAt ?? now },
      { transaction },
    );
    await recordStep(transaction, { blockId, action: 'received', byId: actorId, before: was });
    return { status: 200, body: await blockDto(block, swap, transaction), after: changed(deps, swap, block, actorId, from) };
  });
}

/** A coordinator records that a `trim` block was cut down to size; it then counts as accepted. */
export async function markTrimmed(deps: Deps, blockId: number, actorId: number): Promise<BlockDto> {
  const { dto, after } = await deps.sequelize.transaction(async (transaction) => {
    const { block, swap } = await lockedBlock(blockId, transaction);
    assertSwapIn(swap, ['collecting', 'sorting'], 'marked trimmed');
    if (swap.distributionConfirmedAt)
      throw new ConflictError('The return of blocks is already confirmed.', 'distribution_confirmed');
    if (block.state !== 'measured' || block.verdict !== 'trim') {
      throw new ConflictError('Only a measured block with the verdict “Trim to size” can be marked trimmed.', 'not_trim');
    }
    if (block.trimmed) return { dto: await blockDto(block, swap, transaction), after: undefined };
    const was = snapshotOf(block);
    await block.update({ trimmed: true, trimmedAt: new Date() }, { transaction });
    await recordStep(transaction, { blockId, action: 'trimmed', byId: actorId, before: was });
    return { dto: await blockDto(block, swap, transaction), after: changed(deps, swap, block, actorId, 'measured') };
  });
  after?.();
  return dto;
}

export async function getBlock(block: Block, viewer: BlockViewer): Promise<BlockDto> {
  // The policy loads the swap with the block; anyone else passes the block alone.
  const swap = block.swap ?? (await Swap.findByPk(block.swapId));
  return blockDto(block, swap!, undefined, viewer);
}

/**
 * Blocks of a swap. `maker=me` (or the caller's own id) and `recipient=me` (blocks coming to the
 * caller) are open to every member; anyone else's blocks, or all of them, only to officers.
 */
export async function listBlocks(
  swap: Swap,
  viewer: { userId: number; canManage: boolean },
  query: BlocksQuery,
): Promise<BlockDto[]> {
  const makerId = query.maker === 'me' ? viewer.userId : query.maker;
  const mine = makerId === viewer.userId || (query.recipient === 'me' && makerId === undefined);
  if (!viewer.canManage && !mine) throw new ForbiddenError('Members see their own blocks: ask for maker=me or recipient=me.');
  const blocks = await Block.findAll({
    where: {
      swapId: swap.id,
      ...(makerId ? { makerId } : {}),
      ...(query.recipient === 'me' ? { recipientId: viewer.userId, state: 'returned' } : {}),
    },
    order: [
      ['makerId', 'ASC'],
      ['sequence', 'ASC'],
    ],
  });
  return blockDtos(blocks, swap, undefined, viewer);
}
