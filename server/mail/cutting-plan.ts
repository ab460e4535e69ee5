/**
 * A member's own cutting plan for a pledge of N blocks, from the quilt engine: what to cut from each
 * fabric and how much of each fabric to have, cut in strips across a 42″ usable width of fabric
 * (yardage rounded up to ⅛ yd by the engine). Pure: no I/O.
 */
import {
  DEFAULT_USABLE_WOF,
  batchCuts,
  flyingGeeseCuts,
  formatLength,
  gridCutList,
  hstCut,
  qstCut,
  squareInSquareCuts,
  stripPlan,
  type Piece,
} from '@shared/quilt';
import { blockKindLabels, type BlockKind, type BlockSpec } from '@shared/schemas/blocks';

export interface PlanCut {
  fabric: string;
  width: number;
  height: number;
  count: number;
  /** e.g. "cut once on the diagonal" */
  note: string | null;
}

export interface PlanFabric {
  fabric: string;
  /** strips to cut across the width of fabric, widest first */
  strips: { width: number; count: number }[];
  yards: number;
}

export interface PledgePlan {
  kind: BlockKind;
  kindLabel: string;
  blocks: number;
  wof: number;
  cuts: PlanCut[];
  fabrics: PlanFabric[];
  /** a finishing step, such as the size to trim units to */
  note: string | null;
  /** a custom block's cut list as the coordinator wrote it (no yardage is worked out for it) */
  customCutList: string | null;
}

const SCRAPPY = 'Any fabric';

/** Strips and yardage per fabric for the cuts, each fabric planned on its own. */
function fabricsFor(cuts: PlanCut[], wof: number): PlanFabric[] {
  const byFabric = new Map<string, Piece[]>();
  for (const c of cuts)
    byFabric.set(c.fabric, [...(byFabric.get(c.fabric) ?? []), { width: c.width, height: c.height, count: c.count }]);
  return [...byFabric.entries()].map(([fabric, pieces]) => {
    const plan = stripPlan(pieces, { wof });
    return { fabric, strips: plan.rows.map((r) => ({ width: r.stripWidth, count: r.strips })), yards: plan.totals.yards };
  });
}

/** The swap's colour role in position `i` (its first two name a unit's two fabrics), or the usual word. */
const fabricName = (roles: string[], i: number, fallback: string) => roles[i]?.trim() || fallback;

function unitCuts(
  spec: Exclude<BlockSpec, { kind: 'grid' } | { kind: 'custom' }>,
  blocks: number,
  roles: string[],
): { cuts: PlanCut[]; note: string | null } {
  switch (spec.kind) {
    case 'hst': {
      const cut = hstCut(spec.finished, spec.method);
      const pairs = Math.ceil(blocks / cut.yields);
      const square = cut.square;
      const cuts = [fabricName(roles, 0, 'Light'), fabricName(roles, 1, 'Dark')].map((fabric) => ({
        fabric,
        width: square,
        height: square,
        count: pairs,
        note: null,
      }));
      const spare = pairs * cut.yields - blocks;
      const trim = cut.trimTo ? `Trim each HST to ${formatLength(cut.trimTo)} square.` : null;
      return {
        cuts,
        note:
          [trim, spare > 0 ? `This makes ${spare} spare HST${spare === 1 ? '' : 's'}.` : null].filter(Boolean).join(' ') || null,
      };
    }
    case 'qst': {
      const cut = qstCut(spec.finished);
      const pairs = Math.ceil(blocks / cut.yields);
      const cuts = [fabricName(roles, 0, 'Light'), fabricName(roles, 1, 'Dark')].map((fabric) => ({
        fabric,
        width: cut.square,
        height: cut.square,
        count: pairs,
        note: 'cut twice on the diagonal after sewing',
      }));
      const spare = pairs * cut.yields - blocks;
      return { cuts, note: spare > 0 ? `This makes ${spare} spare QST${spare === 1 ? '' : 's'}.` : null };
    }
    case 'flying-geese': {
      const scaled = batchCuts(flyingGeeseCuts(spec.finished.width, spec.finished.height, spec.method), blocks);
      const cuts = scaled.pieces.map((p) => ({
        fabric: p.role === 'goose' ? fabricName(roles, 0, 'Goose fabric') : fabricName(roles, 1, 'Sky fabric'),
        width: p.width,
        height: p.height,
        count: p.count,
        note: null,
      }));
      return { cuts, note: scaled.spare > 0 ? `This makes ${scaled.spare} spare flying geese.` : null };
    }
    case 'square-in-square': {
      const c = squareInSquareCuts(spec.finished);
      return {
        cuts: [
          {
            fabric: fabricName(roles, 0, 'Centre fabric'),
            width: c.centre.square,
            height: c.centre.square,
            count: blocks,
            note: null,
          },
          {
            fabric: fabricName(roles, 1, 'Corner fabric'),
            width: c.corners.square,
            height: c.corners.square,
            count: 2 * blocks,
            note: 'cut once on the diagonal',
          },
        ],
        note: null,
      };
    }
  }
}

/** The cutting plan and fabric amounts for `blocks` blocks of a swap's block spec; `roles` are its colour roles, in order. */
export function pledgePlan(spec: BlockSpec, blocks: number, wof = DEFAULT_USABLE_WOF, roles: string[] = []): PledgePlan {
  const base = { kind: spec.kind, kindLabel: blockKindLabels[spec.kind], blocks, wof };
  if (spec.kind === 'custom') return { ...base, cuts: [], fabrics: [], note: null, customCutList: spec.cutList };
  let cuts: PlanCut[];
  let note: string | null = null;
  if (spec.kind === 'grid') {
    cuts = gridCutList(
      { columns: spec.columns, rows: spec.rows, seam: spec.seam ?? 0.25, ...(spec.roles ? { roles: spec.roles } : {}) },
      { blocks },
    ).map((row) => ({ fabric: row.role ?? SCRAPPY, width: row.width, height: row.height, count: row.count, note: null }));
    if (!spec.roles)
      note =
        'The swap does not say which fabric goes where, so the amounts assume every patch is cut from one fabric; scrappy blocks need less of each.';
  } else {
    ({ cuts, note } = unitCuts(spec, blocks, roles));
  }
  return { ...base, cuts, fabrics: fabricsFor(cuts, wof), note, customCutList: null };
}
