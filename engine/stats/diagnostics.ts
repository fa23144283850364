/**
 * Everything the pattern screen and the forecast report show about one series: correlograms
 * with bands, the white-noise verdict, unit-root tests, suggested differencing and plain
 * sentences, with the parts left out for lack of data named and explained.
 */
import { EngineError } from '../core/errors';
import { acf, bartlettBands, whiteNoiseBand } from './acf';
import { adfTest, type AdfResult } from './adf';
import { isConstant } from './isConstant';
import { kpssTest, type KpssResult } from './kpss';
import { ndiffs } from './ndiffs';
import { nsdiffs } from './nsdiffs';
import { pacf } from './pacf';
import { requireFiniteSeries, type SeriesInput } from './requireFiniteSeries';
import { countOf, cycleWords, type TimeUnit } from './timeUnitWords';
import { whiteNoiseVerdict, type WhiteNoiseVerdict } from './whiteNoise';

/** Options of {@link seriesDiagnostics}. */
export interface SeriesDiagnosticsOptions {
  /** Seasonal period in observations (7 for a weekly rhythm in daily data), an integer ≥ 2. */
  readonly period?: number;
  /** Largest correlogram lag. Default min(n − 1, max(⌊10 log₁₀ n⌋, 2 · period)), R's default widened to two cycles. */
  readonly maxLag?: number;
  /** Coverage of the bands. Default 0.95. */
  readonly level?: number;
  /** Significance level of every test. Default 0.05; ndiffs clamps it to [0.01, 0.1], the range of the KPSS table. */
  readonly alpha?: number;
  /** Spacing of the observations, for the wording. Default `'day'`. */
  readonly unit?: TimeUnit;
  /** What the series is: the `'series'` itself (default) or a model's `'leftovers'` (residuals). */
  readonly subject?: 'series' | 'leftovers';
  /** Parameters fitted to produce the series when it holds residuals (Ljung–Box degrees of freedom). Default 0. */
  readonly fitdf?: number;
  /**
   * Seasonal strength F_S of the series' decomposition ({@link seasonalStrength} on the
   * seasonal and remainder of engine/decompose); enables the seasonal-differencing suggestion.
   */
  readonly seasonalStrength?: number;
}

/** A correlogram for lags 1..maxLag: `values[k − 1]` is the correlation at lag k. */
export interface Correlogram {
  readonly values: Float64Array;
  /** ±band inside which white noise falls with probability `level` at each lag. */
  readonly whiteNoiseBand: number;
}

/** The autocorrelation correlogram with Bartlett's widening bands (R ci.type = "ma"), `bartlettBands[k − 1]` at lag k. */
export interface AcfCorrelogram extends Correlogram {
  readonly bartlettBands: Float64Array;
}

/** The parts of {@link SeriesDiagnostics} that may be left out. */
export type DiagnosticComponent = 'acf' | 'pacf' | 'whiteNoise' | 'adf' | 'kpss' | 'ndiffs' | 'nsdiffs';

/** Result of {@link seriesDiagnostics}. Every part is null when it was left out; `omitted` says why. */
export interface SeriesDiagnostics {
  readonly n: number;
  readonly period: number | null;
  readonly maxLag: number;
  readonly level: number;
  readonly acf: AcfCorrelogram | null;
  readonly pacf: Correlogram | null;
  /** Ljung–Box and band count, see {@link whiteNoiseVerdict}. */
  readonly whiteNoise: WhiteNoiseVerdict | null;
  /** ADF with a constant, lag by AIC (statsmodels convention). */
  readonly adf: AdfResult | null;
  /** KPSS level stationarity, tseries' short lag. */
  readonly kpss: KpssResult | null;
  /** Suggested first differences, forecast::ndiffs (KPSS). */
  readonly ndiffs: number | null;
  /** Suggested seasonal differences, forecast::nsdiffs (seasonal strength); null without a strength. */
  readonly nsdiffs: 0 | 1 | null;
  /** Plain sentences in reading order: pattern, rhythm, level, differencing, then what was left out. */
  readonly sentences: readonly string[];
  readonly omitted: readonly { readonly component: DiagnosticComponent; readonly reason: string }[];
}

/** Fewest observations for the correlograms and the Ljung–Box test. */
export const MIN_OBSERVATIONS_CORRELOGRAM = 10;
/** Fewest observations for the ADF and KPSS tests and the differencing suggestion. */
export const MIN_OBSERVATIONS_UNIT_ROOT = 20;

/**
 * Runs the series diagnostics of DESIGN.md §4.3 on `y`:
 * - ACF (with white-noise and Bartlett bands) and PACF up to maxLag ({@link acf}, {@link pacf});
 * - the white-noise verdict: Ljung–Box plus the count of lags outside the band ({@link whiteNoiseVerdict});
 * - ADF with a constant and AIC lag, statsmodels' variant ({@link adfTest}), and KPSS for
 *   level stationarity with tseries' short lag ({@link kpssTest});
 * - suggested differencing by repeated KPSS as forecast::ndiffs ({@link ndiffs}) and, when
 *   the caller passes the seasonal strength of a decomposition, seasonal differencing as
 *   forecast::nsdiffs ({@link nsdiffs});
 * - sentences for a non-statistician.
 * A part that needs more data than there is (see the MIN_OBSERVATIONS constants) or that the
 * data make undefined is left out, set to null and explained in `omitted` and the sentences,
 * so a short or quiet history never fails the whole screen. A constant series leaves out
 * every part.
 *
 * O(n · maxLag + n k² K) (the ADF lag search dominates for long series).
 *
 * @throws EngineError NOT_ENOUGH_DATA for an empty series; INVALID_ARGUMENT for non-finite
 *   values or out-of-range options.
 * @example seriesDiagnostics(dailyOutflows, { period: 7 }).sentences
 *   // ['A pattern shows at lag 7: values 7 days apart tend to move together, which points to something that repeats every week.', …]
 */
export function seriesDiagnostics(y: SeriesInput, options: SeriesDiagnosticsOptions = {}): SeriesDiagnostics {
  requireFiniteSeries(y, 1, 'seriesDiagnostics');
  const n = y.length;
  const level = options.level ?? 0.95;
  const alpha = options.alpha ?? 0.05;
  const unit = options.unit ?? 'day';
  const subject = options.subject ?? 'series';
  const fitdf = options.fitdf ?? 0;
  const period = options.period;
  if (period !== undefined && (!Number.isInteger(period) || period < 2)) {
    throw new EngineError('INVALID_ARGUMENT', `seriesDiagnostics: period must be an integer ≥ 2, got ${period}`);
  }
  if (!(level > 0 && level < 1) || !(alpha > 0 && alpha < 1)) {
    throw new EngineError('INVALID_ARGUMENT', 'seriesDiagnostics: level and alpha must be in (0, 1)');
  }
  const defaultMaxLag = Math.max(Math.floor(10 * Math.log10(n)), period !== undefined ? 2 * period : 0);
  const maxLag = Math.max(0, Math.min(n - 1, options.maxLag ?? defaultMaxLag));
  if (options.maxLag !== undefined && (!Number.isInteger(options.maxLag) || options.maxLag < 1)) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `seriesDiagnostics: maxLag must be an integer ≥ 1, got ${options.maxLag}`,
    );
  }

  // `tell`: whether the reason is news for the reader (too little history) or only for the
  // caller (no period or decomposition passed).
  const omitted: { component: DiagnosticComponent; reason: string; tell: boolean }[] = [];
  const leaveOut = (component: DiagnosticComponent, reason: string, tell = true): null => {
    omitted.push({ component, reason, tell });
    return null;
  };
  const attempt = <T>(component: DiagnosticComponent, reason: string, run: () => T): T | null => {
    try {
      return run();
    } catch (e) {
      if (e instanceof EngineError && e.code === 'NOT_ENOUGH_DATA') return leaveOut(component, reason);
      throw e;
    }
  };

  const base = { n, period: period ?? null, maxLag, level };
  if (isConstant(y)) {
    const reason = 'The values never change, so there is no pattern or drift to measure.';
    const components: DiagnosticComponent[] = ['acf', 'pacf', 'whiteNoise', 'adf', 'kpss', 'ndiffs', 'nsdiffs'];
    return {
      ...base,
      acf: null,
      pacf: null,
      whiteNoise: null,
      adf: null,
      kpss: null,
      ndiffs: null,
      nsdiffs: null,
      sentences: [reason],
      omitted: components.map((component) => ({ component, reason })),
    };
  }

  const tooShort = (what: string, needed: number): string =>
    `Too little history to ${what}: it needs at least ${countOf(needed, unit)}, there ${n === 1 ? 'is' : 'are'} ${countOf(n, unit)}.`;

  let acfPart: AcfCorrelogram | null = null;
  let pacfPart: Correlogram | null = null;
  let whiteNoise: WhiteNoiseVerdict | null = null;
  if (n < MIN_OBSERVATIONS_CORRELOGRAM || maxLag < 1) {
    const reason = tooShort('look for repeating patterns', MIN_OBSERVATIONS_CORRELOGRAM);
    leaveOut('acf', reason);
    leaveOut('pacf', reason);
    leaveOut('whiteNoise', reason);
  } else {
    const band = whiteNoiseBand(n, level);
    const r = acf(y, maxLag);
    acfPart = { values: r.slice(1), whiteNoiseBand: band, bartlettBands: bartlettBands(r, n, level) };
    pacfPart = attempt('pacf', 'The partial autocorrelations are undefined for this series.', () => ({
      values: pacf(y, maxLag),
      whiteNoiseBand: band,
    }));
    whiteNoise = attempt('whiteNoise', tooShort('test for a remaining pattern', fitdf + 2), () =>
      whiteNoiseVerdict(y, { fitdf, level, alpha, unit, subject, ...(period !== undefined ? { period } : {}) }),
    );
  }

  let adf: AdfResult | null = null;
  let kpss: KpssResult | null = null;
  let differences: number | null = null;
  if (n < MIN_OBSERVATIONS_UNIT_ROOT) {
    const reason = tooShort('tell whether the level drifts', MIN_OBSERVATIONS_UNIT_ROOT);
    leaveOut('adf', reason);
    leaveOut('kpss', reason);
    leaveOut('ndiffs', reason);
  } else {
    const undefinedReason = 'The series follows its own past too exactly for a drift test to mean anything.';
    adf = attempt('adf', undefinedReason, () => adfTest(y, { deterministic: 'constant', lags: 'aic' }));
    kpss = attempt('kpss', undefinedReason, () => kpssTest(y, { null: 'level', lags: 'short' }));
    differences = attempt('ndiffs', undefinedReason, () => ndiffs(y, { alpha: Math.min(0.1, Math.max(0.01, alpha)) }));
  }

  let seasonalDifferences: 0 | 1 | null = null;
  if (period === undefined) {
    leaveOut('nsdiffs', 'No seasonal period was given, so seasonal differencing was not considered.', false);
  } else if (options.seasonalStrength === undefined) {
    leaveOut('nsdiffs', 'No seasonal strength was passed, so seasonal differencing was not considered.', false);
  } else if (n < 2 * period) {
    leaveOut('nsdiffs', tooShort('judge the seasonal rhythm', 2 * period));
  } else {
    seasonalDifferences = nsdiffs(y, { period, seasonalStrength: options.seasonalStrength });
  }

  const sentences: string[] = [];
  if (whiteNoise) sentences.push(whiteNoise.sentence);
  if (acfPart && period !== undefined && period <= maxLag && whiteNoise?.strongestLag !== period) {
    // A rhythm shows as a peak at the period; a drifting series has high but steadily
    // falling correlations at every lag, which is persistence, not a rhythm.
    const at = (lag: number): number => acfPart?.values[lag - 1] ?? -Infinity;
    const rPeriod = at(period);
    if (rPeriod > acfPart.whiteNoiseBand && rPeriod > at(period - 1) && rPeriod > at(period + 1)) {
      sentences.push(
        `Values ${countOf(period, unit)} apart are alike: there is a rhythm that repeats every ${cycleWords(period, unit)}.`,
      );
    }
  }
  if (adf && kpss) sentences.push(levelSentence(adf.pValue < alpha, kpss.pValue >= alpha));
  if (differences !== null && differences > 0) {
    sentences.push(
      differences === 1
        ? `Working with ${unit}-to-${unit} changes instead of levels removes the drift (one difference).`
        : `Even the ${unit}-to-${unit} changes drift, so the changes of those changes are used (${differences} differences).`,
    );
  }
  if (seasonalDifferences === 1 && period !== undefined) {
    sentences.push(
      `The rhythm that repeats every ${cycleWords(period, unit)} is strong: comparing each ${unit} with the one ${countOf(period, unit)} earlier removes it.`,
    );
  }
  for (const reason of new Set(omitted.filter((o) => o.tell).map((o) => o.reason))) sentences.push(reason);
  return {
    ...base,
    acf: acfPart,
    pacf: pacfPart,
    whiteNoise,
    adf,
    kpss,
    ndiffs: differences,
    nsdiffs: seasonalDifferences,
    sentences,
    omitted: omitted.map(({ component, reason }) => ({ component, reason })),
  };
}

function levelSentence(adfFindsStableLevel: boolean, kpssFindsStableLevel: boolean): string {
  if (adfFindsStableLevel && kpssFindsStableLevel) {
    return 'The level is stable: the series keeps returning to its usual range instead of drifting away.';
  }
  if (!adfFindsStableLevel && !kpssFindsStableLevel) {
    return 'The level drifts: the series wanders away from where it was and does not come back on its own.';
  }
  return 'The tests disagree on whether the level drifts, so long-range figures deserve extra care.';
}
