import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createRng } from '../../engine/core/random';
import { createSha256, sha256Hex, toHex } from '../../engine/backup/sha256';

describe('sha256', () => {
  // Source: NIST FIPS 180-4 example values (csrc.nist.gov, "SHA256.pdf", one-block and
  // two-block messages) and FIPS 180-2 Appendix B.3 (one million "a"); the empty message
  // from NIST CAVP SHAVS SHA256ShortMsg.rsp (Len = 0). Checked here against sha256sum.
  it('gives the published example digests', () => {
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
    expect(sha256Hex('a'.repeat(1_000_000))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
  });

  it('agrees with Node’s OpenSSL for every length around the block and padding edges, in any chunking', () => {
    // Source of the expected values: node:crypto createHash('sha256') (OpenSSL).
    const rng = createRng(5);
    for (let n = 0; n <= 200; n++) {
      const bytes = new Uint8Array(n);
      for (let i = 0; i < n; i++) bytes[i] = rng.nextInt(256);
      const expected = createHash('sha256').update(bytes).digest('hex');
      expect(toHex(createSha256().update(bytes).digest()), `length ${n}`).toBe(expected);
      const cut = rng.nextInt(n + 1);
      const chunked = createSha256().update(bytes.subarray(0, cut)).update(bytes.subarray(cut)).digest();
      expect(toHex(chunked), `length ${n} cut at ${cut}`).toBe(expected);
    }
  });

  it('hashes text as UTF-8, also when a surrogate pair straddles the encoding chunk', () => {
    const text = 'x'.repeat(65_535) + '😀' + 'Grüße €';
    expect(sha256Hex(text)).toBe(createHash('sha256').update(text, 'utf8').digest('hex'));
  });
});
