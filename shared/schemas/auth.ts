import { z } from 'zod';

/**
 * An address as it is compared and stored: Unicode NFKC (full-width and other look-alike forms
 * folded), trimmed, lower case. Rate limits and look-ups both use this form, so `" Ada@X.test"`
 * and `"ada@x.test"` are one address everywhere.
 */
export function normaliseEmail(raw: string): string {
  return raw.normalize('NFKC').trim().toLowerCase();
}

export const emailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .max(320, 'That e-mail address is too long.')
  .transform(normaliseEmail)
  .pipe(
    z
      .string()
      .min(1, 'Enter your e-mail address.')
      .max(254, 'That e-mail address is too long.')
      .pipe(z.email({ error: 'That does not look like an e-mail address.' })),
  );

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(10, 'Use at least 10 characters for your password.')
  .max(200, 'Use at most 200 characters for your password.');

// Control characters, bidirectional overrides and isolates, and invisible format characters: they
// can make a name look like another one, or hide it. Joiners (U+200C, U+200D) stay: some scripts need them.
const hiddenInName = /[\p{Cc}\u00AD\u061C\u180E\u200B\u200E\u200F\u202A-\u202E\u2060-\u2064\u2066-\u206F\uFEFF\uFFF9-\uFFFB]/gu;

/** A display name as stored: NFC, runs of white space made one space, hidden characters removed, trimmed. */
export function cleanDisplayName(raw: string): string {
  return raw.normalize('NFC').replace(/\s+/g, ' ').replace(hiddenInName, '').replace(/ {2,}/g, ' ').trim();
}

/** The form two display names are compared in: "Ada  ADMIN" and "ada admin" are the same name. */
export function displayNameKey(name: string): string {
  return cleanDisplayName(name).normalize('NFKC').toLowerCase();
}

export const displayNameSchema = z
  .string({ error: 'Enter your name as the guild knows you.' })
  .max(200, 'Keep your name under 80 characters.')
  .transform(cleanDisplayName)
  .pipe(
    z
      .string()
      .min(1, 'Enter your name as the guild knows you.')
      .max(80, 'Keep your name under 80 characters.')
      .regex(/[\p{L}\p{N}]/u, 'Use at least one letter or number in your name.'),
  );

/** A page of this site to go on to (an invitation, say): a path, never another site ("//x", "/\\x"). */
export const nextPathSchema = z
  .string()
  .max(500, 'That return path is too long.')
  .regex(/^\/(?![/\\])[^\s\\]*$/, 'The return path must be a page of this site.');

export const registerSchema = z.object({
  email: emailSchema,
  password: passwordSchema,
  displayName: displayNameSchema,
  next: nextPathSchema.optional(),
});
export type RegisterInput = z.infer<typeof registerSchema>;

export const confirmEmailSchema = z.object({
  token: z
    .string({ error: 'The confirmation link is incomplete. Open it again from the e-mail.' })
    .min(20, 'The confirmation link is incomplete. Open it again from the e-mail.')
    .max(200, 'The confirmation link is not one of ours. Open it again from the e-mail.'),
});
export type ConfirmEmailInput = z.infer<typeof confirmEmailSchema>;

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

export const changePasswordSchema = z.object({
  currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(200),
  newPassword: passwordSchema,
});
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export const unitsSchema = z.enum(['in', 'mm']);
export type Units = z.infer<typeof unitsSchema>;

export const profileUpdateSchema = z
  .object({
    displayName: displayNameSchema.optional(),
    /** null: no unit of my own, follow each guild's default */
    units: unitsSchema.nullable().optional(),
    mailingAddress: z.string().trim().max(500, 'Keep the address under 500 characters.').nullable().optional(),
  })
  .strict();
export type ProfileUpdateInput = z.infer<typeof profileUpdateSchema>;
