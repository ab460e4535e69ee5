/**
 * Whole-quilt arithmetic: layout, sashing, borders, finished top, binding, backing and batting.
 * Sashing (when given) runs between the blocks and around the outside of them, with cornerstones.
 */
import { DEFAULT_SEAM, seamArg } from './blocks';
import { DEFAULT_USABLE_WOF, fabricYardsExact } from './fabric';
import { type Fraction, QuiltInputError, countArg, lengthArg, maxQ, q, sumQ } from './rational';

export interface QuiltPlanOptions {
  blockFinished: { width: number; height: number };
  blocks: number;
  /** blocks across; when absent the layout closest to square that holds every block is chosen */
  columns?: number;
  /** finished width of sashing between and around the blocks */
  sashing?: number;
  /** finished widths of the borders, innermost first */
  borders?: number[];
  /** cut width of the binding strips (default 2½″) */
  bindingWidth?: number;
  /** extra binding length for the corners and the join (default 12″) */
  bindingAllowance?: number;
  /** usable width of fabric for binding strips (default 42″) */
  wof?: number;
  /** backing beyond the top on every side (default 4″; 6–8″ for longarm machines) */
  backingOverage?: number;
  /** usable width of the backing fabric (default 42″) */
  backingWof?: number;
  /** seam allowance used to join backing widths (default ½″, so each join takes 1″) */
  backingSeam?: number;
  /** batting beyond the top on every side (default: the backing overage) */
  battingOverage?: number;
  seam?: number;
}

export interface Rect {
  width: number;
  height: number;
}

export interface BackingLayout {
  /** which way the panels (and any seams between them) run on the quilt */
  direction: 'vertical' | 'horizontal';
  seams: 'none' | 'vertical' | 'horizontal';
  panels: number;
  /** length each panel is cut to */
  panelLength: number;
  /** width of the joined panels across the seams, after the seam allowances */
  piecedWidth: number;
  fabricLength: number;
  yards: number;
}

export interface QuiltPlan {
  layout: { columns: number; rows: number; cells: number; emptyCells: number };
  blockUnfinished: Rect;
  /** blocks plus sashing, before borders */
  centre: Rect;
  top: Rect;
  sashing?: {
    width: number;
    strips: { count: number; cut: Rect }[];
    cornerstones: { count: number; cut: Rect };
  };
  borders: { finished: number; sides: { count: 2; cut: Rect }; topAndBottom: { count: 2; cut: Rect } }[];
  binding: { perimeter: number; length: number; stripWidth: number; strips: number; joinLoss: number; yards: number };
  backing: { width: number; height: number } & BackingLayout & { alternative: BackingLayout };
  batting: Rect;
}

const rect = (w: Fraction, h: Fraction): Rect => ({ width: w.valueOf(), height: h.valueOf() });

/** Aspect ratio ≥ 1 of a rectangle, exactly. */
const aspect = (w: Fraction, h: Fraction): Fraction => (w.gte(h) ? w.div(h) : h.div(w));

/** Size of blocks plus sashing for a count of blocks along one side. */
const span = (n: number, block: Fraction, sash: Fraction): Fraction => block.mul(n).add(sash.mul(n + 1));

/**
 * Columns × rows for `blocks`: with `columns` given, rows = ⌈blocks ⁄ columns⌉; otherwise the layout
 * whose blocks-and-sashing area is closest to square, then the fewest empty cells, then portrait.
 */
export function chooseLayout(
  blocks: number,
  block: { width: Fraction; height: Fraction },
  sash: Fraction,
  columns?: number,
): { columns: number; rows: number } {
  if (columns !== undefined) return { columns, rows: Math.ceil(blocks / columns) };
  let best = { columns: 1, rows: blocks };
  let bestKey: [Fraction, number] | null = null;
  for (let c = 1; c <= blocks; c += 1) {
    const r = Math.ceil(blocks / c);
    if ((r - 1) * c >= blocks) continue; // a whole empty row
    const key: [Fraction, number] = [aspect(span(c, block.width, sash), span(r, block.height, sash)), r * c - blocks];
    const better = bestKey === null || key[0].lt(bestKey[0]) || (key[0].equals(bestKey[0]) && key[1] < bestKey[1]);
    if (better) {
      best = { columns: c, rows: r };
      bestKey = key;
    }
  }
  return best;
}

/** Panels of fabric width f joined with `join` lost per seam that cover `across`. */
function panelsFor(across: Fraction, f: Fraction, join: Fraction): number {
  if (across.lte(f)) return 1;
  return across.sub(join).div(f.sub(join)).ceil().valueOf();
}

function backingLayout(
  across: Fraction,
  along: Fraction,
  f: Fraction,
  join: Fraction,
  seams: 'vertical' | 'horizontal',
): BackingLayout {
  const panels = panelsFor(across, f, join);
  const fabric = along.mul(panels);
  return {
    direction: seams,
    seams: panels === 1 ? 'none' : seams,
    panels,
    panelLength: along.valueOf(),
    piecedWidth: f
      .mul(panels)
      .sub(join.mul(panels - 1))
      .valueOf(),
    fabricLength: fabric.valueOf(),
    yards: fabricYardsExact(fabric).valueOf(),
  };
}

/**
 * Plan a quilt from its blocks: layout, finished top (blocks + sashing between and around +
 * 2 × each border), binding (perimeter + allowance, strips joined on the diagonal, each join using
 * one strip width), backing (overage each side, widths joined with seams vertical or horizontal,
 * whichever needs less fabric) and batting. Yardage is rounded up to ⅛ yd.
 */
export function quiltPlan(opts: QuiltPlanOptions): QuiltPlan {
  if (typeof opts !== 'object' || opts === null)
    throw new QuiltInputError('blocks', 'Give the block size and the number of blocks.');
  const bw = lengthArg('blockFinished.width', opts.blockFinished?.width);
  const bh = lengthArg('blockFinished.height', opts.blockFinished?.height);
  const blocks = countArg('blocks', opts.blocks, 1);
  const columns = opts.columns === undefined ? undefined : countArg('columns', opts.columns, 1);
  const sash = lengthArg('sashing', opts.sashing ?? 0, { zero: true });
  const borders = (opts.borders ?? []).map((b, i) => lengthArg(`borders[${i}]`, b));
  const bindingWidth = lengthArg('bindingWidth', opts.bindingWidth ?? 2.5);
  const allowance = lengthArg('bindingAllowance', opts.bindingAllowance ?? 12, { zero: true });
  const wof = lengthArg('wof', opts.wof ?? DEFAULT_USABLE_WOF);
  const overage = lengthArg('backingOverage', opts.backingOverage ?? 4, { zero: true });
  const backingWof = lengthArg('backingWof', opts.backingWof ?? DEFAULT_USABLE_WOF);
  const backingSeam = lengthArg('backingSeam', opts.backingSeam ?? 0.5, { zero: true });
  const battingOverage = lengthArg('battingOverage', opts.battingOverage ?? overage.valueOf(), { zero: true });
  const seam = seamArg(opts.seam ?? DEFAULT_SEAM);
  if (bindingWidth.gte(wof))
    throw new QuiltInputError('bindingWidth', 'Binding strips must be narrower than the width of fabric.');
  const join = backingSeam.mul(2);
  if (join.gte(backingWof)) throw new QuiltInputError('backingSeam', 'The backing seam is too wide for the fabric.');

  const layout = chooseLayout(blocks, { width: bw, height: bh }, sash, columns);
  const cw = span(layout.columns, bw, sash);
  const ch = span(layout.rows, bh, sash);
  const two = seam.mul(2);
  const bordersOut: QuiltPlan['borders'] = [];
  let w = cw;
  let h = ch;
  for (const b of borders) {
    // Sides first, then top and bottom across the full width (common practice, no source).
    bordersOut.push({
      finished: b.valueOf(),
      sides: { count: 2, cut: rect(b.add(two), h.add(two)) },
      topAndBottom: { count: 2, cut: rect(w.add(b.mul(2)).add(two), b.add(two)) },
    });
    w = w.add(b.mul(2));
    h = h.add(b.mul(2));
  }
  const perimeter = w.add(h).mul(2);
  const bindingLength = perimeter.add(allowance);
  // n strips joined on the diagonal give n·WOF − (n − 1)·strip width of binding.
  const strips = Math.max(1, bindingLength.sub(bindingWidth).div(wof.sub(bindingWidth)).ceil().valueOf());

  const needW = w.add(overage.mul(2));
  const needH = h.add(overage.mul(2));
  const vertical = backingLayout(needW, needH, backingWof, join, 'vertical');
  const horizontal = backingLayout(needH, needW, backingWof, join, 'horizontal');
  const [chosen, other] = horizontal.fabricLength < vertical.fabricLength ? [horizontal, vertical] : [vertical, horizontal];

  const plan: QuiltPlan = {
    layout: { ...layout, cells: layout.columns * layout.rows, emptyCells: layout.columns * layout.rows - blocks },
    blockUnfinished: rect(bw.add(two), bh.add(two)),
    centre: rect(cw, ch),
    top: rect(w, h),
    borders: bordersOut,
    binding: {
      perimeter: perimeter.valueOf(),
      length: bindingLength.valueOf(),
      stripWidth: bindingWidth.valueOf(),
      strips,
      joinLoss: bindingWidth.valueOf(),
      yards: fabricYardsExact(bindingWidth.mul(strips)).valueOf(),
    },
    backing: { width: needW.valueOf(), height: needH.valueOf(), ...chosen, alternative: other },
    batting: rect(w.add(battingOverage.mul(2)), h.add(battingOverage.mul(2))),
  };
  if (sash.gt(0)) {
    const { columns: c, rows: r } = layout;
    plan.sashing = {
      width: sash.valueOf(),
      strips: [
        { count: r * (c + 1), cut: rect(sash.add(two), bh.add(two)) },
        { count: c * (r + 1), cut: rect(bw.add(two), sash.add(two)) },
      ],
      cornerstones: { count: (r + 1) * (c + 1), cut: rect(sash.add(two), sash.add(two)) },
    };
  }
  return plan;
}

/**
 * Blocks across and down to reach at least a target finished size (blocks, sashing and borders
 * included).
 */
export function layoutForTarget(opts: { target: Rect; blockFinished: Rect; sashing?: number; borders?: number[] }): {
  columns: number;
  rows: number;
  blocks: number;
} {
  const tw = lengthArg('target.width', opts.target?.width);
  const th = lengthArg('target.height', opts.target?.height);
  const bw = lengthArg('blockFinished.width', opts.blockFinished?.width);
  const bh = lengthArg('blockFinished.height', opts.blockFinished?.height);
  const sash = lengthArg('sashing', opts.sashing ?? 0, { zero: true });
  const border = sumQ((opts.borders ?? []).map((b, i) => lengthArg(`borders[${i}]`, b))).mul(2);
  const count = (t: Fraction, b: Fraction) => Math.max(1, maxQ(q(0), t.sub(border).sub(sash)).div(b.add(sash)).ceil().valueOf());
  const columns = count(tw, bw);
  const rows = count(th, bh);
  return { columns, rows, blocks: columns * rows };
}
