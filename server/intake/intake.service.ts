/**
 * Intake: label data for printing, the swap pack the intake view keeps offline, and resolving a
 * scanned reference or a typed short code to a block of the swap. Receiving and measuring go
 * through the blocks service (its routes), so events, idempotency and the live board stay in one place.
 */
import { Op } from 'sequelize';
import { formatShortCode } from '@shared/block-reference';
import type { IntakeBlockDto, IntakePackDto, LabelSheetDataDto, ResolveAnswerDto, ResolveBody } from '@shared/schemas/intake';
import { Block, Guild, Swap, User } from '../db/models';
import { AppError, ConflictError, NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { referenceKey, signBlock, verifyReference } from './references';
import { qrDataUrl } from './qr';

type Deps = Pick<AppDeps, 'config'>;

type SignedIntakeBlock = IntakeBlockDto & { reference: string };

/** The swap's blocks (or one maker's), numbered per maker, each with its reference and short code. */
async function signedBlocks(deps: Deps, swap: Swap, makerId: number | null): Promise<SignedIntakeBlock[]> {
  const blocks = await Block.findAll({
    where: { swapId: swap.id, ...(makerId !== null ? { makerId } : {}) },
    order: [
      ['makerId', 'ASC'],
      ['sequence', 'ASC'],
    ],
  });
  const makers = await User.findAll({
    where: { id: { [Op.in]: [...new Set(blocks.map((b) => b.makerId))] } },
    attributes: ['id', 'displayName'],
  });
  const names = new Map(makers.map((u) => [u.id, u.displayName]));
  const counts = new Map<number, number>();
  for (const b of blocks) counts.set(b.makerId, (counts.get(b.makerId) ?? 0) + 1);
  const seen = new Map<number, number>();
  const key = referenceKey(deps.config.SESSION_SECRET);
  return blocks.map((b) => {
    const ordinal = (seen.get(b.makerId) ?? 0) + 1;
    seen.set(b.makerId, ordinal);
    const signed = signBlock(key, swap.id, b.id);
    return {
      id: b.id,
      swapId: swap.id,
      maker: { id: b.makerId, displayName: names.get(b.makerId) ?? 'A former member' },
      ordinal,
      of: counts.get(b.makerId)!,
      state: b.state,
      verdict: b.verdict ?? null,
      shortCode: signed.shortCode,
      reference: signed.reference,
    };
  });
}

/** What the intake view caches for offline use: the swap's target and every block's codes. */
export async function intakePack(deps: Deps, swap: Swap): Promise<IntakePackDto> {
  return {
    swap: {
      id: swap.id,
      guildId: swap.guildId,
      title: swap.title,
      state: swap.state,
      unfinished: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
      tolerance: swap.tolerance,
      squareness: swap.squareness,
    },
    blocks: await signedBlocks(deps, swap, null),
    generatedAt: new Date().toISOString(),
  };
}

const withoutReference = ({ reference: _reference, ...block }: SignedIntakeBlock): IntakeBlockDto => block;

/**
 * Finds the block a label names. A reference must carry a valid tag and name this swap; a short
 * code must match exactly one block of this swap.
 */
export async function resolveBlock(deps: Deps, swap: Swap, body: ResolveBody): Promise<ResolveAnswerDto> {
  if (body.reference !== undefined) {
    const check = verifyReference(referenceKey(deps.config.SESSION_SECRET), body.reference);
    if (!check.ok) {
      throw check.reason === 'unreadable'
        ? new AppError(
            400,
            'not_a_label',
            'That is not a Blockpost label: the code could not be read. Type the short code under the QR code instead.',
          )
        : new AppError(
            400,
            'label_not_valid',
            'This label does not check out: it was not printed by Blockpost, or its code was changed. Type the short code instead, or ask the maker.',
          );
    }
    if (check.swapId !== swap.id) throw await otherSwapError(swap, check.swapId);
    const blocks = await signedBlocks(deps, swap, null);
    const block = blocks.find((b) => b.id === check.blockId);
    if (!block)
      throw new NotFoundError('This label’s block is no longer part of the swap: the maker may have lowered their pledge.');
    return { block: withoutReference(block), via: 'reference' };
  }
  const code = body.shortCode!.toUpperCase().replace(/[\s-]/g, '');
  const matches = (await signedBlocks(deps, swap, null)).filter((b) => b.shortCode === code);
  if (matches.length === 0) {
    throw new AppError(
      404,
      'unknown_code',
      `No block in this swap has the code ${formatShortCode(code)}. Check the letters (there is no 0, O, 1 or I), or scan the QR code.`,
    );
  }
  if (matches.length > 1)
    throw new ConflictError('Two blocks of this swap share that short code; scan the QR code instead.', 'ambiguous_code');
  return { block: withoutReference(matches[0]!), via: 'shortCode' };
}

async function otherSwapError(swap: Swap, otherId: number): Promise<AppError> {
  const other = await Swap.findByPk(otherId, { attributes: ['id', 'guildId', 'title'] });
  if (other && other.guildId === swap.guildId) {
    return new ConflictError(
      `This label is for “${other.title}”, not for this swap. Open that swap’s intake to take it in.`,
      'other_swap',
    );
  }
  return new ConflictError('This label is for a swap of another guild; it cannot be taken in here.', 'other_swap');
}

/** Label data for printing: one label per block with its QR code. */
export async function labelSheet(deps: Deps, swap: Swap, makerId: number | null): Promise<LabelSheetDataDto> {
  const guild = await Guild.findByPk(swap.guildId, { attributes: ['id', 'name'] });
  const blocks = await signedBlocks(deps, swap, makerId);
  const labels = await Promise.all(
    blocks.map(async (b) => ({
      blockId: b.id,
      ordinal: b.ordinal,
      of: b.of,
      makerName: b.maker.displayName,
      reference: b.reference,
      shortCode: b.shortCode,
      qr: await qrDataUrl(b.reference),
    })),
  );
  return {
    swap: { id: swap.id, guildId: swap.guildId, title: swap.title, guildName: guild?.name ?? '', state: swap.state },
    labels,
  };
}
