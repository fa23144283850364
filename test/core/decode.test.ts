import { describe, expect, it } from 'vitest';
import { declaredEncoding, decodeStatementBytes, decodeWindows1252, looksBinary } from '../../engine/import/decode';

const ascii = (text: string) => new TextEncoder().encode(text);

function utf16(text: string, littleEndian: boolean, bom: boolean): Uint8Array {
  const out = new Uint8Array(text.length * 2 + (bom ? 2 : 0));
  let o = 0;
  if (bom) {
    out[o++] = littleEndian ? 0xff : 0xfe;
    out[o++] = littleEndian ? 0xfe : 0xff;
  }
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[o++] = littleEndian ? c & 0xff : c >> 8;
    out[o++] = littleEndian ? c >> 8 : c & 0xff;
  }
  return out;
}

describe('decodeWindows1252', () => {
  it('maps 0x80-0x9F through the WHATWG table', () => {
    // Source: WHATWG Encoding Standard, index-windows-1252: 0x80 → U+20AC (€), 0x8A → U+0160 (Š),
    // 0x91 → U+2018, 0x96 → U+2013, 0x9F → U+0178 (Ÿ); the unassigned 0x81, 0x8D, 0x8F,
    // 0x90, 0x9D map to the C1 controls of the same value.
    const bytes = new Uint8Array([0x80, 0x8a, 0x91, 0x96, 0x9f, 0x81, 0x8d, 0x8f, 0x90, 0x9d]);
    expect(Array.from(decodeWindows1252(bytes), (c) => c.codePointAt(0))).toEqual([
      0x20ac, 0x160, 0x2018, 0x2013, 0x178, 0x81, 0x8d, 0x8f, 0x90, 0x9d,
    ]);
  });
  it('maps ASCII and 0xA0-0xFF to the same code points', () => {
    // Source: WHATWG Encoding Standard, index-windows-1252 (0xA0–0xFF are identical to Latin-1).
    const bytes = new Uint8Array([0x41, 0x7f, 0xa0, 0xe9, 0xfc, 0xff]);
    expect(decodeWindows1252(bytes)).toBe('A\u007f\u00a0éüÿ');
  });
  it('maps every byte 0x80-0x9F as the WHATWG index lists it', () => {
    // Source: WHATWG Encoding Standard, index-windows-1252.txt (pointers 0–31 = bytes 0x80–0x9F).
    // Node's own TextDecoder('windows-1252') cannot serve as the reference: builds without full
    // ICU decode these bytes as Latin-1 (this machine's Node 20 does).
    const index = [
      0x20ac, 0x0081, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x008d,
      0x017d, 0x008f, 0x0090, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a,
      0x0153, 0x009d, 0x017e, 0x0178,
    ];
    const bytes = Uint8Array.from({ length: 32 }, (_, i) => 0x80 + i);
    expect(Array.from(decodeWindows1252(bytes), (c) => c.codePointAt(0))).toEqual(index);
  });
  it('decodes inputs longer than one internal chunk and the empty input', () => {
    const big = new Uint8Array(20_000).fill(0x80);
    expect(decodeWindows1252(big)).toBe('€'.repeat(20_000));
    expect(decodeWindows1252(new Uint8Array(0))).toBe('');
  });
});

describe('decodeStatementBytes', () => {
  it('strips a UTF-8 BOM and reports it', () => {
    const d = decodeStatementBytes(new Uint8Array([0xef, 0xbb, 0xbf, 0x41, 0xc3, 0xa9]));
    expect(d).toEqual({ text: 'Aé', encoding: 'utf-8', hadBom: true });
  });
  it('reads UTF-16 LE and BE with a BOM', () => {
    expect(decodeStatementBytes(utf16('Datum;Betrag €', true, true))).toEqual({
      text: 'Datum;Betrag €',
      encoding: 'utf-16le',
      hadBom: true,
    });
    expect(decodeStatementBytes(utf16('Datum;Betrag €', false, true))).toEqual({
      text: 'Datum;Betrag €',
      encoding: 'utf-16be',
      hadBom: true,
    });
  });
  it('sniffs UTF-16 without a BOM from the zero bytes of ASCII text', () => {
    const text = 'Date,Amount,Description\r\n2026-01-02,-12.50,Clay supply\r\n';
    expect(decodeStatementBytes(utf16(text, true, false))).toEqual({ text, encoding: 'utf-16le', hadBom: false });
    expect(decodeStatementBytes(utf16(text, false, false))).toEqual({ text, encoding: 'utf-16be', hadBom: false });
  });
  it('keeps non-ASCII characters in sniffed UTF-16', () => {
    const text = 'Café;12,50 €;Überweisung\r\n'.repeat(5);
    expect(decodeStatementBytes(utf16(text, true, false)).text).toBe(text);
  });
  it('does not take short or plain ASCII input for UTF-16', () => {
    expect(decodeStatementBytes(ascii('A,B')).encoding).toBe('utf-8');
    expect(decodeStatementBytes(new Uint8Array([0x41, 0x00])).encoding).not.toBe('utf-16le');
  });
  it('prefers strict UTF-8 and falls back to windows-1252 on invalid UTF-8', () => {
    expect(decodeStatementBytes(ascii('Miete 1.200,00 €'))).toEqual({
      text: 'Miete 1.200,00 €',
      encoding: 'utf-8',
      hadBom: false,
    });
    // 0x80 alone is not valid UTF-8: windows-1252 reads it as the euro sign.
    expect(decodeStatementBytes(new Uint8Array([0x31, 0x30, 0x20, 0x80]))).toEqual({
      text: '10 €',
      encoding: 'windows-1252',
      hadBom: false,
    });
  });
  it('obeys a declared single-byte encoding even when the bytes are valid UTF-8', () => {
    // "Ã©" in windows-1252 is the UTF-8 encoding of é: the declaration decides.
    const bytes = new Uint8Array([0xc3, 0xa9]);
    expect(decodeStatementBytes(bytes).text).toBe('é');
    expect(decodeStatementBytes(bytes, 'windows-1252').text).toBe('Ã©');
  });
});

describe('declaredEncoding', () => {
  it('reads the XML declaration', () => {
    expect(declaredEncoding(ascii('<?xml version="1.0" encoding="UTF-8"?><Document/>'))).toBe('utf-8');
    expect(declaredEncoding(ascii("<?xml version='1.0' encoding='ISO-8859-1'?><Document/>"))).toBe('windows-1252');
  });
  it('reads the OFX 1.x CHARSET header', () => {
    // Source: OFX Banking Specification, OFX 1.x headers (ENCODING:USASCII with CHARSET:1252).
    const header =
      'OFXHEADER:100\r\nDATA:OFXSGML\r\nVERSION:102\r\nSECURITY:NONE\r\nENCODING:USASCII\r\nCHARSET:1252\r\n';
    expect(declaredEncoding(ascii(header))).toBe('windows-1252');
    expect(declaredEncoding(ascii(header.replace('CHARSET:1252', 'CHARSET:NONE')))).toBeUndefined();
  });
  it('maps latin1 labels to windows-1252 and ignores unknown labels', () => {
    // Source: WHATWG Encoding Standard, labels "latin1", "iso-8859-1", "us-ascii" → windows-1252.
    for (const label of ['latin1', 'iso-8859-1', 'us-ascii', 'cp1252']) {
      expect(declaredEncoding(ascii(`<?xml version="1.0" encoding="${label}"?>`)), label).toBe('windows-1252');
    }
    expect(declaredEncoding(ascii('<?xml version="1.0" encoding="koi8-r"?>'))).toBeUndefined();
    expect(declaredEncoding(ascii('Date;Amount'))).toBeUndefined();
  });
});

describe('looksBinary', () => {
  it('flags NUL bytes and many control characters, not text', () => {
    expect(looksBinary(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00]))).toBe(true);
    expect(looksBinary(Uint8Array.from({ length: 100 }, (_, i) => (i % 4 === 0 ? 0x01 : 0x41)))).toBe(true);
    expect(looksBinary(ascii('Date;Amount\r\n2026-01-02;-12,50\r\n\tindented\f'))).toBe(false);
  });
  it('does not flag UTF-16 text, with or without a BOM', () => {
    expect(looksBinary(utf16('Date,Amount\r\n2026-01-02,5.00\r\n', true, false))).toBe(false);
    expect(looksBinary(utf16('Date,Amount\r\n', false, true))).toBe(false);
  });
  it('treats the empty file as not binary (it is refused as empty elsewhere)', () => {
    expect(looksBinary(new Uint8Array(0))).toBe(false);
  });
});
