import { useFieldArray, useWatch, type UseFormReturn } from 'react-hook-form';
import { blockKindLabels, blockSizes, type BlockKind } from '@shared/schemas/blocks';
import { Button } from '@/components/ui/button';
import { SelectField, TextArea, TextField } from '@/components/ui/fields';
import { sizeText } from '@/lib/lengths';
import { BlockPreview } from '../block-preview';
import type { Units } from '@shared/schemas/auth';
import { defaultCell, parseBlock, type SetupValues } from './setup-values';

const kindOptions = (Object.keys(blockKindLabels) as BlockKind[]).map((k) => ({ value: k, label: blockKindLabels[k] }));
const hstMethods = [
  { value: 'two-at-a-time', label: 'Two at a time (squares finished + ⅞″)' },
  { value: 'trim', label: 'Oversize and trim (squares finished + 1″)' },
  { value: 'four-at-a-time', label: 'Four at a time (sewn all round)' },
  { value: 'eight-at-a-time', label: 'Eight at a time (2 × finished + 1¾″)' },
];
const geeseMethods = [
  { value: 'no-waste', label: 'No-waste, four at a time' },
  { value: 'stitch-and-flip', label: 'Stitch and flip, one at a time' },
];
const lengthHints: Record<Units, string> = {
  in: 'Any of 3 1/2, 3½, 3.5 or 89 mm.',
  mm: 'A bare number is millimetres (88.9); inches need their mark (3½″ or 3.5 in).',
};
/** Usual sizes, in the unit in force (¼″ = 6.35 mm, ⅛″ = 3.175 mm: 25.4 mm to the inch, NIST SP 811). */
const usual = (units: Units, inch: string, mm: string) => (units === 'mm' ? `${mm} mm (${inch})` : inch);

function LengthList({
  form,
  name,
  label,
  units,
}: {
  form: UseFormReturn<SetupValues>;
  name: 'block.columns' | 'block.rows';
  label: string;
  units: Units;
}) {
  const { fields, append, remove } = useFieldArray({ control: form.control, name });
  const errors = form.formState.errors.block?.[name === 'block.columns' ? 'columns' : 'rows'];
  return (
    <fieldset className="space-y-3">
      <legend className="font-semibold">{label}</legend>
      {errors?.message && (
        <p role="alert" className="font-semibold text-madder-deep">
          {errors.message}
        </p>
      )}
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        {fields.map((field, i) => (
          <TextField
            key={field.id}
            label={`${name === 'block.columns' ? 'Column' : 'Row'} ${i + 1}`}
            inputMode="decimal"
            unit={units}
            error={errors?.[i]?.value?.message}
            {...form.register(`${name}.${i}.value` as const)}
          />
        ))}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button
          variant="secondary"
          onClick={() =>
            append({ value: fields.at(-1) ? form.getValues(`${name}.${fields.length - 1}.value` as const) : defaultCell(units) })
          }
          disabled={fields.length >= 12}
        >
          Add {name === 'block.columns' ? 'a column' : 'a row'}
        </Button>
        <Button variant="quiet" onClick={() => remove(fields.length - 1)} disabled={fields.length <= 1}>
          Remove the last
        </Button>
      </div>
    </fieldset>
  );
}

function sizesOrNull(spec: ReturnType<typeof parseBlock>['spec']) {
  try {
    return spec ? blockSizes(spec) : null;
  } catch {
    return null;
  }
}

/** Block kind and sizes, with the unfinished size and a drawing worked out live by the engine. */
export function StepBlock({ form, units }: { form: UseFormReturn<SetupValues>; units: Units }) {
  const lengthHint = lengthHints[units];
  const { register, formState } = form;
  const e = formState.errors.block;
  const block = useWatch({ control: form.control, name: 'block' });
  const roles = useWatch({ control: form.control, name: 'colourRules' })
    .map((r) => r.role)
    .filter(Boolean);
  const { spec, problem } = parseBlock(block, units);
  const sizes = sizesOrNull(spec);

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_18rem]">
      <div className="space-y-5">
        <SelectField label="Kind of block" options={kindOptions} error={e?.kind?.message} {...register('block.kind')} />
        {block.kind === 'grid' && (
          <>
            <p className="text-walnut-soft">
              Give the cut width of each column and the cut height of each row, seam allowance included. {lengthHint}
            </p>
            <LengthList form={form} name="block.columns" label="Column cut widths" units={units} />
            <LengthList form={form} name="block.rows" label="Row cut heights" units={units} />
          </>
        )}
        {(block.kind === 'hst' || block.kind === 'qst' || block.kind === 'square-in-square') && (
          <>
            <TextField
              label="Finished size of the unit (sewn into the quilt)"
              hint={`The size once sewn in, without seam allowance: not the size you cut or measure. ${lengthHint}`}
              inputMode="decimal"
              unit={units}
              error={e?.finished?.message}
              {...register('block.finished')}
            />
            {sizes && (
              <p className="-mt-3 text-indigo-deep">
                As typed: finished {sizeText(sizes.finished, units)}; unfinished {sizeText(sizes.unfinished, units)} (cut edge to
                cut edge, what you measure).
              </p>
            )}
          </>
        )}
        {block.kind === 'hst' && (
          <SelectField
            label="How the HSTs are made"
            options={hstMethods}
            error={e?.hstMethod?.message}
            {...register('block.hstMethod')}
          />
        )}
        {(block.kind === 'flying-geese' || block.kind === 'custom') && (
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField
              label="Finished width"
              hint={block.kind === 'flying-geese' ? 'Twice the height.' : lengthHint}
              inputMode="decimal"
              unit={units}
              error={e?.finishedWidth?.message}
              {...register('block.finishedWidth')}
            />
            <TextField
              label="Finished height"
              inputMode="decimal"
              unit={units}
              error={e?.finishedHeight?.message}
              {...register('block.finishedHeight')}
            />
          </div>
        )}
        {block.kind === 'flying-geese' && (
          <SelectField
            label="How the geese are made"
            options={geeseMethods}
            error={e?.geeseMethod?.message}
            {...register('block.geeseMethod')}
          />
        )}
        {block.kind === 'custom' && (
          <TextArea
            label="Cut list"
            hint="Write each piece with its cut size and how many, one per line."
            rows={6}
            error={e?.cutList?.message}
            {...register('block.cutList')}
          />
        )}
        {block.kind === 'grid' || block.kind === 'custom' ? (
          <TextField
            label="Seam allowance"
            hint={`${usual(units, '¼″', '6.35')} is usual.`}
            inputMode="decimal"
            unit={units}
            error={e?.seam?.message}
            {...register('block.seam')}
          />
        ) : (
          <p className="text-walnut-soft">Unit blocks use a ¼″ seam allowance: their cut formulas assume it.</p>
        )}
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField
            label="Tolerance on each side"
            hint={`How far from the unfinished size a block may be, either way. ${usual(units, '⅛″', '3.175')} is usual.`}
            inputMode="decimal"
            unit={units}
            error={formState.errors.tolerance?.message}
            {...register('tolerance')}
          />
          <TextField
            label="Squareness limit"
            hint={`Largest difference between the two diagonals. ${usual(units, '¼″', '6.35')} is usual.`}
            inputMode="decimal"
            unit={units}
            error={formState.errors.squareness?.message}
            {...register('squareness')}
          />
        </div>
      </div>
      <aside aria-live="polite" className="rounded-card bg-linen p-4">
        <p className="text-walnut-soft">Unfinished size (cut edge to cut edge)</p>
        {sizes ? (
          <>
            <p className="font-display text-3xl font-bold text-indigo-deep">{sizeText(sizes.unfinished, units)}</p>
            <p>Finished in the quilt: {sizeText(sizes.finished, units)}</p>
            {spec && <BlockPreview spec={spec} roles={roles} units={units} className="mt-4" />}
          </>
        ) : (
          <p className="mt-2">{problem ?? 'Fill in the sizes to see the block.'}</p>
        )}
      </aside>
    </div>
  );
}
