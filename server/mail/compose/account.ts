/**
 * Account mail worked out in the job queue rather than in the request: whether an address has an
 * account is looked up here, so the request answers alike, in the same time, either way. These
 * messages carry live secrets, so they go straight to the mailer and are not kept in mail_messages;
 * a failed send fails the job, which the queue retries (with a fresh token).
 */
import { Op } from 'sequelize';
import type { Config } from '../../config';
import { PasswordReset, PendingSignup, User } from '../../db/models';
import type { Mailer } from '../mailer';
import { confirmSignupMail, passwordResetMail, signupAttemptMail } from '../account-messages';
import { newToken } from '../link-tokens';
import { appUrl } from './context';

export const RESET_VALID_MINUTES = 60;
export const SIGNUP_VALID_HOURS = 24;
/** A pending sign-up still unmailed this long after it was made lost its job (or came from a node without workers). */
const UNMAILED_AFTER_MINUTES = 5;

export interface AccountMailDeps {
  config: Pick<Config, 'PUBLIC_URL'>;
  mailer: Mailer;
}

export type AccountMailOutcome = 'confirm-link' | 'already-registered' | 'reset-link' | 'nothing';

/**
 * Mails a pending sign-up: a new address gets the confirmation link; an address with an account gets
 * a note to its owner instead, and the attempt (with its password hash) is deleted.
 */
export async function sendSignupMail(deps: AccountMailDeps, pendingSignupId: number): Promise<AccountMailOutcome> {
  const pending = await PendingSignup.findByPk(pendingSignupId);
  if (!pending || pending.mailedAt || pending.expiresAt <= new Date()) return 'nothing';
  const owner = await User.findOne({ where: { email: pending.email }, attributes: ['id', 'email', 'displayName'] });
  if (owner) {
    await deps.mailer.send(
      signupAttemptMail({
        to: owner.email,
        displayName: owner.displayName,
        signInUrl: appUrl(deps.config, '/sign-in'),
        forgotUrl: appUrl(deps.config, '/forgot-password'),
      }),
    );
    await pending.destroy();
    return 'already-registered';
  }
  const { token, tokenHash } = newToken();
  await pending.update({ tokenHash });
  const query = new URLSearchParams({ token });
  if (pending.nextPath) query.set('next', pending.nextPath);
  await deps.mailer.send(
    confirmSignupMail({
      to: pending.email,
      url: appUrl(deps.config, `/confirm-email?${query.toString()}`),
      validHours: SIGNUP_VALID_HOURS,
    }),
  );
  await pending.update({ mailedAt: new Date() });
  return 'confirm-link';
}

/** Sends a reset link if the address has an account, and nothing otherwise. */
export async function sendPasswordReset(deps: AccountMailDeps, email: string): Promise<AccountMailOutcome> {
  const user = await User.findOne({ where: { email }, attributes: ['id', 'email', 'displayName'] });
  if (!user) return 'nothing';
  const { token, tokenHash } = newToken();
  await PasswordReset.create({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + RESET_VALID_MINUTES * 60_000) });
  await deps.mailer.send(
    passwordResetMail({
      to: user.email,
      displayName: user.displayName,
      url: appUrl(deps.config, `/reset-password?token=${encodeURIComponent(token)}`),
      validMinutes: RESET_VALID_MINUTES,
    }),
  );
  return 'reset-link';
}

/**
 * For the periodic sweep: deletes expired pending sign-ups (and their password hashes), and returns
 * the ids of those whose mail never went out, to queue again.
 */
export async function tidyPendingSignups(now = new Date()): Promise<number[]> {
  await PendingSignup.destroy({ where: { expiresAt: { [Op.lte]: now } } });
  const stale = await PendingSignup.findAll({
    where: { mailedAt: null, createdAt: { [Op.lt]: new Date(now.getTime() - UNMAILED_AFTER_MINUTES * 60_000) } },
    attributes: ['id'],
    order: [['id', 'ASC']],
    limit: 500,
  });
  return stale.map((p) => p.id);
}
