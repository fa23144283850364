/**
 * One measurement of the import bench, run by test/bench/import.ts in a fresh Node process
 * (`--expose-gc`) so that nothing else lives in its heap:
 *
 *   tsx test/bench/_importCase.ts <csv|camt|both> <inputs dir> <runs>
 *
 * 1. Reads the input file(s) as bytes, collects garbage and records the baseline (rss,
 *    heap used, peak rss so far).
 * 2. Memory: imports once, cold, exactly as the app would (importStatement + buildLedger),
 *    then reads the process's peak rss (`process.resourceUsage().maxRSS`, kept by the kernel,
 *    so it sees the peak inside synchronous code that no timer could sample) and, after a
 *    collection, the heap still held by the result. Peak above the baseline is what the
 *    import itself cost.
 * 3. Speed: `runs` timed runs after that warm-up, a collection before each; medians of the
 *    wall time and of the process's CPU time (user + system, which on a shared machine shows
 *    the work without the waiting for a core).
 *    For `csv`, runs of the plain RFC 4180 parser (_plainCsv.ts) on the decoded text
 *    alternate with the import runs, so both see the same machine load.
 *
 * Prints one JSON line on stdout. Figures only, nothing asserted.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger, type LedgerInputFile } from '../../engine/ledger/buildLedger';
import { parsePlainCsv } from './_plainCsv';

const [mode, dir, runsArg] = process.argv.slice(2) as [string, string, string | undefined];
const runs = Number(runsArg ?? 5);
const gc = (globalThis as { gc?: () => void }).gc;
if (!gc) throw new Error('run with --expose-gc');
const MiB = 2 ** 20;

function settle(): NodeJS.MemoryUsage {
  gc?.();
  gc?.();
  return process.memoryUsage();
}

function peakRss(): number {
  // maxRSS is in kilobytes.
  return (process.resourceUsage().maxRSS * 1024) / MiB;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1
    ? (sorted[mid] as number)
    : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

function parse(bytes: Uint8Array, file: string): LedgerInputFile {
  const result = importStatement(bytes, { fileName: file });
  if (result.format === undefined || result.problems.some((p) => p.severity === 'error')) {
    throw new Error(`${file}: ${result.problems[0]?.message ?? 'not imported'}`);
  }
  return { file, result: result as ImportResult };
}

/** Wall time and CPU time (user + system) of this process: on a shared machine the CPU time shows the work. */
function timed<T>(run: () => T): { ms: number; cpu: number; value: T } {
  const start = performance.now();
  const cpu = process.cpuUsage();
  const value = run();
  const used = process.cpuUsage(cpu);
  return { ms: performance.now() - start, cpu: (used.user + used.system) / 1000, value };
}

const csvBytes = mode === 'csv' || mode === 'both' ? readFileSync(join(dir, 'bench.csv')) : undefined;
const camtBytes = mode === 'camt' || mode === 'both' ? readFileSync(join(dir, 'bench.xml')) : undefined;
const files: [Uint8Array, string][] = [];
if (camtBytes) files.push([camtBytes, 'bench.xml']);
if (csvBytes) files.push([csvBytes, 'bench.csv']);

// 1. Baseline: the input bytes and the loaded code, nothing else.
const base = settle();
const basePeak = peakRss();

// 2. Memory of one cold import.
const cold = timed(() => {
  const inputs = files.map(([bytes, name]) => parse(bytes, name));
  return { inputs, ledger: buildLedger(inputs) };
});
const afterRss = process.memoryUsage().rss / MiB;
const peak = peakRss();
const kept = settle();
const entries = cold.value.inputs.reduce((n, f) => n + (f.result.statements[0]?.entries.length ?? 0), 0);
const memory = {
  baseRss: base.rss / MiB,
  basePeak,
  baseHeap: base.heapUsed / MiB,
  afterRss,
  peakRss: peak,
  peakAboveBase: peak - base.rss / MiB,
  keptHeap: (kept.heapUsed - base.heapUsed) / MiB,
  keptPerEntry: (kept.heapUsed - base.heapUsed) / Math.max(1, entries),
  coldMs: cold.ms,
};
const reconciled = cold.value.ledger.reconciliation.every((r) => r.reconciled);
const transactions = cold.value.ledger.transactions.length;
const dropped = cold.value.ledger.files.reduce((n, f) => n + f.accounts.reduce((m, a) => m + a.duplicates, 0), 0);
cold.value = undefined as never;

// 3. Speed.
type Run = { ms: number; cpu: number };
const parseRuns: Run[] = [];
const ledgerRuns: Run[] = [];
const plainRuns: Run[] = [];
const decodeRuns: Run[] = [];
let plainRecords = 0;
let plainFields = 0;
const csvText = csvBytes ? new TextDecoder('utf-8').decode(csvBytes) : '';
for (let k = 0; k < runs; k++) {
  if (mode === 'csv') {
    settle();
    const plain = timed(() => parsePlainCsv(csvText, ';'));
    plainRuns.push(plain);
    plainRecords = plain.value.length;
    plainFields = plain.value.reduce((n, r) => n + r.length, 0);
    settle();
    decodeRuns.push(timed(() => new TextDecoder('utf-8').decode(csvBytes)));
  }
  settle();
  const parsed = timed(() => files.map(([bytes, name]) => parse(bytes, name)));
  parseRuns.push(parsed);
  settle();
  ledgerRuns.push(timed(() => buildLedger(parsed.value)));
}

/** Medians of wall and CPU time. */
const summary = (list: readonly Run[]): Run => ({
  ms: median(list.map((r) => r.ms)),
  cpu: median(list.map((r) => r.cpu)),
});
const totalRuns = parseRuns.map((p, i) => ({
  ms: p.ms + (ledgerRuns[i] as Run).ms,
  cpu: p.cpu + (ledgerRuns[i] as Run).cpu,
}));

console.log(
  JSON.stringify({
    mode,
    runs,
    entries,
    transactions,
    dropped,
    reconciled,
    memory,
    parse: summary(parseRuns),
    ledger: summary(ledgerRuns),
    total: summary(totalRuns),
    ...(mode === 'csv' ? { plain: summary(plainRuns), decode: summary(decodeRuns), plainRecords, plainFields } : {}),
  }),
);
