import { createHash, randomBytes } from 'node:crypto';

/**
 * The secret in a link sent by mail (invitation, password reset, sign-up confirmation): a random
 * URL-safe token, and the SHA-256 we store instead of it.
 */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
