/**
 * Measuring blocks. The server works out the verdict itself with the engine's checkBlock; a
 * verdict sent by a client is never read. Every measurement is kept: the latest ruler one is the
 * block's verdict, the maker's own are shown beside it.
 */
import { checkBlock } from '@shared/quilt';
import type { MeasurementBody } from '@shared/schemas/blocks';
import type { BlockDto, MeasurementDto } from '@shared/swap-types';
import { Block, Measurement, type Swap } from '../db/models';
import { preparedPoolQuery } from '../db/prepared';
import { buildFromRow, modelColumns, personBeside, sqlOnce } from '../db/model-columns';
import { ConflictError, NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { blockDtosFrom, measurementDto, withMeasurement } from './block-dto';
import { priorAnswer } from './idempotency';
import { assertSwapIn, blockChanged } from './blocks.service';
import { readBlockForMeasurement, writeMeasurement, type MeasuringRow } from './blocks.queries';
import { measuringAs, readBlockAccess, type BlockAccess } from './blocks.policy';
import type { Reply } from '../http/route';

type Deps = Pick<AppDeps, 'events' | 'pool'>;

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

/** What recording a measurement reads first: the caller's access to the block, and the rest of `MeasuringRow`. */
export type MeasuringRead = Omit<MeasuringRow, 'block' | 'swap' | 'role'> & { access: BlockAccess };

/**
 * The policy's read for a measurement (canReadBlock's decision), with what the write and the answer
 * need, in one round trip (blocks.queries.ts readBlockForMeasurement).
 */
export async function readForMeasurement(deps: Pick<AppDeps, 'pool'>, userId: number, blockId: number): Promise<MeasuringRead> {
  const row = await readBlockForMeasurement(deps.pool, blockId, userId);
  if (!row) throw new NotFoundError('That block does not exist.');
  const { block, swap, role, ...rest } = row;
  return { ...rest, access: readBlockAccess(block, swap, role, userId) };
}

// A block changed by someone else between the read and the write is read again; this many times at most.
const ATTEMPTS = 5;

/**
 * Records a measurement as the policy allows (blocks.policy.ts measuringAs): a ruler measurement
 * needs the block received and moves it to `measured`; a maker's own measurement changes no state.
 * Three round trips with the session's: the read, then one statement that writes the step, the
 * measurement and a clientId's answer only if the block is still as read (else it reads again). A
 * repeat of a request with a clientId answers as the first did, whatever has happened since.
 */
export async function recordMeasurement(
  deps: Deps,
  user: { id: number; displayName: string },
  body: MeasurementBody,
  first: MeasuringRead,
): Promise<Reply<MeasurementAnswer>> {
  const blockId = first.access.block.id;
  try {
    let read = first;
    for (let attempt = 1; ; attempt++) {
      const reply = await measureOnce(deps, user, body, read);
      if (reply) return reply;
      if (attempt === ATTEMPTS)
        throw new ConflictError('This block changed while it was being measured; send the measurement again.', 'block_busy');
      read = await readForMeasurement(deps, user.id, blockId);
    }
  } catch (error) {
    if (!body.clientId) throw error;
    const source = measuringAs(first.access, body.source);
    const claim = { clientId: body.clientId, userId: user.id, blockId, action: `measurement:${source}` };
    // A clientId already taken failed the write whole: the first request's answer stands.
    return (await priorAnswer(
      claim,
      (error as { code?: string }).code === UNIQUE_VIOLATION ? undefined : error,
    )) as Reply<MeasurementAnswer>;
  }
}

const UNIQUE_VIOLATION = '23505';

/** One attempt: the answer, or null when the block is no longer as read. */
async function measureOnce(
  deps: Deps,
  user: { id: number; displayName: string },
  body: MeasurementBody,
  read: MeasuringRead,
): Promise<Reply<MeasurementAnswer> | null> {
  const { access, related } = read;
  const { block, swap } = access;
  const source = measuringAs(access, body.source);
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
  // As stored (NUMERIC(9,4)), so the answer built here is the row read back.
  const values = {
    blockId: block.id,
    measuredById: user.id,
    source,
    width: measured.width,
    height: measured.height,
    diagonal1: measured.diagonals?.[0] ?? null,
    diagonal2: measured.diagonals?.[1] ?? null,
    verdict,
    deviationWidth: four(deviations.width),
    deviationHeight: four(deviations.height),
    deviationDiagonal: deviations.diagonal == null ? null : four(deviations.diagonal),
    note: body.note || null,
    at,
  };
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
  // The row as the write stores it, under the id read.
  const { measuredById: _by, at: _at, ...stored } = values;
  const measurement = { ...stored, id: read.nextId, createdAt: at, withdrawnAt: null };
  // The step records the block as read; the answer shows it as it will be.
  const step = changes ? { changes, byId: user.id } : null;
  const stepped = Block.build({ ...block.dataValues, ...changes } as never, { isNewRecord: false, raw: true });
  const [blockAnswer] = await blockDtosFrom(
    [stepped],
    swap,
    withMeasurement(related, {
      ...measurement,
      measuredById: user.id,
      measuredByName: user.displayName,
      createdAt: at.toISOString(),
    }),
  );
  const answer = {
    ...measurementDto({ ...measurement, measuredBy: { id: user.id, displayName: user.displayName } }),
    block: blockAnswer!,
  };
  // Serialised once: stored with a clientId and sent as it is.
  const answerJson = JSON.stringify(answer);
  const request = body.clientId ? { clientId: body.clientId, action: `measurement:${source}`, responseJson: answerJson } : null;
  if (!(await writeMeasurement(deps.pool, { block, seen: read.seen, nextId: read.nextId }, values, step, request))) return null;
  return {
    status: 201,
    body: answer,
    json: answerJson,
    after: () => {
      deps.events.emit('block.measured', {
        swapId: swap.id,
        guildId: swap.guildId,
        actorId: user.id,
        blockId: block.id,
        makerId: block.makerId,
        measurementId: read.nextId,
        verdict,
        source,
      });
      if (from !== stepped.state) blockChanged(deps, { block: stepped, swap }, user.id, from)();
    },
  };
}

/** Block $blockId's measurements with who measured each, newest first. */
const BLOCK_MEASUREMENTS = sqlOnce(
  () => `SELECT ${modelColumns(Measurement, 'm')}, u.id AS "by.id", u.display_name AS "by.displayName"
           FROM measurements m LEFT JOIN users u ON u.id = m.measured_by_id
          WHERE m.block_id = $blockId ORDER BY m.created_at DESC, m.id DESC`,
);

/** Every measurement of a block, newest first, in one named statement (an officer opening a board row). */
export async function listMeasurements(deps: Pick<AppDeps, 'pool'>, block: Block): Promise<MeasurementDto[]> {
  const rows = await preparedPoolQuery<Record<string, unknown>>(deps.pool, BLOCK_MEASUREMENTS(), { blockId: block.id });
  return rows.map((row) => {
    const { person, values } = personBeside(row, 'by');
    return measurementDto(Object.assign(buildFromRow(Measurement, values), { measuredBy: person }));
  });
}
