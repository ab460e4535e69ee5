/**
 * Signed block references for labels: HMAC-SHA256 over (version, swapId, blockId) with a key derived
 * from SESSION_SECRET, so a label cannot be made up, edited, or moved to another swap. Rotating
 * SESSION_SECRET voids printed labels (the short codes change too).
 */
import { createHmac, hkdfSync, timingSafeEqual } from 'node:crypto';
import {
  REFERENCE_VERSION,
  SHORT_CODE_BYTES,
  TAG_BYTES,
  packReference,
  parseReference,
  referenceHeader,
  shortCodeFromBytes,
} from '@shared/block-reference';

export interface SignedBlock {
  reference: string;
  shortCode: string;
}

export type ReferenceCheck =
  { ok: true; swapId: number; blockId: number } | { ok: false; reason: 'unreadable' | 'version' | 'signature' };

const keys = new Map<string, Buffer>();

/**
 * A key of its own for labels (HKDF-SHA256, RFC 5869), so the session secret itself never signs
 * anything a member can print.
 */
export function referenceKey(secret: string): Buffer {
  let key = keys.get(secret);
  if (!key) {
    key = Buffer.from(hkdfSync('sha256', secret, 'blockpost', 'intake block reference v1', 32));
    keys.set(secret, key);
  }
  return key;
}

function mac(key: Buffer, header: Uint8Array): Buffer {
  return createHmac('sha256', key).update(header).digest();
}

/**
 * The reference and short code of one block. The tag keeps 128 of the HMAC's 256 bits (RFC 2104 §5:
 * at least half the hash length); the short code takes the next 40 bits.
 */
export function signBlock(key: Buffer, swapId: number, blockId: number): SignedBlock {
  const header = referenceHeader(swapId, blockId);
  const full = mac(key, header);
  return {
    reference: packReference(header, full.subarray(0, TAG_BYTES)),
    shortCode: shortCodeFromBytes(full.subarray(TAG_BYTES, TAG_BYTES + SHORT_CODE_BYTES)),
  };
}

/** Checks a reference's tag in constant time and returns the swap and block it names. */
export function verifyReference(key: Buffer, text: string): ReferenceCheck {
  const parsed = parseReference(text);
  if (!parsed) return { ok: false, reason: 'unreadable' };
  if (parsed.version !== REFERENCE_VERSION) return { ok: false, reason: 'version' };
  const expected = mac(key, parsed.header).subarray(0, TAG_BYTES);
  if (!timingSafeEqual(expected, Buffer.from(parsed.tag))) return { ok: false, reason: 'signature' };
  return { ok: true, swapId: parsed.swapId, blockId: parsed.blockId };
}
