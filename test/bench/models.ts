/**
 * Rough timings of the model fits (printed, never asserted): the six additive ETS models
 * under both optimiser strategies, autoEts and a rolling-origin backtest, on five years of
 * synthetic daily data with a weekly season. Run: npx tsx test/bench/models.ts
 */
import { autoEts } from '../../engine/models/autoEts';
import { fitEts } from '../../engine/models/ets';
import { rollingOriginBacktest } from '../../engine/backtest/rollingOrigin';
import { etsCandidate, seasonalNaiveCandidate } from '../../engine/backtest/candidates';
import { createRng } from '../../engine/core/random';
import type { EtsSeason, EtsTrend } from '../../engine/models/etsModel';

const rng = createRng(2024);
const weekly = [120, -40, -50, -30, 0, 60, -60];
let level = 1000;
const y = Float64Array.from({ length: 5 * 365 + 1 }, (_, t) => {
  level += 4 * rng.normal();
  return level + (weekly[t % 7] as number) + 25 * rng.normal();
});

function time<T>(label: string, run: () => T): T {
  const start = performance.now();
  const out = run();
  console.log(`${label.padEnd(60)} ${(performance.now() - start).toFixed(0).padStart(6)} ms`);
  return out;
}

const models: [EtsTrend, EtsSeason][] = [
  ['N', 'N'],
  ['A', 'N'],
  ['Ad', 'N'],
  ['N', 'A'],
  ['A', 'A'],
  ['Ad', 'A'],
];
console.log(`n = ${y.length} daily values, period 7`);
for (const optimizer of ['forecast', 'refined'] as const) {
  let total = 0;
  for (const [trend, season] of models) {
    const start = performance.now();
    const fit = fitEts(y, { trend, season, period: 7, optimizer });
    const ms = performance.now() - start;
    total += ms;
    console.log(
      `${optimizer.padEnd(9)} ${fit.method.padEnd(12)} AICc ${fit.aicc.toFixed(1).padStart(9)} ` +
        `${String(fit.optimizer?.evaluations).padStart(5)} evaluations ${ms.toFixed(0).padStart(6)} ms`,
    );
  }
  console.log(`${`six models (${optimizer})`.padEnd(60)} ${total.toFixed(0).padStart(6)} ms`);
}
const auto = time('autoEts (six models, refined)', () => autoEts(y, { period: 7 }));
console.log(`  chose ${auto.method}`);
for (const optimizer of ['forecast', 'refined'] as const) {
  time(`backtest: 5 origins x (snaive + autoEts ${optimizer}), h = 28`, () =>
    rollingOriginBacktest(y, [seasonalNaiveCandidate(7), etsCandidate(7, { optimizer })], {
      horizon: 28,
      minTrain: 365,
      period: 7,
      maxOrigins: 5,
    }),
  );
}
