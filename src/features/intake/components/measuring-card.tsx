import { useRef } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { formatLength } from '@shared/quilt';
import {
  measuringFormSchema,
  type IntakeBlockDto,
  type MeasuringFormInput,
  type MeasuringFormOutput,
} from '@shared/schemas/intake';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';
import { measuringInUnits } from '@/entities/me/api/units';

const schemaResolver = zodResolver(measuringFormSchema);

interface Props {
  block: IntakeBlockDto;
  target: { width: number; height: number };
  tolerance: number;
  units: 'in' | 'mm';
  onMeasured: (m: MeasuringFormOutput) => void;
  onCancel: () => void;
}

/**
 * Keyboard-first: the width box has focus, Tab to the height, Enter records (diagonals are optional),
 * Escape closes the card. On a phone the keyboard's Next key (Enter in the width box) moves to the
 * height and its Save key records. Lengths in any form: 9 1/2, 9½″, 9.5, 241 mm; a bare number is in
 * the person's unit.
 */
export function MeasuringCard({ block, target, tolerance, units, onMeasured, onCancel }: Props) {
  const resolver: Resolver<MeasuringFormInput, unknown, MeasuringFormOutput> = (values, context, options) =>
    schemaResolver(measuringInUnits(values, units), context, options);
  const form = useForm<MeasuringFormInput, unknown, MeasuringFormOutput>({
    resolver,
    defaultValues: { width: '', height: '', diagonal1: '', diagonal2: '' },
  });
  const { errors } = form.formState;
  const heightField = form.register('height');
  const heightInput = useRef<HTMLInputElement | null>(null);
  // Fractions need a space and a slash, which the number pad lacks; millimetres need only digits and a point.
  const inputMode = units === 'mm' ? 'decimal' : 'text';
  const size = `${formatLength(target.width, { unit: units })} × ${formatLength(target.height, { unit: units })}`;
  return (
    <section aria-labelledby="measuring-title" className="seam rounded-card border-2 border-indigo bg-card p-5">
      <form
        noValidate
        onSubmit={form.handleSubmit(onMeasured)}
        onKeyDown={(e) => {
          if (e.key === 'Escape') onCancel();
        }}
      >
        <h2 id="measuring-title" className="text-2xl font-bold text-indigo-deep">
          Block {block.ordinal} of {block.of} · {block.maker.displayName}
        </h2>
        <p className="text-walnut-soft">
          Received. Target {size} unfinished, ± {formatLength(tolerance, { unit: units })}.{' '}
          {block.state === 'measured' && block.verdict && (
            <>
              Measured before: <VerdictBadge verdict={block.verdict} />; a new measurement replaces it.
            </>
          )}
        </p>
        <div className="mt-4 grid grid-cols-2 gap-3">
          <TextField
            label="Width"
            autoFocus
            inputMode={inputMode}
            autoComplete="off"
            autoCapitalize="off"
            enterKeyHint="next"
            unit={units}
            className="text-2xl"
            error={errors.width?.message}
            onKeyDown={(e) => {
              // The phone keyboard's Next key: on to the height rather than recording half a measurement.
              if (e.key === 'Enter' && !e.nativeEvent.isComposing) {
                e.preventDefault();
                // At once, not as the form library's setFocus does (on a timer): a fast typist or a
                // keyboard wedge sends the height's first keys within milliseconds of Next.
                heightInput.current?.focus();
              }
            }}
            {...form.register('width')}
          />
          <TextField
            label="Height"
            inputMode={inputMode}
            autoComplete="off"
            autoCapitalize="off"
            enterKeyHint="done"
            unit={units}
            className="text-2xl"
            error={errors.height?.message}
            {...heightField}
            ref={(el) => {
              heightField.ref(el);
              heightInput.current = el;
            }}
          />
        </div>
        <fieldset className="mt-3">
          <legend className="font-semibold">Diagonals (optional, for squareness)</legend>
          <div className="grid grid-cols-2 gap-3">
            <TextField
              label="Diagonal 1"
              inputMode={inputMode}
              unit={units}
              autoComplete="off"
              error={errors.diagonal1?.message}
              {...form.register('diagonal1')}
            />
            <TextField
              label="Diagonal 2"
              inputMode={inputMode}
              unit={units}
              autoComplete="off"
              error={errors.diagonal2?.message}
              {...form.register('diagonal2')}
            />
          </div>
        </fieldset>
        <div className="mt-4 flex flex-wrap items-center gap-3">
          <Button type="submit">Record measurement</Button>
          <Button variant="quiet" onClick={onCancel}>
            Not now
          </Button>
          <span className="hidden text-base text-walnut-soft sm:inline">Enter records · Esc closes</span>
          <span className="text-base text-walnut-soft sm:hidden">Width, Next, height, Save</span>
        </div>
      </form>
    </section>
  );
}
