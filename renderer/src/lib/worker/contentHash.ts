/**
 * The hash that recognises a file imported twice: SHA-256 (FIPS 180-4) of its bytes, in
 * hex, through Web Crypto. Where Web Crypto is missing (an insecure context), 64-bit
 * FNV-1a (IETF draft-eastlake-fnv) prefixed `fnv1a64-` stands in; it only ever compares
 * with hashes made the same way in the same browser.
 */

function hex(bytes: Uint8Array): string {
  let out = '';
  for (const b of bytes) out += b.toString(16).padStart(2, '0');
  return out;
}

/** 64-bit FNV-1a of the bytes, as `fnv1a64-` and 16 hex digits. O(n). */
export function fnv1a64(bytes: Uint8Array): string {
  // Two 32-bit halves instead of BigInt: a 50 MB file hashes in well under a second.
  let hi = 0xcbf29ce4;
  let lo = 0x84222325;
  for (let i = 0; i < bytes.length; i++) {
    lo = (lo ^ (bytes[i] as number)) >>> 0;
    // Multiply by the prime 0x100000001b3 = 2^40 + 0x1b3.
    const loProduct = lo * 0x1b3;
    const carry = Math.floor(loProduct / 0x1_0000_0000);
    const newLo = loProduct >>> 0;
    hi = (hi * 0x1b3 + carry + ((lo << 8) >>> 0)) >>> 0;
    lo = newLo;
  }
  return `fnv1a64-${hi.toString(16).padStart(8, '0')}${lo.toString(16).padStart(8, '0')}`;
}

/**
 * Hash of a file's bytes.
 * @example await contentHash(new TextEncoder().encode('abc')) // 'ba7816bf…15ad' (SHA-256)
 */
export async function contentHash(bytes: Uint8Array): Promise<string> {
  const subtle = globalThis.crypto?.subtle;
  if (!subtle) return fnv1a64(bytes);
  // Bytes that crossed postMessage or came from a File are ArrayBuffer-backed, as digest needs.
  const data = bytes.buffer instanceof ArrayBuffer ? (bytes as Uint8Array<ArrayBuffer>) : new Uint8Array(bytes);
  return hex(new Uint8Array(await subtle.digest('SHA-256', data)));
}
