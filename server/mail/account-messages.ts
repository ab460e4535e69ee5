/** Account mail (invitations, password resets): always sent, so it carries no unsubscribe link. */
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
