import { useEffect, useState } from 'react';
import { useSearchParams } from 'react-router';
import { convertTyped, type Units } from './use-length-field';

/** Everything typed into the planner, exactly as typed. */
export interface PlannerInputs {
  units: Units;
  kind: string;
  columns: string;
  rows: string;
  seam: string;
  finished: string;
  geeseWidth: string;
  geeseHeight: string;
  wof: string;
  /** "yes" once the person has confirmed an unusually narrow fabric */
  narrowOk: string;
  hstMethod: string;
  geeseMethod: string;
  count: string;
  /** empty while "Blocks in the quilt" follows "How many blocks" */
  quiltBlocks: string;
  across: string;
  sashing: string;
  borders: string;
  binding: string;
}

/** Short names in the page address, so a plan can be bookmarked and shared. */
const keys: Record<keyof PlannerInputs, string> = {
  units: 'u',
  kind: 'kind',
  columns: 'cols',
  rows: 'rows',
  seam: 'seam',
  finished: 'fin',
  geeseWidth: 'gw',
  geeseHeight: 'gh',
  wof: 'wof',
  narrowOk: 'narrow',
  hstMethod: 'hst',
  geeseMethod: 'geese',
  count: 'n',
  quiltBlocks: 'qn',
  across: 'across',
  sashing: 'sash',
  borders: 'borders',
  binding: 'bind',
};

/** Lengths that are written in a unit (and rewritten when the unit changes); the flag marks lists. */
const lengthFields: [Exclude<keyof PlannerInputs, 'units'>, boolean][] = [
  ['columns', true],
  ['rows', true],
  ['seam', false],
  ['finished', false],
  ['geeseWidth', false],
  ['geeseHeight', false],
  ['wof', false],
  ['sashing', false],
  ['borders', true],
  ['binding', false],
];

const inchDefaults: PlannerInputs = {
  units: 'in',
  kind: 'grid',
  columns: '4, 3, 2, 1',
  rows: '4, 3, 2, 1',
  seam: '1/4',
  finished: '3',
  geeseWidth: '6',
  geeseHeight: '3',
  wof: '42',
  narrowOk: '',
  hstMethod: 'two-at-a-time',
  geeseMethod: 'no-waste',
  count: '12',
  quiltBlocks: '',
  across: '',
  sashing: '',
  borders: '',
  binding: '2 1/2',
};

const MAX_PARAM = 200;

/** The same inputs with every length rewritten from one unit into the other. */
export function inUnits(inputs: PlannerInputs, units: Units): PlannerInputs {
  const next = { ...inputs, units };
  for (const [field, list] of lengthFields) next[field] = convertTyped(inputs[field], inputs.units, units, list);
  return next;
}

function fromParams(params: URLSearchParams, defaultUnits: Units): PlannerInputs {
  const asked = params.get(keys.units);
  const units: Units = asked === 'mm' || asked === 'in' ? asked : defaultUnits;
  const start = units === 'in' ? inchDefaults : inUnits(inchDefaults, units);
  const out = { ...start };
  for (const field of Object.keys(keys) as (keyof PlannerInputs)[]) {
    const value = params.get(keys[field]);
    if (value !== null && field !== 'units') out[field] = value.slice(0, MAX_PARAM);
  }
  return out;
}

/**
 * The planner's inputs, kept exactly as typed and mirrored into the page address (replacing the history
 * entry, so Back leaves the planner rather than undoing keystrokes). Only values that differ from the
 * defaults are written, so the address stays short.
 */
export function usePlannerState(defaultUnits: Units) {
  const [params, setParams] = useSearchParams();
  const [inputs, setInputs] = useState<PlannerInputs>(() => fromParams(params, defaultUnits));

  useEffect(() => {
    const defaults = inputs.units === 'in' ? inchDefaults : inUnits(inchDefaults, inputs.units);
    const next = new URLSearchParams();
    for (const field of Object.keys(keys) as (keyof PlannerInputs)[]) {
      if (field === 'units' ? inputs.units !== defaultUnits : inputs[field] !== defaults[field])
        next.set(keys[field], inputs[field]);
    }
    if (next.toString() !== new URLSearchParams(window.location.search).toString())
      setParams(next, { replace: true, preventScrollReset: true });
  }, [inputs, defaultUnits, setParams]);

  const set = (field: keyof PlannerInputs, value: string) => setInputs((prev) => ({ ...prev, [field]: value }));
  const setUnits = (units: Units) => setInputs((prev) => inUnits(prev, units));
  return { inputs, set, setUnits };
}
