import { z } from 'zod';
import { emailSchema, unitsSchema } from './auth';
import { idParam } from './ids';
import { guildPaymentFields } from './payments';

export const roles = ['admin', 'coordinator', 'member'] as const;
export const roleSchema = z.enum(roles, { error: 'Choose admin, coordinator or member.' });
export type Role = z.infer<typeof roleSchema>;

export const roleLabels: Record<Role, string> = {
  admin: 'Guild admin',
  coordinator: 'Swap coordinator',
  member: 'Member',
};

export { idParam } from './ids';

export const guildParamsSchema = z.object({ guildId: idParam });
export const memberParamsSchema = z.object({ guildId: idParam, userId: idParam });

export const timeZoneSchema = z
  .string()
  .trim()
  .max(64, 'Choose a time zone such as America/Chicago.')
  .refine((tz) => {
    try {
      new Intl.DateTimeFormat('en', { timeZone: tz });
      return true;
    } catch {
      return false;
    }
  }, 'Choose a time zone such as America/Chicago.');

export const createGuildSchema = z.object({
  name: z
    .string({ error: 'Give the guild a name.' })
    .trim()
    .min(2, 'Give the guild a name of at least 2 characters.')
    .max(100, 'Keep the guild name under 100 characters.'),
  timeZone: timeZoneSchema.optional(),
});
export type CreateGuildInput = z.infer<typeof createGuildSchema>;

/** Who sees the verdicts on other makers' blocks: the guild's officers only, or every member. */
export const verdictsVisibleToSchema = z.enum(['officers', 'guild'], { error: 'Choose officers or guild.' });
export type VerdictsVisibleTo = z.infer<typeof verdictsVisibleToSchema>;

/** PATCH /api/guilds/:guildId: any of the guild's settings (admins). */
export const updateGuildSchema = createGuildSchema
  .partial()
  .extend(guildPaymentFields)
  .extend({ defaultUnit: unitsSchema.optional() })
  .extend({ verdictsVisibleTo: verdictsVisibleToSchema.optional() })
  .strict()
  .refine((o) => Object.keys(o).length > 0, { message: 'Nothing to change.' });
export type UpdateGuildInput = z.infer<typeof updateGuildSchema>;

export const updateMemberSchema = z.object({ role: roleSchema });
export type UpdateMemberInput = z.infer<typeof updateMemberSchema>;

export const createInvitationSchema = z.object({
  email: emailSchema,
  role: roleSchema.default('member'),
  /** An open link: anyone signed in who has it may join (admins only). Otherwise only this address's account. */
  open: z.boolean({ error: 'Say whether the link is open to anyone.' }).default(false),
});
export type CreateInvitationInput = z.input<typeof createInvitationSchema>;

export const invitationTokenParams = z.object({
  token: z.string().min(20, 'The invitation link is incomplete.').max(200),
});
