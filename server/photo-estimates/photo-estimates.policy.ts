/**
 * Who may measure a block from its photo (deny by default): the block's maker for their own block,
 * and the coordinators and admins of its guild for any block. The same people see the estimates'
 * history; other members see only the latest estimate, on the roster, beside the ruler verdict.
 */
import { ForbiddenError } from '../http/errors';
import { canReadBlock, type BlockAccess, type BlockRead } from '../blocks/blocks.policy';

async function makerOrOfficer(read: BlockRead, userId: number, blockId: number, refusal: string): Promise<BlockAccess> {
  const access = await canReadBlock(read, userId, blockId);
  if (!access.isMaker && !access.canManage) throw new ForbiddenError(refusal);
  return access;
}

/** The maker, or a coordinator or admin of the block's guild. */
export function canEstimateBlock(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  return makerOrOfficer(read, userId, blockId, 'Only the maker of this block or a coordinator can measure it from a photo.');
}

/** The same people may read the estimates with their marked corners. */
export function canSeeEstimates(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  return makerOrOfficer(
    read,
    userId,
    blockId,
    'Only the maker of this block and the guild’s coordinators see its photo estimates.',
  );
}
