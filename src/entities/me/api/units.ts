import type { MeDto } from '@shared/types';
import type { Units } from '@shared/schemas/auth';

/**
 * The unit a bare number means for this person: their own choice once they made one, otherwise the
 * guild's default there. Outside any guild (the planner) a person who has not chosen follows their
 * guilds when they all agree, and inches otherwise.
 */
export function unitsFor(me: MeDto | null | undefined, guildId?: number): Units {
  if (!me) return 'in';
  if (me.user.unitsChosen) return me.user.units;
  if (guildId !== undefined) return me.memberships.find((m) => m.guildId === guildId)?.defaultUnit ?? me.user.units;
  const defaults = new Set(me.memberships.map((m) => m.defaultUnit));
  return defaults.size === 1 ? [...defaults][0]! : me.user.units;
}

/** No unit letters or quote marks: a bare number, which in millimetre mode means millimetres. */
const BARE = /^[^a-z"'″“”′’]*$/i;

/** A typed length as the shared schemas read it: a bare number gets the person's unit written after it. */
export function withUnit(text: string, units: Units): string {
  return units === 'mm' && text.trim() !== '' && BARE.test(text) ? `${text.trim()} mm` : text;
}

/** Every box of a measuring form (width, height, diagonals) through `withUnit`. */
export function measuringInUnits<T extends { width: string; height: string; diagonal1: string; diagonal2: string }>(
  values: T,
  units: Units,
): T {
  if (units === 'in') return values;
  return {
    ...values,
    width: withUnit(values.width, units),
    height: withUnit(values.height, units),
    diagonal1: withUnit(values.diagonal1, units),
    diagonal2: withUnit(values.diagonal2, units),
  };
}
