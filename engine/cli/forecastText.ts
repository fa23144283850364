/**
 * The readable form of a forecast for the terminal: a weekly table of balance quantiles
 * and of the chance of having gone below the threshold, the shortfall probability with
 * its Monte Carlo standard error, when a shortfall would first happen, what drives it, the
 * recurring flows projected, the models chosen with their backtest scores, notes, and the
 * caution. Plain words; amounts as plain decimals in the currency's digits.
 */
import { exponentOf, formatMinor } from '../core/money';
import { describeCadence } from '../recurring/cadence';
import type { DirectionReport } from '../forecast/residualFlows';
import type { ForecastResult } from '../forecast/runForecast';
import { QUANTILE_LEVELS } from '../simulate/types';
import { textTable } from './textTable';

const P10 = QUANTILE_LEVELS.indexOf(0.1);
const P50 = QUANTILE_LEVELS.indexOf(0.5);
const P90 = QUANTILE_LEVELS.indexOf(0.9);

/** A probability as a percentage with one decimal; tiny non-zero values as "<0.1%". */
export function percent(p: number): string {
  if (p > 0 && p < 0.0005) return '<0.1%';
  if (p < 1 && p > 0.9995) return '>99.9%';
  return `${(100 * p).toFixed(1)}%`;
}

function grouped(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** End-of-week rows: day 7, 14, … and the last day when the horizon is not whole weeks. */
function weekEnds(horizon: number): number[] {
  const out: number[] = [];
  for (let d = 6; d < horizon; d += 7) out.push(d);
  if (out[out.length - 1] !== horizon - 1) out.push(horizon - 1);
  return out;
}

function modelSentence(name: string, m: DirectionReport, money: (x: number) => string, currency: string): string {
  if (m.treatment === 'none') return `${name}: none remain besides the recurring flows, so none are projected.`;
  const chosen = `${name}: ${m.method}, fitted as ${m.model} on ${grouped(m.trainingDays)} days averaging ${money(m.meanPerDay)} ${currency} a day`;
  const b = m.backtest;
  if (b === null) return `${chosen}, used without a backtest because the history is too short for one.`;
  const scoreOf = (c: (typeof b.candidates)[number]) => {
    const parts = [
      c.pinball ? `pinball ${money(c.pinball.mean)}` : 'pinball n/a',
      c.mase !== null ? `MASE ${c.mase.toFixed(2)}` : 'MASE n/a',
    ];
    if (c.coverage80 !== null && c.coverage90 !== null)
      parts.push(`80%/90% intervals covered ${percent(c.coverage80)}/${percent(c.coverage90)}`);
    if (c.failures.length > 0) parts.push(`failed at ${c.failures.length} origin${c.failures.length === 1 ? '' : 's'}`);
    return parts.join(', ');
  };
  const winner = b.candidates.find((c) => c.name === m.method);
  const others = b.candidates.filter((c) => c.name !== m.method);
  return (
    `${chosen}, chosen by a rolling-origin backtest (${b.origins.length} origins of ${b.horizon} days) for the lowest mean pinball loss` +
    (winner ? ` (${scoreOf(winner)})` : '') +
    (others.length ? `; the other candidates: ${others.map((c) => `${c.name}: ${scoreOf(c)}`).join('; ')}.` : '.')
  );
}

/**
 * The text report of a forecast.
 * @param scopeDescription e.g. "account NL21HRBL0412345670".
 * @example forecastText(result, 'account NL21HRBL0412345670')
 */
export function forecastText(result: ForecastResult, scopeDescription: string): string {
  const e = exponentOf(result.currency);
  const c = result.currency;
  const money = (minor: number) => formatMinor(Math.round(minor), e);
  const last = result.daily[result.daily.length - 1];
  const threshold = `${money(result.threshold)} ${c}`;
  const out: string[] = [];
  out.push(
    `Forecast for ${scopeDescription} as of ${result.asOf}: ${result.horizonDays} days to ${last?.date ?? result.asOf}, ` +
      `${grouped(result.paths)} simulated paths, seed ${result.seed}.`,
  );
  out.push(
    `Starting balance ${money(result.startBalance)} ${c}${result.relativeBalance ? ' (relative: no statement states a balance)' : ''}; threshold ${threshold}.`,
  );
  out.push('');
  out.push(`End-of-week balance (${c}) and the chance of having gone below ${threshold} by then:`);
  const rows = weekEnds(result.horizonDays).map((d) => {
    const day = result.daily[d] as ForecastResult['daily'][number];
    return [
      day.date,
      money(day.quantiles[P10] as number),
      money(day.quantiles[P50] as number),
      money(day.quantiles[P90] as number),
      percent(day.pCrossed),
    ];
  });
  out.push(
    textTable(['week to', 'P10', 'P50', 'P90', 'gone below'], rows, ['left', 'right', 'right', 'right', 'right']),
  );
  out.push('');
  const s = result.shortfall;
  out.push(
    `Chance of going below ${threshold} at some point by ${last?.date ?? result.asOf}: ${percent(s.probability)} ` +
      `(Monte Carlo standard error ${(100 * s.standardError).toFixed(2)} percentage points with ${grouped(result.paths)} paths).`,
  );
  const fc = s.firstCrossing;
  if (fc.p10 === null) {
    out.push(
      'Fewer than 10% of the paths go below the threshold within the horizon, so no first-crossing range is given.',
    );
  } else {
    const parts = [`10% of the paths have gone below by ${fc.p10}`];
    if (fc.p50 !== null) parts.push(`50% by ${fc.p50}`);
    if (fc.p90 !== null) parts.push(`90% by ${fc.p90}`);
    const missing = fc.p50 === null ? '50%' : fc.p90 === null ? '90%' : null;
    out.push(
      `When it first happens: ${parts.join(', ')}${missing ? `; fewer than ${missing} go below within the horizon` : ''}.`,
    );
  }
  if (s.drivers.length > 0) {
    out.push(
      'Main drivers (horizon total in the paths that go below minus in those that do not; negative pushes towards a shortfall):',
    );
    out.push(
      textTable(
        ['flow', `difference (${c})`],
        s.drivers.map((d) => [d.label, money(d.amount)]),
        ['left', 'right'],
      )
        .split('\n')
        .map((l) => `  ${l}`)
        .join('\n'),
    );
  }
  out.push('');
  if (result.recurring.length > 0) {
    out.push(`Recurring flows projected by their own schedule (${result.recurring.length}):`);
    out.push(
      textTable(
        ['flow', 'cadence', `amount (${c})`, 'next', 'confidence', 'status'],
        result.recurring.map((r) => [
          r.label,
          describeCadence(r.cadence),
          money(r.amount),
          r.nextDate ?? 'paused',
          percent(r.flow.confidence),
          r.status,
        ]),
        ['left', 'left', 'right', 'left', 'right', 'left'],
      )
        .split('\n')
        .map((l) => `  ${l}`)
        .join('\n'),
    );
  } else {
    out.push('No recurring flows are projected.');
  }
  if (result.recurringSkipped.length > 0) {
    out.push(
      `Recurring flows found but not projected: ${result.recurringSkipped.map((r) => `${r.label} (${r.reason})`).join('; ')}.`,
    );
  }
  out.push('');
  out.push(
    `Models. ${modelSentence('Other inflows', result.model.inflow, money, c)} ${modelSentence('Other outflows', result.model.outflow, money, c)} ` +
      'Pinball loss and MASE are averaged over the backtest days; lower is better, and a MASE below 1 beats the weekly seasonal naive forecast.',
  );
  if (result.notes.length > 0) {
    out.push('');
    out.push('Notes:');
    for (const n of result.notes) out.push(`  - ${n}`);
  }
  out.push('');
  out.push(result.caution);
  return out.join('\n') + '\n';
}
