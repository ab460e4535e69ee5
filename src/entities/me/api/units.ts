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
