import { useFieldArray, useWatch, type UseFormReturn } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import type { Units } from '@shared/schemas/auth';
import { BlockPreview } from '../block-preview';
import { parseBlock, type SetupValues } from './setup-values';

/** Fabric roles with notes, and for grid blocks which role goes in each cell. */
export function StepFabric({ form, units }: { form: UseFormReturn<SetupValues>; units: Units }) {
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'colourRules' });
  const errors = form.formState.errors;
  const block = useWatch({ control: form.control, name: 'block' });
  const rules = useWatch({ control: form.control, name: 'colourRules' });
  const roleNames = [...new Set(rules.map((r) => r.role.trim()).filter(Boolean))];

  const { spec } = parseBlock(block);
  const fill = (role: (r: number, c: number) => string) =>
    form.setValue(
      'block.roles',
      block.rows.map((_, r) => block.columns.map((__, c) => role(r, c))),
      { shouldDirty: true },
    );

  const setCell = (row: number, col: number, role: string) => {
    const next = Array.from({ length: block.rows.length }, (_, r) =>
      Array.from({ length: block.columns.length }, (_, c) => (r === row && c === col ? role : (block.roles[r]?.[c] ?? ''))),
    );
    form.setValue('block.roles', next, { shouldDirty: true });
  };

  return (
    <div className="space-y-8">
      <fieldset className="space-y-4">
        <legend className="text-xl font-semibold text-indigo-deep">Fabric roles and colour rules</legend>
        <p className="text-walnut-soft">
          Name each fabric the block uses (light, dark, print…) and say what makers should choose. No brand names needed.
        </p>
        {fields.map((field, i) => (
          <div
            key={field.id}
            className="grid gap-3 rounded-lg border border-walnut/15 p-3 sm:grid-cols-[12rem_1fr_auto] sm:items-end"
          >
            <TextField
              label={`Fabric ${i + 1}`}
              error={errors.colourRules?.[i]?.role?.message}
              {...form.register(`colourRules.${i}.role` as const)}
            />
            <TextField
              label="Rule"
              hint="e.g. cream to pale gold, no white"
              error={errors.colourRules?.[i]?.note?.message}
              {...form.register(`colourRules.${i}.note` as const)}
            />
            <Button variant="quiet" onClick={() => remove(i)}>
              Remove<span className="sr-only"> fabric {i + 1}</span>
            </Button>
          </div>
        ))}
        <Button variant="secondary" onClick={() => append({ role: '', note: '' })} disabled={fields.length >= 12}>
          Add a fabric
        </Button>
      </fieldset>

      {block.kind === 'grid' && roleNames.length > 0 && (
        <fieldset className="space-y-3">
          <legend className="text-xl font-semibold text-indigo-deep">Which fabric goes where</legend>
          <p className="text-walnut-soft">
            Optional. Choose a fabric for every cell to get a strip-set recipe per fabric; leave all empty to skip.
          </p>
          {errors.block?.roles?.message && (
            <p role="alert" className="font-semibold text-madder-deep">
              {errors.block.roles.message}
            </p>
          )}
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => fill((r, c) => block.roles[r]?.[c] || roleNames[0]!)}>
              Fill empty cells with {roleNames[0]}
            </Button>
            {roleNames.length > 1 && (
              <Button variant="secondary" onClick={() => fill((r, c) => roleNames[(r + c) % 2 === 0 ? 1 : 0]!)}>
                Checkerboard
              </Button>
            )}
            <Button variant="quiet" onClick={() => form.setValue('block.roles', [], { shouldDirty: true })}>
              Clear
            </Button>
          </div>
          <div className="flex flex-wrap items-start gap-6">
            <div className="relative overflow-x-auto">
              <table className="border-collapse">
                <caption className="sr-only">Fabric of each cell, row by row</caption>
                <tbody>
                  {block.rows.map((_, r) => (
                    <tr key={r}>
                      {block.columns.map((__, c) => (
                        <td key={c} className="p-1">
                          <select
                            aria-label={`Row ${r + 1}, column ${c + 1}`}
                            className="min-h-11 rounded-lg border-2 border-walnut/30 bg-white px-2"
                            value={block.roles[r]?.[c] ?? ''}
                            onChange={(e) => setCell(r, c, e.target.value)}
                          >
                            <option value="">—</option>
                            {roleNames.map((n) => (
                              <option key={n} value={n}>
                                {n}
                              </option>
                            ))}
                          </select>
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {spec && <BlockPreview spec={spec} roles={roleNames} units={units} className="w-56" />}
          </div>
        </fieldset>
      )}
    </div>
  );
}
