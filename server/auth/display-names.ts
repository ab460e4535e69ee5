import { Op } from 'sequelize';
import { cleanDisplayName, displayNameKey } from '@shared/schemas/auth';
import { Guild, Membership, User } from '../db/models';
import { AppError } from '../http/errors';

/**
 * Refuses a display name another active member of one of `guildIds` already has (compared without
 * case, spacing or look-alike forms), so nobody can pass for someone else in a guild. The answer
 * suggests a name that is free.
 */
export async function assertNameFreeInGuilds(userId: number, rawName: string, guildIds: number[], email?: string): Promise<void> {
  if (!guildIds.length) return;
  const others = await Membership.findAll({
    where: { guildId: { [Op.in]: guildIds }, status: 'active', userId: { [Op.ne]: userId } },
    include: [
      { model: User, as: 'user', attributes: ['displayName'] },
      { model: Guild, as: 'guild', attributes: ['name'] },
    ],
  });
  const name = cleanDisplayName(rawName);
  const key = displayNameKey(name);
  const clash = others.find((m) => displayNameKey(m.user!.displayName) === key);
  if (!clash) return;
  const taken = new Set(others.map((m) => displayNameKey(m.user!.displayName)));
  const initial = email?.trim()[0]?.toUpperCase();
  const candidates = [
    ...(initial && /\p{L}/u.test(initial) ? [`${name} ${initial}.`] : []),
    ...[2, 3, 4, 5, 6, 7, 8, 9].map((n) => `${name} ${n}`),
  ];
  const suggestion = candidates.find((c) => c.length <= 80 && !taken.has(displayNameKey(c)));
  throw new AppError(
    409,
    'name_taken',
    `Someone in ${clash.guild!.name} is already called “${clash.user!.displayName}”. Add something that tells you apart${suggestion ? `, such as “${suggestion}”` : ''}.`,
    { displayName: `Already used in ${clash.guild!.name}${suggestion ? `; try “${suggestion}”` : ''}.` },
  );
}
