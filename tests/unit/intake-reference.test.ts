import { describe, expect, it } from 'vitest';
import {
  SHORT_CODE_ALPHABET,
  classifyIntakeInput,
  formatShortCode,
  fromBase64Url,
  normaliseShortCode,
  parseReference,
  referenceHeader,
  toBase64Url,
} from '../../shared/block-reference';
import { referenceKey, signBlock, verifyReference } from '../../server/intake/references';

const key = referenceKey('a-session-secret-of-some-length');

function flipByte(reference: string, index: number): string {
  const bytes = fromBase64Url(reference)!;
  bytes[index] = bytes[index]! ^ 0x01;
  return toBase64Url(bytes);
}

describe('base64url', () => {
  it('matches Node’s own encoder for every length 0–40 (RFC 4648 §5, no padding)', () => {
    for (let n = 0; n <= 40; n++) {
      const bytes = Uint8Array.from({ length: n }, (_, i) => (i * 37 + n * 11) & 0xff);
      const text = toBase64Url(bytes);
      expect(text).toBe(Buffer.from(bytes).toString('base64url'));
      expect(fromBase64Url(text)).toEqual(bytes);
    }
  });

  it('refuses other alphabets and non-canonical spellings', () => {
    expect(fromBase64Url('ab+c')).toBeNull();
    expect(fromBase64Url('abcde')).toBeNull(); // 5 characters cannot end a byte string
    expect(fromBase64Url('QR')).toBeNull(); // 'R' leaves non-zero spare bits; 'QQ' is the one spelling of 0x41
    expect(fromBase64Url('QQ')).toEqual(Uint8Array.of(0x41));
  });
});

describe('signed block references', () => {
  it('round-trips swap and block ids, small and large', () => {
    for (const [swapId, blockId] of [
      [1, 1],
      [7, 51],
      [300, 16_384],
      [2_000_000, 99_999_999],
    ] as const) {
      const { reference } = signBlock(key, swapId, blockId);
      expect(verifyReference(key, reference)).toEqual({ ok: true, swapId, blockId });
      expect(reference).toMatch(/^[\w-]+$/);
    }
  });

  it('stays compact: 28 characters for ids under 16 384', () => {
    // 1 version byte + 2 + 2 varint bytes + 16 tag bytes = 21 bytes = 28 base64url characters.
    expect(signBlock(key, 9_000, 12_000).reference).toHaveLength(28);
  });

  it('refuses a reference with any single byte flipped', () => {
    const { reference } = signBlock(key, 12, 345);
    const length = fromBase64Url(reference)!.length;
    for (let i = 0; i < length; i++) {
      const check = verifyReference(key, flipByte(reference, i));
      expect(check.ok, `byte ${i}`).toBe(false);
    }
  });

  it('refuses a reference signed with another key (another server’s secret)', () => {
    const { reference } = signBlock(referenceKey('another-secret-entirely-here'), 12, 345);
    expect(verifyReference(key, reference)).toEqual({ ok: false, reason: 'signature' });
  });

  it('cannot be replayed on another swap: moving the tag to another swap’s header fails', () => {
    const { reference } = signBlock(key, 12, 345);
    const parsed = parseReference(reference)!;
    const moved = toBase64Url(Uint8Array.from([...referenceHeader(13, 345), ...parsed.tag]));
    expect(verifyReference(key, moved)).toEqual({ ok: false, reason: 'signature' });
    const otherBlock = toBase64Url(Uint8Array.from([...referenceHeader(12, 346), ...parsed.tag]));
    expect(verifyReference(key, otherBlock)).toEqual({ ok: false, reason: 'signature' });
  });

  it('says when it is not a reference at all, or of an unknown version', () => {
    expect(verifyReference(key, 'hello')).toEqual({ ok: false, reason: 'unreadable' });
    expect(verifyReference(key, '')).toEqual({ ok: false, reason: 'unreadable' });
    const { reference } = signBlock(key, 12, 345);
    expect(verifyReference(key, `${reference}AA`)).toEqual({ ok: false, reason: 'unreadable' });
    const bytes = fromBase64Url(reference)!;
    bytes[0] = 2;
    expect(verifyReference(key, toBase64Url(bytes))).toEqual({ ok: false, reason: 'version' });
  });
});

describe('short codes', () => {
  it('use 8 characters with no 0, O, 1 or I', () => {
    expect(SHORT_CODE_ALPHABET).toHaveLength(32);
    expect(SHORT_CODE_ALPHABET).not.toMatch(/[01IO]/);
    const { shortCode } = signBlock(key, 3, 4);
    expect(shortCode).toMatch(/^[2-9A-HJ-NP-Z]{8}$/);
    expect(formatShortCode(shortCode)).toMatch(/^[2-9A-HJ-NP-Z]{4}-[2-9A-HJ-NP-Z]{4}$/);
  });

  it('do not collide within a swap of 20 000 blocks', () => {
    // 40 bits per code: for n codes the chance of any collision is about n²/2⁴¹ (birthday bound),
    // 2 × 10⁻⁴ at n = 20 000; with this fixed key the outcome is fixed, and a real swap is far smaller.
    const codes = new Set<string>();
    for (let blockId = 1; blockId <= 20_000; blockId++) codes.add(signBlock(key, 77, blockId).shortCode);
    expect(codes.size).toBe(20_000);
  });

  it('differ between swaps for the same block id, and between keys', () => {
    expect(signBlock(key, 1, 10).shortCode).not.toBe(signBlock(key, 2, 10).shortCode);
    expect(signBlock(key, 1, 10).shortCode).not.toBe(signBlock(referenceKey('a-different-session-secret'), 1, 10).shortCode);
  });

  it('read back in any case, with spaces or hyphens, and say what is wrong otherwise', () => {
    expect(normaliseShortCode(' k7qm-3xwd ')).toEqual({ code: 'K7QM3XWD' });
    expect(normaliseShortCode('K7QM 3XWD')).toEqual({ code: 'K7QM3XWD' });
    expect(normaliseShortCode('K7QM-3XW0')).toEqual({ error: expect.stringContaining('no 0, O, 1 or I') });
    expect(normaliseShortCode('K7QM')).toEqual({ error: expect.stringContaining('8 characters') });
    expect(normaliseShortCode('K7QM-3XW!')).toEqual({ error: '“!” is not used in short codes.' });
  });

  it('are told apart from scanned references', () => {
    const { reference, shortCode } = signBlock(key, 5, 6);
    expect(classifyIntakeInput(reference)).toMatchObject({ kind: 'reference', parsed: { swapId: 5, blockId: 6 } });
    expect(classifyIntakeInput(formatShortCode(shortCode).toLowerCase())).toEqual({ kind: 'shortCode', code: shortCode });
    expect(classifyIntakeInput('https://example.test/some/long/thing')).toMatchObject({ kind: 'invalid' });
    expect(classifyIntakeInput('   ')).toMatchObject({ kind: 'invalid' });
  });
});
