/**
 * The import bench's inputs: one invented, seeded statement of 100,000 entries (market
 * takings, supplies, rent and fees over about three years) written with the project's
 * writers as a `;`-delimited CSV with a running balance and as camt.053.001.08, saved as
 * UTF-8 files in a directory. Generating is kept apart from measuring: the bench writes the
 * files here, then imports them in fresh processes (_importCase.ts), so the memory of the
 * generator (the 64 MiB camt text, the entry objects) never shows in the import's figures.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { addDays } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';
import type { ParsedStatement, StatementEntry } from '../../engine/import/types';
import { writeCamt053 } from '../../engine/write/camt053';
import { writeCsv } from '../../engine/write/csv';
import { encodeText } from '../../engine/write/encode';

/** Entries in each generated file. */
export const BENCH_ROWS = 100_000;

/** Where `writeImportInputs` put the files, and how large they are. */
export interface ImportInputs {
  readonly csvFile: string;
  readonly camtFile: string;
  readonly csvBytes: number;
  readonly camtBytes: number;
  readonly rows: number;
}

function inventedStatement(rows: number): ParsedStatement {
  const rng = createRng(100_000);
  const words = [
    'Clay',
    'Glaze',
    'Kiln',
    'Market',
    'Studio',
    'Commission',
    'Tableware',
    'Shelf',
    'Brushes',
    'Packaging',
  ];
  const counterparties = ['Riverclay Supplies', 'Tillpoint Payments', 'Kilnyard Studios', 'Fennel & Rye Bistro'];
  const entries: StatementEntry[] = [];
  let date = '2023-11-01';
  for (let i = 0; i < rows; i++) {
    if (rng.nextFloat() < 0.011) date = addDays(date, 1);
    const credit = rng.nextFloat() < 0.4;
    const amount = (credit ? 1 : -1) * (100 + rng.nextInt(250_000));
    entries.push({
      bookingDate: date,
      valueDate: date,
      amount,
      description: `${words[rng.nextInt(words.length)]} ${words[rng.nextInt(words.length)]} ref ${rng.nextInt(1_000_000)}`,
      counterparty: counterparties[rng.nextInt(counterparties.length)] as string,
      bankRef: `B${String(i).padStart(7, '0')}`,
      status: 'booked',
      source: {},
    });
  }
  const opening = 1_000_000;
  const closing = entries.reduce((s, e) => s + e.amount, opening);
  return {
    account: { identifier: 'NL94EBBL0123456789' },
    currency: 'EUR',
    statementId: 'BENCH-1',
    from: '2023-11-01',
    to: date,
    entries,
    balances: [
      { kind: 'opening', date: '2023-11-01', at: 'start', amount: opening, source: {} },
      { kind: 'closing', date, at: 'end', amount: closing, source: {} },
    ],
  };
}

/**
 * Generates both inputs and writes them to `dir` as `bench.csv` and `bench.xml`.
 * @example const inputs = writeImportInputs(mkdtempSync(join(tmpdir(), 'ebbline-bench-')));
 */
export function writeImportInputs(dir: string, rows = BENCH_ROWS): ImportInputs {
  const statement = inventedStatement(rows);
  const csvText = writeCsv(
    { ...statement, entries: statement.entries.map(({ bankRef: _b, valueDate: _v, ...rest }) => rest) },
    {
      delimiter: ';',
      decimalSeparator: ',',
      thousandsSeparator: '.',
      dateFormat: 'DD.MM.YYYY',
      signStyle: 'signed',
      runningBalance: true,
      newestFirst: false,
      preambleLines: ['Account;NL94 EBBL 0123 4567 89', 'Currency;EUR'],
      includeCurrencyColumn: false,
      lineEnding: '\r\n',
    },
  );
  const csv = encodeText(csvText, 'utf-8');
  const camt = encodeText(writeCamt053([statement], { version: '001.08' }), 'utf-8');
  const csvFile = join(dir, 'bench.csv');
  const camtFile = join(dir, 'bench.xml');
  writeFileSync(csvFile, csv);
  writeFileSync(camtFile, camt);
  return { csvFile, camtFile, csvBytes: csv.length, camtBytes: camt.length, rows };
}
