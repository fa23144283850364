/**
 * Text to bytes in the encodings bank statement files come in, the reverse of
 * engine/import/decode.ts. Used by tests and the demo generator to write statement files.
 */
import { EngineError } from '../core/errors';
import { decodeWindows1252 } from '../import/decode';

/** Encodings `encodeText` writes. */
export type TextEncodingName = 'utf-8' | 'utf-8-bom' | 'utf-16le' | 'utf-16be' | 'windows-1252';

/**
 * Code point → byte for windows-1252, built from the decoder's table so both directions
 * share one source (WHATWG Encoding Standard, index-windows-1252).
 */
const WINDOWS_1252: ReadonlyMap<number, number> = (() => {
  const bytes = new Uint8Array(256);
  for (let b = 0; b < 256; b++) bytes[b] = b;
  const text = decodeWindows1252(bytes);
  const map = new Map<number, number>();
  for (let b = 0; b < 256; b++) map.set(text.charCodeAt(b), b);
  return map;
})();

/**
 * UTF-8 bytes of `text` (RFC 3629). A lone surrogate becomes U+FFFD, as the WHATWG
 * `TextEncoder` does. Written out here so the engine needs no platform encoder. O(n).
 *
 * @example [...utf8Bytes('€')] // [0xe2, 0x82, 0xac]
 */
export function utf8Bytes(text: string): Uint8Array {
  const out = new Uint8Array(text.length * 3);
  let o = 0;
  for (let i = 0; i < text.length; i++) {
    let cp = text.charCodeAt(i);
    if (cp >= 0xd800 && cp <= 0xdbff && i + 1 < text.length) {
      const low = text.charCodeAt(i + 1);
      if (low >= 0xdc00 && low <= 0xdfff) {
        cp = 0x10000 + ((cp - 0xd800) << 10) + (low - 0xdc00);
        i++;
      }
    }
    if (cp >= 0xd800 && cp <= 0xdfff) cp = 0xfffd;
    if (cp < 0x80) out[o++] = cp;
    else if (cp < 0x800) {
      out[o++] = 0xc0 | (cp >> 6);
      out[o++] = 0x80 | (cp & 0x3f);
    } else if (cp < 0x10000) {
      out[o++] = 0xe0 | (cp >> 12);
      out[o++] = 0x80 | ((cp >> 6) & 0x3f);
      out[o++] = 0x80 | (cp & 0x3f);
    } else {
      out[o++] = 0xf0 | (cp >> 18);
      out[o++] = 0x80 | ((cp >> 12) & 0x3f);
      out[o++] = 0x80 | ((cp >> 6) & 0x3f);
      out[o++] = 0x80 | (cp & 0x3f);
    }
  }
  return out.slice(0, o);
}

/**
 * Encodes `text`.
 * - `utf-8`: no byte-order mark; `utf-8-bom`: EF BB BF first.
 * - `utf-16le` / `utf-16be`: with a byte-order mark (FF FE / FE FF), as Windows tools
 *   write "Unicode" text; strip the first two bytes for BOM-less UTF-16.
 * - `windows-1252`: one byte per character (€ is 0x80).
 *
 * @throws EngineError INVALID_ARGUMENT when a character has no windows-1252 byte
 *   (the message names it and its position), or for an unknown encoding name.
 * @example encodeText('€1', 'windows-1252') // Uint8Array [0x80, 0x31]
 * @example encodeText('A', 'utf-16be') // Uint8Array [0xfe, 0xff, 0x00, 0x41]
 */
export function encodeText(text: string, encoding: TextEncodingName): Uint8Array {
  switch (encoding) {
    case 'utf-8':
      return utf8Bytes(text);
    case 'utf-8-bom': {
      const body = utf8Bytes(text);
      const out = new Uint8Array(body.length + 3);
      out.set([0xef, 0xbb, 0xbf]);
      out.set(body, 3);
      return out;
    }
    case 'utf-16le':
    case 'utf-16be': {
      const little = encoding === 'utf-16le';
      const out = new Uint8Array(2 + 2 * text.length);
      out[0] = little ? 0xff : 0xfe;
      out[1] = little ? 0xfe : 0xff;
      for (let i = 0; i < text.length; i++) {
        const u = text.charCodeAt(i);
        out[2 + 2 * i] = little ? u & 0xff : u >> 8;
        out[3 + 2 * i] = little ? u >> 8 : u & 0xff;
      }
      return out;
    }
    case 'windows-1252': {
      const out = new Uint8Array(text.length);
      for (let i = 0; i < text.length; i++) {
        const b = WINDOWS_1252.get(text.charCodeAt(i));
        if (b === undefined) {
          const cp = text.codePointAt(i) as number;
          throw new EngineError(
            'INVALID_ARGUMENT',
            `character "${String.fromCodePoint(cp)}" (U+${cp.toString(16).toUpperCase().padStart(4, '0')}) at position ${i} has no windows-1252 byte`,
          );
        }
        out[i] = b;
      }
      return out;
    }
    default:
      throw new EngineError('INVALID_ARGUMENT', `unknown text encoding "${String(encoding)}"`);
  }
}
