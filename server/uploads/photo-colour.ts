/**
 * Colour statistics of stored photos (mean L*a*b* and the spread of lightness), for the design wall.
 * Worked out once from the re-encoded image when a photo is stored; photos stored before that (or
 * whose statistics failed) are filled in by a background pass at start-up and on first request.
 * Kept in their own table, `photo_colours`, so the photo rows stay as the photo store writes them.
 */
import sharp from 'sharp';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { colourStatistics, type ColourStatistics } from '@shared/colour';
import type { FeatureStartup } from '../features';
import type { Photo } from '../db/models';
import { storageOf, type PhotoStoreDeps } from './photo-store';
import { readAll } from './storage/photo-storage';

/** Side of the small copy the statistics are read from: plenty for a mean and three percentiles. */
const SAMPLE_SIDE = 96;

/** Statistics of an encoded image (JPEG, WebP, PNG), read from a small sRGB copy of it. */
export async function photoColourOf(image: Buffer): Promise<ColourStatistics> {
  const { data, info } = await sharp(image)
    .resize(SAMPLE_SIDE, SAMPLE_SIDE, { fit: 'inside' })
    .toColourspace('srgb')
    .removeAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  return colourStatistics(data, info.channels);
}

interface ColourRow {
  photo_id: number;
  mean_l: number;
  mean_a: number;
  mean_b: number;
  p10: number;
  p50: number;
  p90: number;
}

const toStats = (r: ColourRow): ColourStatistics => ({
  meanLab: [Number(r.mean_l), Number(r.mean_a), Number(r.mean_b)],
  lightness: { p10: Number(r.p10), p50: Number(r.p50), p90: Number(r.p90) },
});

async function saveColour(sequelize: Sequelize, photoId: number, s: ColourStatistics, transaction?: Transaction): Promise<void> {
  await sequelize.query(
    `INSERT INTO photo_colours (photo_id, mean_l, mean_a, mean_b, p10, p50, p90)
     SELECT $id, $l, $a, $b, $p10, $p50, $p90 WHERE EXISTS (SELECT 1 FROM photos WHERE id = $id)
     ON CONFLICT (photo_id) DO NOTHING`,
    {
      bind: { id: photoId, l: s.meanLab[0], a: s.meanLab[1], b: s.meanLab[2], p10: s.lightness.p10, p50: s.lightness.p50, p90: s.lightness.p90 },
      type: QueryTypes.INSERT,
      transaction,
    },
  );
}

/**
 * Stores the statistics of newly inserted photos, inside the transaction that inserts them. A photo
 * whose statistics cannot be worked out is skipped (the background pass tries again); this never
 * makes the upload fail.
 */
export async function recordPhotoColours(
  sequelize: Sequelize,
  rows: readonly Photo[],
  images: readonly Buffer[],
  transaction: Transaction,
): Promise<void> {
  for (const [i, row] of rows.entries()) {
    const image = images[i];
    if (!image) continue;
    const stats = await photoColourOf(image).catch(() => null);
    if (stats) await saveColour(sequelize, row.id, stats, transaction);
  }
}

/** Stored statistics of some photos, by photo id (photos without any are left out). */
export async function readPhotoColours(sequelize: Sequelize, photoIds: readonly number[], transaction?: Transaction): Promise<Map<number, ColourStatistics>> {
  if (photoIds.length === 0) return new Map();
  const rows = await sequelize.query<ColourRow>('SELECT * FROM photo_colours WHERE photo_id = ANY($ids::int[])', {
    bind: { ids: [...photoIds] },
    type: QueryTypes.SELECT,
    transaction,
  });
  return new Map(rows.map((r) => [r.photo_id, toStats(r)]));
}

/** The photo's statistics, worked out from its stored file now when they are missing; null when the file is gone. */
export async function photoColour(deps: PhotoStoreDeps, photo: Pick<Photo, 'id' | 'fileName'>): Promise<ColourStatistics | null> {
  const stored = (await readPhotoColours(deps.sequelize, [photo.id])).get(photo.id);
  if (stored) return stored;
  const object = await storageOf(deps).get(photo.fileName);
  if (!object) return null;
  const stats = await photoColourOf(await readAll(object.body));
  await saveColour(deps.sequelize, photo.id, stats);
  return stats;
}

/** Fills in the statistics of up to `limit` block photos that have none; returns how many were done. */
export async function backfillPhotoColours(deps: PhotoStoreDeps, limit = 200): Promise<number> {
  const missing = await deps.sequelize.query<{ id: number; fileName: string }>(
    `SELECT p.id, p.file_name AS "fileName" FROM photos p
      WHERE p.block_id IS NOT NULL AND NOT EXISTS (SELECT 1 FROM photo_colours c WHERE c.photo_id = p.id)
      ORDER BY p.id LIMIT $limit`,
    { bind: { limit }, type: QueryTypes.SELECT },
  );
  let done = 0;
  for (const photo of missing) {
    const stats = await photoColour(deps, photo).catch(() => null);
    if (stats) done += 1;
  }
  return done;
}

/**
 * At start-up, works through the block photos stored without colour statistics, a batch at a time,
 * in the background. Failures are logged and never stop the server.
 */
export const photoColourBackfillFeature: FeatureStartup = async ({ deps }) => {
  let stopped = false;
  const run = async () => {
    try {
      let total = 0;
      for (;;) {
        if (stopped) break;
        const done = await backfillPhotoColours(deps, 50);
        total += done;
        if (done < 50) break;
      }
      if (total) deps.logger.info({ photos: total }, 'worked out colour statistics of earlier photos');
    } catch (err) {
      if (!stopped) deps.logger.warn({ err }, 'the photo colour pass failed; it runs again at the next start');
    }
  };
  const running = run();
  return {
    name: 'photo-colour-backfill',
    close: async () => {
      stopped = true;
      await running;
    },
  };
};
