import {
  flyingGeeseCuts,
  gridBlock,
  gridRecipe,
  hstCut,
  qstCut,
  squareInSquareCuts,
  stripPlan,
  unfinishedSize,
  type GridBlock,
  type GridRecipe,
  type HstMethod,
  type GeeseMethod,
  type StripPlan,
  type Piece,
} from '@shared/quilt';

export type BlockKind = 'grid' | 'hst' | 'qst' | 'flying-geese' | 'square-in-square';

export type BlockInput =
  | { kind: 'grid'; columns: number[]; rows: number[]; seam: number }
  | { kind: 'hst'; finished: number; method: HstMethod; seam: number }
  | { kind: 'qst'; finished: number; seam: number }
  | { kind: 'flying-geese'; width: number; height: number; method: GeeseMethod; seam: number }
  | { kind: 'square-in-square'; finished: number; seam: number };

export interface CutRow {
  what: string;
  width: number;
  height: number;
  count: number;
  note?: string;
}

export interface BlockPlan {
  unfinished: { width: number; height: number };
  finished: { width: number; height: number };
  grid?: GridBlock;
  recipe?: GridRecipe;
  /** pieces for all the blocks */
  cuts: CutRow[];
  strips: StripPlan;
}

/** Everything the planner shows for `count` blocks (or units) of one design. */
export function planBlock(input: BlockInput, count: number, wof: number): BlockPlan {
  if (input.kind === 'grid') {
    const grid = gridBlock({ columns: input.columns, rows: input.rows, seam: input.seam });
    const recipe = gridRecipe({ columns: input.columns, rows: input.rows, seam: input.seam }, { blocks: count, wof });
    const cuts = recipe.cutList.map((r) => ({ what: 'Patch', width: r.width, height: r.height, count: r.count }));
    return {
      unfinished: grid.unfinished,
      finished: grid.finished,
      grid,
      recipe,
      cuts,
      strips: stripPlan(asPieces(cuts), { wof }),
    };
  }
  const square = (finished: number) => ({ width: finished, height: finished });
  let finished: { width: number; height: number };
  let cuts: CutRow[];
  if (input.kind === 'hst' || input.kind === 'qst') {
    finished = square(input.finished);
    const cut = input.kind === 'hst' ? hstCut(input.finished, input.method) : qstCut(input.finished);
    const batches = Math.ceil(count / cut.yields);
    const note = `${cut.yields} units per ${cut.squares === 2 ? 'pair' : 'set'} of squares${cut.trimTo ? `, trim each to ${cut.trimTo}″` : ''}${cut.roundedUp ? ' (rounded up to ⅛″)' : ''}`;
    cuts = [
      { what: 'Light square', width: cut.square, height: cut.square, count: batches * (cut.squares / 2), note },
      { what: 'Dark square', width: cut.square, height: cut.square, count: batches * (cut.squares / 2), note },
    ];
  } else if (input.kind === 'flying-geese') {
    finished = { width: input.width, height: input.height };
    const pieces = flyingGeeseCuts(input.width, input.height, input.method);
    const batches = Math.ceil(count / (pieces[0]?.yields ?? 1));
    cuts = pieces.map((p) => ({
      what: `${p.role === 'goose' ? 'Goose' : 'Sky'} ${p.shape}`,
      width: p.width,
      height: p.height,
      count: p.count * batches,
      note: `${p.yields} ${p.yields === 1 ? 'goose' : 'geese'} per set`,
    }));
  } else {
    finished = square(input.finished);
    const s = squareInSquareCuts(input.finished);
    cuts = [
      { what: 'Centre square', width: s.centre.square, height: s.centre.square, count },
      {
        what: 'Corner squares',
        width: s.corners.square,
        height: s.corners.square,
        count: 2 * count,
        note: 'cut once diagonally: 4 triangles per block',
      },
    ];
  }
  const unfinished = { width: unfinishedSize(finished.width, input.seam), height: unfinishedSize(finished.height, input.seam) };
  return { unfinished, finished, cuts, strips: stripPlan(asPieces(cuts), { wof }) };
}

function asPieces(cuts: CutRow[]): Piece[] {
  return cuts.filter((c) => c.count > 0).map((c) => ({ width: c.width, height: c.height, count: c.count }));
}
