/**
 * Photo references for blocks. The photos table belongs to the upload feature and may not exist
 * yet on an older database, so it is read with plain SQL once its presence is known.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { PhotoRefDto } from '@shared/swap-types';

let photosTableKnown = false;

async function hasPhotosTable(sequelize: Sequelize, transaction?: Transaction): Promise<boolean> {
  if (photosTableKnown) return true;
  const [row] = await sequelize.query<{ present: boolean }>("SELECT to_regclass('public.photos') IS NOT NULL AS present", {
    type: QueryTypes.SELECT,
    transaction,
  });
  photosTableKnown = Boolean(row?.present);
  return photosTableKnown;
}

export function photoRef(id: number): PhotoRefDto {
  return { id, url: `/api/photos/${id}`, thumbUrl: `/api/photos/${id}?size=thumb` };
}

/** Photos of each block, oldest first, in one query. */
export async function photosByBlock(sequelize: Sequelize, blockIds: number[], transaction?: Transaction): Promise<Map<number, PhotoRefDto[]>> {
  const byBlock = new Map<number, PhotoRefDto[]>();
  if (blockIds.length === 0 || !(await hasPhotosTable(sequelize, transaction))) return byBlock;
  const rows = await sequelize.query<{ id: number; block_id: number }>(
    'SELECT id, block_id FROM photos WHERE block_id = ANY($ids::int[]) ORDER BY created_at, id',
    { bind: { ids: blockIds }, type: QueryTypes.SELECT, transaction },
  );
  for (const row of rows) {
    const list = byBlock.get(row.block_id) ?? [];
    list.push(photoRef(row.id));
    byBlock.set(row.block_id, list);
  }
  return byBlock;
}

/** Photos of every block of a swap, in one query that needs no block ids first (for the roster). */
export async function photosBySwap(sequelize: Sequelize, swapId: number, transaction?: Transaction): Promise<Map<number, PhotoRefDto[]>> {
  const byBlock = new Map<number, PhotoRefDto[]>();
  if (!(await hasPhotosTable(sequelize, transaction))) return byBlock;
  const rows = await sequelize.query<{ id: number; block_id: number }>(
    `SELECT p.id, p.block_id FROM photos p JOIN blocks b ON b.id = p.block_id
      WHERE b.swap_id = $swapId ORDER BY p.created_at, p.id`,
    { bind: { swapId }, type: QueryTypes.SELECT, transaction },
  );
  for (const row of rows) byBlock.set(row.block_id, [...(byBlock.get(row.block_id) ?? []), photoRef(row.id)]);
  return byBlock;
}
