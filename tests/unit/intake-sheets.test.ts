import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { LABEL_SHEETS, defaultSheet, paginate, perSheet, sheetById } from '../../src/features/intake/components/label-sheets';

const css = readFileSync(new URL('../../src/features/intake/components/labels.css', import.meta.url), 'utf8');

/** The custom properties of one `.sheet-<id>` rule, lengths in millimetres (converted by mathjs). */
function sheetRule(id: string): Record<string, number | string> {
  const body = new RegExp(`\\.sheet-${id}\\s*\\{([^}]*)\\}`).exec(css)?.[1];
  if (!body) throw new Error(`labels.css has no .sheet-${id} rule`);
  const props: Record<string, number | string> = {};
  for (const [, name, value] of body.matchAll(/(?<![\w-])--([\w-]+):([^;]+);/g)) {
    const length = /^([\d.]+)(mm|in)$/.exec(value!.trim());
    props[name!] = length
      ? unit(Number(length[1]), length[2]!).toNumber('mm')
      : /^\d+$/.test(value!.trim())
        ? Number(value)
        : value!.trim();
  }
  const page = /page:\s*([\w-]+);/.exec(body)?.[1];
  if (page) props.page = page;
  return props;
}

const printed = LABEL_SHEETS.filter((s) => s.page !== null);

describe('label sheet geometry', () => {
  it.each(printed.map((s) => [s.id, s] as const))('%s adds up to its page, with equal margins left and right', (id, sheet) => {
    const g = sheetRule(id) as Record<string, number>;
    expect(g.cols).toBe(sheet.columns);
    expect(g.rows).toBe(sheet.rows);
    const across = 2 * g.side! + sheet.columns * g['label-w']! + (sheet.columns - 1) * g['gap-x']!;
    const down = g.top! + sheet.rows * g['label-h']! + (sheet.rows - 1) * g['gap-y']!;
    expect(across).toBeCloseTo(g['page-w']!, 6);
    // Top and bottom margins match (within 0.01 mm) on every sheet here.
    expect(g['page-h']! - down).toBeCloseTo(g.top!, 2);
  });

  it('uses the page sizes of ISO 216 (A4 210 × 297 mm) and ANSI Letter (8.5 × 11 in)', () => {
    // ISO 216 A4 and the US Letter size (ANSI/ASME Y14.1), from memory; 25.4 mm to the inch (NIST SP 811).
    for (const s of printed) {
      const g = sheetRule(s.id);
      const [w, h] = s.page === 'A4' ? [210, 297] : [215.9, 279.4];
      expect(g['page-w']).toBeCloseTo(w, 6);
      expect(g['page-h']).toBeCloseTo(h, 6);
      expect(g.page).toBe(s.page === 'A4' ? 'a4-labels' : 'letter-labels');
    }
    expect(css).toMatch(/@page a4-labels\s*\{\s*size: 210mm 297mm;\s*margin: 0;/);
    expect(css).toMatch(/@page letter-labels\s*\{\s*size: 8\.5in 11in;\s*margin: 0;/);
  });

  it('gives each label the size its name promises', () => {
    const mm = (x: number, u: 'mm' | 'in') => unit(x, u).toNumber('mm');
    const expected: Record<string, [number, number]> = {
      'a4-21': [63.5, 38.1],
      'a4-14': [99.1, 38.1],
      'letter-30': [mm(2.625, 'in'), mm(1, 'in')],
      'letter-10': [mm(4, 'in'), mm(2, 'in')],
    };
    for (const s of printed) {
      const g = sheetRule(s.id);
      expect([g['label-w'], g['label-h']], s.id).toEqual(expected[s.id]);
    }
  });

  it('fits the QR code and its short code line inside each label', () => {
    for (const s of printed) {
      const g = sheetRule(s.id) as Record<string, number | string>;
      // CSS Values and Units Level 3: 1pt = 1/72 in (mathjs's 'pt' is a pint).
      const textMm = unit(Number(String(g.text).replace('pt', '')) / 72, 'in').toNumber('mm');
      const codeLine = 1.2 * textMm; // line height 1.2; the code line is never larger than the text
      expect((g.qr as number) + codeLine + 2 * (g.pad as number), s.id).toBeLessThan(g['label-h'] as number);
      // At least 0.45 mm a module for a version-2/3 code (25–29 modules + 2 × 2 quiet): readable by phone cameras
      // at a hand's width (common practice, no source).
      expect((g.qr as number) / 33, s.id).toBeGreaterThan(0.45);
    }
  });
});

describe('laying labels out', () => {
  const labels = Array.from({ length: 25 }, (_, i) => i + 1);

  it('puts 25 labels on two A4 sheets of 21 and one Letter sheet of 30', () => {
    expect(paginate(labels, sheetById('a4-21')).map((p) => p.length)).toEqual([21, 4]);
    expect(paginate(labels, sheetById('letter-30')).map((p) => p.length)).toEqual([25]);
    expect(paginate(labels, sheetById('a4-14')).map((p) => p.length)).toEqual([14, 11]);
    expect(paginate(labels, sheetById('letter-10')).map((p) => p.length)).toEqual([10, 10, 5]);
  });

  it('leaves used positions of a part-used first sheet blank, in reading order', () => {
    const pages = paginate(labels, sheetById('letter-30'), 11);
    expect(pages.map((p) => p.length)).toEqual([30, 6]);
    expect(pages[0]!.slice(0, 11).every((c) => c.kind === 'skipped')).toBe(true);
    expect(pages[0]![11]).toEqual({ kind: 'label', label: 1 });
    expect(pages[1]!.at(-1)).toEqual({ kind: 'label', label: 25 });
    // A whole sheet cannot be skipped, and nothing to print gives no sheets.
    expect(paginate(labels, sheetById('a4-21'), 99)[0]!.filter((c) => c.kind === 'skipped')).toHaveLength(
      perSheet(sheetById('a4-21')) - 1,
    );
    expect(paginate([], sheetById('a4-21'), 3)).toEqual([]);
  });

  it('starts readers in the US and Canada on Letter, everyone else on A4', () => {
    expect(defaultSheet('en-US')).toBe('letter-30');
    expect(defaultSheet('fr-CA')).toBe('letter-30');
    expect(defaultSheet('en-GB')).toBe('a4-21');
    expect(defaultSheet('de')).toBe('a4-21');
  });
});
