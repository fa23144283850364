/**
 * `npm run bench:peers`: Ebbline's decomposition + ETS forecast next to R's closest analogue,
 * forecast::mstl + forecast::forecast(method = "ets") (test/oracles/peers.R), on the same
 * five-year daily series (the other inflows of the bench history of _forecastData.ts, written
 * to a temporary CSV), in the same run. Prints the time of each (first run and warm median)
 * and the ratio, and both accuracy scores: MASE on the held-out last 28 days, scaled by the
 * weekly seasonal naive error of the training days (Hyndman and Koehler 2006). Figures only;
 * without Rscript and the forecast package it prints why and exits 0.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { mase } from '../../engine/backtest/scores';
import { addDays } from '../../engine/core/dates';
import { decomposeDaily, projectDailySeasonality } from '../../engine/decompose/dailyDecomposition';
import { explainedEntryIds } from '../../engine/forecast/recurringComponents';
import { modelResidualFlow } from '../../engine/forecast/residualFlows';
import { residualSeries } from '../../engine/forecast/runForecast';
import { fitDecompositionEts, forecastDecompositionEts } from '../../engine/models/decompositionEts';
import { detectRecurringFlows } from '../../engine/recurring/detectRecurringFlows';
import { benchHistory, median } from './_forecastData';

const HOLD_OUT = 28;
const RUNS = 5;
const ROOT = join(import.meta.dirname, '../..');

function rAvailable(): string | null {
  const probe = spawnSync('Rscript', ['-e', 'suppressMessages(library(forecast)); cat("ok")'], { encoding: 'utf8' });
  if (probe.error) return 'Rscript was not found';
  if (probe.status !== 0 || !probe.stdout.includes('ok')) return 'R is installed but its forecast package is not';
  return null;
}

const missing = rAvailable();
if (missing !== null) {
  console.log(
    `bench:peers skipped: ${missing}. Install r-base-core and r-cran-forecast (DEVELOPERS.md, "Reference fixtures") to compare with R.`,
  );
  process.exit(0);
}

const history = benchHistory();
const detected = detectRecurringFlows(history.entries, { asOf: history.asOf });
const y = residualSeries(history, explainedEntryIds(detected, [])).inflow;
const n = y.length - HOLD_OUT;
const train = y.slice(0, n);
const test = y.subarray(n);
const trainEnd = addDays(history.start, n - 1);

// Ours: the decomposition + ETS model exactly as the forecast fits it (engine/forecast/residualFlows.ts).
function ours(): { point: Float64Array; model: string } {
  const d = decomposeDaily(train, history.start, { iterations: 2 });
  const seasonal = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    seasonal[i] = (d.weekly[i] as number) + (d.monthly?.[i] ?? 0) + (d.yearly?.[i] ?? 0);
  }
  const fit = fitDecompositionEts(train, { seasonal, allowedModels: ['ANN', 'AAN', 'AAdN'] });
  const future = projectDailySeasonality(d, addDays(trainEnd, 1), HOLD_OUT).total;
  return { point: forecastDecompositionEts(fit, HOLD_OUT, { futureSeasonal: future }).point, model: fit.method };
}

const ourTimes: number[] = [];
let ourForecast: { point: Float64Array; model: string } = { point: new Float64Array(0), model: '' };
for (let run = 0; run < RUNS; run++) {
  const start = performance.now();
  ourForecast = ours();
  ourTimes.push(performance.now() - start);
}
const selectionStart = performance.now();
const selection = modelResidualFlow(train, history.start, 'inflow', addDays(trainEnd, 1), HOLD_OUT);
const selectionMs = performance.now() - selectionStart;

const dir = mkdtempSync(join(tmpdir(), 'ebbline-peers-'));
const csv = join(dir, 'series.csv');
writeFileSync(csv, 'y\n' + Array.from(train, (v) => String(v)).join('\n') + '\n');
const r = spawnSync('Rscript', [join(ROOT, 'test/oracles/peers.R'), csv, String(HOLD_OUT), String(RUNS)], {
  encoding: 'utf8',
});
rmSync(dir, { recursive: true, force: true });
if (r.status !== 0) {
  console.log(`bench:peers: Rscript failed (${r.status}): ${r.stderr.split('\n').slice(-3).join(' ')}`);
  process.exit(1);
}
const peer = JSON.parse(r.stdout) as {
  model: string;
  point: number[];
  elapsedMs: number[];
  columns: string[];
  version: string;
};

const oursMs = median(ourTimes.slice(1));
const rMs = median(peer.elapsedMs.slice(1));
const oursMase = mase(test, ourForecast.point, train, 7);
const rMase = mase(test, peer.point, train, 7);
console.log(`series: other inflows of the bench history, ${y.length} days (${n} to fit, last ${HOLD_OUT} held out)`);
console.log(`R: ${peer.version}; mstl columns ${peer.columns.join(', ')}`);
const rows = [
  ['', 'model', 'first ms', 'warm median ms', `MASE (last ${HOLD_OUT} days)`],
  ['Ebbline decomposition + ETS', ourForecast.model, ourTimes[0]!.toFixed(0), oursMs.toFixed(0), oursMase.toFixed(3)],
  [
    'R mstl + forecast(method = "ets")',
    `STL + ${peer.model}`,
    peer.elapsedMs[0]!.toFixed(0),
    rMs.toFixed(0),
    rMase.toFixed(3),
  ],
];
const widths = rows[0]!.map((_, c) => Math.max(...rows.map((row) => row[c]!.length)));
for (const row of rows)
  console.log(row.map((cell, c) => (c < 2 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join('  '));
console.log(`time ratio (Ebbline / R, warm medians): ${(oursMs / rMs).toFixed(2)}`);
console.log(
  `for context, Ebbline's full model selection (backtest of ${selection.report.backtest?.candidates.length ?? 0} candidates, final fit): ` +
    `${selectionMs.toFixed(0)} ms, chose ${selection.report.method} [${selection.report.model}]`,
);
