/**
 * Planning and confirming the return of blocks. Only accepted blocks take part: true to size, or
 * trim once trimmed. In `return` mode every maker gets back as many blocks as they had accepted,
 * never their own (planned with the engine's planDistribution); in `gift` mode all go to one recipient.
 */
import { Op, type Transaction } from 'sequelize';
import { planDistribution } from '@shared/quilt';
import type { ConfirmDistributionInput, DistributionQuery } from '@shared/schemas/swaps';
import type {
  DistributionByMakerDto,
  DistributionByRecipientDto,
  DistributionPlanDto,
  DistributionResultDto,
  TransferDto,
} from '@shared/swap-types';
import { Block, Swap, User } from '../db/models';
import { ConflictError, NotFoundError } from '../http/errors';
import { isAccepted } from '../blocks/block-dto';
import type { AppDeps } from '../deps';
import type { Config } from '../config';
import { referenceKey, signBlock } from '../intake/references';

type Deps = Pick<AppDeps, 'events' | 'sequelize'>;

interface Pool {
  accepted: Map<number, Block[]>;
  names: Map<number, string>;
  leftOut: DistributionPlanDto['leftOut'];
}

async function acceptedPool(swap: Swap, transaction?: Transaction): Promise<Pool> {
  const blocks = await Block.findAll({
    where: { swapId: swap.id },
    order: [
      ['makerId', 'ASC'],
      ['sequence', 'ASC'],
    ],
    transaction,
    ...(transaction ? { lock: transaction.LOCK.UPDATE } : {}),
  });
  const accepted = new Map<number, Block[]>();
  const leftOut = { pending: 0, rejected: 0, untrimmed: 0 };
  for (const b of blocks) {
    if (isAccepted(b)) accepted.set(b.makerId, [...(accepted.get(b.makerId) ?? []), b]);
    else if (b.state !== 'measured') leftOut.pending += 1;
    else if (b.verdict === 'trim') leftOut.untrimmed += 1;
    else leftOut.rejected += 1;
  }
  const ids = [...new Set([...accepted.keys(), ...(swap.giftRecipientId ? [swap.giftRecipientId] : [])])];
  const users = await User.findAll({ where: { id: ids }, attributes: ['id', 'displayName'], transaction });
  return { accepted, leftOut, names: new Map(users.map((u) => [u.id, u.displayName])) };
}

function giftName(swap: Swap, names: Map<number, string>) {
  return swap.giftRecipientId
    ? (names.get(swap.giftRecipientId) ?? 'A former member')
    : (swap.giftRecipientName ?? 'The gift recipient');
}

function named(swap: Swap, names: Map<number, string>, t: { from: number; to: number | null; count: number }): TransferDto {
  return {
    ...t,
    fromName: names.get(t.from) ?? 'A former member',
    toName:
      t.to === null || (swap.mode === 'gift' && t.to === swap.giftRecipientId)
        ? giftName(swap, names)
        : (names.get(t.to) ?? 'A former member'),
  };
}

function assertPlannable(swap: Swap) {
  if (swap.state !== 'collecting' && swap.state !== 'sorting') {
    throw new ConflictError(
      `The return can be planned while the swap is collecting or sorting; it is ${swap.state} now.`,
      'swap_state',
    );
  }
  if (swap.distributionConfirmedAt)
    throw new ConflictError('The return of blocks is already confirmed.', 'distribution_confirmed');
}

/** Proposes who sends how many accepted blocks to whom. Changes nothing. */
export async function planReturn(swap: Swap): Promise<DistributionPlanDto> {
  assertPlannable(swap);
  const pool = await acceptedPool(swap);
  const makers = [...pool.accepted].map(([id, blocks]) => ({
    id,
    displayName: pool.names.get(id) ?? 'A former member',
    accepted: blocks.length,
  }));
  const acceptedTotal = makers.reduce((s, m) => s + m.accepted, 0);
  let transfers: TransferDto[];
  let shortfall: DistributionPlanDto['shortfall'] = [];
  if (swap.mode === 'gift') {
    transfers = makers.map((m) => named(swap, pool.names, { from: m.id, to: swap.giftRecipientId ?? null, count: m.accepted }));
  } else {
    const plan = planDistribution(makers.map((m) => ({ id: String(m.id), accepted: m.accepted })));
    transfers = plan.transfers.map((t) => named(swap, pool.names, { from: Number(t.from), to: Number(t.to), count: t.count }));
    shortfall = plan.shortfall.map((s) => ({
      id: Number(s.id),
      displayName: pool.names.get(Number(s.id)) ?? 'A former member',
      missing: s.missing,
    }));
  }
  return { mode: swap.mode, transfers, shortfall, makers, acceptedTotal, leftOut: pool.leftOut };
}

/** Why hand-edited transfers do not add up, or null when they do. */
function conservationProblem(swap: Swap, pool: Pool, transfers: ConfirmDistributionInput['transfers']): string | null {
  const name = (id: number) => pool.names.get(id) ?? `member ${id}`;
  const sent = new Map<number, number>();
  const received = new Map<number | null, number>();
  const pairs = new Set<string>();
  for (const t of transfers) {
    if (!pool.accepted.has(t.from)) return `${name(t.from)} has no accepted blocks to send.`;
    const key = `${t.from}>${t.to}`;
    if (pairs.has(key))
      return `The transfer from ${name(t.from)} to ${t.to === null ? giftName(swap, pool.names) : name(t.to)} is listed twice; combine the lines.`;
    pairs.add(key);
    sent.set(t.from, (sent.get(t.from) ?? 0) + t.count);
    received.set(t.to, (received.get(t.to) ?? 0) + t.count);
  }
  for (const [maker, blocks] of pool.accepted) {
    const s = sent.get(maker) ?? 0;
    if (s !== blocks.length)
      return `${name(maker)} has ${blocks.length} accepted block${blocks.length === 1 ? '' : 's'} but the transfers send ${s}.`;
  }
  if (swap.mode === 'gift') {
    const target = swap.giftRecipientId ?? null;
    const stray = transfers.find((t) => t.to !== target);
    return stray ? `This is a gift swap: every block goes to ${giftName(swap, pool.names)}.` : null;
  }
  for (const t of transfers) {
    if (t.to === null) return 'Every transfer needs a member who receives it.';
    if (t.to === t.from) return `${name(t.from)} cannot receive their own blocks.`;
    if (!pool.accepted.has(t.to)) return `${name(t.to)} had no accepted blocks, so receives none back.`;
  }
  for (const [maker, blocks] of pool.accepted) {
    const r = received.get(maker) ?? 0;
    if (r !== blocks.length)
      return `${name(maker)} should receive ${blocks.length} block${blocks.length === 1 ? '' : 's'} but the transfers give ${r}.`;
  }
  return null;
}

/**
 * Checks the (possibly hand-edited) transfers and assigns concrete blocks: each becomes `returned`
 * with its recipient. All or nothing, in one transaction.
 */
export async function confirmReturn(
  deps: Deps,
  swapId: number,
  actorId: number,
  input: ConfirmDistributionInput,
): Promise<DistributionResultDto> {
  const result = await deps.sequelize.transaction(async (transaction) => {
    const swap = await Swap.findByPk(swapId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!swap) throw new NotFoundError('That swap does not exist.');
    if (swap.state !== 'sorting') {
      throw new ConflictError(`Confirm the return while the swap is sorting; it is ${swap.state} now.`, 'swap_state');
    }
    if (swap.distributionConfirmedAt)
      throw new ConflictError('The return of blocks is already confirmed.', 'distribution_confirmed');
    const pool = await acceptedPool(swap, transaction);
    if (pool.accepted.size === 0)
      throw new ConflictError('No block is accepted yet, so there is nothing to return.', 'nothing_accepted');
    const problem = conservationProblem(swap, pool, input.transfers);
    if (problem) throw new ConflictError(problem, 'distribution_invalid');

    const now = new Date();
    const queue = new Map([...pool.accepted].map(([maker, blocks]) => [maker, [...blocks]]));
    let returned = 0;
    for (const t of input.transfers) {
      const blocks = queue.get(t.from)!.splice(0, t.count);
      const recipientId = swap.mode === 'gift' ? (swap.giftRecipientId ?? null) : t.to;
      await Block.update(
        { state: 'returned', recipientId, returnedAt: now },
        { where: { id: { [Op.in]: blocks.map((b) => b.id) } }, transaction },
      );
      returned += blocks.length;
    }
    await swap.update({ distributionConfirmedAt: now, distributionConfirmedById: actorId }, { transaction });
    return { swap, pool, returned, now };
  });
  const { swap, pool } = result;
  deps.events.emit('distribution.confirmed', { swapId, guildId: swap.guildId, actorId, transfers: input.transfers.length });
  for (const blocks of pool.accepted.values()) {
    for (const b of blocks) {
      deps.events.emit('block.changed', {
        swapId,
        guildId: swap.guildId,
        actorId,
        blockId: b.id,
        makerId: b.makerId,
        from: 'measured',
        to: 'returned',
      });
    }
  }
  return {
    swapId,
    confirmedAt: result.now.toISOString(),
    transfers: input.transfers.map((t) => named(swap, pool.names, t)),
    blocksReturned: result.returned,
  };
}

/** The confirmed return, block by block, for the export. */
export async function confirmedTransfers(swap: Swap): Promise<{ from: string; to: string; count: number; blocks: string }[]> {
  const blocks = await Block.findAll({
    where: { swapId: swap.id, state: 'returned' },
    include: [
      { model: User, as: 'maker', attributes: ['id', 'displayName'] },
      { model: User, as: 'recipient', attributes: ['id', 'displayName'] },
    ],
    order: [
      ['makerId', 'ASC'],
      ['recipientId', 'ASC'],
      ['sequence', 'ASC'],
    ],
  });
  const rows = new Map<string, { from: string; to: string; count: number; blocks: string[] }>();
  for (const b of blocks) {
    const to = b.recipient?.displayName ?? (swap.giftRecipientName || 'The gift recipient');
    const key = `${b.makerId}>${b.recipientId}`;
    const row = rows.get(key) ?? { from: b.maker?.displayName ?? 'A former member', to, count: 0, blocks: [] };
    row.count += 1;
    row.blocks.push(`#${b.sequence}`);
    rows.set(key, row);
  }
  return [...rows.values()].map((r) => ({ ...r, blocks: r.blocks.join(' ') }));
}

/**
 * The confirmed return for hand-out night: each recipient's bundle (or each maker's blocks), every
 * block with its maker and the short code printed on its label. Empty until the return is confirmed.
 */
export async function distributionListing(
  config: Pick<Config, 'SESSION_SECRET'>,
  swap: Swap,
  by: DistributionQuery['by'],
): Promise<DistributionByRecipientDto[] | DistributionByMakerDto[]> {
  const blocks = await Block.findAll({
    where: { swapId: swap.id, state: 'returned' },
    include: [
      { model: User, as: 'maker', attributes: ['id', 'displayName'] },
      { model: User, as: 'recipient', attributes: ['id', 'displayName'] },
    ],
    order: [['id', 'ASC']],
  });
  const key = referenceKey(config.SESSION_SECRET);
  const person = (id: number | null, user: User | null | undefined, fallback: string) => ({
    id,
    displayName: user?.displayName ?? fallback,
  });
  const gift = swap.giftRecipientName || 'The gift recipient';
  const rows = blocks.map((b) => ({
    id: b.id,
    sequence: b.sequence,
    code: signBlock(key, swap.id, b.id).shortCode,
    maker: { id: b.makerId as number, displayName: b.maker?.displayName ?? 'A former member' },
    recipient: b.recipientId === null ? { id: null, displayName: gift } : person(b.recipientId, b.recipient, 'A former member'),
  }));
  const byName = (a: { displayName: string }, b: { displayName: string }) => a.displayName.localeCompare(b.displayName, 'en');
  const bySequence = (
    a: { maker: { displayName: string }; sequence: number },
    b: { maker: { displayName: string }; sequence: number },
  ) => byName(a.maker, b.maker) || a.sequence - b.sequence;
  if (by === 'maker') {
    const groups = new Map<number, DistributionByMakerDto>();
    for (const r of rows.sort(bySequence)) {
      const g = groups.get(r.maker.id) ?? { maker: r.maker, blocks: [] };
      g.blocks.push({ id: r.id, recipient: r.recipient, code: r.code });
      groups.set(r.maker.id, g);
    }
    return [...groups.values()].sort((a, b) => byName(a.maker, b.maker));
  }
  const groups = new Map<number | null, DistributionByRecipientDto>();
  for (const r of rows.sort(bySequence)) {
    const g = groups.get(r.recipient.id) ?? { recipient: r.recipient, blocks: [] };
    g.blocks.push({ id: r.id, maker: r.maker, code: r.code });
    groups.set(r.recipient.id, g);
  }
  return [...groups.values()].sort((a, b) => byName(a.recipient, b.recipient));
}
