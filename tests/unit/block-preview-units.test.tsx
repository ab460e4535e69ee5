// @vitest-environment happy-dom
/**
 * The block drawing writes its sizes in the viewer's unit: a nine-patch cut from three 3½″ strips
 * each way is 9½″ cut and 9″ finished, which in millimetre mode reads 241.3 mm and 228.6 mm
 * (25.4 mm to the inch, NIST SP 811).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen } from '@testing-library/react';
import type { BlockSpec } from '../../shared/schemas/blocks';
import { BlockPreview } from '../../src/features/swaps/components/block-preview';
import { len, sizeText } from '../../src/lib/lengths';

const ninePatch: BlockSpec = { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 };

afterEach(cleanup);

describe('block drawing caption', () => {
  it('prints millimetres for a viewer in millimetre mode', () => {
    const { container } = render(<BlockPreview spec={ninePatch} units="mm" />);
    const caption = container.querySelector('figcaption')!.textContent;
    expect(caption).toBe('Solid edge: cut size 241.3 mm × 241.3 mm. Dashed line: seam line, finished size 228.6 mm × 228.6 mm.');
    expect(caption).not.toContain('″');
    expect(screen.getByRole('img').getAttribute('aria-label')).toBe(
      'Preview of the block: 241.3 mm × 241.3 mm unfinished, 228.6 mm × 228.6 mm finished.',
    );
  });

  it('prints inches by default and in inch mode', () => {
    for (const units of [undefined, 'in'] as const) {
      const { container } = render(<BlockPreview spec={ninePatch} {...(units ? { units } : {})} />);
      expect(container.querySelector('figcaption')!.textContent).toBe(
        'Solid edge: cut size 9½″ × 9½″. Dashed line: seam line, finished size 9″ × 9″.',
      );
      cleanup();
    }
  });
});

describe('shared client length text', () => {
  it('writes inches to the nearest 1/16″ and millimetres to a tenth', () => {
    expect(len(3 + 3 / 16)).toBe('3 3⁄16″');
    expect(len(3 + 3 / 16, 'mm')).toBe('81.0 mm');
    expect(sizeText({ width: 8.5, height: 11 })).toBe('8½″ × 11″');
    expect(sizeText({ width: 8.5, height: 11 }, 'mm')).toBe('215.9 mm × 279.4 mm');
  });
});
