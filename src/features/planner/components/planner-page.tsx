import { useId, useState } from 'react';
import { HST_METHODS, type HstMethod, type GeeseMethod } from '@shared/quilt';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/fields';
import { PageHeader } from '@/components/ui/page';
import { SafetyCautions } from '@/components/ui/safety-cautions';
import { parseList, parseOne } from '../hooks/use-length-field';
import { usePlannerState } from '../hooks/use-planner-state';
import { planBlock, type BlockInput, type BlockKind, type BlockPlan } from './block-plan';
import { BlockResults } from './block-results';
import { QuiltPlanCard } from './quilt-plan-card';
import { useLengthFormat, UnitsToggle, type Units } from './units';

const kindOptions: { value: BlockKind; label: string }[] = [
  { value: 'grid', label: 'Grid block (strips and squares)' },
  { value: 'hst', label: 'Half-square triangles (HST)' },
  { value: 'qst', label: 'Quarter-square triangles (QST)' },
  { value: 'flying-geese', label: 'Flying geese' },
  { value: 'square-in-square', label: 'Square in a square' },
];

const hstOptions: { value: HstMethod; label: string }[] = [
  { value: 'two-at-a-time', label: 'Two at a time (finished + ⅞″)' },
  { value: 'trim', label: 'Two at a time, trimmed (finished + 1″)' },
  { value: 'four-at-a-time', label: 'Four at a time' },
  { value: 'eight-at-a-time', label: 'Eight at a time (2 × finished + 1¾″)' },
];
const geeseOptions: { value: GeeseMethod; label: string }[] = [
  { value: 'no-waste', label: 'No-waste, four at a time' },
  { value: 'stitch-and-flip', label: 'Stitch and flip, one at a time' },
];

/** Fabric narrower than this is unusual for quilting cotton (common practice, no source): ask before planning with it. */
const NARROW_WOF = 36;
const MAX_COUNT = 5000;

const pick = <T extends string>(value: string, options: { value: T }[]): T =>
  options.find((o) => o.value === value)?.value ?? options[0]!.value;

/** The widest piece or strip set the plan cuts from the width of fabric, in inches. */
function widestCut(plan: BlockPlan): number {
  const pieces = plan.cuts.map((c) => Math.max(c.width, c.height));
  const sets = plan.recipe?.stripSets.map((s) => s.sewnWidth) ?? [];
  return Math.max(0, ...pieces, ...sets);
}

/** The Cutting planner: any block, any sizes, cut list, strips and yardage for N blocks, and a quilt plan. */
export function PlannerPage({ defaultUnits = 'in' }: { defaultUnits?: Units }) {
  const { inputs, set, setUnits } = usePlannerState(defaultUnits);
  const { units } = inputs;
  const fmt = useLengthFormat(units);
  const countId = useId();
  const narrowId = useId();
  const kind = pick(inputs.kind, kindOptions);
  const hstMethod = HST_METHODS.includes(inputs.hstMethod as HstMethod) ? (inputs.hstMethod as HstMethod) : 'two-at-a-time';
  const geeseMethod = pick(inputs.geeseMethod, geeseOptions);

  const columns = parseList(inputs.columns, { units });
  const rows = parseList(inputs.rows, { units });
  const seam = parseOne(inputs.seam, { units });
  const finished = parseOne(inputs.finished, { units });
  const geeseWidth = parseOne(inputs.geeseWidth, { units });
  const geeseHeight = parseOne(inputs.geeseHeight, { units });
  let wof = parseOne(inputs.wof, { units });
  const countText = inputs.count.trim();
  const count = Number(countText);
  const countError =
    /^\d+$/.test(countText) && count >= 1 && count <= MAX_COUNT
      ? undefined
      : `Enter a whole number from 1 to ${MAX_COUNT}${countText ? `; “${countText}” is not one` : ''}.`;

  let input: BlockInput | null = null;
  if (kind === 'grid' && columns.values && rows.values && seam.value !== null)
    input = { kind, columns: columns.values, rows: rows.values, seam: seam.value };
  if ((kind === 'hst' || kind === 'qst' || kind === 'square-in-square') && finished.value !== null) {
    input =
      kind === 'hst'
        ? { kind, finished: finished.value, method: hstMethod, seam: 0.25 }
        : { kind, finished: finished.value, seam: 0.25 };
  }
  if (kind === 'flying-geese' && geeseWidth.value !== null && geeseHeight.value !== null) {
    input = { kind, width: geeseWidth.value, height: geeseHeight.value, method: geeseMethod, seam: 0.25 };
  }

  let plan: BlockPlan | null = null;
  let planError = '';
  let narrow = false;
  if (input && !countError && wof.value !== null) {
    try {
      // The sizes are checked against a usual width first, so a too-narrow fabric is named as such.
      const sized = planBlock(input, count, Math.max(wof.value, 42));
      const widest = widestCut(sized);
      if (wof.value < widest) {
        wof = { value: null, error: `The fabric must be at least as wide as the widest piece or strip set, ${fmt(widest)}.` };
      } else {
        plan = wof.value === Math.max(wof.value, 42) ? sized : planBlock(input, count, wof.value);
        narrow = wof.value < NARROW_WOF;
      }
    } catch (error) {
      planError = error instanceof Error ? error.message : 'These sizes do not make a block.';
    }
  }
  const waitingForNarrow = plan !== null && narrow && inputs.narrowOk !== 'yes';

  // The last plan that could be worked out stays on screen, marked out of date, while a field is being fixed.
  const [lastGood, setLastGood] = useState<{ key: string; plan: BlockPlan; count: number } | null>(null);
  const current = plan && !waitingForNarrow ? { key: JSON.stringify([input, count, wof.value]), plan, count } : null;
  if (current && current.key !== lastGood?.key) setLastGood(current);
  const shown = current ?? lastGood;
  const stale = !current && shown !== null;
  const lengthHint = units === 'mm' ? 'A number on its own is millimetres.' : 'A number on its own is inches.';

  return (
    <div className="space-y-8">
      <PageHeader
        title="Cutting planner"
        lead="Type sizes the way you measure them — 3½, 3 1/2, 3-1/2″ or 89 mm. Everything below updates as you type, and the page address keeps your plan, so you can bookmark or share it."
        actions={<UnitsToggle units={units} onChange={setUnits} />}
      />
      <Card title="The block">
        <p className="mb-4 text-walnut-soft">{lengthHint}</p>
        <div className="grid gap-4 md:grid-cols-2">
          <SelectField label="Kind of block" options={kindOptions} value={kind} onChange={(e) => set('kind', e.target.value)} />
          <div>
            <label htmlFor={countId} className="block font-semibold">
              How many blocks or units
            </label>
            <input
              id={countId}
              inputMode="numeric"
              enterKeyHint="next"
              className="mt-1 block min-h-11 w-full rounded-lg border-2 border-walnut/30 bg-white px-3 aria-[invalid=true]:border-madder"
              value={inputs.count}
              onChange={(e) => set('count', e.target.value)}
              aria-invalid={countError ? true : undefined}
              aria-describedby={countError ? `${countId}-error` : undefined}
            />
            {countError && (
              <p id={`${countId}-error`} role="alert" className="mt-1 font-semibold text-madder-deep">
                {countError}
              </p>
            )}
          </div>
          {kind === 'grid' && (
            <>
              <TextField
                label="Column cut widths"
                hint="Left to right, separated by commas."
                unit={units}
                value={inputs.columns}
                onChange={(e) => set('columns', e.target.value)}
                error={columns.error}
              />
              <TextField
                label="Row cut heights"
                hint="Top to bottom, separated by commas."
                unit={units}
                value={inputs.rows}
                onChange={(e) => set('rows', e.target.value)}
                error={rows.error}
              />
              <TextField
                label="Seam allowance"
                unit={units}
                value={inputs.seam}
                onChange={(e) => set('seam', e.target.value)}
                error={seam.error}
              />
            </>
          )}
          {(kind === 'hst' || kind === 'qst' || kind === 'square-in-square') && (
            <TextField
              label="Finished size of the unit"
              unit={units}
              value={inputs.finished}
              onChange={(e) => set('finished', e.target.value)}
              error={finished.error}
            />
          )}
          {kind === 'hst' && (
            <SelectField
              label="Method"
              options={hstOptions}
              value={hstMethod}
              onChange={(e) => set('hstMethod', e.target.value)}
            />
          )}
          {kind === 'flying-geese' && (
            <>
              <TextField
                label="Finished width of a goose"
                unit={units}
                value={inputs.geeseWidth}
                onChange={(e) => set('geeseWidth', e.target.value)}
                error={geeseWidth.error}
              />
              <TextField
                label="Finished height of a goose"
                unit={units}
                value={inputs.geeseHeight}
                onChange={(e) => set('geeseHeight', e.target.value)}
                error={geeseHeight.error}
              />
              <SelectField
                label="Method"
                options={geeseOptions}
                value={geeseMethod}
                onChange={(e) => set('geeseMethod', e.target.value)}
              />
            </>
          )}
          <div>
            <TextField
              label="Usable width of fabric (WOF)"
              hint={`After the selvages are cut off; ${units === 'mm' ? '1020–1070 mm' : '40–42″'} is usual.`}
              unit={units}
              value={inputs.wof}
              onChange={(e) => {
                set('wof', e.target.value);
                set('narrowOk', '');
              }}
              error={wof.error}
            />
            {narrow && plan && (
              <div className="mt-2 rounded-lg border-l-4 border-weld bg-weld/10 px-3 py-2">
                <p className="font-semibold text-weld-deep">
                  Take care: that is narrower than most quilting cotton ({fmt(NARROW_WOF)} or more).
                </p>
                <label htmlFor={narrowId} className="mt-1 flex min-h-11 cursor-pointer items-center gap-3">
                  <input
                    id={narrowId}
                    type="checkbox"
                    className="h-6 w-6 shrink-0"
                    checked={inputs.narrowOk === 'yes'}
                    onChange={(e) => set('narrowOk', e.target.checked ? 'yes' : '')}
                  />
                  My fabric really is this narrow
                </label>
              </div>
            )}
          </div>
        </div>
        {kind !== 'grid' && <p className="mt-3 text-walnut-soft">Unit cut sizes assume ¼″ seams, the usual allowance.</p>}
      </Card>
      {planError && (
        <p role="alert" className="font-semibold text-madder-deep">
          {planError}
        </p>
      )}
      {stale && (
        <Alert tone="warning" title="Out of date">
          The results below are for the last sizes that worked. Fix the field marked above and they update again.
        </Alert>
      )}
      {shown && (
        <div
          className={`grid gap-6 lg:grid-cols-[2fr_1fr] ${stale ? 'rounded-card outline-dashed outline-4 outline-offset-8 outline-weld' : ''}`}
          aria-label={stale ? 'Results, out of date' : undefined}
          role={stale ? 'region' : undefined}
        >
          <BlockResults plan={shown.plan} count={shown.count} fmt={fmt} />
          <SafetyCautions topics={['cutting', 'pressing']} className="self-start" />
        </div>
      )}
      {shown && (
        <QuiltPlanCard
          blockFinished={shown.plan.finished}
          blockCount={shown.count}
          inputs={inputs}
          set={set}
          fmt={fmt}
          stale={stale}
        />
      )}
    </div>
  );
}
