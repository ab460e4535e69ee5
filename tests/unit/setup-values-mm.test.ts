import { describe, expect, it } from 'vitest';
import { createSwapSchema } from '@shared/schemas/swaps';
import { blockSpecSchema } from '@shared/schemas/blocks';
import type { SwapDto } from '@shared/swap-types';
import {
  blockBody,
  defaultValues,
  lengthTextIn,
  parseBlock,
  toBody,
  validateValues,
  valuesFromSwap,
  type SetupValues,
} from '../../src/features/swaps/components/setup/setup-values';

// Every conversion below uses 1 in = 25.4 mm exactly (NIST SP 811, "Guide for the Use of the
// International System of Units", Appendix B.8).
const TZ = 'America/Chicago';
const NOW = Date.UTC(2026, 0, 5, 12);

function withGrid(v: SetupValues, column: string): SetupValues {
  return {
    ...v,
    title: 'Kestrel Hollow nine-patch',
    block: { ...v.block, kind: 'grid', columns: [{ value: column }], rows: [{ value: column }] },
  };
}

describe('swap set-up form in millimetre mode', () => {
  it('reads a bare 88.9 per column as 3½″ once the body is parsed', () => {
    const v = withGrid(defaultValues(TZ, 'usd', 'mm', NOW), '88.9');
    const body = toBody({ ...v, tolerance: '3.175', squareness: '6.35' }, TZ, 'mm');
    expect(body.block).toMatchObject({ columns: ['88.9 mm'], rows: ['88.9 mm'] });
    const parsed = createSwapSchema.parse(body);
    expect(parsed.block).toMatchObject({ kind: 'grid', columns: [3.5], rows: [3.5], seam: 0.25 });
    expect(parsed.tolerance).toBe(0.125); // 3.175 mm is ⅛″
    expect(parsed.squareness).toBe(0.25); // 6.35 mm is ¼″
    expect(validateValues(v, TZ, 'mm')).toEqual({});
  });

  it('leaves a length typed with its unit alone', () => {
    const v = withGrid(defaultValues(TZ, 'usd', 'mm', NOW), '3 1/2"');
    expect(blockBody(v.block, 'mm')).toMatchObject({ columns: ['3 1/2"'] });
    expect(blockSpecSchema.parse(blockBody(v.block, 'mm'))).toMatchObject({ columns: [3.5] });
  });

  it('works the live size out in millimetres', () => {
    const v = defaultValues(TZ, 'usd', 'mm', NOW);
    const { spec } = parseBlock({ ...v.block, kind: 'hst', finished: '76.2' }, 'mm');
    expect(spec).toMatchObject({ kind: 'hst', finished: 3 }); // 76.2 mm is 3″
    // The same bare number in inch mode is far too big for a unit, so it does not read as 3″.
    expect(parseBlock({ ...v.block, kind: 'hst', finished: '76.2' }, 'in').spec).not.toMatchObject({ finished: 3 });
  });

  it('starts a new swap with the usual sizes written in millimetres', () => {
    const v = defaultValues(TZ, 'usd', 'mm', NOW);
    const parsed = createSwapSchema.parse(toBody({ ...v, title: 'Starter' }, TZ, 'mm'));
    expect(parsed.block).toMatchObject({ columns: [3.5, 3.5, 3.5], seam: 0.25 });
    expect([parsed.tolerance, parsed.squareness]).toEqual([0.125, 0.25]);
  });

  it('shows a stored swap in millimetres when editing', () => {
    expect(lengthTextIn(3.5, 'mm')).toBe('88.9');
    expect(lengthTextIn(0.25, 'mm')).toBe('6.35');
    expect(lengthTextIn(0.125, 'mm')).toBe('3.175');
    const swap = {
      title: 'Kestrel Hollow stars',
      description: '',
      block: { kind: 'grid', columns: [3.5, 2], rows: [3.5], seam: 0.25 },
      tolerance: 0.125,
      squareness: 0.25,
      colourRules: [],
      quota: { min: 1, max: 4 },
      signupClosesAt: '2026-02-01T00:00:00.000Z',
      dueAt: '2026-03-01T00:00:00.000Z',
      signupReminderDays: 7,
      dueReminderDays: 2,
      mode: 'return',
      giftRecipient: null,
      fees: { entry: 0, postage: 0 },
      guild: { id: 1, name: 'Kestrel Hollow Quilters', timeZone: TZ },
    } as unknown as SwapDto;
    const v = valuesFromSwap(swap, 'usd', 'mm');
    expect(v.block.columns.map((c) => c.value)).toEqual(['88.9', '50.8']);
    expect([v.block.seam, v.tolerance, v.squareness]).toEqual(['6.35', '3.175', '6.35']);
    const parsed = createSwapSchema.parse(toBody(v, TZ, 'mm'));
    expect(parsed.block).toMatchObject({ columns: [3.5, 2], rows: [3.5], seam: 0.25 });
    expect([parsed.tolerance, parsed.squareness]).toEqual([0.125, 0.25]);
    // Inch mode shows the same swap as before.
    const inch = valuesFromSwap(swap, 'usd');
    expect(inch.block.columns.map((c) => c.value)).toEqual(['3½″', '2″']);
    expect([inch.block.seam, inch.tolerance, inch.squareness]).toEqual(['¼″', '⅛″', '¼″']);
  });
});

describe('swap set-up form in inch mode (unchanged)', () => {
  it('still reads a bare number as inches and sends it as typed', () => {
    const v = withGrid(defaultValues(TZ, 'usd', 'in', NOW), '3.5');
    expect(v.block.seam).toBe('1/4');
    expect([v.tolerance, v.squareness]).toEqual(['1/8', '1/4']);
    const body = toBody(v, TZ);
    expect(body.block).toMatchObject({ columns: ['3.5'], seam: '1/4' });
    expect(body.tolerance).toBe('1/8');
    const parsed = createSwapSchema.parse(body);
    expect(parsed.block).toMatchObject({ columns: [3.5], rows: [3.5], seam: 0.25 });
    expect(toBody(v, TZ, 'in')).toEqual(body);
  });
});
