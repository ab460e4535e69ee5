/** Account mail (invitations, password resets, sign-up): always sent, so it carries no unsubscribe link. */
import type { OutgoingMail } from './mailer';
import { roleLabels, type Role } from '@shared/schemas/guilds';
import { renderMail } from './render';
import { mailDate } from './format';

export function invitationMail(opts: {
  to: string;
  guildName: string;
  inviterName: string;
  role: Role;
  url: string;
  expiresAt: Date;
}): OutgoingMail {
  const rendered = renderMail(
    'invitation',
    {
      inviterName: opts.inviterName,
      guildName: opts.guildName,
      roleLabel: roleLabels[opts.role].toLowerCase(),
      url: opts.url,
      expires: `${mailDate(opts.expiresAt, 'UTC')} UTC`,
    },
    {
      // Names are chosen by members: they stay out of the subject line, and are quoted in the body.
      subject: 'An invitation to a quilt guild on Blockpost',
      preheader: `“${opts.inviterName}” invited you to join the guild “${opts.guildName}”.`,
      heading: 'An invitation to join a guild',
      reason: `You get this because a member of the guild, “${opts.inviterName}”, entered this address in an invitation.`,
      unsubscribe: null,
      preferencesUrl: null,
    },
  );
  return { to: opts.to, ...rendered };
}

export function passwordResetMail(opts: { to: string; displayName: string; url: string; validMinutes: number }): OutgoingMail {
  const rendered = renderMail(
    'password-reset',
    { displayName: opts.displayName, url: opts.url, validMinutes: opts.validMinutes },
    {
      subject: 'Reset your Blockpost password',
      preheader: `The link works once, within ${opts.validMinutes} minutes.`,
      heading: 'Reset your password',
      reason: 'You get this because someone asked for a password reset for this address.',
      unsubscribe: null,
      preferencesUrl: null,
    },
  );
  return { to: opts.to, ...rendered };
}

/** The link that turns a pending sign-up into an account. */
export function confirmSignupMail(opts: { to: string; url: string; validHours: number }): OutgoingMail {
  // The name typed in the form is left out: anyone can type any address, and their words should not reach its owner.
  const rendered = renderMail(
    'account-confirm',
    { url: opts.url, validHours: opts.validHours },
    {
      subject: 'Confirm your address to finish signing up',
      preheader: `The link works once, within ${opts.validHours} hours.`,
      heading: 'Confirm your address',
      reason: 'You get this because someone entered this address to make a Blockpost account.',
      unsubscribe: null,
      preferencesUrl: null,
    },
  );
  return { to: opts.to, ...rendered };
}

/** To the owner of an address someone tried to sign up with again: no link that makes anything. */
export function signupAttemptMail(opts: { to: string; displayName: string; signInUrl: string; forgotUrl: string }): OutgoingMail {
  const rendered = renderMail(
    'account-exists',
    { displayName: opts.displayName, signInUrl: opts.signInUrl, forgotUrl: opts.forgotUrl },
    {
      subject: 'Someone tried to sign up with your address',
      preheader: 'You already have an account; nothing was changed.',
      heading: 'You already have an account',
      reason: 'You get this because someone entered this address to make a new Blockpost account.',
      unsubscribe: null,
      preferencesUrl: null,
    },
  );
  return { to: opts.to, ...rendered };
}
