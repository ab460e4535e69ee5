/**
 * The cutting plan of a swap block for a number of blocks, from the quilt math engine: what to cut
 * of each fabric, the strip-set recipe for grid blocks, and yardage rounded up to ⅛ yd.
 */
import { useMemo } from 'react';
import {
  batchCuts,
  flyingGeeseCuts,
  gridRecipe,
  hstCut,
  qstCut,
  squareInSquareCuts,
  stripPlan,
  type Piece,
  type StripSetDesign,
} from '@shared/quilt';
import type { Units } from '@shared/schemas/auth';
import type { BlockSpec } from '@shared/schemas/blocks';
import { len } from '@/lib/lengths';

export interface CutRow {
  fabric: string;
  what: string;
  width: number;
  height: number;
  count: number;
}

export interface FabricNeed {
  fabric: string;
  yards: number;
  strips: number;
  stripWidths: number[];
}

export interface CuttingPlan {
  blocks: number;
  /** width of fabric the strips are cut across, inches */
  wof: number;
  cuts: CutRow[];
  fabrics: FabricNeed[];
  stripSets: StripSetDesign[];
  notes: string[];
  /** custom blocks: the coordinator's own words, no yardage */
  freeText?: string;
}

const fabricName = (roles: string[], i: number, fallback: string) => roles[i] ?? fallback;

function yardage(cuts: CutRow[], wof: number): FabricNeed[] {
  const byFabric = new Map<string, Piece[]>();
  for (const c of cuts)
    byFabric.set(c.fabric, [...(byFabric.get(c.fabric) ?? []), { width: c.width, height: c.height, count: c.count }]);
  return [...byFabric].map(([fabric, pieces]) => {
    const plan = stripPlan(pieces, { wof, orientation: 'fewest-strips' });
    return { fabric, yards: plan.totals.yards, strips: plan.totals.strips, stripWidths: plan.rows.map((r) => r.stripWidth) };
  });
}

/**
 * Pure: the plan for `blocks` blocks; `roles` names the fabrics (from the swap's colour rules). Lengths
 * stay in inches; the notes, being text, are written in `units`.
 */
export function cuttingPlan(spec: BlockSpec, blocks: number, roles: string[] = [], units: Units = 'in', wof = 42): CuttingPlan {
  const n = Math.max(1, Math.floor(blocks));
  const notes: string[] = [];
  if (spec.kind === 'custom') {
    return {
      blocks: n,
      wof,
      cuts: [],
      fabrics: [],
      stripSets: [],
      notes: ['Cut as the coordinator describes below, once per block.'],
      freeText: spec.cutList,
    };
  }
  if (spec.kind === 'grid') {
    const recipe = gridRecipe(
      { columns: spec.columns, rows: spec.rows, seam: spec.seam ?? 0.25, ...(spec.roles ? { roles: spec.roles } : {}) },
      { blocks: n, wof },
    );
    const cuts = recipe.cutList.map((c) => ({
      fabric: c.role ?? 'Any fabric',
      what: 'Patch',
      width: c.width,
      height: c.height,
      count: c.count,
    }));
    const fabrics = recipe.stripsToCut.map((s) => ({
      fabric: s.role ?? 'Any fabric',
      yards: s.yards,
      strips: s.count,
      stripWidths: [s.width],
    }));
    const merged = new Map<string, FabricNeed>();
    for (const f of fabrics) {
      const m = merged.get(f.fabric);
      merged.set(
        f.fabric,
        m
          ? { ...m, yards: m.yards + f.yards, strips: m.strips + f.strips, stripWidths: [...m.stripWidths, ...f.stripWidths] }
          : f,
      );
    }
    notes.push('Sew the strips of each strip set together along their length, press, then sub-cut across at the heights given.');
    return { blocks: n, wof, cuts, fabrics: [...merged.values()], stripSets: recipe.stripSets, notes };
  }
  let cuts: CutRow[];
  if (spec.kind === 'hst') {
    const unit = hstCut(spec.finished, spec.method);
    const { batches, spare } = batchCuts([{ count: 1, yields: unit.yields }], n);
    const a = fabricName(roles, 0, 'Light');
    const b = fabricName(roles, 1, 'Dark');
    cuts = [
      { fabric: a, what: 'Square', width: unit.square, height: unit.square, count: batches },
      { fabric: b, what: 'Square', width: unit.square, height: unit.square, count: batches },
    ];
    notes.push(`Each pair of squares makes ${unit.yields} HSTs${spare ? `; you will have ${spare} spare` : ''}.`);
    if (unit.trimTo) notes.push(`Trim each HST to ${len(unit.trimTo, units)} square.`);
  } else if (spec.kind === 'qst') {
    const unit = qstCut(spec.finished);
    const { batches, spare } = batchCuts([{ count: 1, yields: unit.yields }], n);
    cuts = [
      { fabric: fabricName(roles, 0, 'Light'), what: 'Square', width: unit.square, height: unit.square, count: batches },
      { fabric: fabricName(roles, 1, 'Dark'), what: 'Square', width: unit.square, height: unit.square, count: batches },
    ];
    notes.push(`Each pair of squares makes ${unit.yields} QSTs${spare ? `; you will have ${spare} spare` : ''}.`);
  } else if (spec.kind === 'flying-geese') {
    const pieces = flyingGeeseCuts(spec.finished.width, spec.finished.height, spec.method);
    const { pieces: scaled, spare } = batchCuts(pieces, n);
    cuts = scaled.map((p) => ({
      fabric: fabricName(roles, p.role === 'goose' ? 0 : 1, p.role === 'goose' ? 'Goose' : 'Sky'),
      what: p.shape === 'square' ? 'Square' : 'Rectangle',
      width: p.width,
      height: p.height,
      count: p.count,
    }));
    if (spare) notes.push(`The no-waste method makes geese four at a time; you will have ${spare} spare.`);
  } else {
    const unit = squareInSquareCuts(spec.finished);
    cuts = [
      {
        fabric: fabricName(roles, 0, 'Centre'),
        what: 'Centre square',
        width: unit.centre.square,
        height: unit.centre.square,
        count: n,
      },
      {
        fabric: fabricName(roles, 1, 'Corners'),
        what: 'Square, cut once on the diagonal',
        width: unit.corners.square,
        height: unit.corners.square,
        count: 2 * n,
      },
    ];
    // The rounding step is an inch step whatever the viewer's unit; in millimetres it is named exactly.
    const step = units === 'mm' ? '⅛″ (3.175 mm)' : '⅛″';
    notes.push(`Sizes with √2 are rounded up to the next ${step}; trim the finished unit square.`);
  }
  return { blocks: n, wof, cuts, fabrics: yardage(cuts, wof), stripSets: [], notes };
}

/** Memoised cuttingPlan; null while the spec cannot be planned (an engine error is returned as text). */
export function useCuttingPlan(
  spec: BlockSpec | null,
  blocks: number,
  roles: string[],
  units: Units = 'in',
): { plan: CuttingPlan | null; problem: string | null } {
  const key = JSON.stringify([spec, blocks, roles, units]);
  return useMemo(() => {
    if (!spec) return { plan: null, problem: null };
    try {
      return { plan: cuttingPlan(spec, blocks, roles, units), problem: null };
    } catch (error) {
      return { plan: null, problem: error instanceof Error ? error.message : 'This block cannot be planned.' };
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);
}
