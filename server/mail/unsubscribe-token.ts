/**
 * One-click unsubscribe tokens: the person and the kind of mail, signed with HMAC-SHA256 under
 * SESSION_SECRET. Verifying needs no database lookup, and a token cannot be altered to unsubscribe
 * someone else or from another category. Tokens do not expire: an old e-mail's link must still work.
 */
import { createHmac, timingSafeEqual } from 'node:crypto';
import { mailCategories, type MailCategory } from '@shared/schemas/notifications';

const PURPOSE = 'blockpost-unsubscribe:v1';

function signature(secret: string, userId: number, category: MailCategory) {
  return createHmac('sha256', secret).update(`${PURPOSE}:${userId}:${category}`).digest('base64url');
}

/** `<userId>.<category>.<signature>`, URL-safe. */
export function unsubscribeToken(secret: string, userId: number, category: MailCategory): string {
  return `${userId}.${category}.${signature(secret, userId, category)}`;
}

/** The person and category a token stands for, or null when it was not made with this secret. */
export function verifyUnsubscribeToken(secret: string, token: string): { userId: number; category: MailCategory } | null {
  const match = /^(\d{1,10})\.([a-z-]{1,40})\.([\w-]{43})$/.exec(token);
  if (!match) return null;
  const userId = Number(match[1]);
  const category = match[2] as MailCategory;
  if (!Number.isSafeInteger(userId) || userId < 1 || !mailCategories.includes(category)) return null;
  const expected = Buffer.from(signature(secret, userId, category));
  const given = Buffer.from(match[3]!);
  if (expected.length !== given.length || !timingSafeEqual(expected, given)) return null;
  return { userId, category };
}

/** The API address mail programs POST to (RFC 8058) and people may open. */
export function unsubscribeApiUrl(publicUrl: string, token: string) {
  return `${publicUrl.replace(/\/$/, '')}/api/unsubscribe?token=${encodeURIComponent(token)}`;
}

/** The confirmation page in the app, linked from the message body. */
export function unsubscribePageUrl(publicUrl: string, token: string) {
  return `${publicUrl.replace(/\/$/, '')}/unsubscribe?token=${encodeURIComponent(token)}`;
}

/** RFC 2369 + RFC 8058 headers for one-click unsubscribe. */
export function unsubscribeHeaders(publicUrl: string, token: string): Record<string, string> {
  return {
    'List-Unsubscribe': `<${unsubscribeApiUrl(publicUrl, token)}>`,
    'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
  };
}
