/** Hand-written SQL of the design wall, bind parameters only; each a named statement on the plain pool. */
import type pg from 'pg';
import { preparedPoolQuery } from '../db/prepared';

export interface PlaceableBlockRow {
  id: number;
  sequence: number;
  maker_id: number;
  maker_name: string;
  photo_id: number | null;
  photo_width: number | null;
  photo_height: number | null;
  mean_l: string | null;
  mean_a: string | null;
  mean_b: string | null;
  p10: string | null;
  p50: string | null;
  p90: string | null;
}

/**
 * The blocks of a swap the caller may place on their wall: those returned to them and those they
 * made; with `allReturned` (an officer of a gift swap) every returned block. Each with its newest
 * photo and that photo's colour statistics. Blocks returned to the caller come first.
 */
export function placeableBlocks(
  pool: pg.Pool,
  swapId: number,
  userId: number,
  allReturned: boolean,
): Promise<PlaceableBlockRow[]> {
  return preparedPoolQuery<PlaceableBlockRow>(
    pool,
    `SELECT b.id, b.sequence, b.maker_id, u.display_name AS maker_name,
            p.id AS photo_id, p.width AS photo_width, p.height AS photo_height,
            c.mean_l, c.mean_a, c.mean_b, c.p10, c.p50, c.p90
       FROM blocks b
       JOIN users u ON u.id = b.maker_id
       LEFT JOIN LATERAL (SELECT ph.id, ph.width, ph.height FROM photos ph WHERE ph.block_id = b.id
                           ORDER BY ph.created_at DESC, ph.id DESC LIMIT 1) p ON true
       LEFT JOIN photo_colours c ON c.photo_id = p.id
      WHERE b.swap_id = $swapId
        AND (b.maker_id = $userId OR (b.state = 'returned' AND (b.recipient_id = $userId OR $allReturned)))
      ORDER BY (b.maker_id = $userId), u.display_name, b.sequence, b.id`,
    { swapId, userId, allReturned },
  );
}

export interface DesignRow {
  columns: number;
  rows: number;
  sashing: string | null;
  cornerstones: boolean | null;
  borders: number[] | null;
  alternate: boolean | null;
  cells: { blockId: number | null; rotation: 0 | 90 | 180 | 270; pinned?: boolean }[];
  updated_at: Date;
}

export async function findDesign(pool: pg.Pool, swapId: number, userId: number): Promise<DesignRow | null> {
  const [row] = await preparedPoolQuery<DesignRow>(
    pool,
    'SELECT columns, rows, sashing, cornerstones, borders, alternate, cells, updated_at FROM designs WHERE swap_id = $swapId AND user_id = $userId',
    { swapId, userId },
  );
  return row ?? null;
}

export interface DesignWrite {
  columns: number;
  rows: number;
  sashing: number | null;
  cornerstones: boolean | null;
  borders: number[] | null;
  alternate: boolean | null;
  cells: DesignRow['cells'];
}

/** Inserts or replaces the caller's design of a swap (one row per member and swap). */
export async function upsertDesign(pool: pg.Pool, swapId: number, userId: number, d: DesignWrite): Promise<DesignRow> {
  const [row] = await preparedPoolQuery<DesignRow>(
    pool,
    `INSERT INTO designs (swap_id, user_id, columns, rows, sashing, cornerstones, borders, alternate, cells)
     VALUES ($swapId, $userId, $columns, $rows, $sashing, $cornerstones, $borders::jsonb, $alternate, $cells::jsonb)
     ON CONFLICT (swap_id, user_id) DO UPDATE SET columns = EXCLUDED.columns, rows = EXCLUDED.rows, sashing = EXCLUDED.sashing,
       cornerstones = EXCLUDED.cornerstones, borders = EXCLUDED.borders, alternate = EXCLUDED.alternate, cells = EXCLUDED.cells,
       updated_at = now()
     RETURNING columns, rows, sashing, cornerstones, borders, alternate, cells, updated_at`,
    {
      swapId,
      userId,
      columns: d.columns,
      rows: d.rows,
      sashing: d.sashing,
      cornerstones: d.cornerstones,
      borders: d.borders === null ? null : JSON.stringify(d.borders),
      alternate: d.alternate,
      cells: JSON.stringify(d.cells),
    },
  );
  return row!;
}
