import { describe, expect, it } from 'vitest';
import { encodeText, utf8Bytes } from '../../engine/write/encode';
import { decodeWindows1252 } from '../../engine/import/decode';

describe('encodeText', () => {
  it('writes UTF-8 with and without a byte-order mark', () => {
    // Source: RFC 3629 section 3 (the UTF-8 bit layout; applied by hand to U+20AC it gives E2 82 AC).
    // From memory: the byte-order mark U+FEFF is EF BB BF in UTF-8 (Unicode Standard, chapter 23, Specials).
    expect([...encodeText('€', 'utf-8')]).toEqual([0xe2, 0x82, 0xac]);
    expect([...encodeText('€', 'utf-8-bom')]).toEqual([0xef, 0xbb, 0xbf, 0xe2, 0x82, 0xac]);
  });

  it('writes UTF-16 with its byte-order mark, surrogate pairs as two code units', () => {
    // Source: RFC 2781 section 2.1 (surrogate-pair algorithm; by hand U+1F3FA → D83C DFFA).
    // From memory: RFC 2781 section 3.2, the byte-order mark is FF FE little-endian and FE FF big-endian.
    expect([...encodeText('A€', 'utf-16le')]).toEqual([0xff, 0xfe, 0x41, 0x00, 0xac, 0x20]);
    expect([...encodeText('A€', 'utf-16be')]).toEqual([0xfe, 0xff, 0x00, 0x41, 0x20, 0xac]);
    expect([...encodeText('\u{1f3fa}', 'utf-16be')]).toEqual([0xfe, 0xff, 0xd8, 0x3c, 0xdf, 0xfa]);
  });

  it('writes windows-1252 by the WHATWG index', () => {
    // Source: WHATWG Encoding Standard, index-windows-1252: 0x80 → U+20AC, 0x9F → U+0178, 0x8A → U+0160; 0xA0–0xFF as Latin-1
    expect([...encodeText('€ŸŠ', 'windows-1252')]).toEqual([0x80, 0x9f, 0x8a]);
    expect([...encodeText('é ü', 'windows-1252')]).toEqual([0xe9, 0x20, 0xfc]);
  });

  it('round-trips every windows-1252 byte through the decoder', () => {
    const all = new Uint8Array(256).map((_, b) => b);
    expect([...encodeText(decodeWindows1252(all), 'windows-1252')]).toEqual([...all]);
  });

  it('refuses a character windows-1252 has no byte for, naming it', () => {
    expect(() => encodeText('ok 🏺', 'windows-1252')).toThrow(
      /"🏺" \(U\+1F3FA\) at position 3 has no windows-1252 byte/,
    );
    // U+0080 is not in index-windows-1252 (byte 0x80 is €).
    expect(() => encodeText('\u0080', 'windows-1252')).toThrow(/U\+0080/);
  });
});

describe('utf8Bytes', () => {
  it('agrees with the platform TextEncoder, lone surrogates included', () => {
    // Source: WHATWG Encoding Standard, UTF-8 encoder (lone surrogates are encoded as U+FFFD).
    for (const text of ['', 'abc', 'é€', '\u{1f3fa}x', '\ud800', 'a\udc00b', '\u07ff\u0800\uffff']) {
      expect([...utf8Bytes(text)]).toEqual([...new TextEncoder().encode(text)]);
    }
  });
});
