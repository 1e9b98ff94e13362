import { describe, expect, it } from 'vitest';
import { contentId, readingCanonical } from '../../src/io/content-id';
import { sha256 } from '../../src/io/sha256';

const hex = (b: Uint8Array) => Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');

describe('content ids', () => {
  it('SHA-256 reproduces the FIPS 180-2 examples', () => {
    // FIPS 180-2, appendix B.1 (one block) and B.2 (two blocks); digests from memory of the
    // standard, and cross-checked against Web Crypto in the next test.
    expect(hex(sha256('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(hex(sha256('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq'))).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
  });
  it('agrees with Web Crypto on text of every padding length and on non-ASCII', async () => {
    for (const t of [
      '',
      'µS/cm °C',
      'x'.repeat(55),
      'x'.repeat(56),
      'x'.repeat(64),
      'Quellhof\u001f'.repeat(40),
    ]) {
      const ref = new Uint8Array(await crypto.subtle.digest('SHA-256', new TextEncoder().encode(t)));
      expect(hex(sha256(t))).toBe(hex(ref));
    }
  });
  it('is a version-8 UUID that depends on content only', () => {
    const id = contentId(
      readingCanonical('site-1', '2026-06-03T07:15:00.000Z', { ph: 7.21, temperature_c: 9.4 }),
    );
    expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-8[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(
      contentId(readingCanonical('site-1', '2026-06-03T07:15:00.000Z', { temperature_c: 9.4, ph: 7.21 })),
    ).toBe(id);
    expect(
      contentId(readingCanonical('site-1', '2026-06-03T07:15:00.000Z', { temperature_c: 9.5, ph: 7.21 })),
    ).not.toBe(id);
  });
});
