import { z } from 'zod';

export const emailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'That does not look like an e-mail address.' }));

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(10, 'Use at least 10 characters for your password.')
  .max(200, 'Use at most 200 characters for your password.');

export const displayNameSchema = z
  .string({ error: 'Enter your name as the guild knows you.' })
  .trim()
  .min(1, 'Enter your name as the guild knows you.')
  .max(80, 'Keep your name under 80 characters.');

export const registerSchema = z.object({
  email: emailSchema,
  password: passwordSchema,
  displayName: displayNameSchema,
});
export type RegisterInput = z.infer<typeof registerSchema>;

export const loginSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200),
});
export type LoginInput = z.infer<typeof loginSchema>;

export const resetRequestSchema = z.object({ email: emailSchema });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;

export const resetSchema = z.object({
  token: z.string({ error: 'The reset link is incomplete.' }).min(20, 'The reset link is incomplete.').max(200),
  password: passwordSchema,
});
export type ResetInput = z.infer<typeof resetSchema>;

export const unitsSchema = z.enum(['in', 'mm']);
export type Units = z.infer<typeof unitsSchema>;

export const profileUpdateSchema = z
  .object({
    displayName: displayNameSchema.optional(),
    units: unitsSchema.optional(),
    mailingAddress: z.string().trim().max(500, 'Keep the address under 500 characters.').nullable().optional(),
  })
  .strict();
export type ProfileUpdateInput = z.infer<typeof profileUpdateSchema>;
