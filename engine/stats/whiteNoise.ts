/**
 * A plain-words verdict on whether a series (typically a model's leftovers) is random noise.
 */
import { EngineError } from '../core/errors';
import { acf, whiteNoiseBand } from './acf';
import { ljungBox, type LjungBoxResult } from './ljungBox';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';
import { logGamma } from './distributions';
import { countOf, cycleWords, namedCycle, unitAdjective, type TimeUnit } from './timeUnitWords';

/** Options of {@link whiteNoiseVerdict}. */
export interface WhiteNoiseOptions {
  /**
   * Ljung–Box lag h, also the number of ACF lags compared with the band. Default
   * min(2m, ⌊n/5⌋) for a seasonal period m, min(10, ⌊n/5⌋) otherwise, at least fitdf + 1
   * (Hyndman and Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §5.4).
   */
  readonly lag?: number;
  /** Parameters fitted to produce the series when it holds model residuals. Default 0. */
  readonly fitdf?: number;
  /** Seasonal period (7 for a weekly rhythm in daily data), used for the default lag and the wording. */
  readonly period?: number;
  /** Coverage of the ACF band. Default 0.95. */
  readonly level?: number;
  /** Significance level of the Ljung–Box test and of the count of lags outside the band. Default 0.05. */
  readonly alpha?: number;
  /** Spacing of the observations, for the wording. Default `'day'`. */
  readonly unit?: TimeUnit;
  /** What the series is, for the wording: a model's `'leftovers'` (default) or the `'series'` itself. */
  readonly subject?: 'leftovers' | 'series';
}

/** Result of {@link whiteNoiseVerdict}. */
export interface WhiteNoiseVerdict {
  /** True when neither the Ljung–Box test nor the count of lags outside the band finds a pattern. */
  readonly isWhiteNoise: boolean;
  /** Ljung–Box p-value; below alpha means autocorrelation remains. */
  readonly pValue: number;
  readonly ljungBox: LjungBoxResult;
  /** ACF lags 1..lagsChecked were compared with the white-noise band. */
  readonly lagsChecked: number;
  /** The lags whose autocorrelation lies outside ±band, ascending. */
  readonly lagsOutside: readonly number[];
  /** lagsOutside.length / lagsChecked. */
  readonly shareOutside: number;
  /** P(at least that many lags outside) for white noise: binomial(lagsChecked, 1 − level) upper tail. */
  readonly chanceOfThatManyOutside: number;
  /** The lag with the largest |r_k| among lagsOutside, or null when none is outside. */
  readonly strongestLag: number | null;
  /** One sentence for a non-statistician. */
  readonly sentence: string;
}

/** P(X ≥ k) for X ~ Binomial(m, q), the pmf summed in log space from k upwards (no cancellation). */
function binomialUpperTail(k: number, m: number, q: number): number {
  if (k <= 0) return 1;
  const logChoose = logGamma(m + 1);
  let tail = 0;
  for (let j = k; j <= m; j++) {
    tail += Math.exp(logChoose - logGamma(j + 1) - logGamma(m - j + 1) + j * Math.log(q) + (m - j) * Math.log1p(-q));
  }
  return Math.min(tail, 1);
}

function describePattern(
  lag: number,
  correlation: number,
  also: readonly number[],
  subject: 'leftovers' | 'series',
  unit: TimeUnit,
  period: number | undefined,
): string {
  const noun = subject === 'leftovers' ? 'leftovers' : 'values';
  const together = correlation > 0;
  // A cycle is named only when it is one: a multiple of the seasonal period, or a lag with a
  // calendar name (7 days, 12 months), with values that move together.
  const cycle =
    together && period !== undefined && lag % period === 0
      ? cycleWords(period, unit)
      : together
        ? namedCycle(lag, unit)
        : null;
  let relation: string;
  if (lag === 1) {
    const one = subject === 'leftovers' ? 'leftover' : 'value';
    relation = together
      ? `each ${unit}'s ${one} tends to be followed by a similar one`
      : `each ${unit}'s ${one} tends to be followed by one on the other side of the usual level`;
  } else {
    relation = `${noun} ${countOf(lag, unit)} apart tend to ${together ? 'move together' : 'move in opposite directions'}`;
  }
  const consequence =
    subject === 'leftovers'
      ? cycle !== null
        ? `, so something that repeats every ${cycle} was missed`
        : ', so the model missed part of the pattern'
      : cycle !== null
        ? `, which points to something that repeats every ${cycle}`
        : ', so past values help predict the next ones';
  const listed = also.length > 4 ? `${also.slice(0, 3).join(', ')} and ${also.length - 3} more` : also.join(', ');
  const others = also.length > 0 ? ` (it also shows at lag${also.length === 1 ? '' : 's'} ${listed})` : '';
  const opening = subject === 'leftovers' ? 'A pattern remains' : 'A pattern shows';
  return `${opening} at lag ${lag}${others}: ${relation}${consequence}.`;
}

/**
 * Verdict on whether `y` behaves like white noise, with a sentence a non-statistician
 * understands. Two checks, each at level alpha:
 * 1. the Ljung–Box test (Ljung and Box 1978, Biometrika 65(2)) on the first h
 *    autocorrelations, h − fitdf degrees of freedom;
 * 2. the number of the same h autocorrelations outside the white-noise band ±z/√n: for
 *    white noise each falls outside with probability 1 − level, nearly independently
 *    (Bartlett 1946), so a count whose binomial upper-tail probability is below alpha means
 *    a pattern even when the pooled test misses it.
 * `isWhiteNoise` requires both to pass. The sentence names the strongest lag outside the
 * band when there is one (e.g. "A pattern remains at lag 7: leftovers 7 days apart tend to
 * move together, so something that repeats every week was missed.").
 *
 * O(n · h).
 *
 * @throws EngineError NOT_ENOUGH_DATA when the series is constant or too short for the lag
 *   (h ≥ n); INVALID_ARGUMENT for non-finite values or out-of-range options.
 * @example whiteNoiseVerdict(residuals, { period: 7, fitdf: 2 }).sentence
 *   // 'The day-to-day leftovers look like random noise: no pattern remains that the model missed.'
 */
export function whiteNoiseVerdict(y: SeriesInput, options: WhiteNoiseOptions = {}): WhiteNoiseVerdict {
  const fitdf = options.fitdf ?? 0;
  const level = options.level ?? 0.95;
  const alpha = options.alpha ?? 0.05;
  const unit = options.unit ?? 'day';
  const subject = options.subject ?? 'leftovers';
  const { period } = options;
  requireFiniteSeries(y, 2, 'whiteNoiseVerdict');
  if (period !== undefined && (!Number.isInteger(period) || period < 2)) {
    throw new EngineError('INVALID_ARGUMENT', `whiteNoiseVerdict: period must be an integer ≥ 2, got ${period}`);
  }
  if (!(alpha > 0 && alpha < 1)) {
    throw new EngineError('INVALID_ARGUMENT', `whiteNoiseVerdict: alpha must be in (0, 1), got ${alpha}`);
  }
  const n = y.length;
  const lag = options.lag ?? Math.max(fitdf + 1, Math.min(period !== undefined ? 2 * period : 10, Math.floor(n / 5)));
  const test = ljungBox(y, { lag, fitdf });
  const r = acf(y, lag);
  const band = whiteNoiseBand(n, level);
  const lagsOutside: number[] = [];
  let strongestLag: number | null = null;
  for (let k = 1; k <= lag; k++) {
    const rk = Math.abs(r[k] as number);
    if (rk > band) {
      lagsOutside.push(k);
      if (strongestLag === null || rk > Math.abs(r[strongestLag] as number)) strongestLag = k;
    }
  }
  const chance = binomialUpperTail(lagsOutside.length, lag, 1 - level);
  const isWhiteNoise = test.pValue >= alpha && chance >= alpha;
  let sentence: string;
  if (isWhiteNoise) {
    sentence =
      subject === 'leftovers'
        ? `The ${unit}-to-${unit} leftovers look like random noise: no pattern remains that the model missed.`
        : `The ${unitAdjective(unit)} values look like random noise: past ${unit}s say little about the next one.`;
  } else if (strongestLag !== null) {
    const also = lagsOutside.filter((k) => k !== strongestLag);
    sentence = describePattern(strongestLag, r[strongestLag] as number, also, subject, unit, period);
  } else {
    sentence =
      subject === 'leftovers'
        ? `The leftovers are not quite random: small patterns over ${countOf(lag, unit)} add up, so the model missed something.`
        : `The values are not quite random: small patterns over ${countOf(lag, unit)} add up, so past values help predict the next ones.`;
  }
  return {
    isWhiteNoise,
    pValue: test.pValue,
    ljungBox: test,
    lagsChecked: lag,
    lagsOutside,
    shareOutside: lagsOutside.length / lag,
    chanceOfThatManyOutside: chance,
    strongestLag,
    sentence,
  };
}
