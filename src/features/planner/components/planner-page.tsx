import { useId, useState } from 'react';
import type { HstMethod, GeeseMethod } from '@shared/quilt';
import { Card } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/fields';
import { PageHeader } from '@/components/ui/page';
import { SafetyCautions } from '@/components/ui/safety-cautions';
import { parseList, useLengthField } from '../hooks/use-length-field';
import { planBlock, type BlockInput, type BlockKind } from './block-plan';
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

/** The Cutting planner: any block, any sizes, cut list, strips and yardage for N blocks, and a quilt plan. */
export function PlannerPage({ defaultUnits = 'in' }: { defaultUnits?: Units }) {
  const [units, setUnits] = useState<Units>(defaultUnits);
  const fmt = useLengthFormat(units);
  const [kind, setKind] = useState<BlockKind>('grid');
  const [columnsText, setColumnsText] = useState('4, 3, 2, 1');
  const [rowsText, setRowsText] = useState('4, 3, 2, 1');
  const seam = useLengthField('1/4');
  const finished = useLengthField('3');
  const geeseWidth = useLengthField('6');
  const geeseHeight = useLengthField('3');
  const wof = useLengthField('42');
  const [hstMethod, setHstMethod] = useState<HstMethod>('two-at-a-time');
  const [geeseMethod, setGeeseMethod] = useState<GeeseMethod>('no-waste');
  const [countText, setCountText] = useState('12');
  const countId = useId();

  const columns = parseList(columnsText);
  const rows = parseList(rowsText);
  const count = Number(countText);
  const countError = Number.isInteger(count) && count >= 1 && count <= 5000 ? undefined : 'Enter a whole number from 1 to 5000.';

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

  let plan: ReturnType<typeof planBlock> | null = null;
  let planError = '';
  if (input && !countError && wof.value !== null) {
    try {
      plan = planBlock(input, count, wof.value);
    } catch (error) {
      planError = error instanceof Error ? error.message : 'These sizes do not make a block.';
    }
  }

  return (
    <div className="space-y-8">
      <PageHeader
        title="Cutting planner"
        lead="Type sizes the way you measure them — 3½, 3 1/2, 3-1/2″ or 89 mm. Everything below updates as you type."
        actions={<UnitsToggle units={units} onChange={setUnits} />}
      />
      <Card title="The block">
        <div className="grid gap-4 md:grid-cols-2">
          <SelectField
            label="Kind of block"
            options={kindOptions}
            value={kind}
            onChange={(e) => setKind(e.target.value as BlockKind)}
          />
          <div>
            <label htmlFor={countId} className="block font-semibold">
              How many blocks or units
            </label>
            <input
              id={countId}
              inputMode="numeric"
              className="mt-1 block min-h-11 w-full rounded-lg border-2 border-walnut/30 bg-white px-3"
              value={countText}
              onChange={(e) => setCountText(e.target.value)}
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
                value={columnsText}
                onChange={(e) => setColumnsText(e.target.value)}
                error={columns.error}
              />
              <TextField
                label="Row cut heights"
                hint="Top to bottom, separated by commas."
                value={rowsText}
                onChange={(e) => setRowsText(e.target.value)}
                error={rows.error}
              />
              <TextField
                label="Seam allowance"
                value={seam.text}
                onChange={(e) => seam.setText(e.target.value)}
                error={seam.error}
              />
            </>
          )}
          {(kind === 'hst' || kind === 'qst' || kind === 'square-in-square') && (
            <TextField
              label="Finished size of the unit"
              value={finished.text}
              onChange={(e) => finished.setText(e.target.value)}
              error={finished.error}
            />
          )}
          {kind === 'hst' && (
            <SelectField
              label="Method"
              options={hstOptions}
              value={hstMethod}
              onChange={(e) => setHstMethod(e.target.value as HstMethod)}
            />
          )}
          {kind === 'flying-geese' && (
            <>
              <TextField
                label="Finished width of a goose"
                value={geeseWidth.text}
                onChange={(e) => geeseWidth.setText(e.target.value)}
                error={geeseWidth.error}
              />
              <TextField
                label="Finished height of a goose"
                value={geeseHeight.text}
                onChange={(e) => geeseHeight.setText(e.target.value)}
                error={geeseHeight.error}
              />
              <SelectField
                label="Method"
                options={[
                  { value: 'no-waste', label: 'No-waste, four at a time' },
                  { value: 'stitch-and-flip', label: 'Stitch and flip, one at a time' },
                ]}
                value={geeseMethod}
                onChange={(e) => setGeeseMethod(e.target.value as GeeseMethod)}
              />
            </>
          )}
          <TextField
            label="Usable width of fabric (WOF)"
            hint="After the selvages are cut off; 40–42″ is usual."
            value={wof.text}
            onChange={(e) => wof.setText(e.target.value)}
            error={wof.error}
          />
        </div>
        {kind !== 'grid' && <p className="mt-3 text-walnut-soft">Unit cut sizes assume ¼″ seams, the usual allowance.</p>}
      </Card>
      {planError && (
        <p role="alert" className="font-semibold text-madder-deep">
          {planError}
        </p>
      )}
      {plan && (
        <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
          <BlockResults plan={plan} count={count} fmt={fmt} />
          <SafetyCautions topics={['cutting', 'pressing']} className="self-start" />
        </div>
      )}
      {plan && <QuiltPlanCard blockFinished={plan.finished} defaultBlocks={count} fmt={fmt} />}
    </div>
  );
}
