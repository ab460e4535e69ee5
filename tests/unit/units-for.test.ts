import { describe, expect, it } from 'vitest';
import type { MeDto } from '@shared/types';
import { measuringFormSchema } from '@shared/schemas/intake';
import { measuringInUnits, unitsFor, withUnit } from '../../src/entities/me/api/units';

const me = (units: 'in' | 'mm', unitsChosen: boolean, defaults: ('in' | 'mm')[]): MeDto => ({
  user: { id: 1, email: 'a@example.test', displayName: 'A', units, unitsChosen, mailingAddress: null },
  memberships: defaults.map((d, i) => ({ guildId: i + 1, guildName: `G${i}`, role: 'member', defaultUnit: d })),
});

describe('unitsFor', () => {
  it('follows the guild until the person chooses, then their choice everywhere', () => {
    expect(unitsFor(me('in', false, ['mm', 'in']), 1)).toBe('mm');
    expect(unitsFor(me('in', false, ['mm', 'in']), 2)).toBe('in');
    expect(unitsFor(me('in', true, ['mm']), 1)).toBe('in');
    expect(unitsFor(me('mm', true, ['in']), 1)).toBe('mm');
  });
  it('outside a guild follows the guilds when they agree, else the stored unit', () => {
    expect(unitsFor(me('in', false, ['mm', 'mm']))).toBe('mm');
    expect(unitsFor(me('in', false, ['mm', 'in']))).toBe('in');
    expect(unitsFor(null)).toBe('in');
  });
});

describe('withUnit', () => {
  it('writes millimetres after a bare number only, in millimetre mode', () => {
    expect(withUnit('241.3', 'mm')).toBe('241.3 mm');
    expect(withUnit('9 1/2"', 'mm')).toBe('9 1/2"');
    expect(withUnit('24 cm', 'mm')).toBe('24 cm');
    expect(withUnit('241.3', 'in')).toBe('241.3');
    expect(withUnit('  ', 'mm')).toBe('  ');
  });
  it('makes the measuring schema read a bare 241.3 as 9½″ (1 in = 25.4 mm exactly, NIST SP 811, Appendix B.8)', () => {
    const parsed = measuringFormSchema.parse(
      measuringInUnits({ width: '241.3', height: '9½″', diagonal1: '', diagonal2: '' }, 'mm'),
    );
    expect(parsed.width).toBeCloseTo(9.5, 12);
    expect(parsed.height).toBe(9.5);
  });
});
