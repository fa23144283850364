/**
 * Forecast benches (printed, never asserted). Run: npm run bench -- forecast
 * (a) recurring detection + decomposition + model selection by backtest, inflow and
 *     outflow, on five years of daily data (target < 200 ms);
 * (b) simulateBalances + summariseBalances, 10,000 paths × 365 days, 20 recurring flows and
 *     the residual components (targets < 150 ms and < 200 MB);
 * (c) the whole runForecast on the demo business account, 5,000 paths × 90 days.
 * Times: the first (cold) run and the median of the warm runs after it.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { addDays } from '../../engine/core/dates';
import { decomposeDaily } from '../../engine/decompose/dailyDecomposition';
import { historyFromLedger } from '../../engine/forecast/history';
import { explainedEntryIds } from '../../engine/forecast/recurringComponents';
import { modelResidualFlow } from '../../engine/forecast/residualFlows';
import { residualSeries, runForecast } from '../../engine/forecast/runForecast';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { detectRecurringFlows } from '../../engine/recurring/detectRecurringFlows';
import { simulateBalances } from '../../engine/simulate/simulateBalances';
import { summariseBalances } from '../../engine/simulate/summariseBalances';
import type { FlowComponent } from '../../engine/simulate/types';
import { benchHistory, median } from './_forecastData';

const gc = (globalThis as { gc?: () => void }).gc;

/** Wall time and CPU time (user + system) of this process: on a shared machine the CPU time shows the work. */
function timed<T>(run: () => T): { ms: number; cpu: number; value: T } {
  const start = performance.now();
  const cpu = process.cpuUsage();
  const value = run();
  const used = process.cpuUsage(cpu);
  return { ms: performance.now() - start, cpu: (used.user + used.system) / 1000, value };
}

type Run = { ms: number; cpu: number };

function report(label: string, runs: readonly Run[], target?: number): void {
  const [first, ...warm] = runs as [Run, ...Run[]];
  const w = warm.length ? warm : [first];
  console.log(
    `${label.padEnd(66)} first ${first.ms.toFixed(0).padStart(5)} ms (cpu ${first.cpu.toFixed(0).padStart(5)})` +
      `   warm median ${median(w.map((r) => r.ms))
        .toFixed(0)
        .padStart(5)} ms (cpu ${median(w.map((r) => r.cpu))
        .toFixed(0)
        .padStart(5)})` +
      (target !== undefined ? `   target < ${target} ms` : ''),
  );
}

const load = (): string => {
  try {
    return `load average ${readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ')}`;
  } catch {
    return 'load average unknown';
  }
};
console.log(
  `${load()} (wall times include waiting for the CPU on a busy machine; cpu = this process's user + system time)`,
);

// (a) -----------------------------------------------------------------------------------
{
  const history = benchHistory();
  const forecastStart = addDays(history.asOf, 1);
  const parts: Record<string, Run[]> = { detect: [], decompose: [], inflow: [], outflow: [], total: [] };
  let methods = '';
  for (let run = 0; run < 6; run++) {
    const total = timed(() => {
      const detect = timed(() => detectRecurringFlows(history.entries, { asOf: history.asOf }));
      const residual = residualSeries(history, explainedEntryIds(detect.value, []));
      const decompose = timed(() => {
        decomposeDaily(residual.inflow, history.start);
        decomposeDaily(residual.outflow, history.start);
      });
      const inflow = timed(() => modelResidualFlow(residual.inflow, history.start, 'inflow', forecastStart, 90));
      const outflow = timed(() => modelResidualFlow(residual.outflow, history.start, 'outflow', forecastStart, 90));
      parts.detect!.push(detect);
      parts.decompose!.push(decompose);
      parts.inflow!.push(inflow);
      parts.outflow!.push(outflow);
      methods = `inflow ${inflow.value.report.method} [${inflow.value.report.model}], outflow ${outflow.value.report.method} [${outflow.value.report.model}], ${detect.value.length} recurring flows`;
    });
    parts.total!.push(total);
  }
  console.log(`(a) five years of daily data (${history.entries.length} entries); ${methods}`);
  report('  recurring detection', parts.detect!);
  report('  decomposition of inflow and outflow (3 passes, full history)', parts.decompose!);
  report('  inflow: model selection with backtest (4 origins) and final fit', parts.inflow!);
  report('  outflow: model selection with backtest (4 origins) and final fit', parts.outflow!);
  report('  (a) total', parts.total!, 200);
}

// (b) -----------------------------------------------------------------------------------
{
  const horizon = 365;
  const paths = 10_000;
  const components: FlowComponent[] = [];
  for (let i = 0; i < 20; i++) {
    const monthlyDays = Array.from({ length: 12 }, (_, m) => Math.min(horizon - 1, m * 30 + (i % 28)));
    const weeklyDays = Array.from({ length: 52 }, (_, w) => w * 7 + (i % 7));
    components.push({
      kind: 'recurring',
      key: `flow:${i}`,
      label: `Recurring flow ${i}`,
      days: i % 4 === 0 ? weeklyDays : monthlyDays,
      amount:
        i % 3 === 0
          ? { kind: 'fixed', value: -5_000 - 1_000 * i }
          : { kind: 'empirical', values: [-12_000, -12_500, -11_800, -13_100, -12_250, -12_900] },
      timing: { offsets: [-1, 0, 1, 2], weights: [1, 6, 2, 1] },
      probability: i % 5 === 0 ? 0.9 : 1,
    });
  }
  const residuals = Array.from({ length: 1095 }, (_, t) => 2_000 * Math.sin(t * 1.7) + 500 * Math.cos(t * 0.3));
  for (const [key, sign] of [
    ['residual:inflow', 1],
    ['residual:outflow', -1],
  ] as const) {
    components.push({
      kind: 'residual',
      key,
      label: key,
      sign,
      model: {
        alpha: 0.05,
        beta: 0,
        gamma: 0.02,
        phi: 1,
        level: 9_000,
        trend: 0,
        season: [-2_000, -1_500, 0, 500, 1_000, 6_000, -4_000],
        sigma: 1_800,
      },
      errors: { kind: 'bootstrap', residuals, meanBlock: 7 },
      offset: Array.from({ length: horizon }, (_, d) => 300 * Math.sin((2 * Math.PI * d) / 30)),
    });
  }
  components.push({
    kind: 'intermittent',
    key: 'intermittent:invoices',
    label: 'Invoices',
    sign: 1,
    probability: [0.05, 0.05, 0.05, 0.05, 0.06, 0.01, 0.01],
    phase: 3,
    sizes: [60_000, 85_000, 120_000, 150_000, 180_000],
  });
  const input = { startBalance: 1_500_000, horizon, paths, seed: 7, threshold: 0, components };
  const times: Run[] = [];
  let memory = '';
  for (let run = 0; run < 4; run++) {
    gc?.();
    const before = process.memoryUsage();
    const t = timed(() => summariseBalances(simulateBalances(input), 0, components));
    const after = process.memoryUsage();
    times.push(t);
    if (run === 0) {
      const mb = (b: number) => (b / 1048576).toFixed(0);
      memory =
        `heap +${mb(after.heapUsed - before.heapUsed)} MB, array buffers +${mb(after.arrayBuffers - before.arrayBuffers)} MB, ` +
        `rss +${mb(after.rss - before.rss)} MB, peak rss ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB (target < 200 MB)`;
    }
  }
  console.log(`(b) simulate + summarise, ${paths} paths × ${horizon} days, ${components.length} components`);
  report('  (b) simulateBalances + summariseBalances', times, 150);
  console.log(`  memory of the first run: ${memory}`);
}

// (c) -----------------------------------------------------------------------------------
{
  const dir = join(import.meta.dirname, '../../resources/demo/statements');
  const files = readdirSync(dir)
    .filter((f) => f.startsWith('business-') && f.endsWith('.xml'))
    .sort()
    .map((f) => ({
      file: f,
      result: importStatement(new Uint8Array(readFileSync(join(dir, f))), { fileName: f }) as ImportResult,
    }));
  const history = historyFromLedger(buildLedger(files));
  const times: Run[] = [];
  let summary = '';
  for (let run = 0; run < 4; run++) {
    const t = timed(() => runForecast(history, { horizon: 90, paths: 5000, seed: 7 }));
    times.push(t);
    summary = `shortfall ${t.value.shortfall.probability}, inflow ${t.value.model.inflow.method}, outflow ${t.value.model.outflow.method}`;
  }
  console.log(
    `(c) runForecast on the demo business account (${history.entries.length} entries, ${history.start} to ${history.asOf}); ${summary}`,
  );
  report('  (c) runForecast, 5,000 paths × 90 days', times);
}
