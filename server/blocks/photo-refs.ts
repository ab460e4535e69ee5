/**
 * Photo references for blocks. The photos table belongs to the upload feature and may not exist
 * yet on an older database, so it is read with plain SQL once its presence is known.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { PhotoRefDto } from '@shared/swap-types';

let photosTableKnown = false;

export async function hasPhotosTable(sequelize: Sequelize, transaction?: Transaction): Promise<boolean> {
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
