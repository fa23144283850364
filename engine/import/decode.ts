/**
 * Turns the bytes of a statement file into text. Order of evidence: a byte-order mark;
 * the zero-byte pattern of UTF-16 without a BOM; strict UTF-8; otherwise Windows-1252.
 * Per the WHATWG Encoding Standard, the labels `latin1` and `iso-8859-1` also decode as
 * windows-1252 (byte 0x80 is "€"), so ISO-8859-1 files are covered by the same table.
 */

/** Largest statement file Ebbline reads: 256 MiB. Larger files are refused, not truncated. */
export const MAX_STATEMENT_BYTES = 256 * 1024 * 1024;

export type TextEncodingId = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface DecodedText {
  readonly text: string;
  readonly encoding: TextEncodingId;
  readonly hadBom: boolean;
}

/** Windows-1252 code points for bytes 0x80–0x9F (WHATWG index-windows-1252). */
const CP1252_HIGH = [
  0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152, 0x8d, 0x17d, 0x8f,
  0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122, 0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178,
];

/** Decodes bytes as windows-1252. O(n). */
export function decodeWindows1252(bytes: Uint8Array): string {
  const chunk = 8192;
  const parts: string[] = [];
  const codes = new Uint16Array(Math.min(chunk, bytes.length));
  for (let start = 0; start < bytes.length; start += chunk) {
    const end = Math.min(start + chunk, bytes.length);
    for (let i = start; i < end; i++) {
      const b = bytes[i] as number;
      codes[i - start] = b >= 0x80 && b <= 0x9f ? (CP1252_HIGH[b - 0x80] as number) : b;
    }
    parts.push(String.fromCharCode(...codes.subarray(0, end - start)));
  }
  return parts.join('');
}

function decodeUtf16(bytes: Uint8Array, littleEndian: boolean, offset: number): string {
  const n = Math.floor((bytes.length - offset) / 2);
  const parts: string[] = [];
  const chunk = 8192;
  const codes = new Uint16Array(Math.min(chunk, n));
  for (let start = 0; start < n; start += chunk) {
    const end = Math.min(start + chunk, n);
    for (let i = start; i < end; i++) {
      const a = bytes[offset + 2 * i] as number;
      const b = bytes[offset + 2 * i + 1] as number;
      codes[i - start] = littleEndian ? a | (b << 8) : (a << 8) | b;
    }
    parts.push(String.fromCharCode(...codes.subarray(0, end - start)));
  }
  return parts.join('');
}

/** Guesses UTF-16 without a BOM from where the zero bytes of ASCII text fall. */
function sniffUtf16(bytes: Uint8Array): 'utf-16le' | 'utf-16be' | undefined {
  const n = Math.min(bytes.length - (bytes.length % 2), 4096);
  if (n < 4) return undefined;
  let evenZeros = 0;
  let oddZeros = 0;
  for (let i = 0; i < n; i += 2) {
    if (bytes[i] === 0) evenZeros++;
    if (bytes[i + 1] === 0) oddZeros++;
  }
  const pairs = n / 2;
  if (oddZeros > pairs * 0.4 && evenZeros < pairs * 0.05) return 'utf-16le';
  if (evenZeros > pairs * 0.4 && oddZeros < pairs * 0.05) return 'utf-16be';
  return undefined;
}

/**
 * Decodes statement bytes to text, choosing the encoding from the content.
 * `declared` is an encoding the caller read from the file itself (XML declaration, OFX
 * CHARSET); a single-byte declaration forces windows-1252 decoding.
 *
 * @example decodeStatementBytes(new Uint8Array([0xef, 0xbb, 0xbf, 0x41])).text // 'A'
 */
export function decodeStatementBytes(bytes: Uint8Array, declared?: TextEncodingId): DecodedText {
  if (bytes.length >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) {
    return { text: new TextDecoder('utf-8').decode(bytes.subarray(3)), encoding: 'utf-8', hadBom: true };
  }
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) {
    return { text: decodeUtf16(bytes, true, 2), encoding: 'utf-16le', hadBom: true };
  }
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) {
    return { text: decodeUtf16(bytes, false, 2), encoding: 'utf-16be', hadBom: true };
  }
  const utf16 = sniffUtf16(bytes);
  if (utf16) return { text: decodeUtf16(bytes, utf16 === 'utf-16le', 0), encoding: utf16, hadBom: false };
  if (declared === 'windows-1252') return { text: decodeWindows1252(bytes), encoding: 'windows-1252', hadBom: false };
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8', hadBom: false };
  } catch {
    return { text: decodeWindows1252(bytes), encoding: 'windows-1252', hadBom: false };
  }
}

/**
 * Reads an encoding the file declares in its first bytes: an XML declaration's
 * `encoding="…"` or an OFX 1.x `CHARSET:` / `ENCODING:` header.
 */
export function declaredEncoding(bytes: Uint8Array): TextEncodingId | undefined {
  const head = decodeWindows1252(bytes.subarray(0, 512));
  const xml = /<\?xml[^>]*encoding\s*=\s*["']([^"']+)["']/i.exec(head);
  const label = xml?.[1] ?? /^CHARSET:\s*(\S+)/im.exec(head)?.[1];
  if (!label) return undefined;
  const l = label.toLowerCase();
  if (l === 'utf-8' || l === 'utf8') return 'utf-8';
  if (/^(1252|windows-1252|cp1252|iso-8859-1|iso8859-1|latin1|latin-1|us-ascii|ascii)$/.test(l)) return 'windows-1252';
  return undefined;
}

/**
 * True when the bytes look like a binary (non-text) file: NUL bytes or many control
 * characters in the first 4 KiB of a file that is not UTF-16.
 */
export function looksBinary(bytes: Uint8Array): boolean {
  if (sniffUtf16(bytes)) return false;
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)))
    return false;
  const n = Math.min(bytes.length, 4096);
  let control = 0;
  for (let i = 0; i < n; i++) {
    const b = bytes[i] as number;
    if (b === 0) return true;
    if (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d && b !== 0x0c && b !== 0x1a) control++;
  }
  return n > 0 && control / n > 0.05;
}
