import { useState } from 'react';
import { parseLength } from '@shared/quilt';
import { MAX_BORDER, MAX_BORDERS, MAX_DESIGN_SIDE, MAX_SASHING } from '@shared/schemas/designs';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import type { Layout } from '../lib/layout';
import { borderColour, SETTING_COLOURS } from '../lib/palette';

/** A length box that keeps what was typed and says what is wrong beside it. */
function LengthField({
  label,
  value,
  max,
  zero,
  hint,
  onValid,
}: {
  label: string;
  value: number;
  max: number;
  zero: boolean;
  hint?: string;
  onValid: (x: number) => void;
}) {
  const [text, setText] = useState(value ? String(value) : zero ? '0' : '');
  const [error, setError] = useState<string>();
  const check = (t: string) => {
    setText(t);
    let x: number;
    try {
      x = t.trim() === '' && zero ? 0 : parseLength(t);
    } catch (e) {
      setError((e as Error).message);
      return;
    }
    if (x > max) return setError(`Use at most ${max}″.`);
    if (!zero && x <= 0) return setError('Use more than zero.');
    setError(undefined);
    onValid(x);
  };
  return (
    <TextField
      label={label}
      hint={hint}
      value={text}
      maxLength={40}
      inputMode="decimal"
      unit="in"
      error={error}
      onChange={(e) => check(e.target.value)}
    />
  );
}

function CountField({ label, value, onValid }: { label: string; value: number; onValid: (n: number) => void }) {
  const [text, setText] = useState(String(value));
  const [error, setError] = useState<string>();
  return (
    <TextField
      label={label}
      value={text}
      inputMode="numeric"
      maxLength={2}
      error={error}
      onChange={(e) => {
        setText(e.target.value);
        const n = Number(e.target.value);
        if (!Number.isInteger(n) || n < 1 || n > MAX_DESIGN_SIDE)
          return setError(`Use a whole number from 1 to ${MAX_DESIGN_SIDE}.`);
        setError(undefined);
        onValid(n);
      }}
    />
  );
}

function Check({
  label,
  checked,
  onChange,
  hint,
}: {
  label: string;
  checked: boolean;
  onChange: (on: boolean) => void;
  hint?: string;
}) {
  return (
    <label className="flex min-h-11 items-start gap-3">
      <input
        type="checkbox"
        className="mt-1 h-6 w-6 accent-indigo"
        checked={checked}
        onChange={(e) => onChange(e.target.checked)}
      />
      <span>
        <span className="font-semibold">{label}</span>
        {hint && <span className="block text-base text-walnut-soft">{hint}</span>}
      </span>
    </label>
  );
}

/** Grid size and setting: sashing with or without cornerstones, plain alternate blocks, borders. */
export function SettingPanel({
  layout,
  square,
  onResize,
  onChange,
  onAlternate,
}: {
  layout: Layout;
  square: boolean;
  onResize: (columns: number, rows: number) => void;
  onChange: (patch: Partial<Pick<Layout, 'sashing' | 'cornerstones' | 'borders'>>) => void;
  onAlternate: (on: boolean) => void;
}) {
  // Borders get a key of their own so removing one keeps what was typed in the others.
  const [borderKeys, setBorderKeys] = useState(() => layout.borders.map((_, i) => i));
  const [nextKey, setNextKey] = useState(layout.borders.length);
  return (
    <div className="space-y-4">
      <div className="grid grid-cols-2 gap-3">
        <CountField label="Blocks across" value={layout.columns} onValid={(n) => onResize(n, layout.rows)} />
        <CountField label="Blocks down" value={layout.rows} onValid={(n) => onResize(layout.columns, n)} />
      </div>
      <Check
        label="Plain alternate blocks (checkerboard)"
        hint={`Every other cell becomes a plain block, shown in ${SETTING_COLOURS.plain.name}.`}
        checked={layout.alternate}
        onChange={onAlternate}
      />
      <LengthField
        label="Sashing width (finished)"
        hint={`0 for none; shown in ${SETTING_COLOURS.sashing.name}.`}
        value={layout.sashing}
        max={MAX_SASHING}
        zero
        onValid={(x) => onChange({ sashing: x })}
      />
      {layout.sashing > 0 && (
        <Check
          label="Cornerstones where sashing strips meet"
          hint={`Shown in ${SETTING_COLOURS.cornerstones.name}; without them long strips join the rows.`}
          checked={layout.cornerstones}
          onChange={(on) => onChange({ cornerstones: on })}
        />
      )}
      <fieldset className="space-y-3">
        <legend className="font-semibold">Borders, innermost first</legend>
        {borderKeys.map((key, i) => (
          <div key={key} className="flex items-end gap-2">
            <div className="min-w-0 flex-1">
              <LengthField
                label={`Border ${i + 1} width (finished), shown in ${borderColour(i).name}`}
                value={layout.borders[i] ?? 2}
                max={MAX_BORDER}
                zero={false}
                onValid={(x) => onChange({ borders: layout.borders.map((b, j) => (j === i ? x : b)) })}
              />
            </div>
            <Button
              variant="secondary"
              aria-label={`Remove border ${i + 1}`}
              onClick={() => {
                setBorderKeys((k) => k.filter((_, j) => j !== i));
                onChange({ borders: layout.borders.filter((_, j) => j !== i) });
              }}
            >
              Remove
            </Button>
          </div>
        ))}
        {layout.borders.length < MAX_BORDERS && (
          <Button
            variant="secondary"
            onClick={() => {
              setBorderKeys((k) => [...k, nextKey]);
              setNextKey((n) => n + 1);
              onChange({ borders: [...layout.borders, 2] });
            }}
          >
            Add a border
          </Button>
        )}
      </fieldset>
      {!square && (
        <p className="text-base text-walnut-soft">This swap’s block is not square, so blocks turn half way round (180°) only.</p>
      )}
    </div>
  );
}
