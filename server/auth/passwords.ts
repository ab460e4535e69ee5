import { hash, verify } from '@node-rs/argon2';

/** argon2id with the library's recommended defaults (~65 ms a hash on this machine). */
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

// Verifying against a fixed hash for unknown e-mails keeps sign-in timing alike for both cases.
let decoyHash: Promise<string> | null = null;
export function decoyVerify(password: string) {
  decoyHash ??= hash('blockpost-decoy-password');
  return decoyHash.then((h) => verifyPassword(h, password));
}
