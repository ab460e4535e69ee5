/** Turns block and measurement rows into the API's answers, loading related rows in batches. */
import { QueryTypes, type Transaction } from 'sequelize';
import type { BlockDto, MeasurementDto } from '@shared/swap-types';
import { Block, Measurement, type Swap, User } from '../db/models';
import { photosByBlock } from './photo-refs';
import { latestPhotoEstimates } from '../photo-estimates/estimate-dto';

export function isAccepted(block: Pick<Block, 'verdict' | 'trimmed' | 'state'>): boolean {
  if (block.state !== 'measured' && block.state !== 'returned') return false;
  return block.verdict === 'true' || (block.verdict === 'trim' && block.trimmed);
}

export function measurementDto(m: Measurement): MeasurementDto {
  const diagonals: [number, number] | null = m.diagonal1 != null && m.diagonal2 != null ? [m.diagonal1, m.diagonal2] : null;
  return {
    id: m.id,
    blockId: m.blockId,
    source: m.source,
    measuredBy: m.measuredBy ? { id: m.measuredBy.id, displayName: m.measuredBy.displayName } : null,
    width: m.width,
    height: m.height,
    diagonals,
    verdict: m.verdict,
    deviations: {
      width: m.deviationWidth,
      height: m.deviationHeight,
      ...(m.deviationDiagonal != null ? { diagonal: m.deviationDiagonal } : {}),
    },
    note: m.note ?? null,
    at: m.createdAt.toISOString(),
  };
}

/** The latest measurement of each source for each block, in one query. */
async function latestMeasurements(blockIds: number[], transaction?: Transaction): Promise<Map<number, Measurement[]>> {
  const byBlock = new Map<number, Measurement[]>();
  if (blockIds.length === 0) return byBlock;
  const ids = await Measurement.sequelize!.query<{ id: number }>(
    `SELECT DISTINCT ON (block_id, source) id FROM measurements
      WHERE block_id = ANY($ids::int[]) ORDER BY block_id, source, created_at DESC, id DESC`,
    { bind: { ids: blockIds }, type: QueryTypes.SELECT, transaction },
  );
  if (ids.length === 0) return byBlock;
  const rows = await Measurement.findAll({
    where: { id: ids.map((r) => r.id) },
    include: [{ model: User, as: 'measuredBy', attributes: ['id', 'displayName'] }],
    transaction,
  });
  for (const m of rows) byBlock.set(m.blockId, [...(byBlock.get(m.blockId) ?? []), m]);
  return byBlock;
}

const iso = (d: Date | null | undefined) => d?.toISOString() ?? null;

/** Full block answers for a list of blocks, with a fixed number of queries whatever the count. */
export async function blockDtos(blocks: Block[], swap: Swap, transaction?: Transaction): Promise<BlockDto[]> {
  const ids = blocks.map((b) => b.id);
  const userIds = [...new Set(blocks.flatMap((b) => [b.makerId, b.recipientId].filter((x): x is number => x != null)))];
  // One after another: queries inside a transaction share its single connection.
  const users = await User.findAll({ where: { id: userIds }, attributes: ['id', 'displayName'], transaction });
  const measurements = await latestMeasurements(ids, transaction);
  const photos = await photosByBlock(Block.sequelize!, ids, transaction);
  const estimates = await latestPhotoEstimates(Block.sequelize!, ids, transaction);
  const names = new Map(users.map((u) => [u.id, u.displayName]));
  return blocks.map((b) => {
    const latest = measurements.get(b.id) ?? [];
    const ruler = latest.find((m) => m.source === 'ruler');
    const maker = latest.find((m) => m.source === 'maker');
    let recipient: BlockDto['recipient'] = null;
    if (b.state === 'returned') {
      recipient = b.recipientId
        ? { id: b.recipientId, displayName: names.get(b.recipientId) ?? 'A former member' }
        : { id: null, displayName: swap.giftRecipientName ?? 'The gift recipient' };
    }
    return {
      id: b.id,
      swapId: b.swapId,
      maker: { id: b.makerId, displayName: names.get(b.makerId) ?? 'A former member' },
      sequence: b.sequence,
      state: b.state,
      verdict: b.verdict ?? null,
      trimmed: b.trimmed,
      accepted: isAccepted(b),
      handIn: b.handInHow ? { how: b.handInHow, note: b.handInNote ?? null } : null,
      recipient,
      times: {
        sewn: iso(b.sewnAt),
        handedIn: iso(b.handedInAt),
        received: iso(b.receivedAt),
        measured: iso(b.measuredAt),
        returned: iso(b.returnedAt),
        trimmed: iso(b.trimmedAt),
      },
      latest: { ruler: ruler ? measurementDto(ruler) : null, maker: maker ? measurementDto(maker) : null },
      photos: photos.get(b.id) ?? [],
      photoEstimate: estimates.get(b.id) ?? null,
    };
  });
}

export async function blockDto(block: Block, swap: Swap, transaction?: Transaction): Promise<BlockDto> {
  const [dto] = await blockDtos([block], swap, transaction);
  return dto!;
}
