/** Members' pledges: signing up creates their pledged blocks, changing or withdrawing adjusts them. */
import { Op, type Transaction } from 'sequelize';
import type { SignupDto } from '@shared/swap-types';
import { Block, Signup, Swap } from '../db/models';
import { ConflictError, NotFoundError, ValidationError } from '../http/errors';
import type { AppDeps } from '../deps';
import { signupIsOpen } from './swap-dto';

type Deps = Pick<AppDeps, 'events' | 'sequelize'>;

// Blocks not handed in yet may be dropped when a pledge shrinks: plain pledges first, then sewn ones.
const DROPPABLE = ['pledged', 'sewn'];

function assertOpen(swap: Swap) {
  if (signupIsOpen(swap)) return;
  if (swap.state === 'signup')
    throw new ConflictError('Sign-up for this swap closed on its close date; ask the coordinator to extend it.', 'signup_closed');
  throw new ConflictError(
    `Sign-up for this swap is closed (it is ${swap.state}). A coordinator can reopen sign-up while the swap is sewing.`,
    'signup_closed',
  );
}

/** Makes the member's blocks match `count`: new ones numbered after the highest, extra ones dropped. */
async function matchBlocks(swapId: number, makerId: number, count: number, transaction: Transaction) {
  const blocks = await Block.findAll({
    where: { swapId, makerId },
    order: [['sequence', 'ASC']],
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (blocks.length < count) {
    const next = (blocks.at(-1)?.sequence ?? 0) + 1;
    const fresh = Array.from({ length: count - blocks.length }, (_, i) => ({ swapId, makerId, sequence: next + i }));
    await Block.bulkCreate(fresh, { transaction });
    return;
  }
  const extra = blocks.length - count;
  if (extra === 0) return;
  const droppable = [...blocks.filter((b) => b.state === 'pledged'), ...blocks.filter((b) => b.state === 'sewn')]
    .sort((a, b) => DROPPABLE.indexOf(a.state) - DROPPABLE.indexOf(b.state) || b.sequence - a.sequence)
    .slice(0, extra);
  if (droppable.length < extra) {
    const kept = blocks.length - droppable.length;
    throw new ConflictError(
      `${kept} of your blocks are already handed in, so your pledge cannot go below ${kept}.`,
      'blocks_handed_in',
    );
  }
  await Block.destroy({ where: { id: { [Op.in]: droppable.map((b) => b.id) } }, transaction });
}

function signupDto(s: Signup): SignupDto {
  return { swapId: s.swapId, userId: s.userId, blocks: s.blocks, status: s.status };
}

/** Signs the member up, or changes their pledge, within the swap's quota. */
export async function pledge(deps: Deps, swapId: number, userId: number, blocks: number): Promise<SignupDto> {
  const { signup, guildId } = await deps.sequelize.transaction(async (transaction) => {
    // Locking the swap keeps it in sign-up while the pledge is written and serialises pledges.
    const swap = await Swap.findByPk(swapId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!swap) throw new NotFoundError('That swap does not exist.');
    assertOpen(swap);
    if (blocks < swap.quotaMin || blocks > swap.quotaMax) {
      const range =
        swap.quotaMin === swap.quotaMax ? `exactly ${swap.quotaMin}` : `between ${swap.quotaMin} and ${swap.quotaMax}`;
      throw new ValidationError(`Pledge ${range} blocks for this swap.`, { blocks: `Pledge ${range} blocks.` });
    }
    const [row] = await Signup.findOrBuild({
      where: { swapId, userId },
      defaults: { swapId, userId, blocks },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    row.set({ blocks, status: 'active' });
    await row.save({ transaction });
    await matchBlocks(swapId, userId, blocks, transaction);
    return { signup: row, guildId: swap.guildId };
  });
  deps.events.emit('signup.changed', { swapId, guildId, actorId: userId, userId, blocks });
  return signupDto(signup);
}

/** Withdraws the member before sign-up closes; their blocks not yet handed in are removed. */
export async function withdraw(deps: Deps, swapId: number, userId: number): Promise<void> {
  const guildId = await deps.sequelize.transaction(async (transaction) => {
    const swap = await Swap.findByPk(swapId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!swap) throw new NotFoundError('That swap does not exist.');
    const signup = await Signup.findOne({
      where: { swapId, userId, status: 'active' },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!signup) throw new NotFoundError('You are not signed up for this swap.');
    assertOpen(swap);
    await matchBlocks(swapId, userId, 0, transaction);
    await signup.update({ status: 'withdrawn', blocks: 0 }, { transaction });
    return swap.guildId;
  });
  deps.events.emit('signup.withdrawn', { swapId, guildId, actorId: userId, userId });
}

export async function mySignup(swapId: number, userId: number): Promise<SignupDto | null> {
  const row = await Signup.findOne({ where: { swapId, userId } });
  return row ? signupDto(row) : null;
}
