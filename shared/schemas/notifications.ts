import { z } from 'zod';
import { idParam } from './guilds';

/** Kinds of e-mail a person can switch off. Account mail (invitations, password resets) always goes. */
export const mailCategories = [
  'announcements',
  'signup-confirmations',
  'reminders',
  'receipts',
  'distribution',
  'coordinator-digest',
] as const;
export const mailCategorySchema = z.enum(mailCategories, { error: 'Choose one of the listed kinds of e-mail.' });
export type MailCategory = z.infer<typeof mailCategorySchema>;

/** Every category a message can carry, including account mail, which cannot be switched off. */
export type AnyMailCategory = MailCategory | 'account';

export const mailCategoryInfo: Record<MailCategory, { label: string; description: string }> = {
  announcements: {
    label: 'New swaps',
    description: 'When a coordinator opens a swap for sign-ups: the block, the dates and a link.',
  },
  'signup-confirmations': {
    label: 'Sign-up confirmations',
    description: 'After you sign up or change your pledge: your own cutting plan and fabric amounts.',
  },
  reminders: {
    label: 'Deadline reminders',
    description: 'A few days before sign-up closes and before blocks are due, while you still owe blocks.',
  },
  receipts: {
    label: 'Block receipts',
    description: 'When your blocks are received and measured, with what to do about any that need work.',
  },
  distribution: {
    label: 'Blocks coming back',
    description: 'When the swap is shared out: how many blocks you will get and from how many makers.',
  },
  'coordinator-digest': {
    label: 'Weekly digests for coordinators',
    description: 'Each Monday, what changed that week in the swaps of guilds you coordinate.',
  },
};

export const mailStatuses = ['queued', 'sending', 'sent', 'failed', 'skipped'] as const;
export type MailStatus = (typeof mailStatuses)[number];

export const mailStatusLabels: Record<MailStatus, string> = {
  queued: 'Waiting to send',
  sending: 'Sending',
  sent: 'Sent',
  failed: 'Failed',
  skipped: 'Not sent',
};

/** PATCH /api/me/mail-preferences: any subset of categories, each on or off. */
export const updateMailPreferencesSchema = z
  .partialRecord(mailCategorySchema, z.boolean({ error: 'Use true or false.' }))
  .refine((v) => Object.keys(v).length > 0, 'Choose at least one kind of e-mail to change.');
export type UpdateMailPreferencesInput = z.infer<typeof updateMailPreferencesSchema>;

/** Every category at once, as the choices form holds them. */
export const mailChoicesSchema = z.object(
  Object.fromEntries(mailCategories.map((c) => [c, z.boolean({ error: 'Use true or false.' })])) as Record<
    MailCategory,
    z.ZodBoolean
  >,
);
export type MailChoices = z.infer<typeof mailChoicesSchema>;

export const unsubscribeQuerySchema = z.object({
  token: z.string({ error: 'The unsubscribe link is incomplete.' }).min(10, 'The unsubscribe link is incomplete.').max(300),
});

export const mailLogQuerySchema = z.object({
  status: z.enum(mailStatuses, { error: 'Choose a listed status.' }).optional(),
  category: z.enum([...mailCategories, 'account'], { error: 'Choose a listed kind of e-mail.' }).optional(),
  /** Matches the recipient's address or name, or the subject. */
  q: z.string().trim().max(100, 'Keep the search under 100 characters.').optional(),
  page: z.coerce.number({ error: 'Expected a page number.' }).int().min(1).max(10_000).default(1),
});
/** The history's filters as the client sends them. */
export interface MailLogQuery {
  status?: MailStatus;
  category?: AnyMailCategory;
  q?: string;
  page?: number;
}

export const mailLogParamsSchema = z.object({ guildId: idParam });

export interface MailPreferenceDto {
  category: MailCategory;
  label: string;
  description: string;
  enabled: boolean;
}

export interface MailPreferencesDto {
  email: string;
  categories: MailPreferenceDto[];
}

export interface UnsubscribeInfoDto {
  category: MailCategory;
  label: string;
  description: string;
  enabled: boolean;
  /** The address with most of it hidden, so a forwarded link does not reveal it. */
  emailHint: string;
}

export interface MailMessageDto {
  id: number;
  category: AnyMailCategory;
  kind: string;
  subject: string;
  recipient: { userId: number | null; displayName: string | null; email: string };
  swapId: number | null;
  status: MailStatus;
  /** Why it failed or was not sent. */
  reason: string | null;
  attempts: number;
  createdAt: string;
  updatedAt: string;
  sentAt: string | null;
}

export interface MailLogDto {
  messages: MailMessageDto[];
  page: number;
  pageSize: number;
  total: number;
  counts: Record<MailStatus, number>;
}
