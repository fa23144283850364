/**
 * The models behind a forecast and their backtest scores, in one plain paragraph for the
 * report: which method models the flows the recurring schedules leave over, what it was
 * compared with, and how it scored out of sample (MASE: below 1 beats the weekly seasonal
 * naive forecast; coverage: how often the 80% and 90% intervals held the actual value).
 */
import type { ForecastResult } from '../forecast/runForecast';
import type { DirectionReport } from '../forecast/residualFlows';
import { formatCount } from './plainFormat';

function score(x: number | null | undefined, digits = 2): string | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : x.toFixed(digits);
}

function share(x: number | null | undefined): string | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : `${Math.round(x * 100)}%`;
}

function direction(r: DirectionReport, noun: string): string {
  if (r.method === 'none') return `There were no ${noun} beyond the recurring ones to model.`;
  let text = `The ${noun} beyond the recurring ones are modelled by the method “${r.method}” (fitted model: ${r.model}) on ${formatCount(r.trainingDays)} days of history`;
  const b = r.backtest;
  const own = b?.candidates.find((c) => c.name === r.method);
  if (!b || !own) {
    text += ', without a backtest comparison.';
  } else {
    const others = b.candidates.length - 1;
    const scores = [
      score(own.mase) && `MASE ${score(own.mase)}`,
      share(own.coverage80) && `80% interval coverage ${share(own.coverage80)}`,
      share(own.coverage90) && `90% coverage ${share(own.coverage90)}`,
    ].filter(Boolean);
    text += `; it was chosen by a rolling-origin backtest (${b.origins.length} origins of ${b.horizon} days) over ${others} other candidate${others === 1 ? '' : 's'}`;
    text += scores.length ? `, scoring ${scores.join(', ')}.` : '.';
  }
  if (r.residualCheck) text += ` ${r.residualCheck}`;
  return text;
}

/**
 * @example describeModels(result) // 'Recurring flows (8) are projected by their own schedules. The inflows beyond …'
 */
export function describeModels(result: ForecastResult): string {
  const n = result.recurring.length;
  const recurring =
    n === 0
      ? 'No recurring flow is projected by its own schedule.'
      : `${n} recurring flow${n === 1 ? ' is' : 's are'} projected by ${n === 1 ? 'its' : 'their'} own schedule${n === 1 ? '' : 's'}, with amounts and timing learned from the history.`;
  const paths = `${formatCount(result.paths)} paths were simulated with seed ${result.seed}.`;
  return [
    recurring,
    direction(result.model.inflow, 'inflows'),
    direction(result.model.outflow, 'outflows'),
    paths,
  ].join(' ');
}
