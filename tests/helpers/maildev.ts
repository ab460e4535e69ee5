import { inject } from 'vitest';

export interface CaughtMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string }[];
  headers: Record<string, string>;
}

/** All mail maildev holds for one recipient, read through its HTTP API. */
export async function mailTo(address: string): Promise<CaughtMail[]> {
  const res = await fetch(`${inject('maildevApi')}/api/email`);
  if (!res.ok) throw new Error(`maildev answered ${res.status}`);
  const all = (await res.json()) as CaughtMail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** Waits until a message for `address` matching `match` arrives (SMTP delivery is asynchronous). */
export async function waitForMail(address: string, match: (m: CaughtMail) => boolean = () => true, timeoutMs = 10_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const found = (await mailTo(address)).find(match);
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`No mail for ${address} within ${timeoutMs} ms`);
}

export function linkIn(mail: CaughtMail, pattern: RegExp): string {
  const found = mail.text.match(pattern);
  if (!found) throw new Error(`No link matching ${pattern} in: ${mail.text}`);
  return found[0];
}
