import { Op, QueryTypes, UniqueConstraintError } from 'sequelize';
import type { RegisterInput, ProfileUpdateInput } from '@shared/schemas/auth';
import type { MeDto } from '@shared/types';
import { passwordStrength } from '@shared/password-strength';
import { Membership, PasswordReset, PendingSignup, User } from '../db/models';
import { ConflictError, UnauthorizedError, ValidationError } from '../http/errors';
import { hashPassword, verifyPassword } from './passwords';
import { hashToken } from './tokens';
import { toSessionUser } from './passport';
import { assertNameFreeInGuilds } from './display-names';
import { SIGNUP_VALID_HOURS } from '../mail/compose/account';
import type { AppDeps } from '../deps';
import { END_SESSIONS, ME } from './auth.queries';
import { preparedPoolQuery } from '../db/prepared';

export { RESET_VALID_MINUTES } from '../mail/compose/account';

/**
 * Refuses a password that is quick to guess (common, a pattern, a repeat, or made of the person's
 * own name or address), with the reason and a tip, under the given field name.
 */
export function assertStrongPassword(password: string, personal: string[], field = 'password') {
  const strength = passwordStrength(password, personal);
  if (strength.strong) return;
  const message = `${strength.reason} ${strength.tip}`;
  throw new ValidationError(message, { [field]: message });
}

/**
 * Records a sign-up to be confirmed by mail and queues that mail. Whether the address already has an
 * account is not looked up here but in the mail job, and the password is hashed either way, so the
 * answer is the same, in the same time, for a new address and a taken one. No account exists until
 * the link is opened, so nobody can hold an address they cannot read.
 */
export async function requestSignup(deps: Pick<AppDeps, 'events'>, input: RegisterInput): Promise<void> {
  assertStrongPassword(input.password, [input.email, input.displayName]);
  const passwordHash = await hashPassword(input.password);
  const pending = await PendingSignup.create({
    email: input.email,
    displayName: input.displayName,
    passwordHash,
    nextPath: input.next ?? null,
    expiresAt: new Date(Date.now() + SIGNUP_VALID_HOURS * 3_600_000),
  });
  deps.events.emit('account.signup-requested', { pendingSignupId: pending.id });
}

/**
 * Turns a pending sign-up into an account, once: the link's token is spent with every other pending
 * sign-up for the address. Returns the new account and the path to continue to.
 */
export async function confirmSignup(
  deps: Pick<AppDeps, 'sequelize'>,
  token: string,
): Promise<{ user: Express.User; next: string | null }> {
  const pending = await PendingSignup.findOne({ where: { tokenHash: hashToken(token) } });
  if (!pending) {
    throw new ValidationError('This confirmation link was already used or is not one of ours. Sign in, or sign up again.', {
      token: 'This confirmation link was already used or is not valid.',
    });
  }
  if (pending.expiresAt <= new Date()) {
    await pending.destroy();
    throw new ValidationError(`This confirmation link has expired (links work for ${SIGNUP_VALID_HOURS} hours). Sign up again.`, {
      token: 'This confirmation link has expired.',
    });
  }
  try {
    const user = await deps.sequelize.transaction(async (transaction) => {
      const spent = await PendingSignup.destroy({ where: { id: pending.id }, transaction });
      if (spent !== 1) throw new ValidationError('This confirmation link was already used. Sign in instead.');
      await PendingSignup.destroy({ where: { email: pending.email }, transaction });
      return User.create(
        { email: pending.email, displayName: pending.displayName, passwordHash: pending.passwordHash },
        { transaction },
      );
    });
    return { user: toSessionUser(user), next: pending.nextPath };
  } catch (error) {
    if (error instanceof UniqueConstraintError) {
      // Someone confirmed this address first: the link is spent, and the address has its account.
      await PendingSignup.destroy({ where: { email: pending.email } });
      throw new ConflictError(
        'This address already has an account. Sign in, or reset your password if you forgot it.',
        'email_taken',
      );
    }
    throw error;
  }
}

export async function getMe(deps: Pick<AppDeps, 'pool'>, userId: number): Promise<MeDto | null> {
  // The statement's columns are the answer's fields, in its order.
  const [row] = await preparedPoolQuery<MeDto['user'] & Pick<MeDto, 'memberships'>>(deps.pool, ME, { userId });
  if (!row) return null;
  // The mailing address is private: it goes to its owner here, and to coordinators of swaps they join.
  const { memberships, ...user } = row;
  return { user, memberships };
}

/** Changes name, units or address; a new name must not be another member's in any of the person's guilds. */
export async function updateProfile(userId: number, input: ProfileUpdateInput) {
  const user = await User.findByPk(userId);
  if (!user) throw new ValidationError('Your account no longer exists.');
  if (input.displayName !== undefined && input.displayName !== user.displayName) {
    const guildIds = (await Membership.findAll({ where: { userId, status: 'active' }, attributes: ['guildId'] })).map(
      (m) => m.guildId,
    );
    await assertNameFreeInGuilds(userId, input.displayName, guildIds, user.email);
  }
  // Choosing a unit overrides every guild's default; clearing it (null) follows the guilds again.
  const { units, ...rest } = input;
  await user.update({
    ...rest,
    ...(units === undefined ? {} : units === null ? { units: 'in', unitsChosen: false } : { units, unitsChosen: true }),
  });
  return toSessionUser(user);
}

/**
 * Queues a reset link for the address. The mail job looks the address up and mails only if it has an
 * account, so the request waits the same time either way.
 */
export function requestPasswordReset(deps: Pick<AppDeps, 'events'>, email: string) {
  deps.events.emit('account.reset-requested', { email });
}

/** Uses a reset token once; every other open token for the account is spent too. */
export async function resetPassword(deps: Pick<AppDeps, 'sequelize'>, token: string, password: string) {
  const reset = await PasswordReset.findOne({
    where: { tokenHash: hashToken(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
  });
  if (!reset) {
    throw new ValidationError('This reset link has expired or was already used. Ask for a new one.', {
      token: 'This reset link has expired or was already used.',
    });
  }
  const owner = await User.findByPk(reset.userId, { attributes: ['email', 'displayName'] });
  assertStrongPassword(password, owner ? [owner.email, owner.displayName] : []);
  const passwordHash = await hashPassword(password);
  await deps.sequelize.transaction(async (transaction) => {
    const [spent] = await PasswordReset.update({ usedAt: new Date() }, { where: { id: reset.id, usedAt: null }, transaction });
    if (spent !== 1) throw new ValidationError('This reset link was already used. Ask for a new one.');
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: reset.userId, usedAt: null }, transaction });
    await User.update({ passwordHash }, { where: { id: reset.userId }, transaction });
  });
  return reset.userId;
}

/** Changes the password of a signed-in person who knows the current one. */
export async function changePassword(userId: number, currentPassword: string, newPassword: string) {
  const user = await User.findByPk(userId);
  if (!user) throw new UnauthorizedError('Your account no longer exists.');
  if (!(await verifyPassword(user.passwordHash, currentPassword))) {
    throw new ValidationError('That is not your current password.', { currentPassword: 'That is not your current password.' });
  }
  if (currentPassword === newPassword) {
    throw new ValidationError('Choose a new password that differs from the current one.', {
      newPassword: 'Choose a password that differs from the current one.',
    });
  }
  assertStrongPassword(newPassword, [user.email, user.displayName], 'newPassword');
  await user.update({ passwordHash: await hashPassword(newPassword) });
}

/**
 * Ends every sign-in session of the account but `keep` (the caller's own, when it stays signed in),
 * and the live sockets opened with them, on every node.
 */
export async function endSessions(deps: Pick<AppDeps, 'sequelize' | 'events'>, userId: number, keep?: string) {
  const rows = await deps.sequelize.query<{ sid: string }>(END_SESSIONS, {
    bind: { userId, keep: keep ?? null },
    type: QueryTypes.SELECT,
  });
  const sessionIds = rows.map((r) => r.sid);
  if (sessionIds.length) deps.events.emit('session.ended', { userId, sessionIds });
  return sessionIds.length;
}
