/** Mail choices, one-click unsubscribe and the guild's message history. */
import { Op, type WhereOptions } from 'sequelize';
import {
  mailCategories,
  mailCategoryInfo,
  mailStatuses,
  type MailCategory,
  type MailLogDto,
  type MailMessageDto,
  type MailPreferencesDto,
  type MailStatus,
  type UnsubscribeInfoDto,
  type mailLogQuerySchema,
} from '@shared/schemas/notifications';
import type { z } from 'zod';
import { MailMessage, User } from '../db/models';
import { NotFoundError, ValidationError } from '../http/errors';
import { verifyUnsubscribeToken } from '../mail/unsubscribe-token';
import { setPreferences } from '../mail/preferences';
import type { AppDeps } from '../deps';
import { preparedPoolQuery } from '../db/prepared';

const LOG_PAGE_SIZE = 50;

/** Person $userId's address and the categories they chose (no row: the default, on). */
const MAIL_CHOICES = `SELECT u.email,
         coalesce((SELECT json_object_agg(p.category, p.enabled) FROM mail_preferences p WHERE p.user_id = u.id), '{}') AS chosen
    FROM users u WHERE u.id = $userId`;

/** A person's address and each category on or off (the default, on, where they chose nothing); null without the account. */
async function mailChoicesOf(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
): Promise<{ email: string; enabled: Record<MailCategory, boolean> } | null> {
  const [row] = await preparedPoolQuery<{ email: string; chosen: Partial<Record<string, boolean>> }>(deps.pool, MAIL_CHOICES, {
    userId,
  });
  if (!row) return null;
  const enabled = Object.fromEntries(mailCategories.map((c) => [c, row.chosen[c] ?? true])) as Record<MailCategory, boolean>;
  return { email: row.email, enabled };
}

/** The caller's mail choices, in one named statement. */
export async function getPreferences(deps: Pick<AppDeps, 'pool'>, userId: number): Promise<MailPreferencesDto> {
  const choices = await mailChoicesOf(deps, userId);
  if (!choices) throw new NotFoundError('That account no longer exists.');
  return {
    email: choices.email,
    categories: mailCategories.map((category) => ({
      category,
      ...mailCategoryInfo[category],
      enabled: choices.enabled[category],
    })),
  };
}

export async function updatePreferences(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  userId: number,
  changes: Partial<Record<MailCategory, boolean>>,
) {
  await setPreferences(deps, userId, changes);
  return getPreferences(deps, userId);
}

/** "m•••••@example.org": enough to recognise, not enough to harvest from a forwarded link. */
export function emailHint(email: string) {
  const [local = '', domain = ''] = email.split('@');
  return `${local.slice(0, 1)}${'•'.repeat(Math.max(3, Math.min(local.length - 1, 8)))}@${domain}`;
}

function tokenOrThrow(secret: string, token: string) {
  const claims = verifyUnsubscribeToken(secret, token);
  if (!claims) {
    throw new ValidationError(
      'This unsubscribe link is not valid; it may have been cut short when copied. Sign in and open your e-mail choices instead.',
      { token: 'This link is not valid.' },
    );
  }
  return claims;
}

/** What an unsubscribe link is about, for its confirmation page. */
export async function unsubscribeInfo(deps: Pick<AppDeps, 'pool'>, secret: string, token: string): Promise<UnsubscribeInfoDto> {
  const { userId, category } = tokenOrThrow(secret, token);
  const choices = await mailChoicesOf(deps, userId);
  if (!choices) throw new NotFoundError('The account this link was sent to no longer exists.');
  return { category, ...mailCategoryInfo[category], enabled: choices.enabled[category], emailHint: emailHint(choices.email) };
}

/** Switches the link's category off (or back on); the token alone is the authority. */
export async function applyUnsubscribe(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  secret: string,
  token: string,
  enabled: boolean,
): Promise<UnsubscribeInfoDto> {
  const { userId, category } = tokenOrThrow(secret, token);
  if (!(await User.findByPk(userId, { attributes: ['id'] })))
    throw new NotFoundError('The account this link was sent to no longer exists.');
  await setPreferences(deps, userId, { [category]: enabled });
  return unsubscribeInfo(deps, secret, token);
}

type LogQuery = z.output<typeof mailLogQuerySchema>;

function messageDto(m: MailMessage): MailMessageDto {
  return {
    id: m.id,
    category: m.category,
    kind: m.kind,
    subject: m.subject,
    recipient: { userId: m.userId, displayName: m.user?.displayName ?? null, email: m.toAddress },
    swapId: m.swapId,
    status: m.status,
    reason: m.statusReason,
    attempts: m.attempts,
    createdAt: m.createdAt.toISOString(),
    updatedAt: m.updatedAt.toISOString(),
    sentAt: m.sentAt?.toISOString() ?? null,
  };
}

/** One page of a guild's messages, newest first, with counts per status for the filter. */
export async function mailLog(guildId: number, query: LogQuery): Promise<MailLogDto> {
  const where: WhereOptions = { guildId };
  if (query.category) Object.assign(where, { category: query.category });
  const search = query.q?.trim();
  // LIKE wildcards typed by the admin are matched literally.
  const like = search ? `%${search.replace(/[\\%_]/g, '\\$&')}%` : null;
  const searchWhere = like
    ? {
        [Op.or]: [
          { toAddress: { [Op.iLike]: like } },
          { subject: { [Op.iLike]: like } },
          { '$user.display_name$': { [Op.iLike]: like } },
        ],
      }
    : {};
  const include = [{ model: User, as: 'user', attributes: ['id', 'displayName'], required: false }];
  const [rows, total, grouped] = await Promise.all([
    MailMessage.findAll({
      where: { ...where, ...searchWhere, ...(query.status ? { status: query.status } : {}) },
      include,
      attributes: { exclude: ['textBody', 'htmlBody'] },
      order: [
        ['createdAt', 'DESC'],
        ['id', 'DESC'],
      ],
      limit: LOG_PAGE_SIZE,
      offset: (query.page - 1) * LOG_PAGE_SIZE,
      subQuery: false,
    }),
    MailMessage.count({ where: { ...where, ...searchWhere, ...(query.status ? { status: query.status } : {}) }, include }),
    MailMessage.count({ where: { ...where, ...searchWhere }, include, group: ['status'] }) as unknown as Promise<
      { status: MailStatus; count: number }[]
    >,
  ]);
  const counts = Object.fromEntries(mailStatuses.map((s) => [s, 0])) as Record<MailStatus, number>;
  for (const g of grouped) counts[g.status] = Number(g.count);
  return { messages: rows.map(messageDto), page: query.page, pageSize: LOG_PAGE_SIZE, total, counts };
}

/** One message of the guild with its text, as it was sent. */
export async function mailMessage(guildId: number, messageId: number): Promise<MailMessageDto & { text: string }> {
  const m = await MailMessage.findOne({
    where: { id: messageId, guildId },
    include: [{ model: User, as: 'user', attributes: ['id', 'displayName'] }],
  });
  if (!m) throw new NotFoundError('That message is not in this guild’s history.');
  return { ...messageDto(m), text: m.textBody };
}
