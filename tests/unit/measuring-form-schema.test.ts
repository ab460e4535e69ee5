import { describe, expect, it } from 'vitest';
import { checkBlock } from '../../shared/quilt';
import { measuringFormSchema } from '../../shared/schemas/intake';

const form = (v: Partial<Record<'width' | 'height' | 'diagonal1' | 'diagonal2', string>>) =>
  measuringFormSchema.safeParse({ width: '', height: '', diagonal1: '', diagonal2: '', ...v });

describe('the measuring form’s entries (intake card and swap page)', () => {
  it('reads lengths in any form parseLength knows, in inches', () => {
    // 241.3 mm = 9.5 in exactly (25.4 mm to the inch, NIST SP 811).
    expect(form({ width: '9 1/2', height: '241.3 mm' })).toEqual({ success: true, data: { width: 9.5, height: 9.5 } });
    expect(form({ width: '9½″', height: '9-5/8"', diagonal1: '13 1/2', diagonal2: '13.375' })).toEqual({
      success: true,
      data: { width: 9.5, height: 9.625, diagonals: [13.5, 13.375] },
    });
  });

  it('names the field and the problem, and asks for diagonals in pairs', () => {
    const issues = (r: ReturnType<typeof form>) =>
      Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));
    expect(issues(form({ height: '9.5' }))).toEqual({ width: 'Type the width, e.g. 9 1/2 or 241 mm.' });
    expect(issues(form({ width: 'nine', height: '0' }))).toEqual({
      width: expect.stringContaining('“nine” is not a length'),
      height: 'The height must be more than zero.',
    });
    expect(issues(form({ width: '9.5', height: '9.5', diagonal1: '13.4' }))).toEqual({
      diagonal2: 'Give both diagonals, or neither.',
    });
    expect(issues(form({ width: '950', height: '9.5' }))).toEqual({ width: 'The width must be at most 120″.' });
  });

  it('gives the same verdict on the device as the engine does for the server’s stored value', () => {
    // The server stores four decimals; a metric entry rounds there, and the verdict must not change.
    const target = { width: 9.5, height: 9.5 };
    // 238.125 mm is exactly 9⅜″, the lower edge of 9½″ ± ⅛″; 238.1 mm is just under it.
    for (const [w, h, verdict] of [
      ['238.125 mm', '9.5', 'true'],
      ['238.1 mm', '9.5', 'short'],
      ['9 3/8', '9 5/8', 'true'],
      ['9 11/32', '9.5', 'short'],
      ['9 21/32', '9.5', 'trim'],
    ] as const) {
      const parsed = form({ width: w, height: h });
      if (!parsed.success) throw parsed.error;
      const here = checkBlock({ target, tolerance: 0.125, squareness: 0.25, measured: parsed.data });
      const four = (x: number) => Math.round(x * 10_000) / 10_000;
      const stored = checkBlock({
        target,
        tolerance: 0.125,
        squareness: 0.25,
        measured: { width: four(parsed.data.width), height: four(parsed.data.height) },
      });
      expect([here.verdict, stored.verdict], `${w} × ${h}`).toEqual([verdict, verdict]);
    }
  });
});
