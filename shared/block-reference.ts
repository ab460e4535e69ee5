/**
 * The pure half of a signed block reference (no keys, no I/O): its byte layout, base64url text,
 * and the short code typed instead of scanning. Signing and checking live on the server; the client
 * uses this file to tell a reference from a short code and to read which swap a label is for.
 *
 * Layout: version (1 byte) ‖ swapId (unsigned LEB128) ‖ blockId (unsigned LEB128) ‖ tag (16 bytes).
 * The tag is the first 16 bytes of HMAC-SHA256(key, version ‖ swapId ‖ blockId); the short code is
 * the next 5 bytes of the same HMAC written as 8 characters of SHORT_CODE_ALPHABET.
 */

export const REFERENCE_VERSION = 1;
export const TAG_BYTES = 16;
export const SHORT_CODE_BYTES = 5;
export const SHORT_CODE_LENGTH = 8;
/** 32 characters, 5 bits each: digits 2–9 and the letters without I and O (no 0/O or 1/I mix-ups). */
export const SHORT_CODE_ALPHABET = '23456789ABCDEFGHJKLMNPQRSTUVWXYZ';

const B64URL = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';

/** base64url without padding (RFC 4648 §5). */
export function toBase64Url(bytes: Uint8Array): string {
  let out = '';
  for (let i = 0; i < bytes.length; i += 3) {
    const n = (bytes[i]! << 16) | ((bytes[i + 1] ?? 0) << 8) | (bytes[i + 2] ?? 0);
    const chars = Math.min(4, Math.ceil(((bytes.length - i) * 8) / 6));
    for (let c = 0; c < chars; c++) out += B64URL[(n >> (18 - 6 * c)) & 63];
  }
  return out;
}

/** Reads unpadded base64url; null for any other character or an impossible length. */
export function fromBase64Url(text: string): Uint8Array | null {
  if (text.length % 4 === 1) return null;
  const out: number[] = [];
  let acc = 0;
  let bits = 0;
  for (const ch of text) {
    const v = B64URL.indexOf(ch);
    if (v < 0) return null;
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out.push((acc >> bits) & 0xff);
    }
  }
  // Leftover bits must be zero, so each byte string has exactly one spelling.
  if (bits > 0 && (acc & ((1 << bits) - 1)) !== 0) return null;
  return Uint8Array.from(out);
}

function writeVarint(n: number, out: number[]) {
  if (!Number.isSafeInteger(n) || n < 0) throw new RangeError(`Cannot encode ${n} as an id.`);
  let rest = n;
  while (rest >= 0x80) {
    out.push((rest % 0x80) | 0x80);
    rest = Math.floor(rest / 0x80);
  }
  out.push(rest);
}

function readVarint(bytes: Uint8Array, start: number): { value: number; next: number } | null {
  let value = 0;
  let scale = 1;
  for (let i = start; i < bytes.length && i < start + 7; i++) {
    const b = bytes[i]!;
    value += (b & 0x7f) * scale;
    if ((b & 0x80) === 0) {
      // A trailing zero byte would give a second spelling of the same id.
      if (b === 0 && i > start) return null;
      return { value, next: i + 1 };
    }
    scale *= 0x80;
  }
  return null;
}

/** The signed bytes: version ‖ swapId ‖ blockId. */
export function referenceHeader(swapId: number, blockId: number, version = REFERENCE_VERSION): Uint8Array {
  const out = [version];
  writeVarint(swapId, out);
  writeVarint(blockId, out);
  return Uint8Array.from(out);
}

/** Joins the header and the tag into the reference text printed in the QR code. */
export function packReference(header: Uint8Array, tag: Uint8Array): string {
  const all = new Uint8Array(header.length + tag.length);
  all.set(header);
  all.set(tag, header.length);
  return toBase64Url(all);
}

export interface ParsedReference {
  version: number;
  swapId: number;
  blockId: number;
  header: Uint8Array;
  tag: Uint8Array;
}

/** Splits a reference into its parts without checking the tag; null when it is not one. */
export function parseReference(text: string): ParsedReference | null {
  const bytes = fromBase64Url(text.trim());
  if (!bytes || bytes.length < 3 + TAG_BYTES) return null;
  const version = bytes[0]!;
  const swap = readVarint(bytes, 1);
  if (!swap) return null;
  const block = readVarint(bytes, swap.next);
  if (!block || bytes.length - block.next !== TAG_BYTES) return null;
  if (swap.value < 1 || block.value < 1) return null;
  return { version, swapId: swap.value, blockId: block.value, header: bytes.slice(0, block.next), tag: bytes.slice(block.next) };
}

/** 40 bits → 8 characters of SHORT_CODE_ALPHABET. */
export function shortCodeFromBytes(bytes: Uint8Array): string {
  if (bytes.length !== SHORT_CODE_BYTES) throw new RangeError(`A short code is made from ${SHORT_CODE_BYTES} bytes.`);
  let n = 0n;
  for (const b of bytes) n = (n << 8n) | BigInt(b);
  let out = '';
  for (let i = SHORT_CODE_LENGTH - 1; i >= 0; i--) out += SHORT_CODE_ALPHABET[Number((n >> BigInt(5 * i)) & 31n)];
  return out;
}

/** `K7QM-3XWD`: two groups of four read more easily aloud and on a label. */
export function formatShortCode(code: string): string {
  return `${code.slice(0, 4)}-${code.slice(4)}`;
}

/**
 * Reads what a person typed as a short code: any case, spaces and hyphens ignored. Returns the
 * 8 plain characters, or a message saying what is wrong.
 */
export function normaliseShortCode(text: string): { code: string } | { error: string } {
  const plain = text.toUpperCase().replace(/[\s\-–—]/g, '');
  if (/[01IO]/.test(plain))
    return { error: 'Short codes have no 0, O, 1 or I. Check the label again: it uses digits 2–9 and letters.' };
  if (plain.length !== SHORT_CODE_LENGTH) return { error: `A short code has ${SHORT_CODE_LENGTH} characters, like K7QM-3XWD.` };
  for (const ch of plain) if (!SHORT_CODE_ALPHABET.includes(ch)) return { error: `“${ch}” is not used in short codes.` };
  return { code: plain };
}

export type IntakeInput =
  | { kind: 'reference'; reference: string; parsed: ParsedReference }
  | { kind: 'shortCode'; code: string }
  | { kind: 'invalid'; message: string };

/** Tells a scanned reference from a typed short code (a keyboard-style barcode scanner types references too). */
export function classifyIntakeInput(text: string): IntakeInput {
  const trimmed = text.trim();
  if (!trimmed) return { kind: 'invalid', message: 'Type the short code under the QR code, or scan the label.' };
  if (trimmed.length > 12) {
    const parsed = parseReference(trimmed);
    return parsed
      ? { kind: 'reference', reference: trimmed, parsed }
      : { kind: 'invalid', message: 'That is not a Blockpost label: the code could not be read.' };
  }
  const short = normaliseShortCode(trimmed);
  return 'code' in short ? { kind: 'shortCode', code: short.code } : { kind: 'invalid', message: short.error };
}
