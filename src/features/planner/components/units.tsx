import { len } from '@/lib/lengths';
import type { Units } from '../hooks/use-length-field';

export type { Units };
export type LengthFormat = (inches: number) => string;

export function useLengthFormat(units: Units): LengthFormat {
  return (inches) => len(inches, units);
}

export function UnitsToggle({ units, onChange }: { units: Units; onChange(u: Units): void }) {
  return (
    <fieldset className="flex items-center gap-2">
      <legend className="sr-only">Show lengths in</legend>
      {(['in', 'mm'] as const).map((u) => (
        <label
          key={u}
          className={`inline-flex min-h-11 cursor-pointer items-center rounded-lg border-2 px-4 font-semibold ${units === u ? 'border-indigo bg-indigo text-white' : 'border-walnut/30 bg-card text-indigo'}`}
        >
          <input type="radio" name="units" value={u} checked={units === u} onChange={() => onChange(u)} className="sr-only" />
          {u === 'in' ? 'Inches' : 'Millimetres'}
        </label>
      ))}
    </fieldset>
  );
}
