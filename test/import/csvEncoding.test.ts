import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { decodeStatementBytes } from '../../engine/import/decode';
import { encodeText, type TextEncodingName } from '../../engine/write/encode';

const TEXT =
  'Buchungstag;Verwendungszweck;Empfänger;Betrag\r\n' +
  '02.08.2025;"Glasur „weiß“ – 12 €";Café Süd;-12,00\r\n' +
  '03.08.2025;Straße;Œuvre;1.000,50\r\n';

function importBytes(bytes: Uint8Array): { encoding: string; entries: [string, number, string, string | undefined][] } {
  const decoded = decodeStatementBytes(bytes);
  const r = csvImporter.parse(decoded.text, { fileName: 'enc.csv', currency: 'EUR' });
  expect(r.problems).toEqual([]);
  return {
    encoding: decoded.encoding,
    entries: (r.statements[0]?.entries ?? []).map((e) => [e.bookingDate, e.amount, e.description, e.counterparty]),
  };
}

const EXPECTED: [string, number, string, string | undefined][] = [
  ['2025-08-02', -1200, 'Glasur „weiß“ – 12 €', 'Café Süd'],
  ['2025-08-03', 100050, 'Straße', 'Œuvre'],
];

describe('CSV in every statement encoding, decoded by decodeStatementBytes', () => {
  it.each<[TextEncodingName, string]>([
    ['utf-8', 'utf-8'],
    ['utf-8-bom', 'utf-8'],
    ['utf-16le', 'utf-16le'],
    ['utf-16be', 'utf-16be'],
    ['windows-1252', 'windows-1252'],
  ])('%s', (encoding, decodedAs) => {
    const { encoding: found, entries } = importBytes(encodeText(TEXT, encoding));
    expect(found).toBe(decodedAs);
    expect(entries).toEqual(EXPECTED);
  });

  it('UTF-16 without a byte-order mark', () => {
    expect(importBytes(encodeText(TEXT, 'utf-16le').subarray(2))).toEqual({ encoding: 'utf-16le', entries: EXPECTED });
    expect(importBytes(encodeText(TEXT, 'utf-16be').subarray(2))).toEqual({ encoding: 'utf-16be', entries: EXPECTED });
  });

  it('Windows-1252 writes € as the single byte 0x80', () => {
    // Source: WHATWG Encoding Standard, index-windows-1252 (pointer 0 → U+20AC, 0x96 → U+2013, 0x8C → U+0152)
    const bytes = encodeText('€–Œ', 'windows-1252');
    expect([...bytes]).toEqual([0x80, 0x96, 0x8c]);
    expect(decodeStatementBytes(bytes).text).toBe('€–Œ');
  });
});
