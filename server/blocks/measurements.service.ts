/**
 * Measuring blocks. The server works out the verdict itself with the engine's checkBlock; a
 * verdict sent by a client is never read. Every measurement is kept: the latest ruler one is the
 * block's verdict, the maker's own are shown beside it.
 */
import { checkBlock } from '@shared/quilt';
import type { MeasurementBody } from '@shared/schemas/blocks';
import type { BlockDto, MeasurementDto } from '@shared/swap-types';
import { type Block, Measurement, type Swap, User } from '../db/models';
import { ConflictError } from '../http/errors';
import type { AppDeps } from '../deps';
import { blockDtosFrom, measurementDto, withMeasurement } from './block-dto';
import { idempotent } from './idempotency';
import { assertSwapIn, blockChanged, type LockedBlock } from './blocks.service';
import { insertMeasurementWithStep } from './blocks.queries';
import type { MeasuringAs } from './blocks.policy';
import type { Reply } from '../http/route';

type Deps = Pick<AppDeps, 'events' | 'sequelize'>;

export type MeasurementAnswer = MeasurementDto & { block: BlockDto };

// Stored as NUMERIC(8,4): the verdict is worked out on the stored value so it can be recomputed.
const four = (x: number) => Math.round(x * 10_000) / 10_000;

/** Verdict and deviations of a measured size against the swap's unfinished size and tolerance. */
function verdictFor(swap: Swap, m: { width: number; height: number; diagonals?: [number, number] }) {
  return checkBlock({
    target: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
    tolerance: swap.tolerance,
    squareness: swap.squareness,
    measured: m.diagonals ? { width: m.width, height: m.height, diagonals: m.diagonals } : { width: m.width, height: m.height },
  });
}

/**
 * Records a measurement as `actor.source`, which the policy settled (blocks.policy.ts measuringAs).
 * A ruler measurement needs the block received and moves it to `measured`; a maker's own measurement
 * changes no state.
 */
export function recordMeasurement(
  deps: Deps,
  locked: LockedBlock,
  actor: { userId: number; displayName: string; source: MeasuringAs },
  body: MeasurementBody,
): Promise<Reply<MeasurementAnswer>> {
  const { block, swap, transaction } = locked;
  const { source } = actor;
  const blockId = block.id;
  const claim = { clientId: body.clientId, userId: actor.userId, blockId, action: `measurement:${source}` };
  return idempotent(deps.sequelize, transaction, claim, async () => {
    if (source === 'ruler') {
      assertSwapIn(swap, ['sewing', 'collecting', 'sorting'], 'measured');
      if (swap.distributionConfirmedAt)
        throw new ConflictError('The return of blocks is already confirmed; measurements are closed.', 'distribution_confirmed');
      if (block.state !== 'received' && block.state !== 'measured') {
        throw new ConflictError('Mark the block received before measuring it.', 'not_received');
      }
    } else {
      assertSwapIn(swap, ['signup', 'sewing', 'collecting', 'sorting'], 'measured by their maker');
    }
    const measured = {
      width: four(body.width),
      height: four(body.height),
      ...(body.diagonals ? { diagonals: [four(body.diagonals[0]), four(body.diagonals[1])] as [number, number] } : {}),
    };
    const { verdict, deviations } = verdictFor(swap, measured);
    const at = new Date();
    const from = block.state;
    // A new ruler measurement replaces the verdict; an earlier trim or decision no longer applies to it.
    const changes =
      source === 'ruler'
        ? {
            state: 'measured',
            verdict,
            measuredAt: at,
            trimmed: false,
            trimmedAt: null,
            acceptedAt: null,
            acceptedById: null,
            acceptedReason: null,
          }
        : null;
    const { measurement: row, related } = await insertMeasurementWithStep(
      deps.sequelize,
      transaction,
      {
        blockId,
        measuredById: actor.userId,
        source,
        width: measured.width,
        height: measured.height,
        diagonal1: measured.diagonals?.[0] ?? null,
        diagonal2: measured.diagonals?.[1] ?? null,
        verdict,
        deviationWidth: deviations.width,
        deviationHeight: deviations.height,
        deviationDiagonal: deviations.diagonal ?? null,
        note: body.note || null,
        at,
      },
      block,
      changes ? { changes, byId: actor.userId } : undefined,
    );
    if (changes) block.set(changes as never, { raw: true });
    // The INSERT returned every column as stored, and the one who measured is the signed-in actor.
    const measuredBy = { id: actor.userId, displayName: actor.displayName };
    const stored = row.get();
    const [blockAnswer] = await blockDtosFrom(
      [block],
      swap,
      withMeasurement(related, {
        ...stored,
        measuredById: actor.userId,
        measuredByName: actor.displayName,
        createdAt: row.createdAt.toISOString(),
      }),
    );
    const answer = { ...measurementDto({ ...stored, measuredBy }), block: blockAnswer! };
    return {
      status: 201,
      body: answer,
      after: () => {
        deps.events.emit('block.measured', {
          swapId: swap.id,
          guildId: swap.guildId,
          actorId: actor.userId,
          blockId,
          makerId: block.makerId,
          measurementId: row.id,
          verdict,
          source,
        });
        if (from !== block.state) blockChanged(deps, locked, actor.userId, from)();
      },
    };
  });
}

/** Every measurement of a block, newest first. */
export async function listMeasurements(block: Block): Promise<MeasurementDto[]> {
  const rows = await Measurement.findAll({
    where: { blockId: block.id },
    include: [{ model: User, as: 'measuredBy', attributes: ['id', 'displayName'] }],
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  return rows.map(measurementDto);
}
