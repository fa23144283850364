/**
 * The runway in plain sentences for the report, the CLI and the screens. Every figure is
 * called an estimate; the caution travels with the estimate (RunwayEstimate.caution) and
 * must be shown beside these sentences.
 */
import { formatAmount, formatCount, formatDate, formatPercent, formatWeeks } from '../report/plainFormat';
import type { RunwayEstimate } from './runway';
import type { CrossingRunway, RunwayQuantile } from './runwayFromCrossedShares';

function quantileText(q: RunwayQuantile): string {
  return q.beyondHorizon || q.weeks === null || q.date === null
    ? 'not within the horizon'
    : `within ${formatWeeks(q.weeks)} (by ${formatDate(q.date)})`;
}

/**
 * The simulated first-crossing range in one sentence (for a forecast without history at
 * hand, e.g. a report made from a result alone).
 * @example describeSimulatedRunway(runwayFromResult(result), 'EUR')
 */
export function describeSimulatedRunway(s: CrossingRunway, currency: string): string {
  const line = formatAmount(s.threshold, currency);
  const horizon = formatWeeks(s.horizonWeeks);
  if (s.shareCrossing === 0) {
    return `In none of the ${formatCount(s.paths)} simulated paths does the balance fall below ${line} within the ${horizon} of the forecast, so the simulated runway is beyond the horizon; that is an estimate, not a guarantee.`;
  }
  if (s.p10.beyondHorizon) {
    return `Only ${formatPercent(s.shareCrossing)} of the ${formatCount(s.paths)} simulated paths fall below ${line} within the ${horizon} of the forecast, so even the runway of the worst 10% of paths is beyond the horizon.`;
  }
  return (
    `Estimated time until the balance first falls below ${line}: in 10% of the simulated paths ${quantileText(s.p10)}, ` +
    `in half of them ${quantileText(s.p50)}, in 90% ${quantileText(s.p90)}; ` +
    `${formatPercent(s.shareCrossing)} of the paths fall below it within the ${horizon} of the forecast.`
  );
}

/**
 * @returns three sentences: simulated range, average weekly burn, naive runway.
 * @example describeRunway(runway({ result, history }))[0]
 *   // 'Estimated time until the balance first falls below 0.00 EUR: in 10% of the simulated paths within 6.1 weeks (12 Dec 2026), …'
 */
export function describeRunway(estimate: RunwayEstimate): string[] {
  const { simulated: s, burn, naive, currency } = estimate;
  const line = formatAmount(s.threshold, currency);
  const sentences: string[] = [describeSimulatedRunway(s, currency)];
  const period = `${formatDate(burn.from)} to ${formatDate(burn.to)}`;
  const weeks = `${burn.weeks} ${burn.weeks === 1 ? 'week' : 'weeks'}`;
  if (burn.burnPerWeek > 0) {
    sentences.push(
      `Average weekly burn over the last ${weeks} (${period}): a net outflow of ${formatAmount(burn.burnPerWeek, currency)} a week.`,
    );
  } else {
    sentences.push(
      `Average weekly burn over the last ${weeks} (${period}): none; the net flow was ${formatAmount(burn.netPerWeek, currency)} a week.`,
    );
  }
  const label =
    s.threshold === 0
      ? 'Naive runway (balance divided by that burn; it ignores timing, seasonality and uncertainty)'
      : `Naive runway (balance above ${line} divided by that burn; it ignores timing, seasonality and uncertainty)`;
  if (naive.status === 'burning' && naive.weeks !== null) sentences.push(`${label}: ${formatWeeks(naive.weeks)}.`);
  else if (naive.status === 'below') sentences.push(`${label}: none, the balance is already below ${line}.`);
  else sentences.push(`${label}: not defined, because the account did not burn cash over that period.`);
  return sentences;
}
