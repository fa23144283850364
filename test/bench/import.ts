/**
 * Import speed and memory: a 100,000-row CSV and a 100,000-entry camt.053 statement,
 * generated from one invented, seeded statement with the project's writers
 * (_importInputs.ts), written to a temporary directory first, then each imported in a fresh
 * Node process (_importCase.ts) so that generating never counts as importing:
 *
 * - time of importStatement (decode, detect, parse) and of buildLedger (normalise,
 *   fingerprints, duplicate detection, reconciliation), median of several runs;
 * - peak rss of the importing process (kernel maxRSS, which sees the peak inside
 *   synchronous code), its baseline before the import (Node, the bundled code and the input
 *   bytes) and the heap the result still holds after a collection; the process runs the
 *   measuring script bundled by esbuild, plain Node without the TypeScript loader;
 * - for the CSV, the same text read by a minimal RFC 4180 parser (_plainCsv.ts: quotes
 *   handled, every field a string) as the reference, timed in the same process,
 *   alternating with the import runs;
 * - the camt file and the CSV together (every CSV row then a duplicate).
 *
 * Figures only, nothing asserted. Run: npm run bench import  (RUNS=n to change the runs)
 */
import { spawnSync } from 'node:child_process';
import { build } from 'esbuild';
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BENCH_ROWS, writeImportInputs } from './_importInputs';

const RUNS = Number(process.env.RUNS ?? 5);
const here = dirname(fileURLToPath(import.meta.url));

interface Run {
  ms: number;
  cpu: number;
}

interface CaseResult {
  mode: string;
  entries: number;
  transactions: number;
  dropped: number;
  reconciled: boolean;
  memory: {
    baseRss: number;
    baseHeap: number;
    peakRss: number;
    peakAboveBase: number;
    keptHeap: number;
    keptPerEntry: number;
    coldMs: number;
  };
  parse: Run;
  ledger: Run;
  total: Run;
  plain?: Run;
  decode?: Run;
  plainRecords?: number;
  plainFields?: number;
}

/**
 * The measuring script bundled into plain JavaScript, so the importing process is plain Node
 * as in the app's worker: under tsx it would also carry the TypeScript loader (a worker
 * thread and an esbuild service, some 40 MiB of rss) in every memory figure.
 */
async function bundleCase(dir: string): Promise<string> {
  const outfile = join(dir, 'importCase.mjs');
  await build({
    entryPoints: [join(here, '_importCase.ts')],
    bundle: true,
    platform: 'node',
    format: 'esm',
    outfile,
    logLevel: 'error',
  });
  return outfile;
}

function runCase(script: string, mode: string, dir: string): CaseResult {
  const r = spawnSync(process.execPath, ['--expose-gc', script, mode, dir, String(RUNS)], {
    encoding: 'utf8',
    maxBuffer: 1 << 24,
  });
  if (r.status !== 0) throw new Error(`${mode}: exited with ${r.status ?? r.signal}\n${r.stderr}`);
  const line = r.stdout.trim().split('\n').pop() as string;
  return JSON.parse(line) as CaseResult;
}

const rate = (rows: number, ms: number): string =>
  Math.round(rows / (ms / 1000))
    .toLocaleString('en-US')
    .padStart(10);

function row(label: string, run: Run, rows: number, extra = ''): void {
  console.log(
    `${label.padEnd(56)} ${run.ms.toFixed(0).padStart(6)} ms ${rate(rows, run.ms)} rows/s` +
      `   cpu ${run.cpu.toFixed(0).padStart(6)} ms ${rate(rows, run.cpu)} rows/s${extra}`,
  );
}

/** "2.1x (cpu 1.9x)": how many times the reference's time a run took. */
const times = (run: Run, reference: Run): string =>
  `${(run.ms / reference.ms).toFixed(2)}x (cpu ${(run.cpu / reference.cpu).toFixed(2)}x) the reference`;

function memoryLine(r: CaseResult): void {
  const m = r.memory;
  console.log(
    `  memory (fresh process, first import): peak rss ${m.peakRss.toFixed(0)} MiB = baseline ${m.baseRss.toFixed(0)} MiB ` +
      `(node + code + input bytes) + ${m.peakAboveBase.toFixed(0)} MiB during the import; ` +
      `heap kept by result + ledger ${m.keptHeap.toFixed(0)} MiB (${Math.round(m.keptPerEntry)} B/entry); ` +
      `cold run ${m.coldMs.toFixed(0)} ms`,
  );
}

const dir = mkdtempSync(join(tmpdir(), 'ebbline-import-bench-'));
try {
  const inputs = writeImportInputs(dir, BENCH_ROWS);
  const script = await bundleCase(dir);
  const [l1, l5] = loadavg() as [number, number, number];
  console.log(
    `inputs: CSV ${inputs.rows.toLocaleString('en-US')} rows, ${(inputs.csvBytes / 2 ** 20).toFixed(1)} MiB; ` +
      `camt.053 ${inputs.rows.toLocaleString('en-US')} entries, ${(inputs.camtBytes / 2 ** 20).toFixed(1)} MiB; ` +
      `each case in a fresh process, median of ${RUNS} runs after a cold first run; ` +
      `load average ${l1.toFixed(1)} / ${l5.toFixed(1)} (wall times include waiting for a core on a busy machine; ` +
      `cpu = the importing process's user + system time)`,
  );

  const csv = runCase(script, 'csv', dir);
  const plain = csv.plain as Run;
  row(
    'CSV reference: minimal RFC 4180 parser (text in)',
    plain,
    csv.entries,
    `  ${csv.plainRecords?.toLocaleString('en-US')} records, ${csv.plainFields?.toLocaleString('en-US')} string fields`,
  );
  row('  (UTF-8 decoding of the bytes alone)', csv.decode as Run, csv.entries);
  row('CSV importStatement (bytes in: decode, detect, parse)', csv.parse, csv.entries, `  ${times(csv.parse, plain)}`);
  row('CSV buildLedger (normalise, dedupe, reconcile)', csv.ledger, csv.entries);
  row('CSV import total (importStatement + buildLedger)', csv.total, csv.entries, `  ${times(csv.total, plain)}`);
  console.log(`  reconciled: ${csv.reconciled}; ${csv.transactions.toLocaleString('en-US')} transactions`);
  memoryLine(csv);

  const camt = runCase(script, 'camt', dir);
  row('camt.053 importStatement (bytes in: decode, detect, parse)', camt.parse, camt.entries);
  row('camt.053 buildLedger (normalise, dedupe, reconcile)', camt.ledger, camt.entries);
  row('camt.053 import total', camt.total, camt.entries);
  console.log(`  reconciled: ${camt.reconciled}; ${camt.transactions.toLocaleString('en-US')} transactions`);
  memoryLine(camt);

  const both = runCase(script, 'both', dir);
  row(
    'camt.053 + CSV buildLedger (CSV rows all duplicates)',
    both.ledger,
    both.entries,
    `  ${both.dropped.toLocaleString('en-US')} dropped`,
  );
  memoryLine(both);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
