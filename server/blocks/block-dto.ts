/** Turns block and measurement rows into the API's answers, loading related rows in batches. */
import type { Transaction } from 'sequelize';
import type { BlockDto, MeasurementDto, PhotoRefDto } from '@shared/swap-types';
import type { VerdictsVisibleTo } from '@shared/schemas/guilds';
import type { Block, Measurement, Swap } from '../db/models';
import { preparedQuery } from '../db/prepared';
import type { AppDeps } from '../deps';
import { photoRef } from './photo-refs';
import { LATEST_ESTIMATES, NEWEST_ESTIMATE_FIRST, latestEstimateDtos, type LatestEstimateRow } from './latest-estimate';
import { blockWithoutVerdict, viewerSeesAllVerdicts } from './verdict-visibility';

/** True to size, trimmed to size, or accepted by an officer's decision. */
export function isAccepted(block: Pick<Block, 'verdict' | 'trimmed' | 'state' | 'acceptedAt'>): boolean {
  if (block.state !== 'measured' && block.state !== 'returned') return false;
  return block.verdict === 'true' || (block.verdict === 'trim' && block.trimmed) || block.acceptedAt != null;
}

/** What a measurement answer is made of: a Measurement row, or the same fields read as JSON. */
export type MeasurementFields = Pick<
  Measurement,
  | 'id'
  | 'blockId'
  | 'source'
  | 'width'
  | 'height'
  | 'diagonal1'
  | 'diagonal2'
  | 'verdict'
  | 'deviationWidth'
  | 'deviationHeight'
  | 'deviationDiagonal'
  | 'note'
  | 'createdAt'
> & { measuredBy?: { id: number; displayName: string } | null; withdrawnAt?: Date | null };

export function measurementDto(m: MeasurementFields): MeasurementDto {
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
    withdrawnAt: m.withdrawnAt ? m.withdrawnAt.toISOString() : null,
  };
}

/** A latest measurement as json_build_object writes it: NUMERIC as JSON numbers, times as ISO strings. */
export type MeasurementJson = Omit<MeasurementFields, 'createdAt' | 'measuredBy'> & {
  measuredById: number | null;
  measuredByName: string | null;
  createdAt: string;
};

export interface RelatedJson {
  users: { id: number; displayName: string }[];
  measurements: MeasurementJson[];
  photos: { id: number; blockId: number }[];
  estimates: LatestEstimateRow[];
}

/**
 * Everything a block answer shows besides the block row, for many blocks, in one round trip: the
 * makers' and recipients' names, the latest ruler and maker measurement (with who took it), the
 * photos and the latest photo estimate. Each part is one aggregate, so the count of rows read does
 * not grow with the number of blocks asked for; each latest measurement is the first entry of the
 * (block, source, time, id) index, so neither does it grow with a block's history of measurements.
 * `ids` and `userIds` are SQL int arrays: the binds by default, or columns of a row read beside.
 */
export function relatedSql(ids = '$ids::int[]', userIds = '$userIds::int[]') {
  return `SELECT
    (SELECT coalesce(json_agg(json_build_object('id', u.id, 'displayName', u.display_name)), '[]')
       FROM users u WHERE u.id = ANY(${userIds})) AS users,
    (SELECT coalesce(json_agg(latest), '[]') FROM (
       SELECT m.id, m.block_id AS "blockId", m.source, mu.id AS "measuredById", mu.display_name AS "measuredByName",
              m.width, m.height, m.diagonal1, m.diagonal2, m.verdict, m.deviation_width AS "deviationWidth",
              m.deviation_height AS "deviationHeight", m.deviation_diagonal AS "deviationDiagonal", m.note, m.created_at AS "createdAt"
         FROM unnest(${ids}) AS asked(block_id)
        CROSS JOIN (VALUES ('ruler'), ('maker')) AS kind(source)
        CROSS JOIN LATERAL (
              SELECT * FROM measurements m
               WHERE m.block_id = asked.block_id AND m.source = kind.source AND m.withdrawn_at IS NULL
               ORDER BY m.created_at DESC, m.id DESC LIMIT 1) m
         LEFT JOIN users mu ON mu.id = m.measured_by_id) latest) AS measurements,
    (SELECT coalesce(json_agg(json_build_object('id', p.id, 'blockId', p.block_id) ORDER BY p.created_at, p.id), '[]')
       FROM photos p WHERE p.block_id = ANY(${ids})) AS photos,
    (SELECT coalesce(json_agg(estimate), '[]') FROM (${LATEST_ESTIMATES} WHERE e.block_id = ANY(${ids}) ${NEWEST_ESTIMATE_FIRST}) estimate) AS estimates`;
}

/**
 * The related rows with `added` among the latest measurements, where `relatedSql` would have put it
 * had it been read after `added` was written: the latest of its block and source by time, then id.
 */
export function withMeasurement(related: RelatedJson, added: MeasurementJson): RelatedJson {
  const addedAt = Date.parse(added.createdAt);
  const same = related.measurements.find((m) => m.blockId === added.blockId && m.source === added.source);
  if (same) {
    const sameAt = Date.parse(same.createdAt);
    if (sameAt > addedAt || (sameAt === addedAt && same.id > added.id)) return related;
  }
  return { ...related, measurements: [...related.measurements.filter((m) => m !== same), added] };
}

/** The binds of `relatedSql` for these blocks: their ids, and the people their answers name. */
export function relatedBind(blocks: Pick<Block, 'id' | 'makerId' | 'recipientId' | 'acceptedById'>[]): {
  ids: number[];
  userIds: number[];
} {
  return {
    ids: blocks.map((b) => b.id),
    userIds: [
      ...new Set(blocks.flatMap((b) => [b.makerId, b.recipientId, b.acceptedById].filter((x): x is number => x != null))),
    ],
  };
}

/** Reads the blocks' related rows: inside a transaction on its connection, outside one on the plain pool; named either way. */
async function relatedRows(deps: BlockReadDeps, blocks: Block[], transaction?: Transaction): Promise<RelatedJson> {
  const bind = relatedBind(blocks);
  const [row] = await preparedQuery<RelatedJson>(deps.pool, relatedSql(), bind, transaction);
  return row!;
}

/** What reading block answers needs: the transaction's connection, or the plain pool outside one. */
export type BlockReadDeps = Pick<AppDeps, 'sequelize' | 'pool'>;

const iso = (d: Date | null | undefined) => d?.toISOString() ?? null;

/**
 * Who reads a block answer: the hand-in note is for the block's maker and the guild's officers only;
 * so is the verdict, unless the guild shows verdicts to every member.
 */
export interface BlockViewer {
  userId: number;
  canManage: boolean;
  /** the guild's verdict setting where the policy's read gave it; read here when it did not */
  verdictsVisibleTo?: VerdictsVisibleTo;
}

/**
 * Full block answers for a list of blocks, with a fixed number of queries whatever the count. With a
 * `viewer`, another maker's hand-in note (tracking numbers, addresses) is left out unless they manage the swap.
 */
export async function blockDtos(
  deps: BlockReadDeps,
  blocks: Block[],
  swap: Swap,
  { transaction, viewer }: { transaction?: Transaction; viewer?: BlockViewer } = {},
): Promise<BlockDto[]> {
  if (blocks.length === 0) return [];
  return blockDtosFrom(blocks, swap, await relatedRows(deps, blocks, transaction), viewer);
}

/** Block answers from their related rows, read already (`relatedSql`); see `blockDtos`. */
export async function blockDtosFrom(
  blocks: Block[],
  swap: Swap,
  related: RelatedJson,
  viewer?: BlockViewer,
): Promise<BlockDto[]> {
  const names = new Map(related.users.map((u) => [u.id, u.displayName]));
  const measurements = new Map<number, MeasurementDto[]>();
  for (const { measuredById, measuredByName, createdAt, ...m } of related.measurements) {
    const measuredBy = measuredById != null && measuredByName != null ? { id: measuredById, displayName: measuredByName } : null;
    const dto = measurementDto({ ...m, measuredBy, createdAt: new Date(createdAt) });
    measurements.set(m.blockId, [...(measurements.get(m.blockId) ?? []), dto]);
  }
  const photos = new Map<number, PhotoRefDto[]>();
  for (const p of related.photos) photos.set(p.blockId, [...(photos.get(p.blockId) ?? []), photoRef(p.id)]);
  const estimates = latestEstimateDtos(related.estimates);
  // Another maker's verdict only for officers, or for everyone when the guild shows verdicts to all.
  const othersHidden =
    !!viewer &&
    blocks.some((b) => b.makerId !== viewer.userId) &&
    !(await viewerSeesAllVerdicts(viewer, swap.guildId, viewer.verdictsVisibleTo));
  const dtos = blocks.map((b): BlockDto => {
    const latest = measurements.get(b.id) ?? [];
    const ruler = latest.find((m) => m.source === 'ruler') ?? null;
    const maker = latest.find((m) => m.source === 'maker') ?? null;
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
      decision:
        b.acceptedAt && b.acceptedReason
          ? {
              reason: b.acceptedReason,
              by: b.acceptedById ? { id: b.acceptedById, displayName: names.get(b.acceptedById) ?? 'A former member' } : null,
              at: b.acceptedAt.toISOString(),
            }
          : null,
      handIn: b.handInHow
        ? { how: b.handInHow, note: !viewer || viewer.canManage || viewer.userId === b.makerId ? (b.handInNote ?? null) : null }
        : null,
      recipient,
      times: {
        sewn: iso(b.sewnAt),
        handedIn: iso(b.handedInAt),
        received: iso(b.receivedAt),
        measured: iso(b.measuredAt),
        returned: iso(b.returnedAt),
        trimmed: iso(b.trimmedAt),
      },
      latest: { ruler, maker },
      photos: photos.get(b.id) ?? [],
      photoEstimate: estimates.get(b.id) ?? null,
    };
  });
  return othersHidden ? dtos.map((d, i) => (blocks[i]!.makerId === viewer!.userId ? d : blockWithoutVerdict(d))) : dtos;
}

export async function blockDto(
  deps: BlockReadDeps,
  block: Block,
  swap: Swap,
  options: { transaction?: Transaction; viewer?: BlockViewer } = {},
): Promise<BlockDto> {
  const [dto] = await blockDtos(deps, [block], swap, options);
  return dto!;
}
