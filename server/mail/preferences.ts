/** Reading and writing people's mail choices. No row means the default: every kind of mail is on. */
import { Op } from 'sequelize';
import { mailCategoryInfo, type AnyMailCategory, type MailCategory } from '@shared/schemas/notifications';
import { MailPreference } from '../db/models';
import type { AppDeps } from '../deps';

/** Sets some categories on or off for one person (upsert per category). */
export async function setPreferences(
  deps: Pick<AppDeps, 'sequelize'>,
  userId: number,
  changes: Partial<Record<MailCategory, boolean>>,
) {
  await deps.sequelize.transaction(async (transaction) => {
    for (const [category, enabled] of Object.entries(changes) as [MailCategory, boolean][]) {
      await MailPreference.upsert({ userId, category, enabled }, { transaction });
    }
  });
}

/** Of these people, those who switched `category` off. Account mail can never be switched off. */
export async function optedOut(userIds: number[], category: AnyMailCategory): Promise<Set<number>> {
  if (category === 'account' || userIds.length === 0) return new Set();
  const rows = await MailPreference.findAll({
    where: { userId: { [Op.in]: userIds }, category, enabled: false },
    attributes: ['userId'],
  });
  return new Set(rows.map((r) => r.userId));
}

/** The reason recorded when a message is not sent because its kind is switched off. */
export function optedOutReason(category: MailCategory) {
  return `Switched off “${mailCategoryInfo[category].label}” in their e-mail choices.`;
}
