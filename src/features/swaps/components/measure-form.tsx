import { useState } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { checkBlock, type CheckBlockResult } from '@shared/quilt';
import { measuringFormSchema, type MeasuringFormInput, type MeasuringFormOutput } from '@shared/schemas/intake';
import type { Units } from '@shared/schemas/auth';
import type { SwapDto } from '@shared/swap-types';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { ApiError } from '@/lib/api-client';
import { useMeasureBlock, type MeasurementAnswer } from '@/entities/block/api/measure-block';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';
import { useMe } from '@/entities/me/api/get-me';
import { measuringInUnits, unitsFor } from '@/entities/me/api/units';
import { newClientId } from '@/lib/client-id';
import { deviation, len, sizeText } from '@/lib/lengths';

type Field = keyof MeasuringFormInput;
const empty: MeasuringFormInput = { width: '', height: '', diagonal1: '', diagonal2: '' };
const schemaResolver = zodResolver(measuringFormSchema);

/** The verdict as the engine sees what is typed so far (a lone diagonal is left out), or null while it cannot be read. */
/** How far a side is off in the viewer's unit; a side exactly on size reads in words, not as a bare 0″. */
const deviationWords = (x: number, units: Units) => (x === 0 ? 'on size' : deviation(x, units));

function preview(swap: SwapDto, v: MeasuringFormInput): CheckBlockResult | null {
  const pair = v.diagonal1.trim() !== '' && v.diagonal2.trim() !== '';
  const parsed = measuringFormSchema.safeParse(pair ? v : { ...v, diagonal1: '', diagonal2: '' });
  if (!parsed.success) return null;
  try {
    return checkBlock({ target: swap.unfinished, tolerance: swap.tolerance, squareness: swap.squareness, measured: parsed.data });
  } catch {
    return null;
  }
}

/** A field named by the server ("diagonals.1") as the box it came from. */
const fieldOf = (path: string): Field =>
  path.startsWith('diagonals') ? (path.endsWith('1') ? 'diagonal2' : 'diagonal1') : (path as Field);

/**
 * Width, height and optional diagonals in any format parseLength reads, checked by the same schema
 * as the intake's measuring card. The verdict shows as soon as the numbers can be read; on saving,
 * the server's own verdict replaces it.
 */
export function MeasureForm({
  swap,
  blockId,
  source,
  label,
  onSaved,
}: {
  swap: SwapDto;
  blockId: number;
  source: 'ruler' | 'maker';
  label: string;
  onSaved?: (m: MeasurementAnswer) => void;
}) {
  const measure = useMeasureBlock(swap.id);
  // A bare number is in the person's unit (their own, or the guild's until they choose).
  const units = unitsFor(useMe().data, swap.guildId);
  const resolver: Resolver<MeasuringFormInput, unknown, MeasuringFormOutput> = (values, context, options) =>
    schemaResolver(measuringInUnits(values, units), context, options);
  const form = useForm<MeasuringFormInput, unknown, MeasuringFormOutput>({
    resolver,
    defaultValues: empty,
  });
  const values = useWatch({ control: form.control }) as MeasuringFormInput;
  const [saved, setSaved] = useState<MeasurementAnswer | null>(null);
  const [problem, setProblem] = useState('');
  // One id per entry: a retry after a lost answer is recorded once.
  const [clientId, setClientId] = useState(newClientId);
  const live = preview(swap, measuringInUnits(values, units));
  const e = form.formState.errors;
  // Fractions need a space and a slash, which the number pad lacks.
  const inputMode = units === 'mm' ? 'decimal' : 'text';

  const onSubmit = form.handleSubmit(async (v) => {
    setProblem('');
    setSaved(null);
    try {
      const answer = await measure.mutateAsync({ blockId, ...v, source, clientId });
      setSaved(answer);
      setClientId(newClientId());
      form.reset(empty);
      onSaved?.(answer);
    } catch (error) {
      if (error instanceof ApiError) {
        for (const [path, message] of Object.entries(error.fields)) form.setError(fieldOf(path), { message });
        setProblem(error.message);
      } else setProblem('The measurement could not be saved. Nothing you typed is lost; please try again.');
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={label}>
      <p className="text-walnut-soft">
        Target {sizeText(swap.unfinished, units)} ± {len(swap.tolerance, units)}.{' '}
        {units === 'mm' ? 'Type 241.3, or 9½″ with its mark.' : 'Type 9 1/2, 9½, 9.5 or 241 mm.'}
      </p>
      {problem && <Alert tone="error">{problem}</Alert>}
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Width"
          inputMode={inputMode}
          unit={units}
          autoComplete="off"
          error={e.width?.message}
          {...form.register('width')}
        />
        <TextField
          label="Height"
          inputMode={inputMode}
          unit={units}
          autoComplete="off"
          error={e.height?.message}
          {...form.register('height')}
        />
        <TextField
          label="Diagonal, corner to corner"
          hint="Optional; give both or neither."
          inputMode={inputMode}
          unit={units}
          autoComplete="off"
          error={e.diagonal1?.message}
          {...form.register('diagonal1')}
        />
        <TextField
          label="Other diagonal"
          hint="Optional."
          inputMode={inputMode}
          unit={units}
          autoComplete="off"
          error={e.diagonal2?.message}
          {...form.register('diagonal2')}
        />
      </div>
      <div aria-live="polite" className="min-h-8">
        {live && !saved && (
          <p className="flex flex-wrap items-center gap-2">
            <span>As typed:</span> <VerdictBadge verdict={live.verdict} />
            <span className="text-walnut-soft">
              width {deviationWords(live.deviations.width, units)}, height {deviationWords(live.deviations.height, units)}
              {live.deviations.diagonal !== undefined &&
                `, diagonals differ by ${deviation(Math.abs(live.deviations.diagonal), units)}`}
            </span>
          </p>
        )}
        {saved && (
          <p className="flex flex-wrap items-center gap-2" role="status">
            <span className="font-semibold">Saved:</span> <VerdictBadge verdict={saved.verdict} source={saved.source} />
            <span className="text-walnut-soft">({sizeText(saved, units)})</span>
          </p>
        )}
      </div>
      <Button type="submit" pending={measure.isPending} pendingLabel="Saving…">
        Save measurement
      </Button>
    </form>
  );
}
