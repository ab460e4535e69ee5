/** What every composer shares: loading the swap and its people, the frame, and opt-outs. */
import { Op } from 'sequelize';
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import { mailCategoryInfo, type MailCategory } from '@shared/schemas/notifications';
import type { Units } from '@shared/schemas/auth';
import type { Role } from '@shared/schemas/guilds';
import { Guild, Membership, Swap, User } from '../../db/models';
import type { Config } from '../../config';
import type { AppDeps } from '../../deps';
import type { Logger } from '../../logger';
import { optedOut, optedOutReason } from '../preferences';
import type { OutgoingRecord } from '../outbox';
import type { MailFrame, RenderedMail, TemplateName } from '../render';
import { unsubscribePageUrl, unsubscribeToken } from '../unsubscribe-token';

/** What drafting a message needs of the configuration: links and unsubscribe tokens. */
export type MailConfig = Pick<Config, 'PUBLIC_URL' | 'SESSION_SECRET'>;

/** What drafting a message from the database needs: the configuration and the connection. */
export interface DraftDeps extends Pick<AppDeps, 'sequelize'> {
  config: MailConfig;
}

export interface ComposeDeps extends Pick<AppDeps, 'sequelize'> {
  pool: pg.Pool;
  config: Config;
  logger: Logger;
  boss: PgBoss;
}

export interface Recipient {
  id: number;
  email: string;
  displayName: string;
  units: Units;
}

const base = (config: Pick<Config, 'PUBLIC_URL'>) => config.PUBLIC_URL.replace(/\/$/, '');

export const appUrl = (config: Pick<Config, 'PUBLIC_URL'>, path: string) => `${base(config)}${path}`;
export const swapUrl = (config: Pick<Config, 'PUBLIC_URL'>, guildId: number, swapId: number) =>
  appUrl(config, `/guilds/${guildId}/swaps/${swapId}`);
export const preferencesUrl = (config: Pick<Config, 'PUBLIC_URL'>) => appUrl(config, '/settings/email');

/** The layout frame for a message in a category, with that person's unsubscribe link. */
export function frameFor(
  config: Pick<Config, 'PUBLIC_URL' | 'SESSION_SECRET'>,
  userId: number,
  category: MailCategory,
  text: { subject: string; preheader: string; heading: string; reason: string },
): MailFrame {
  const token = unsubscribeToken(config.SESSION_SECRET, userId, category);
  return {
    ...text,
    unsubscribe: { url: unsubscribePageUrl(config.PUBLIC_URL, token), label: mailCategoryInfo[category].label.toLowerCase() },
    preferencesUrl: preferencesUrl(config),
  };
}

export async function loadSwap(swapId: number): Promise<{ swap: Swap; guild: Guild } | null> {
  const swap = await Swap.findByPk(swapId);
  if (!swap) return null;
  const guild = await Guild.findByPk(swap.guildId);
  return guild ? { swap, guild } : null;
}

function recipientOf(u: User): Recipient {
  return { id: u.id, email: u.email, displayName: u.displayName, units: u.units };
}

/** Active members of a guild, optionally only some roles. */
export async function guildMembers(guildId: number, roles?: Role[]): Promise<Recipient[]> {
  const rows = await Membership.findAll({
    where: { guildId, status: 'active', ...(roles ? { role: { [Op.in]: roles } } : {}) },
    include: [{ model: User, as: 'user' }],
    order: [['userId', 'ASC']],
  });
  return rows.filter((m) => m.user).map((m) => recipientOf(m.user!));
}

/** Who a gift swap's blocks go to, by name. */
export async function giftName(swap: Swap): Promise<string | null> {
  if (swap.mode !== 'gift') return null;
  if (swap.giftRecipientId)
    return (await User.findByPk(swap.giftRecipientId, { attributes: ['displayName'] }))?.displayName ?? null;
  return swap.giftRecipientName ?? null;
}

export async function usersByIds(ids: number[]): Promise<Map<number, Recipient>> {
  if (ids.length === 0) return new Map();
  const rows = await User.findAll({ where: { id: { [Op.in]: ids } } });
  return new Map(rows.map((u) => [u.id, recipientOf(u)]));
}

export interface Drafted {
  key: string;
  kind: TemplateName;
  mail: RenderedMail;
}

/**
 * Turns each recipient's draft into a record; people who switched the category off are recorded
 * as not sent (so admins can see why), and are never rendered a second time.
 */
export async function recordsFor(
  category: MailCategory,
  scope: { guildId: number; swapId: number | null },
  recipients: Recipient[],
  draft: (r: Recipient) => Drafted,
): Promise<OutgoingRecord[]> {
  const off = await optedOut(
    recipients.map((r) => r.id),
    category,
  );
  return recipients.map((r) => {
    const d = draft(r);
    return {
      key: d.key,
      kind: d.kind,
      category,
      guildId: scope.guildId,
      swapId: scope.swapId,
      userId: r.id,
      to: r.email,
      mail: d.mail,
      skipReason: off.has(r.id) ? optedOutReason(category) : null,
    };
  });
}
