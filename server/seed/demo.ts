/**
 * The demo guild: an invented scenario for trying Blockpost locally. Never run in production.
 * Kestrel Hollow Quilters meet in a library community room; a dozen people across the roles.
 */
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { Guild, Membership, User } from '../db/models';
import { hashPassword } from '../auth/passwords';
import type { Role } from '@shared/schemas/guilds';
import { seedDemoSwaps } from './swaps';
import { seedDemoPhotos } from './photos';
import type { PhotoStoreDeps } from '../uploads/photo-store';
import { seedDemoSewDays } from './sew-days';

export const DEMO_SIGN_INS = {
  password: 'blockpost-demo',
  emails: ['admin@demo.test', 'coordinator@demo.test', 'member@demo.test'],
};

export const demoPeople: { email: string; displayName: string; role: Role; mailingAddress?: string }[] = [
  { email: 'admin@demo.test', displayName: 'Marguerite Okonjo', role: 'admin', mailingAddress: '14 Alder Row, Kestrel Hollow' },
  {
    email: 'coordinator@demo.test',
    displayName: 'Theo Lindqvist',
    role: 'coordinator',
    mailingAddress: '3 Millpond Lane, Kestrel Hollow',
  },
  {
    email: 'member@demo.test',
    displayName: 'Priya Raman',
    role: 'member',
    mailingAddress: '220 Quarry Road, Apt 4, Kestrel Hollow',
  },
  { email: 'dot@demo.test', displayName: 'Dot Pemberton', role: 'admin' },
  { email: 'june@demo.test', displayName: 'June Halvorsen', role: 'coordinator' },
  { email: 'walt@demo.test', displayName: 'Walt Ferreira', role: 'member' },
  { email: 'rosa@demo.test', displayName: 'Rosa Ibáñez', role: 'member' },
  { email: 'kwame@demo.test', displayName: 'Kwame Mensah', role: 'member' },
  { email: 'hana@demo.test', displayName: 'Hana Sato', role: 'member' },
  { email: 'lou@demo.test', displayName: 'Lou Brennan', role: 'member' },
  { email: 'ines@demo.test', displayName: 'Ines Moreau', role: 'member' },
  { email: 'bea@demo.test', displayName: 'Bea Kowalski', role: 'member' },
];

export interface DemoGuild {
  guild: Guild;
  users: Map<string, User>;
}

/** Seeds only an empty database, so a restart never duplicates or overwrites real data. */
export async function seedDemoIfEmpty(
  sequelize: Sequelize,
  config: Pick<Config, 'NODE_ENV'> & PhotoStoreDeps['config'],
): Promise<DemoGuild | null> {
  if (config.NODE_ENV === 'production') return null;
  if ((await User.count()) > 0) return null;
  const passwordHash = await hashPassword(DEMO_SIGN_INS.password);
  const seeded = await sequelize.transaction(async (transaction) => {
    const guild = await Guild.create(
      {
        name: 'Kestrel Hollow Quilters',
        timeZone: 'America/Chicago',
        currency: 'usd',
        duesAmount: 3000,
        duesYear: new Date().getUTCFullYear(),
      },
      { transaction },
    );
    const users = new Map<string, User>();
    for (const person of demoPeople) {
      const user = await User.create(
        { email: person.email, displayName: person.displayName, passwordHash, mailingAddress: person.mailingAddress ?? null },
        { transaction },
      );
      users.set(person.email, user);
      await Membership.create({ guildId: guild.id, userId: user.id, role: person.role }, { transaction });
    }
    const photographed = await seedDemoSwaps(guild.id, users, transaction);
    await seedDemoSewDays(guild.id, users, transaction);
    return { guild, users, photographed };
  });
  // Photos go through the upload pipeline, which writes files and commits on its own.
  await seedDemoPhotos(
    sequelize,
    config,
    seeded.photographed.map((b) => ({ id: b.id, guildId: seeded.guild.id, makerId: b.makerId })),
  );
  return { guild: seeded.guild, users: seeded.users };
}
