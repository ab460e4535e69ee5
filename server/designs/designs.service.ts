/**
 * The design wall: a member's own layout of the blocks that came back to them (and their own), the
 * finishing plan worked out from it with the quilt engine, and the colour-spreading proposal.
 */
import { QuiltInputError, chooseLayout } from '@shared/quilt';
import { fromNumber, q } from '@shared/quilt/rational';
import { arrangeByColour, type Lab } from '@shared/colour';
import { finishingPlan, type FinishingPlan } from '@shared/design/finishing-plan';
import {
  isPlainCell,
  type ArrangeDto,
  type DesignBlockDto,
  type DesignBody,
  type DesignCell,
  type DesignDto,
} from '@shared/schemas/designs';
import type { AppDeps } from '../deps';
import { ValidationError } from '../http/errors';
import type { DesignAccess } from './designs.policy';
import { findDesign, placeableBlocks, upsertDesign, type DesignRow, type PlaceableBlockRow } from './designs.queries';

type Deps = Pick<AppDeps, 'pool'>;

interface Layout {
  columns: number;
  rows: number;
  sashing?: number;
  cornerstones?: boolean;
  borders?: number[];
  alternate?: boolean;
  cells: DesignCell[];
}

function blockDto(r: PlaceableBlockRow, userId: number): DesignBlockDto {
  return {
    id: r.id,
    sequence: r.sequence,
    maker: { id: r.maker_id, displayName: r.maker_name },
    own: r.maker_id === userId,
    photo:
      r.photo_id === null
        ? null
        : {
            id: r.photo_id,
            url: `/api/photos/${r.photo_id}`,
            thumbUrl: `/api/photos/${r.photo_id}?size=thumb`,
            width: r.photo_width ?? 0,
            height: r.photo_height ?? 0,
          },
    colour:
      r.mean_l === null
        ? null
        : {
            meanLab: [Number(r.mean_l), Number(r.mean_a), Number(r.mean_b)],
            lightness: { p10: Number(r.p10), p50: Number(r.p50), p90: Number(r.p90) },
          },
  };
}

async function loadBlocks(deps: Deps, access: DesignAccess): Promise<DesignBlockDto[]> {
  const rows = await placeableBlocks(deps.pool, access.swap.id, access.userId, access.allReturned);
  return rows.map((r) => blockDto(r, access.userId));
}

/** The layout closest to square that holds every block, blocks in order. */
function firstLayout(access: DesignAccess, blocks: DesignBlockDto[]): Layout {
  const { swap } = access;
  const n = Math.max(blocks.length, 1);
  const { columns, rows } = chooseLayout(
    n,
    { width: fromNumber(swap.finishedWidth), height: fromNumber(swap.finishedHeight) },
    q(0),
  );
  const cells: DesignCell[] = Array.from({ length: columns * rows }, (_, i) => ({ blockId: blocks[i]?.id ?? null, rotation: 0 }));
  return { columns, rows, cells };
}

function fromRow(row: DesignRow, placeable: Set<number>): Layout {
  // A block no longer the caller's to place (the return was changed) leaves its cell empty.
  const cells = row.cells.map((c) =>
    c.blockId !== null && !placeable.has(c.blockId) ? { blockId: null, rotation: 0 as const } : c,
  );
  return {
    columns: row.columns,
    rows: row.rows,
    ...(row.sashing !== null ? { sashing: Number(row.sashing) } : {}),
    ...(row.cornerstones !== null ? { cornerstones: row.cornerstones } : {}),
    ...(row.borders !== null ? { borders: row.borders } : {}),
    ...(row.alternate !== null ? { alternate: row.alternate } : {}),
    cells,
  };
}

function planOf(access: DesignAccess, layout: Layout): FinishingPlan {
  const { swap } = access;
  let plain = 0;
  let empty = 0;
  layout.cells.forEach((c, i) => {
    if (isPlainCell(i, layout.columns, layout.alternate)) plain += 1;
    else if (c.blockId === null) empty += 1;
  });
  try {
    return finishingPlan({
      block: { width: swap.finishedWidth, height: swap.finishedHeight },
      seam: swap.seam,
      columns: layout.columns,
      rows: layout.rows,
      plain,
      empty,
      ...(layout.sashing !== undefined ? { sashing: layout.sashing } : {}),
      ...(layout.cornerstones !== undefined ? { cornerstones: layout.cornerstones } : {}),
      ...(layout.borders ? { borders: layout.borders } : {}),
    });
  } catch (error) {
    if (error instanceof QuiltInputError) throw new ValidationError(error.message, { [error.field]: error.message });
    throw error;
  }
}

function toDto(access: DesignAccess, layout: Layout, blocks: DesignBlockDto[], savedAt: Date | null): DesignDto {
  const { swap } = access;
  return {
    ...layout,
    plan: planOf(access, layout),
    savedAt: savedAt ? savedAt.toISOString() : null,
    swap: { id: swap.id, guildId: swap.guildId, title: swap.title, mode: swap.mode },
    block: {
      spec: swap.blockSpec,
      finished: { width: swap.finishedWidth, height: swap.finishedHeight },
      unfinished: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
      seam: swap.seam,
    },
    blocks,
  };
}

/**
 * Refuses (400, with a message per cell) a block that is not the caller's to place, a block in a
 * plain cell of a checkerboard setting, and a quarter turn of a block that is not square.
 */
function checkLayout(access: DesignAccess, body: DesignBody, placeable: Set<number>): void {
  const fields: Record<string, string> = {};
  const square = access.swap.finishedWidth === access.swap.finishedHeight;
  const strangers: number[] = [];
  body.cells.forEach((c, i) => {
    if (c.blockId === null) return;
    if (!placeable.has(c.blockId)) {
      strangers.push(c.blockId);
      fields[`cells.${i}.blockId`] = `Block ${c.blockId} is not yours to place.`;
    } else if (isPlainCell(i, body.columns, body.alternate)) {
      fields[`cells.${i}.blockId`] =
        `Cell ${i + 1} holds a plain alternate block in this setting; move block ${c.blockId} to a block cell.`;
    } else if (!square && (c.rotation === 90 || c.rotation === 270)) {
      fields[`cells.${i}.rotation`] = `Block ${c.blockId} is not square, so it can only be turned half way round (180°).`;
    }
  });
  if (strangers.length) {
    const which = strangers.length === 1 ? `Block ${strangers[0]} is` : `Blocks ${strangers.join(', ')} are`;
    throw new ValidationError(
      `${which} not yours to place: your wall takes the blocks returned to you and the blocks you made.`,
      fields,
    );
  }
  const first = Object.values(fields)[0];
  if (first) throw new ValidationError(Object.keys(fields).length === 1 ? first : 'Some cells need another look.', fields);
}

const layoutOf = (body: DesignBody): Layout => ({
  columns: body.columns,
  rows: body.rows,
  ...(body.sashing !== undefined ? { sashing: body.sashing } : {}),
  ...(body.cornerstones !== undefined ? { cornerstones: body.cornerstones } : {}),
  ...(body.borders !== undefined ? { borders: body.borders } : {}),
  ...(body.alternate !== undefined ? { alternate: body.alternate } : {}),
  cells: body.cells.map((c) => ({ blockId: c.blockId, rotation: c.rotation, ...(c.pinned ? { pinned: true } : {}) })),
});

/** The caller's design of a swap: the saved one, or a first layout of every block they may place. */
export async function getDesign(deps: Deps, access: DesignAccess): Promise<DesignDto> {
  const [blocks, row] = await Promise.all([loadBlocks(deps, access), findDesign(deps.pool, access.swap.id, access.userId)]);
  const layout = row ? fromRow(row, new Set(blocks.map((b) => b.id))) : firstLayout(access, blocks);
  return toDto(access, layout, blocks, row?.updated_at ?? null);
}

/** Saves the caller's design after checking every cell; the answer carries the finishing plan. */
export async function saveDesign(deps: Deps, access: DesignAccess, body: DesignBody): Promise<DesignDto> {
  const blocks = await loadBlocks(deps, access);
  checkLayout(access, body, new Set(blocks.map((b) => b.id)));
  const layout = layoutOf(body);
  const plan = planOf(access, layout); // refuses lengths the engine cannot use before anything is saved
  const row = await upsertDesign(deps.pool, access.swap.id, access.userId, {
    columns: layout.columns,
    rows: layout.rows,
    sashing: layout.sashing ?? null,
    cornerstones: layout.cornerstones ?? null,
    borders: layout.borders ?? null,
    alternate: layout.alternate ?? null,
    cells: layout.cells,
  });
  return { ...toDto(access, layout, blocks, row.updated_at), plan };
}

const round2 = (x: number) => Math.round(x * 100) / 100;

/**
 * Proposes an arrangement of the given layout (or the saved one) in which neighbouring blocks differ
 * most in colour. Pinned tiles, empty cells and plain cells stay; each block keeps its turn. Nothing
 * is saved.
 */
export async function arrangeDesign(deps: Deps, access: DesignAccess, body: DesignBody | null): Promise<ArrangeDto> {
  const blocks = await loadBlocks(deps, access);
  let layout: Layout;
  if (body) {
    checkLayout(access, body, new Set(blocks.map((b) => b.id)));
    layout = layoutOf(body);
  } else {
    const row = await findDesign(deps.pool, access.swap.id, access.userId);
    layout = row ? fromRow(row, new Set(blocks.map((b) => b.id))) : firstLayout(access, blocks);
  }
  const colours = new Map<number, Lab>(blocks.flatMap((b) => (b.colour ? [[b.id, b.colour.meanLab] as [number, Lab]] : [])));
  const result = arrangeByColour({
    columns: layout.columns,
    rows: layout.rows,
    cells: layout.cells.map((c) => c.blockId),
    pinned: layout.cells.flatMap((c, i) => (c.pinned ? [i] : [])),
    colourOf: (id) => colours.get(id) ?? null,
  });
  const cellOf = new Map(layout.cells.flatMap((c) => (c.blockId === null ? [] : [[c.blockId, c] as const])));
  const cells = result.cells.map((id, i) => (id === null ? layout.cells[i]! : { ...cellOf.get(id)! }));
  return { cells, score: round2(result.score), before: round2(result.before) };
}
