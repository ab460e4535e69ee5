import { Op, UniqueConstraintError } from 'sequelize';
import type { RegisterInput, ProfileUpdateInput } from '@shared/schemas/auth';
import type { MeDto } from '@shared/types';
import { Guild, Membership, PasswordReset, User } from '../db/models';
import { ConflictError, ValidationError } from '../http/errors';
import { hashPassword } from './passwords';
import { hashToken, newToken } from './tokens';
import { toSessionUser } from './passport';
import { passwordResetMail } from '../mail/account-messages';
import type { AppDeps } from '../deps';

export const RESET_VALID_MINUTES = 60;

/** Creates an account; the e-mail must be unused. */
export async function register(input: RegisterInput): Promise<Express.User> {
  const passwordHash = await hashPassword(input.password);
  try {
    const user = await User.create({ email: input.email, displayName: input.displayName, passwordHash });
    return toSessionUser(user);
  } catch (error) {
    if (error instanceof UniqueConstraintError) {
      throw new ConflictError('An account with that e-mail already exists. Sign in, or reset your password.', 'email_taken');
    }
    throw error;
  }
}

export async function getMe(userId: number): Promise<MeDto | null> {
  const user = await User.findByPk(userId);
  if (!user) return null;
  const memberships = await Membership.findAll({
    where: { userId, status: 'active' },
    include: [{ model: Guild, as: 'guild', attributes: ['id', 'name'] }],
    order: [['createdAt', 'ASC']],
  });
  return {
    // The mailing address is private: it goes to its owner here, and to coordinators of swaps they join.
    user: { ...toSessionUser(user), mailingAddress: user.mailingAddress ?? null },
    memberships: memberships.map((m) => ({ guildId: m.guildId, guildName: m.guild!.name, role: m.role })),
  };
}

export async function updateProfile(userId: number, input: ProfileUpdateInput) {
  const user = await User.findByPk(userId);
  if (!user) throw new ValidationError('Your account no longer exists.');
  await user.update(input);
  return toSessionUser(user);
}

/** Always resolves the same way, so the answer does not reveal whether the address has an account. */
export async function requestPasswordReset(deps: Pick<AppDeps, 'mailer' | 'config' | 'logger'>, email: string) {
  const user = await User.findOne({ where: { email } });
  if (!user) return;
  const { token, tokenHash } = newToken();
  await PasswordReset.create({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + RESET_VALID_MINUTES * 60_000) });
  const url = `${deps.config.PUBLIC_URL}/reset-password?token=${encodeURIComponent(token)}`;
  try {
    await deps.mailer.send(passwordResetMail({ to: user.email, displayName: user.displayName, url, validMinutes: RESET_VALID_MINUTES }));
  } catch (error) {
    deps.logger.error({ err: error }, 'password reset mail failed');
  }
}

/** Uses a reset token once; every other open token for the account is spent too. */
export async function resetPassword(token: string, password: string) {
  const passwordHash = await hashPassword(password);
  const reset = await PasswordReset.findOne({
    where: { tokenHash: hashToken(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
  });
  if (!reset) {
    throw new ValidationError('This reset link has expired or was already used. Ask for a new one.', {
      token: 'This reset link has expired or was already used.',
    });
  }
  const sequelize = PasswordReset.sequelize!;
  await sequelize.transaction(async (transaction) => {
    const [spent] = await PasswordReset.update(
      { usedAt: new Date() },
      { where: { id: reset.id, usedAt: null }, transaction },
    );
    if (spent !== 1) throw new ValidationError('This reset link was already used. Ask for a new one.');
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: reset.userId, usedAt: null }, transaction });
    await User.update({ passwordHash }, { where: { id: reset.userId }, transaction });
  });
  return reset.userId;
}
