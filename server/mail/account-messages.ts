import type { OutgoingMail } from './mailer';
import { roleLabels, type Role } from '@shared/schemas/guilds';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function layout(title: string, paragraphs: string[], action: { label: string; url: string }) {
  const body = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join('');
  return `<!doctype html><html><body style="background:#F7F3EA;color:#2B2118;font-family:Arial,sans-serif;font-size:17px;padding:24px">
<h1 style="font-size:22px;color:#2F4B7C">${escapeHtml(title)}</h1>${body}
<p><a href="${escapeHtml(action.url)}" style="background:#2F4B7C;color:#fff;padding:12px 20px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p>
<p style="font-size:14px">Or paste this link into your browser: ${escapeHtml(action.url)}</p></body></html>`;
}

export function invitationMail(opts: { to: string; guildName: string; inviterName: string; role: Role; url: string; expiresAt: Date }): OutgoingMail {
  const paragraphs = [
    `${opts.inviterName} has invited you to join ${opts.guildName} on Blockpost as ${roleLabels[opts.role].toLowerCase()}.`,
    'Blockpost is where the guild runs its block swaps and sew days: sign-ups, cutting plans, hand-ins and chat.',
    `The invitation is valid until ${opts.expiresAt.toUTCString()}. If you did not expect it, you can ignore this message.`,
  ];
  return {
    to: opts.to,
    subject: `You are invited to ${opts.guildName} on Blockpost`,
    text: `${paragraphs.join('\n\n')}\n\nAccept the invitation: ${opts.url}\n`,
    html: layout(`Join ${opts.guildName}`, paragraphs, { label: 'Accept the invitation', url: opts.url }),
  };
}

export function passwordResetMail(opts: { to: string; displayName: string; url: string; validMinutes: number }): OutgoingMail {
  const paragraphs = [
    `Hello ${opts.displayName},`,
    `Someone asked to reset the Blockpost password for this address. The link works once, within ${opts.validMinutes} minutes.`,
    'If it was not you, ignore this message: your password stays as it is.',
  ];
  return {
    to: opts.to,
    subject: 'Reset your Blockpost password',
    text: `${paragraphs.join('\n\n')}\n\nChoose a new password: ${opts.url}\n`,
    html: layout('Reset your password', paragraphs, { label: 'Choose a new password', url: opts.url }),
  };
}
