/**
 * Import speed: a 100,000-row CSV and a 100,000-entry camt.053 statement generated in memory
 * (with the project's writers and an invented, seeded statement), each timed through
 * detection + parsing (importStatement) and through the ledger (normalising, fingerprints,
 * duplicate detection, reconciliation: buildLedger), plus the camt file and the CSV together
 * (every CSV row then a duplicate). The reference is a plain CSV split of the same text
 * (split into lines, split each line at the delimiter). Figures only, nothing asserted.
 *
 * Run: npm run bench import  (or npx tsx test/bench/import.ts)
 */
import { addDays } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult, ParsedStatement, StatementEntry } from '../../engine/import/types';
import { buildLedger, type LedgerInputFile } from '../../engine/ledger/buildLedger';
import { writeCamt053 } from '../../engine/write/camt053';
import { writeCsv } from '../../engine/write/csv';
import { encodeText } from '../../engine/write/encode';

const ROWS = 100_000;
const RUNS = 3;
const IBAN = 'NL94EBBL0123456789';

const gc = (globalThis as { gc?: () => void }).gc;

const MiB = 2 ** 20;
let baseline = 0;

/** Heap in use after a collection (when --expose-gc is on), in bytes. */
function settledHeap(): number {
  gc?.();
  return process.memoryUsage().heapUsed;
}

/**
 * Memory figures: heap retained above the baseline (the generated inputs) by what is still
 * referenced, current rss and the process's peak rss so far (inputs included).
 */
function memory(): string {
  const heap = settledHeap();
  const rss = process.memoryUsage().rss / MiB;
  const peak = process.resourceUsage().maxRSS / 1024;
  return `heap +${((heap - baseline) / MiB).toFixed(0)} MiB over the inputs, rss ${rss.toFixed(0)} MiB, peak rss so far ${peak.toFixed(0)} MiB`;
}

/** Median wall time of `RUNS` runs after one warm-up; returns the last result too. */
function time<T>(run: () => T): { ms: number; result: T } {
  let result = run();
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    gc?.();
    const start = performance.now();
    result = run();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(RUNS / 2)] as number, result };
}

function report(label: string, ms: number, rows: number, extra = ''): void {
  const rate = Math.round(rows / (ms / 1000));
  console.log(
    `${label.padEnd(54)} ${ms.toFixed(0).padStart(7)} ms  ${rate.toLocaleString('en-US').padStart(11)} rows/s${extra}`,
  );
}

// An invented statement: market takings, supplies, rent and fees over about three years.
const rng = createRng(100_000);
const words = ['Clay', 'Glaze', 'Kiln', 'Market', 'Studio', 'Commission', 'Tableware', 'Shelf', 'Brushes', 'Packaging'];
const counterparties = ['Riverclay Supplies', 'Tillpoint Payments', 'Kilnyard Studios', 'Fennel & Rye Bistro'];
const entries: StatementEntry[] = [];
let date = '2023-11-01';
for (let i = 0; i < ROWS; i++) {
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
const statement: ParsedStatement = {
  account: { identifier: IBAN },
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

const csvText = writeCsv(
  { ...statement, entries: entries.map(({ bankRef: _b, valueDate: _v, ...rest }) => rest) },
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
const camtText = writeCamt053([statement], { version: '001.08' });
const csvBytes = encodeText(csvText, 'utf-8');
const camtBytes = encodeText(camtText, 'utf-8');
console.log(
  `inputs: CSV ${ROWS.toLocaleString('en-US')} rows, ${(csvBytes.length / 2 ** 20).toFixed(1)} MiB; ` +
    `camt.053 ${ROWS.toLocaleString('en-US')} entries, ${(camtBytes.length / 2 ** 20).toFixed(1)} MiB; median of ${RUNS} runs after a warm-up`,
);
baseline = settledHeap();
console.log(
  `memory with the inputs generated: heap ${(baseline / MiB).toFixed(0)} MiB, peak rss ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MiB` +
    (gc ? '' : ' (run with --expose-gc for settled heap figures)'),
);

// Reference: the plainest possible CSV reading of the same text.
const plain = time(() => {
  let fields = 0;
  for (const line of csvText.split('\r\n')) fields += line.split(';').length;
  return fields;
});
report('CSV plain split (lines, then fields)', plain.ms, ROWS);

function parse(bytes: Uint8Array, file: string): LedgerInputFile {
  const result = importStatement(bytes, { fileName: file });
  if (result.format === undefined || result.problems.some((p) => p.severity === 'error')) {
    throw new Error(`${file}: ${result.problems[0]?.message ?? 'not imported'}`);
  }
  return { file, result: result as ImportResult };
}

const csvParse = time(() => parse(csvBytes, 'bench.csv'));
report(
  'CSV importStatement (detect + parse)',
  csvParse.ms,
  ROWS,
  `  ${(csvParse.ms / plain.ms).toFixed(1)}x the plain split`,
);
console.log(`  ImportResult kept: ${memory()}`);
const csvLedger = time(() => buildLedger([csvParse.result]));
report('CSV buildLedger (normalise + dedupe + reconcile)', csvLedger.ms, ROWS);
report(
  'CSV total',
  csvParse.ms + csvLedger.ms,
  ROWS,
  `  ${((csvParse.ms + csvLedger.ms) / plain.ms).toFixed(1)}x the plain split`,
);
console.log(
  `  reconciled: ${csvLedger.result.reconciliation[0]?.reconciled}; ImportResult and Ledger kept: ${memory()}`,
);

const camtParse = time(() => parse(camtBytes, 'bench.xml'));
report('camt.053 importStatement (detect + parse)', camtParse.ms, ROWS);
console.log(`  ImportResult kept: ${memory()}`);
const camtLedger = time(() => buildLedger([camtParse.result]));
report('camt.053 buildLedger (normalise + dedupe + reconcile)', camtLedger.ms, ROWS);
report('camt.053 total', camtParse.ms + camtLedger.ms, ROWS);
console.log(
  `  reconciled: ${camtLedger.result.reconciliation[0]?.reconciled}; both ImportResults and Ledgers kept: ${memory()}`,
);

const both = time(() => buildLedger([camtParse.result, csvParse.result]));
const dropped = both.result.files[1]?.accounts[0]?.duplicates ?? 0;
report(
  'camt.053 + CSV buildLedger (CSV rows all duplicates)',
  both.ms,
  2 * ROWS,
  `  ${dropped.toLocaleString('en-US')} dropped`,
);
console.log(`  everything kept: ${memory()}`);
