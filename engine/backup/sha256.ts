/**
 * SHA-256 (NIST FIPS 180-4, "Secure Hash Standard", 2015, sections 4.1.2, 4.2.2, 5.1.1,
 * 6.2) in pure TypeScript, for the backup file's content checksum. Written out here because
 * the engine has no platform crypto: Web Crypto's digest is asynchronous and Node's is
 * not available in a worker. Incremental, so a large backup is hashed in chunks without
 * one big byte copy of the whole text.
 *
 * A checksum tells a damaged or hand-edited file from an intact one; it is not a signature
 * and does not stop someone from changing a file and its checksum together.
 */
import { utf8Bytes } from '../write/encode';

// First 32 bits of the fractional parts of the cube roots of the first 64 primes (4.2.2).
const K = Uint32Array.from([
  0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98,
  0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786,
  0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8,
  0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13,
  0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819,
  0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a,
  0x5b9cca4f, 0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7,
  0xc67178f2,
]);

// Initial hash value (5.3.3): fractional parts of the square roots of the first 8 primes.
const H0 = [0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19];

/** An incremental SHA-256 computation. */
export interface Sha256 {
  /** Adds bytes to the message. @throws Error after digest(). */
  update(bytes: Uint8Array): Sha256;
  /** Finishes and returns the 32-byte digest; the hasher cannot be used afterwards. */
  digest(): Uint8Array;
}

/**
 * Starts a SHA-256 computation.
 * @example toHex(createSha256().update(utf8Bytes('abc')).digest()) // 'ba7816bf…f20015ad'
 * Complexity: O(n) in the bytes hashed.
 */
export function createSha256(): Sha256 {
  const h = Uint32Array.from(H0);
  const w = new Uint32Array(64);
  const block = new Uint8Array(64);
  let filled = 0;
  let length = 0; // bytes so far (a double: exact up to 2^53)
  let done = false;

  const compress = (data: Uint8Array, offset: number) => {
    for (let t = 0; t < 16; t++) {
      const i = offset + 4 * t;
      w[t] =
        (((data[i] as number) << 24) |
          ((data[i + 1] as number) << 16) |
          ((data[i + 2] as number) << 8) |
          (data[i + 3] as number)) >>>
        0;
    }
    for (let t = 16; t < 64; t++) {
      const x = w[t - 15] as number;
      const y = w[t - 2] as number;
      const s0 = ((x >>> 7) | (x << 25)) ^ ((x >>> 18) | (x << 14)) ^ (x >>> 3);
      const s1 = ((y >>> 17) | (y << 15)) ^ ((y >>> 19) | (y << 13)) ^ (y >>> 10);
      w[t] = ((w[t - 16] as number) + s0 + (w[t - 7] as number) + s1) >>> 0;
    }
    let a = h[0] as number;
    let b = h[1] as number;
    let c = h[2] as number;
    let d = h[3] as number;
    let e = h[4] as number;
    let f = h[5] as number;
    let g = h[6] as number;
    let hh = h[7] as number;
    for (let t = 0; t < 64; t++) {
      const S1 = ((e >>> 6) | (e << 26)) ^ ((e >>> 11) | (e << 21)) ^ ((e >>> 25) | (e << 7));
      const ch = (e & f) ^ (~e & g);
      const t1 = (hh + S1 + ch + (K[t] as number) + (w[t] as number)) | 0;
      const S0 = ((a >>> 2) | (a << 30)) ^ ((a >>> 13) | (a << 19)) ^ ((a >>> 22) | (a << 10));
      const maj = (a & b) ^ (a & c) ^ (b & c);
      const t2 = (S0 + maj) | 0;
      hh = g;
      g = f;
      f = e;
      e = (d + t1) | 0;
      d = c;
      c = b;
      b = a;
      a = (t1 + t2) | 0;
    }
    h[0] = ((h[0] as number) + a) >>> 0;
    h[1] = ((h[1] as number) + b) >>> 0;
    h[2] = ((h[2] as number) + c) >>> 0;
    h[3] = ((h[3] as number) + d) >>> 0;
    h[4] = ((h[4] as number) + e) >>> 0;
    h[5] = ((h[5] as number) + f) >>> 0;
    h[6] = ((h[6] as number) + g) >>> 0;
    h[7] = ((h[7] as number) + hh) >>> 0;
  };

  const hasher: Sha256 = {
    update(bytes: Uint8Array): Sha256 {
      if (done) throw new Error('SHA-256: update after digest');
      let i = 0;
      length += bytes.length;
      if (filled > 0) {
        const take = Math.min(64 - filled, bytes.length);
        block.set(bytes.subarray(0, take), filled);
        filled += take;
        i = take;
        if (filled < 64) return hasher;
        compress(block, 0);
        filled = 0;
      }
      for (; i + 64 <= bytes.length; i += 64) compress(bytes, i);
      if (i < bytes.length) {
        block.set(bytes.subarray(i), 0);
        filled = bytes.length - i;
      }
      return hasher;
    },
    digest(): Uint8Array {
      if (done) throw new Error('SHA-256: digest called twice');
      done = true;
      // Padding (5.1.1): a 1 bit, zeros, then the message length in bits as 64 bits.
      const bits = length * 8;
      block[filled++] = 0x80;
      if (filled > 56) {
        block.fill(0, filled);
        compress(block, 0);
        filled = 0;
      }
      block.fill(0, filled, 56);
      const high = Math.floor(bits / 0x100000000);
      const low = bits >>> 0;
      block[56] = high >>> 24;
      block[57] = (high >>> 16) & 0xff;
      block[58] = (high >>> 8) & 0xff;
      block[59] = high & 0xff;
      block[60] = low >>> 24;
      block[61] = (low >>> 16) & 0xff;
      block[62] = (low >>> 8) & 0xff;
      block[63] = low & 0xff;
      compress(block, 0);
      const out = new Uint8Array(32);
      for (let j = 0; j < 8; j++) {
        const v = h[j] as number;
        out[4 * j] = v >>> 24;
        out[4 * j + 1] = (v >>> 16) & 0xff;
        out[4 * j + 2] = (v >>> 8) & 0xff;
        out[4 * j + 3] = v & 0xff;
      }
      return out;
    },
  };
  return hasher;
}

/** Lower-case hex of bytes. @example toHex(Uint8Array.of(0, 255)) // '00ff' */
export function toHex(bytes: Uint8Array): string {
  let s = '';
  for (let i = 0; i < bytes.length; i++) s += (bytes[i] as number).toString(16).padStart(2, '0');
  return s;
}

/** Characters encoded per chunk when hashing text. */
const TEXT_CHUNK = 1 << 16;

/**
 * SHA-256 of a text's UTF-8 bytes, as lower-case hex. The text is encoded in chunks that
 * never split a surrogate pair, so memory stays small for large texts.
 * @example sha256Hex('') // 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'
 */
export function sha256Hex(text: string): string {
  const hasher = createSha256();
  for (let start = 0; start < text.length;) {
    let end = Math.min(text.length, start + TEXT_CHUNK);
    const last = text.charCodeAt(end - 1);
    if (end < text.length && last >= 0xd800 && last <= 0xdbff) end--; // keep a high surrogate with its low half
    hasher.update(utf8Bytes(text.slice(start, end)));
    start = end;
  }
  return toHex(hasher.digest());
}
