/**
 * Who may do what with photos (deny by default): any active member of a photo's guild sees it;
 * a block's maker and the guild's coordinators and admins add photos to the block; the uploader
 * and the guild's coordinators and admins remove one.
 */
import { Photo } from '../db/models';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';
import { canReadBlock, type BlockAccess, type BlockRead } from '../blocks/blocks.policy';

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

async function loadPhoto(photoId: number): Promise<Photo> {
  const photo = await Photo.findByPk(photoId);
  if (!photo) throw new NotFoundError('That photo does not exist, or it was removed.');
  return photo;
}

/** Active members of the photo's guild, whatever their role. */
export async function canSeePhoto(userId: number, photoId: number): Promise<Photo> {
  const photo = await loadPhoto(photoId);
  await authorizeGuild(userId, photo.guildId, 'photos:read', 'That photo does not exist, or it was removed.');
  return photo;
}

/** The uploader while still a member, or a coordinator or admin of the photo's guild. */
export async function canRemovePhoto(userId: number, photoId: number): Promise<Photo> {
  const photo = await loadPhoto(photoId);
  const membership = await authorizeGuild(userId, photo.guildId, 'photos:read', 'That photo does not exist, or it was removed.');
  if (photo.uploadedById !== userId && !can(membership.role, 'photos:manage')) {
    throw new ForbiddenError('Only the person who posted this photo or a coordinator can remove it.');
  }
  return photo;
}
