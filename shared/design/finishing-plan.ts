/**
 * The finishing plan of a design-wall layout: finished size from the quilt engine's quiltPlan, and
 * the cut list and yardage for what goes around the blocks — plain alternate blocks, sashing,
 * cornerstones, borders, binding, backing and batting. Lengths in inches; pure, exact arithmetic.
 */
import { quiltPlan } from '../quilt/quilt-plan';
import { DEFAULT_USABLE_WOF, fabricYardsExact } from '../quilt/fabric';
import { type Fraction, countArg, fromNumber, lengthArg, q } from '../quilt/rational';

export interface FinishingInput {
  /** finished size of one block */
  block: { width: number; height: number };
  seam: number;
  columns: number;
  rows: number;
  /** how many cells hold a plain alternate block */
  plain: number;
  /** how many cells are left empty (sewn as plain too, or the layout is not finished yet) */
  empty: number;
  sashing?: number;
  /** cornerstones where sashing strips cross (default true) */
  cornerstones?: boolean;
  /** finished widths, innermost first */
  borders?: number[];
  wof?: number;
}

export type FinishingPart = 'plain' | 'sashing' | 'cornerstones' | 'border' | 'binding' | 'backing';

export interface CutRow {
  part: FinishingPart;
  label: string;
  count: number;
  cut: { width: number; height: number };
  /** strips of this width across the WOF joined end to end for each piece (1 = no join) */
  joinedStrips: number;
}

export interface FabricRow {
  part: FinishingPart;
  label: string;
  /** strips cut across the WOF (backing: panels) */
  strips: number;
  yards: number;
}

export interface FinishingPlan {
  finished: { width: number; height: number };
  /** blocks and sashing, before borders */
  centre: { width: number; height: number };
  layout: { columns: number; rows: number; cells: number; plain: number; empty: number };
  cutList: CutRow[];
  fabric: FabricRow[];
  binding: { length: number; stripWidth: number; strips: number; yards: number };
  backing: { width: number; height: number; panels: number; seams: 'none' | 'vertical' | 'horizontal'; yards: number };
  batting: { width: number; height: number };
}

interface Piece {
  part: FinishingPart;
  label: string;
  count: number;
  /** across the strip (the strip's width) */
  stripWidth: Fraction;
  /** along the strip */
  length: Fraction;
}

/**
 * Strips across the WOF for one kind of piece. A piece up to the WOF long is sub-cut, ⌊WOF ⁄ length⌋
 * to a strip; a longer one is pieced from n strips joined end to end with straight seams, each seam
 * taking twice the seam allowance: n = ⌈(length − 2·SA) ⁄ (WOF − 2·SA)⌉ (common practice, no
 * source). Leftovers are not shared between kinds of piece.
 */
function stripsFor(p: Piece, wof: Fraction, seam: Fraction): { strips: number; joined: number } {
  if (p.count === 0) return { strips: 0, joined: 1 };
  if (p.length.lte(wof)) {
    const perStrip = wof.div(p.length).floor().valueOf();
    return { strips: Math.ceil(p.count / perStrip), joined: 1 };
  }
  const two = seam.mul(2);
  const joined = p.length.sub(two).div(wof.sub(two)).ceil().valueOf();
  return { strips: p.count * joined, joined };
}

/** The finishing plan; throws the engine's QuiltInputError for lengths it refuses. */
export function finishingPlan(input: FinishingInput): FinishingPlan {
  const columns = countArg('columns', input.columns, 1);
  const rows = countArg('rows', input.rows, 1);
  const seam = lengthArg('seam', input.seam);
  const bw = lengthArg('block.width', input.block.width);
  const bh = lengthArg('block.height', input.block.height);
  const sash = lengthArg('sashing', input.sashing ?? 0, { zero: true });
  const wof = lengthArg('wof', input.wof ?? DEFAULT_USABLE_WOF);
  const borders = input.borders ?? [];
  const plan = quiltPlan({
    blockFinished: input.block,
    blocks: columns * rows,
    columns,
    sashing: sash.valueOf(),
    borders,
    seam: seam.valueOf(),
    wof: wof.valueOf(),
  });
  const two = seam.mul(2);
  const pieces: Piece[] = [];
  if (input.plain > 0) {
    pieces.push({
      part: 'plain',
      label: 'Plain alternate blocks',
      count: input.plain,
      stripWidth: bh.add(two),
      length: bw.add(two),
    });
  }
  if (sash.gt(0)) {
    const s = sash.add(two);
    const cw = fromNumber(plan.centre.width);
    if (input.cornerstones ?? true) {
      pieces.push(
        { part: 'sashing', label: 'Sashing beside the blocks', count: rows * (columns + 1), stripWidth: s, length: bh.add(two) },
        {
          part: 'sashing',
          label: 'Sashing above and below the blocks',
          count: columns * (rows + 1),
          stripWidth: s,
          length: bw.add(two),
        },
        { part: 'cornerstones', label: 'Cornerstones', count: (rows + 1) * (columns + 1), stripWidth: s, length: s },
      );
    } else {
      // Without cornerstones the rows are joined with long strips the full width of the centre.
      pieces.push(
        { part: 'sashing', label: 'Sashing beside the blocks', count: rows * (columns + 1), stripWidth: s, length: bh.add(two) },
        { part: 'sashing', label: 'Long sashing between the rows', count: rows + 1, stripWidth: s, length: cw.add(two) },
      );
    }
  }
  plan.borders.forEach((b, i) => {
    const label = `Border ${i + 1}${plan.borders.length > 1 ? (i === 0 ? ' (innermost)' : i === plan.borders.length - 1 ? ' (outermost)' : '') : ''}`;
    const width = fromNumber(b.sides.cut.width);
    pieces.push(
      { part: 'border', label: `${label}: sides`, count: 2, stripWidth: width, length: fromNumber(b.sides.cut.height) },
      {
        part: 'border',
        label: `${label}: top and bottom`,
        count: 2,
        stripWidth: width,
        length: fromNumber(b.topAndBottom.cut.width),
      },
    );
  });

  const cutList: CutRow[] = [];
  // One fabric per part (each border its own), summed over its pieces.
  const fabrics = new Map<string, { part: FinishingPart; label: string; strips: number; length: Fraction }>();
  for (const p of pieces) {
    const { strips, joined } = stripsFor(p, wof, seam);
    cutList.push({
      part: p.part,
      label: p.label,
      count: p.count,
      cut: { width: p.length.valueOf(), height: p.stripWidth.valueOf() },
      joinedStrips: joined,
    });
    const key = p.part === 'border' ? p.label.split(':')[0]! : p.part;
    const label =
      p.part === 'border'
        ? key
        : p.part === 'plain'
          ? 'Plain alternate blocks'
          : p.part === 'sashing'
            ? 'Sashing'
            : 'Cornerstones';
    const f = fabrics.get(key) ?? { part: p.part, label, strips: 0, length: q(0) };
    f.strips += strips;
    f.length = f.length.add(p.stripWidth.mul(strips));
    fabrics.set(key, f);
  }
  cutList.push({
    part: 'binding',
    label: 'Binding strips (joined on the diagonal)',
    count: plan.binding.strips,
    cut: { width: wof.valueOf(), height: plan.binding.stripWidth },
    joinedStrips: plan.binding.strips,
  });
  cutList.push({
    part: 'backing',
    label: `Backing panels (${plan.backing.seams === 'none' ? 'no seam' : `seams ${plan.backing.seams}`})`,
    count: plan.backing.panels,
    cut: { width: plan.backing.panelLength, height: wof.valueOf() },
    joinedStrips: 1,
  });
  const fabric: FabricRow[] = [...fabrics.values()].map((f) => ({
    part: f.part,
    label: f.label,
    strips: f.strips,
    yards: fabricYardsExact(f.length).valueOf(),
  }));
  fabric.push({ part: 'binding', label: 'Binding', strips: plan.binding.strips, yards: plan.binding.yards });
  fabric.push({ part: 'backing', label: 'Backing', strips: plan.backing.panels, yards: plan.backing.yards });
  return {
    finished: plan.top,
    centre: plan.centre,
    layout: { columns, rows, cells: columns * rows, plain: input.plain, empty: input.empty },
    cutList,
    fabric,
    binding: {
      length: plan.binding.length,
      stripWidth: plan.binding.stripWidth,
      strips: plan.binding.strips,
      yards: plan.binding.yards,
    },
    backing: {
      width: plan.backing.width,
      height: plan.backing.height,
      panels: plan.backing.panels,
      seams: plan.backing.seams,
      yards: plan.backing.yards,
    },
    batting: plan.batting,
  };
}
