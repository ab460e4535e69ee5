/**
 * Label sheets described by size, as sold by many makers. The exact geometry (margins, gaps) lives in
 * labels.css as custom properties per sheet; tests/unit/intake-sheets.test.ts checks the two agree
 * and that each sheet adds up to its page. Sizes are common practice, no source (from memory).
 */
import type { LabelSheetId } from '@shared/schemas/intake';

export interface LabelSheet {
  id: LabelSheetId;
  name: string;
  page: 'A4' | 'Letter' | null;
  columns: number;
  rows: number;
  /** the label's size as printed on the packet */
  size: string;
}

export const LABEL_SHEETS: readonly LabelSheet[] = [
  { id: 'a4-21', name: 'A4, 21 labels (3 × 7)', page: 'A4', columns: 3, rows: 7, size: '63.5 × 38.1 mm' },
  { id: 'a4-14', name: 'A4, 14 labels (2 × 7)', page: 'A4', columns: 2, rows: 7, size: '99.1 × 38.1 mm' },
  { id: 'letter-30', name: 'US Letter, 30 labels (3 × 10)', page: 'Letter', columns: 3, rows: 10, size: '2⅝ × 1 in' },
  { id: 'letter-10', name: 'US Letter, 10 labels (2 × 5)', page: 'Letter', columns: 2, rows: 5, size: '4 × 2 in' },
  { id: 'single', name: 'One label at a time, on this screen', page: null, columns: 1, rows: 1, size: 'screen' },
];

export const sheetById = (id: LabelSheetId): LabelSheet => LABEL_SHEETS.find((s) => s.id === id)!;

export const perSheet = (sheet: LabelSheet) => sheet.columns * sheet.rows;

/** US and Canadian readers get Letter by default, everyone else A4. */
export function defaultSheet(language: string): LabelSheetId {
  return /-(?:US|CA)\b/i.test(language) ? 'letter-30' : 'a4-21';
}

export type SheetCell<T> = { kind: 'label'; label: T } | { kind: 'skipped' };

/**
 * Lays labels out on sheets: `skip` positions of the first sheet stay empty (labels already used
 * from a part-used sheet), the rest fill row by row. Returns one array of cells per sheet.
 */
export function paginate<T>(labels: readonly T[], sheet: LabelSheet, skip = 0): SheetCell<T>[][] {
  const size = perSheet(sheet);
  const skipped = Math.max(0, Math.min(Math.trunc(skip), size - 1));
  const cells: SheetCell<T>[] = [
    ...Array.from({ length: skipped }, () => ({ kind: 'skipped' as const })),
    ...labels.map((label) => ({ kind: 'label' as const, label })),
  ];
  const pages: SheetCell<T>[][] = [];
  for (let i = 0; i < cells.length; i += size) pages.push(cells.slice(i, i + size));
  return labels.length === 0 ? [] : pages;
}
