/**
 * Who may do what with photos (deny by default): any active member of a photo's guild sees it;
 * a block's maker and the guild's coordinators and admins add photos to the block; the uploader
 * and the guild's coordinators and admins remove one.
 */
import { Photo } from '../db/models';
import { assertGuildRole, can, findWithGuildRole } from '../guilds/guilds.policy';
import type { Role } from '@shared/schemas/guilds';
import { ForbiddenError, NotFoundError } from '../http/errors';
import { canReadBlock, type BlockAccess, type BlockRead } from '../blocks/blocks.policy';
import type { AppDeps } from '../deps';

/** The block's maker, or a coordinator or admin of its guild. */
export async function canAddBlockPhotos(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  const access = await canReadBlock(read, userId, blockId);
  if (!access.isMaker && !can(access.role, 'photos:manage')) {
    throw new ForbiddenError('Only the maker of this block or a coordinator can add photos to it.');
  }
  return access;
}

/** Any active member of the block's guild sees its photos. */
export async function canSeeBlockPhotos(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  const access = await canReadBlock(read, userId, blockId);
  if (!can(access.role, 'photos:read')) throw new ForbiddenError();
  return access;
}

const MISSING_PHOTO = 'That photo does not exist, or it was removed.';

/**
 * The photo with the caller's role in its guild, in one statement (every thumbnail on a board asks):
 * to someone outside the guild it is as missing as a photo that never was.
 */
async function loadPhoto(deps: Pick<AppDeps, 'pool'>, userId: number, photoId: number): Promise<{ photo: Photo; role: Role }> {
  const read = await findWithGuildRole(deps, Photo, photoId, userId);
  if (!read) throw new NotFoundError(MISSING_PHOTO);
  return { photo: read.found, role: assertGuildRole(read.role, 'photos:read', MISSING_PHOTO) };
}

/** Active members of the photo's guild, whatever their role. */
export async function canSeePhoto(deps: Pick<AppDeps, 'pool'>, userId: number, photoId: number): Promise<Photo> {
  return (await loadPhoto(deps, userId, photoId)).photo;
}

/** The uploader while still a member, or a coordinator or admin of the photo's guild. */
export async function canRemovePhoto(deps: Pick<AppDeps, 'pool'>, userId: number, photoId: number): Promise<Photo> {
  const { photo, role } = await loadPhoto(deps, userId, photoId);
  if (photo.uploadedById !== userId && !can(role, 'photos:manage')) {
    throw new ForbiddenError('Only the person who posted this photo or a coordinator can remove it.');
  }
  return photo;
}
