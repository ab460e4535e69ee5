/**
 * Photo estimates of blocks. The server works everything out again from the marked corners with
 * the engine (a size or verdict sent by a client is never read), stores the corners beside the
 * results, and tells the live board after the row is saved. An estimate never touches the block's
 * state or its ruler verdict.
 */
import { QuiltInputError } from '@shared/quilt';
import {
  estimateFromCorners,
  outsidePhoto,
  type PhotoEstimateBody,
  type PhotoEstimateDto,
  type PhotoEstimatesDto,
} from '@shared/schemas/photo-estimates';
import { Photo, PhotoEstimate, User } from '../db/models';
import { ConflictError, ValidationError } from '../http/errors';
import type { AppDeps } from '../deps';
import type { BlockAccess } from '../blocks/blocks.policy';
import { estimateDto } from './estimate-dto';

type Deps = Pick<AppDeps, 'events'>;

// From sign-up (blocks exist) until the return is confirmed.
const OPEN_STATES = new Set(['signup', 'sewing', 'collecting', 'sorting']);
const measuredBy = { model: User, as: 'measuredBy', attributes: ['id', 'displayName'] };
// NUMERIC(10,4) holds it; a view that steep is refused by its warnings long before.
const MAX_OBLIQUENESS = 999_999;

function isOpen(access: BlockAccess): boolean {
  return OPEN_STATES.has(access.swap.state) && !access.swap.distributionConfirmedAt;
}

/** The block, its swap's target, its photos and every estimate, newest first. */
export async function listEstimates(access: BlockAccess): Promise<PhotoEstimatesDto> {
  const { block, swap } = access;
  const [maker, photos, rows] = await Promise.all([
    User.findByPk(block.makerId, { attributes: ['id', 'displayName'] }),
    Photo.findAll({
      where: { blockId: block.id },
      order: [
        ['createdAt', 'ASC'],
        ['id', 'ASC'],
      ],
    }),
    PhotoEstimate.findAll({
      where: { blockId: block.id },
      include: [measuredBy],
      order: [
        ['createdAt', 'DESC'],
        ['id', 'DESC'],
      ],
    }),
  ]);
  return {
    block: {
      id: block.id,
      swapId: swap.id,
      guildId: swap.guildId,
      sequence: block.sequence,
      state: block.state,
      maker: { id: block.makerId, displayName: maker?.displayName ?? 'A former member' },
    },
    swap: {
      id: swap.id,
      title: swap.title,
      state: swap.state,
      unfinished: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
      tolerance: swap.tolerance,
      squareness: swap.squareness,
    },
    photos: photos.map((p) => ({
      id: p.id,
      url: `/api/photos/${p.id}`,
      thumbUrl: `/api/photos/${p.id}?size=thumb`,
      width: p.width,
      height: p.height,
    })),
    canEstimate: isOpen(access),
    estimates: rows.map(estimateDto),
  };
}

/**
 * Saves a photo estimate worked out from the marked corners. 400 for a photo of another block,
 * corners off the photo, or corners that cannot be measured (on one spot, on a line, crossing);
 * 409 once the swap no longer takes estimates. Emits `block.estimated` once the row is saved.
 */
export async function recordEstimate(
  deps: Deps,
  access: BlockAccess,
  actorId: number,
  body: PhotoEstimateBody,
): Promise<PhotoEstimateDto> {
  const { block, swap } = access;
  if (!isOpen(access)) {
    throw new ConflictError(
      `This swap is ${swap.distributionConfirmedAt ? 'past its return of blocks' : swap.state}; photo estimates are closed.`,
      'estimates_closed',
    );
  }
  const photo = await Photo.findByPk(body.photoId);
  if (!photo || photo.blockId !== block.id) {
    throw new ValidationError('That photo is not one of this block’s photos.', { photoId: 'Choose one of this block’s photos.' });
  }
  for (const [field, what, quad] of [
    ['reference.corners', 'reference square', body.reference.corners],
    ['block.corners', 'block', body.block.corners],
  ] as const) {
    if (outsidePhoto(quad, photo.width, photo.height)) {
      const message = `A corner of the ${what} lies outside the photo (${photo.width} × ${photo.height} pixels).`;
      throw new ValidationError(message, { [field]: message });
    }
  }
  let result;
  try {
    result = estimateFromCorners(body.reference, body.block, {
      width: swap.unfinishedWidth,
      height: swap.unfinishedHeight,
      tolerance: swap.tolerance,
      squareness: swap.squareness,
    });
  } catch (error) {
    if (error instanceof QuiltInputError) throw new ValidationError(error.message, { [error.field]: error.message });
    throw error;
  }
  const row = await PhotoEstimate.create({
    blockId: block.id,
    photoId: photo.id,
    measuredById: actorId,
    referenceSize: body.reference.size,
    referenceCorners: body.reference.corners,
    blockCorners: body.block.corners,
    width: result.width,
    height: result.height,
    sideTop: result.sides[0],
    sideRight: result.sides[1],
    sideBottom: result.sides[2],
    sideLeft: result.sides[3],
    diagonal1: result.diagonals[0],
    diagonal2: result.diagonals[1],
    turned: result.turned,
    verdict: result.verdict,
    deviationWidth: result.deviations.width,
    deviationHeight: result.deviations.height,
    deviationDiagonal: result.deviations.diagonal,
    expectedError: result.expectedError,
    borderline: result.borderline,
    referencePixels: result.referencePixels,
    obliqueness: Math.min(result.obliqueness, MAX_OBLIQUENESS),
    warnings: result.warnings,
  });
  await row.reload({ include: [measuredBy] });
  deps.events.emit('block.estimated', {
    swapId: swap.id,
    guildId: swap.guildId,
    actorId,
    blockId: block.id,
    makerId: block.makerId,
    estimateId: row.id,
    photoId: photo.id,
    verdict: row.verdict,
  });
  return estimateDto(row);
}
