// Invented statement files under test/fixtures/csv/ (made-up names and amounts, layouts built from common
// column words); the expected values below are read off the files by hand.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { decodeStatementBytes } from '../../engine/import/decode';
import { hasErrors, type ImportOptions, type ImportResult } from '../../engine/import/types';

function load(name: string, options: Partial<ImportOptions> = {}): ImportResult {
  const bytes = new Uint8Array(readFileSync(new URL(`../fixtures/csv/${name}`, import.meta.url)));
  const { text } = decodeStatementBytes(bytes);
  return csvImporter.parse(text, { fileName: name, ...options });
}

function summary(r: ImportResult): [string, number, string, string | undefined, string][] {
  return (r.statements[0]?.entries ?? []).map((e) => [
    e.bookingDate,
    e.amount,
    e.description,
    e.counterparty,
    e.status,
  ]);
}

describe('CSV fixtures', () => {
  it('German-style export: preamble, newest first, running balance, pending row, CRLF', () => {
    const r = load('de-preamble-newest-first.csv');
    expect(r.problems).toEqual([]);
    const s = r.statements[0];
    expect(s?.account).toEqual({ identifier: 'DE89370400440532013000', name: 'Werkstattkonto' });
    expect(s?.currency).toBe('EUR');
    expect([s?.from, s?.to]).toEqual(['2025-03-01', '2025-03-05']);
    // Entries come out oldest first.
    expect(summary(r)).toEqual([
      ['2025-03-01', 365000, 'Auftrag 17\r\nVase', 'Kundin Vela', 'booked'],
      ['2025-03-04', -90000, 'Miete März', 'Atelier Miete', 'booked'],
      ['2025-03-04', 31240, 'Einnahmen', 'Marktstand Samstag', 'booked'],
      ['2025-03-05', -125000, 'Rechnung 2025-031; Ton "weiß"', 'Tonlager Nord', 'pending'],
    ]);
    expect(s?.entries.map((e) => e.source.line)).toEqual([10, 9, 8, 7]);
    expect(s?.entries[1]?.valueDate).toBe('2025-03-03');
    expect(s?.balances).toEqual([
      { kind: 'running', date: '2025-03-01', at: 'end', amount: 365000, source: { line: 10 } },
      { kind: 'running', date: '2025-03-04', at: 'end', amount: 306240, source: { line: 8 } },
    ]);
  });

  it('US-style export: month-first dates, debit and credit columns, quoted commas', () => {
    const r = load('us-debit-credit.csv', { currency: 'USD' });
    expect(r.problems).toEqual([]);
    expect(summary(r)).toEqual([
      ['2025-03-01', -120000, 'Studio rent, March', 'Harbor Lofts', 'booked'],
      ['2025-03-14', 245050, 'Invoice 88', 'Kestrel Design', 'booked'],
      // The debit written negative is still a debit.
      ['2025-03-31', -495, 'Card fee', undefined, 'booked'],
    ]);
    expect(r.statements[0]?.balances.map((b) => [b.date, b.amount])).toEqual([
      ['2025-03-01', 380000],
      ['2025-03-14', 625050],
      ['2025-03-31', 624555],
    ]);
    expect(r.statements[0]?.account).toEqual({ name: 'us-debit-credit.csv' });
  });

  it('refuses the US-style file without --currency, asking for it', () => {
    const r = load('us-debit-credit.csv');
    expect(hasErrors(r)).toBe(true);
    expect(r.problems).toEqual([
      {
        file: 'us-debit-credit.csv',
        line: 1,
        message:
          'no currency stated (no currency column, preamble line or code beside the amounts), expected one: give --currency CODE',
        severity: 'error',
      },
    ]);
  });

  it('Dutch-style export: Af/Bij indicator, compact dates, currency in the column name', () => {
    const r = load('nl-indicator.csv');
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.currency).toBe('EUR');
    expect(summary(r)).toEqual([
      ['2025-03-02', -85000, 'Huur atelier', 'Verhuur Zuid', 'booked'],
      ['2025-03-03', 121035, 'Verkoop markt', undefined, 'booked'],
    ]);
  });

  it('French-style export: no-break space thousands, debit/credit, day-first slashes, currency column', () => {
    const r = load('fr-space-thousands.csv');
    expect(r.problems).toEqual([]);
    expect(summary(r)).toEqual([
      ['2025-04-02', -110000, 'Loyer avril', undefined, 'booked'],
      ['2025-04-15', 1234567, 'Commande 42', undefined, 'booked'],
    ]);
  });

  it('Swiss-style export: pipe delimiter, apostrophe thousands, trailing minus', () => {
    const r = load('ch-apostrophe-trailing-minus.csv');
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.currency).toBe('CHF');
    expect(summary(r)).toEqual([
      ['2025-05-02', -240000, 'Miete', undefined, 'booked'],
      ['2025-05-09', 123456705, 'Verkauf', undefined, 'booked'],
    ]);
  });

  it('headerless file: refused without a mapping, read with one', () => {
    const refused = load('headerless.csv', { currency: 'EUR' });
    expect(refused.problems[0]).toMatchObject({ line: 1, severity: 'error' });
    expect(refused.problems[0]?.message).toContain('no header row');
    const r = load('headerless.csv', {
      currency: 'EUR',
      csvMapping: { headerLine: null, columns: { date: 0, description: 1, amount: 2 } },
    });
    expect(r.problems).toEqual([]);
    expect(summary(r)).toEqual([
      ['2025-07-01', -6120, 'Kiln power', undefined, 'booked'],
      ['2025-07-05', 41800, 'Market', undefined, 'booked'],
    ]);
  });

  it('Windows-1252 bytes: € is 0x80 and also states the currency', () => {
    // Source: WHATWG Encoding Standard, index-windows-1252 (pointer 0 = byte 0x80 → U+20AC EURO SIGN)
    const r = load('windows-1252.csv');
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.currency).toBe('EUR');
    expect(summary(r)).toEqual([['2025-08-02', -1200, 'Glasur 12 € Café', undefined, 'booked']]);
  });
});
