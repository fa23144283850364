// Fuzz test: seeded, deterministic mutations of valid CSV statements (byte flips, truncation, inserted delimiters,
// quotes and line breaks, dropped and repeated lines). Every result must be a clean parse or a refusal whose errors
// carry the file, a line and a message; nothing may throw.
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { isCalendarDate } from '../../engine/core/dates';
import { decodeStatementBytes } from '../../engine/import/decode';
import { hasErrors } from '../../engine/import/types';
import { writeCsv } from '../../engine/write/csv';

/** mulberry32: a small seeded generator, so every run mutates the same way. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const fixtureDir = new URL('../fixtures/csv/', import.meta.url);
const corpus: string[] = readdirSync(fixtureDir).map(
  (name) => decodeStatementBytes(new Uint8Array(readFileSync(new URL(name, fixtureDir)))).text,
);
corpus.push(
  writeCsv(
    {
      account: {},
      currency: 'EUR',
      entries: [
        { bookingDate: '2025-01-02', amount: -90000, description: 'Rent "Jan"; studio', status: 'booked', source: {} },
        { bookingDate: '2025-01-03', amount: 123456, description: 'Sale\nmarket', status: 'pending', source: {} },
        { bookingDate: '2025-01-04', amount: 5, description: 'Interest', status: 'booked', source: {} },
      ],
      balances: [{ kind: 'opening', date: '2025-01-02', at: 'start', amount: 100000, source: {} }],
    },
    {
      delimiter: ';',
      decimalSeparator: ',',
      thousandsSeparator: '.',
      dateFormat: 'DD/MM/YYYY',
      signStyle: 'indicator',
      runningBalance: true,
      newestFirst: true,
      preambleLines: ['Account;DE89 3704 0044 0532 0130 00'],
      includeCurrencyColumn: true,
      lineEnding: '\r\n',
    },
  ),
);

const INSERTS = [
  ',',
  ';',
  '\t',
  '|',
  '"',
  '""',
  '\n',
  '\r\n',
  '\r',
  '-',
  '(',
  ')',
  '.',
  ',',
  ' ',
  '\u00a0',
  '€',
  'EUR',
  '9',
  '13',
  '31',
  'CR',
  'X',
];

function mutate(text: string, random: () => number): string {
  let out = text;
  const steps = 1 + Math.floor(random() * 3);
  for (let s = 0; s < steps; s++) {
    const at = Math.floor(random() * (out.length + 1));
    const kind = Math.floor(random() * 6);
    if (kind === 0) {
      // Flip one character to an arbitrary UTF-16 code unit.
      out = out.slice(0, at) + String.fromCharCode(Math.floor(random() * 0x3000)) + out.slice(at + 1);
    } else if (kind === 1) {
      out = out.slice(0, at);
    } else if (kind === 2 || kind === 3) {
      out = out.slice(0, at) + (INSERTS[Math.floor(random() * INSERTS.length)] as string) + out.slice(at);
    } else if (kind === 4) {
      out = out.slice(0, at) + out.slice(at + 1 + Math.floor(random() * 12));
    } else {
      const lines = out.split('\n');
      const k = Math.floor(random() * lines.length);
      if (random() < 0.5) lines.splice(k, 1);
      else lines.splice(k, 0, lines[k] ?? '');
      out = lines.join('\n');
    }
  }
  return out;
}

describe('CSV fuzz', () => {
  it('10,000 mutated files never throw and end in a clean parse or located errors', () => {
    const random = mulberry32(4180);
    let refused = 0;
    let accepted = 0;
    for (let i = 0; i < 10_000; i++) {
      const base = corpus[i % corpus.length] as string;
      const text = mutate(base, random);
      const fileName = `fuzz-${i}.csv`;
      const lineCount = text.split(/\r\n|\r|\n/).length;
      const sniffed = csvImporter.sniff(text);
      expect(sniffed >= 0 && sniffed <= 1).toBe(true);
      const result = csvImporter.parse(text, { fileName, ...(i % 2 === 0 ? { currency: 'EUR' } : {}) });
      expect(result.format).toBe('csv');
      if (hasErrors(result)) {
        refused++;
        const located = result.problems.filter(
          (p) =>
            p.severity === 'error' &&
            p.file === fileName &&
            Number.isInteger(p.line) &&
            (p.line as number) >= 1 &&
            (p.line as number) <= lineCount &&
            p.message.length > 0,
        );
        if (located.length === 0) expect.fail(`no located error for mutation ${i}: ${JSON.stringify(result.problems)}`);
        expect(result.statements).toEqual([]);
      } else {
        accepted++;
        expect(result.statements).toHaveLength(1);
        const statement = result.statements[0];
        expect(statement?.entries.length).toBeGreaterThan(0);
        for (const e of statement?.entries ?? []) {
          if (!isCalendarDate(e.bookingDate) || !Number.isSafeInteger(e.amount) || !(e.source.line ?? 0)) {
            expect.fail(`bad entry for mutation ${i}: ${JSON.stringify(e)}`);
          }
        }
      }
    }
    // Both outcomes occur, so the mutations neither always break nor never break the files.
    expect(refused).toBeGreaterThan(1000);
    expect(accepted).toBeGreaterThan(500);
  });
});
