/**
 * Models the flows that recurring schedules do not explain, one direction at a time
 * (inflow magnitudes, outflow magnitudes), and turns the chosen model into a simulation
 * component.
 *
 * Candidates, compared by a rolling-origin backtest (4 origins, 28-day horizon, scored by
 * MASE with weekly seasonal-naive scaling, pinball loss and 80/90% coverage). The winner is
 * the candidate with the lowest mean pinball loss over P10/P50/P90, MASE breaking ties: the
 * balance paths use the whole predictive distribution, and pinball loss is a proper score of
 * it (Gneiting and Raftery 2007), whereas MASE judges point forecasts by absolute error,
 * whose optimum is the median — for zero-heavy daily flows often zero, which would
 * understate the sums a balance depends on. Every candidate's MASE, pinball and coverage
 * are reported. The ETS and decomposition candidates are estimated at the first origin and
 * updated (parameters kept, states run on) at the later ones, see etsCandidate; this cut the
 * model selection on five years of daily data about fourfold (test/bench/forecast.bench.ts).
 * - seasonal naive with a weekly period (the benchmark);
 * - ETS, additive family with a weekly season, chosen by AICc;
 * - decomposition + ETS: trend, weekly, calendar-monthly and yearly components from
 *   engine/decompose/dailyDecomposition.ts, non-seasonal ETS by AICc on the seasonally
 *   adjusted series, the projected seasonality added back;
 * - for intermittent series (average inter-demand interval above 1.32 days, Syntetos,
 *   Boylan and Croston 2005), Croston's method with the Syntetos–Boylan approximation.
 * The winner (lowest mean pinball loss) is refitted on the whole window and simulated with
 * stationary-bootstrap residuals (Politis and Romano 1994, mean block 7 days), which keeps
 * the day-to-day dependence and the skew of real flows; residuals that pass the
 * white-noise check are drawn day by day instead (see bootstrapBlock). Intermittent winners are simulated
 * as daily occurrences with weekday-specific probabilities and sizes resampled from the last
 * year, so a flow that happens on Saturdays keeps happening on Saturdays.
 */
import { EngineError } from '../core/errors';
import { addDays, isoWeekday, toDayNumber, type CalendarDate } from '../core/dates';
import { decomposeDaily, projectDailySeasonality, type DailyDecomposition } from '../decompose/dailyDecomposition';
import { autoEts, type AutoEtsFit } from '../models/autoEts';
import { etsFromParameters } from '../models/ets';
import { fitDecompositionEts, forecastDecompositionEts, type FittedDecompositionEts } from '../models/decompositionEts';
import { forecastEts } from '../models/etsForecast';
import { etsToStateSpaceModel } from '../models/etsStateSpaceModel';
import type { Forecast } from '../models/forecastTypes';
import { fitIntermittent, forecastIntermittent, isIntermittent } from '../models/intermittent';
import { fitSeasonalNaive, forecastSeasonalNaive } from '../models/seasonalNaive';
import { rollingOriginBacktest, type BacktestReport, type CandidateModel } from '../backtest/rollingOrigin';
import { whiteNoiseVerdict } from '../stats/whiteNoise';
import type { IntermittentComponent, ResidualComponent } from '../simulate/types';

/** Longest history the residual models are fitted on (three years). */
export const MAX_TRAINING_DAYS = 3 * 365 + 1;
/** Shortest history for a backtest: 4 origins of 28 days after 56 training days. */
export const MIN_BACKTEST_DAYS = 56 + 28 + 3 * 28;
const BACKTEST_HORIZON = 28;
const BOOTSTRAP_BLOCK = 7;

/**
 * Mean block length of the residual bootstrap: blocks of about a week keep the day-to-day
 * dependence a model left in its residuals; when the residuals pass the white-noise check
 * there is no dependence to keep, and single days are drawn, because blocks would then
 * replay the chance autocorrelations of one history (and, after a decomposition, the
 * slight negative autocorrelation that subtracting fitted seasonal components leaves), which
 * made the 90% band of 60-day balances up to 12% narrower than the truth in the calibration
 * tests (test/calibration; 12 histories: band width / true width 1.01 ± 0.10 with weekly
 * blocks throughout, 1.02 ± 0.11 with this rule, but 0.88 → 0.96 on the history where a
 * decomposition won, and pooled P5–P95 coverage 89.5% → 90.0%).
 * @example bootstrapBlock(true) // 1
 */
export function bootstrapBlock(residualsLookRandom: boolean | null): number {
  return residualsLookRandom === true ? 1 : BOOTSTRAP_BLOCK;
}

export const CANDIDATE_NAMES = {
  seasonalNaive: 'Seasonal naive (weekly)',
  ets: 'ETS by AICc (weekly season)',
  decomposition: 'Decomposition + ETS',
  croston: 'Croston (SBA)',
} as const;

export interface DirectionReport {
  readonly direction: 'inflow' | 'outflow';
  /** Method the simulation uses. */
  readonly method: string;
  /** The fitted model, e.g. "ETS(A,N,N)". */
  readonly model: string;
  readonly treatment: 'continuous' | 'intermittent' | 'none';
  readonly trainingDays: number;
  readonly meanPerDay: number;
  readonly backtest: BacktestReport | null;
  /** Plain sentence about what is left after the model (Ljung–Box on its residuals). */
  readonly residualCheck: string | null;
  readonly residualsLookRandom: boolean | null;
  readonly components: { readonly weekly: boolean; readonly monthly: boolean; readonly yearly: boolean };
  readonly notes: readonly string[];
}

export interface ResidualFlowModel {
  readonly component: ResidualComponent | IntermittentComponent | null;
  readonly report: DirectionReport;
}

function seasonalSum(d: DailyDecomposition): Float64Array {
  const s = new Float64Array(d.length);
  for (let i = 0; i < d.length; i++) {
    s[i] =
      (d.weekly[i] as number) + (d.monthly ? (d.monthly[i] as number) : 0) + (d.yearly ? (d.yearly[i] as number) : 0);
  }
  return s;
}

/** The same ETS model with the parameters and initial state of `fit`, run over `y` (nothing estimated). */
function updated(fit: AutoEtsFit, y: Float64Array): AutoEtsFit {
  if (fit.constant) return autoEts(y, { period: fit.spec.period });
  const { trend, season, period } = fit.spec;
  return {
    ...etsFromParameters(y, { trend, season, period }, fit.parameters, fit.initialState),
    selection: fit.selection,
  };
}

/**
 * The ETS candidate of the backtest. Estimated (form by AICc, then parameters and initial
 * states) at the first, earliest origin; at the later origins the model is updated, not
 * re-estimated: the data since then run through it with its parameters kept, which gives its
 * states and its error variance at that origin. This is "updating" as opposed to
 * "recalibrating" in Tashman (2000, IJF 16(4), 437–450, section 2.4): no origin ever sees
 * its test data, the later origins only judge the model with slightly older estimates than
 * the final refit on the whole window will have (a small handicap, never an advantage), and
 * the backtest costs one estimation instead of one per origin.
 */
function etsCandidate(): CandidateModel {
  let estimated: { n: number; fit: AutoEtsFit } | null = null;
  return {
    name: CANDIDATE_NAMES.ets,
    fitForecast: (train, h, levels) => {
      if (estimated === null || train.length <= estimated.n) {
        estimated = { n: train.length, fit: autoEts(train, { period: 7 }) };
        return forecastEts(estimated.fit, h, { levels });
      }
      return forecastEts(updated(estimated.fit, train), h, { levels });
    },
  };
}

/**
 * The decomposition + ETS candidate of the backtest, estimated at the first origin and
 * updated at the later ones as the ETS candidate is: the seasonal components found at the
 * first origin are projected over the days since (so the decomposition never sees a test
 * window), the seasonally adjusted series runs through the ETS model with its parameters
 * kept, and the forecast adds the projection of the same components.
 */
function decompositionCandidate(start: CalendarDate): CandidateModel {
  let estimated: { n: number; d: DailyDecomposition; seasonal: Float64Array; fit: FittedDecompositionEts } | null =
    null;
  return {
    name: CANDIDATE_NAMES.decomposition,
    fitForecast: (train, h, levels) => {
      if (estimated === null || train.length <= estimated.n) {
        const d = decomposeDaily(train, start, { iterations: 2 });
        const seasonal = seasonalSum(d);
        const fit = fitDecompositionEts(train, { seasonal, allowedModels: ['ANN', 'AAN', 'AAdN'] });
        estimated = { n: train.length, d, seasonal, fit };
        const future = projectDailySeasonality(d, addDays(start, train.length), h).total;
        return forecastDecompositionEts(fit, h, { levels, futureSeasonal: future });
      }
      const { n, d, seasonal, fit } = estimated;
      const since = projectDailySeasonality(d, addDays(start, n), train.length - n + h).total;
      const adjusted = new Float64Array(train.length);
      for (let t = 0; t < train.length; t++) {
        adjusted[t] = (train[t] as number) - (t < n ? (seasonal[t] as number) : (since[t - n] as number));
      }
      const refit: FittedDecompositionEts = { ...fit, adjustedModel: updated(fit.adjustedModel, adjusted) };
      return forecastDecompositionEts(refit, h, { levels, futureSeasonal: since.subarray(train.length - n) });
    },
  };
}

function candidates(start: CalendarDate, intermittent: boolean): CandidateModel[] {
  const list: CandidateModel[] = [
    {
      name: CANDIDATE_NAMES.seasonalNaive,
      fitForecast: (train, h, levels) => forecastSeasonalNaive(fitSeasonalNaive(train, { period: 7 }), h, { levels }),
    },
    etsCandidate(),
    decompositionCandidate(start),
  ];
  if (intermittent) {
    list.push({
      name: CANDIDATE_NAMES.croston,
      fitForecast: (train, h, levels): Forecast => forecastIntermittent(fitIntermittent(train), h, { levels }),
    });
  }
  return list;
}

function mean(y: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += y[i] as number;
  return y.length ? s / y.length : 0;
}

function residualCheck(residuals: Float64Array, fitdf: number): { sentence: string; random: boolean } | null {
  if (residuals.length < 30) return null;
  try {
    const v = whiteNoiseVerdict(residuals, { period: 7, fitdf, subject: 'leftovers' });
    return { sentence: v.sentence, random: v.isWhiteNoise };
  } catch (e) {
    if (e instanceof EngineError) return null;
    throw e;
  }
}

/** Weekday-specific occurrence probabilities, shrunk towards the overall rate (prior weight 4 days). */
function weekdayProbabilities(y: Float64Array, start: CalendarDate): number[] {
  const startDay = toDayNumber(start);
  const hits = new Array<number>(7).fill(0);
  const days = new Array<number>(7).fill(0);
  let total = 0;
  for (let i = 0; i < y.length; i++) {
    const w = isoWeekday(startDay + i) - 1;
    days[w] = (days[w] as number) + 1;
    if ((y[i] as number) > 0) {
      hits[w] = (hits[w] as number) + 1;
      total++;
    }
  }
  const overall = y.length ? total / y.length : 0;
  return hits.map((h, w) => (h + 4 * overall) / ((days[w] as number) + 4));
}

/** Lowest mean pinball loss among candidates scored at every origin; MASE breaks ties. */
export function pickByPinball(report: BacktestReport): string | null {
  const full = report.candidates.filter((c) => c.pinball !== null && c.failures.length === 0);
  full.sort((a, b) => {
    const pa = (a.pinball as { mean: number }).mean;
    const pb = (b.pinball as { mean: number }).mean;
    if (Math.abs(pa - pb) > 1e-12 * Math.max(1, Math.abs(pa))) return pa - pb;
    return (a.mase ?? Infinity) - (b.mase ?? Infinity);
  });
  return full[0]?.name ?? null;
}

/**
 * Chooses, fits and packages the model of one direction's residual daily series.
 *
 * @param y daily magnitudes (≥ 0) from `start`, zero-filled; never mutated.
 * @param forecastStart first forecast day (the day after the history).
 * @param horizon forecast days, for the seasonal projection.
 * @returns the simulation component (null when the series is all zero) and a report.
 * @example modelResidualFlow(outflows, '2023-11-01', 'outflow', '2026-11-01', 90).report.method
 * Complexity: 4 backtest origins × candidates fits of O(n) each.
 */
export function modelResidualFlow(
  y: Float64Array,
  start: CalendarDate,
  direction: 'inflow' | 'outflow',
  forecastStart: CalendarDate,
  horizon: number,
): ResidualFlowModel {
  const offsetDays = Math.max(0, y.length - MAX_TRAINING_DAYS);
  const window = y.subarray(offsetDays);
  const windowStart = addDays(start, offsetDays);
  const notes: string[] = [];
  if (offsetDays > 0) notes.push(`Models were fitted on the last ${window.length} days of history.`);
  const label = direction === 'inflow' ? 'Other inflows' : 'Other outflows';
  const key = direction === 'inflow' ? 'residual:inflow' : 'residual:outflow';
  const sign = direction === 'inflow' ? 1 : -1;
  const nonZero = window.reduce((c, v) => c + (v > 0 ? 1 : 0), 0);
  const none = { weekly: false, monthly: false, yearly: false };
  if (nonZero === 0) {
    return {
      component: null,
      report: {
        direction,
        method: 'none',
        model: 'none',
        treatment: 'none',
        trainingDays: window.length,
        meanPerDay: 0,
        backtest: null,
        residualCheck: null,
        residualsLookRandom: null,
        components: none,
        notes: [...notes, `No ${direction}s remain besides the recurring flows, so none are projected.`],
      },
    };
  }
  const intermittent = isIntermittent(window);
  let backtest: BacktestReport | null = null;
  let winner: string = intermittent ? CANDIDATE_NAMES.croston : CANDIDATE_NAMES.ets;
  if (window.length >= MIN_BACKTEST_DAYS) {
    backtest = rollingOriginBacktest(window, candidates(windowStart, intermittent), {
      horizon: BACKTEST_HORIZON,
      step: BACKTEST_HORIZON,
      minTrain: 56,
      period: 7,
      minOrigins: 4,
      maxOrigins: 4,
    });
    winner = pickByPinball(backtest) ?? winner;
  } else {
    notes.push(
      `The history is too short for a backtest (${window.length} days, ${MIN_BACKTEST_DAYS} needed), so the ${intermittent ? 'intermittent-flow method' : 'ETS model'} was used without comparison.`,
    );
  }
  const base = { direction, trainingDays: window.length, meanPerDay: mean(window), backtest } as const;

  if (winner === CANDIDATE_NAMES.croston || (window.length < 15 && intermittent)) {
    const fit = fitIntermittent(window);
    const recent = window.subarray(Math.max(0, window.length - 365));
    const sizes = Array.from(recent).filter((v) => v > 0);
    const probability = weekdayProbabilities(
      window.subarray(Math.max(0, window.length - 364)),
      addDays(windowStart, Math.max(0, window.length - 364)),
    );
    // Phase: probability index of the first forecast day (ISO weekday − 1).
    const phase = isoWeekday(toDayNumber(forecastStart)) - 1;
    return {
      component: {
        kind: 'intermittent',
        key,
        label,
        sign,
        probability,
        phase,
        sizes: sizes.length ? sizes : Array.from(fit.sizes),
      },
      report: {
        ...base,
        method: CANDIDATE_NAMES.croston,
        model: `Croston ${fit.variant.toUpperCase()} (α = ${fit.alpha.toFixed(2)})`,
        treatment: 'intermittent',
        residualCheck: null,
        residualsLookRandom: null,
        components: { weekly: true, monthly: false, yearly: false },
        notes: [
          ...notes,
          `${direction === 'inflow' ? 'Receipts arrive' : 'Payments go out'} on ${Math.round(100 * fit.probability)}% of days; each weekday keeps its own chance and sizes are drawn from the last year.`,
        ],
      },
    };
  }

  if (winner === CANDIDATE_NAMES.seasonalNaive) {
    const fit = fitSeasonalNaive(window, { period: 7 });
    const residuals = Array.from(fit.residuals).filter((r) => Number.isFinite(r));
    const check = residualCheck(Float64Array.from(residuals), 0);
    let ss = 0;
    for (const r of residuals) ss += r * r;
    return {
      component: {
        kind: 'residual',
        key,
        label,
        sign,
        // Seasonal naive as a state-space model: level 0, the last week as seasonal states, γ = 1.
        model: {
          alpha: 0,
          beta: 0,
          gamma: 1,
          phi: 1,
          level: 0,
          trend: 0,
          season: Array.from(fit.lastPeriod),
          sigma: Math.sqrt(ss / Math.max(1, residuals.length)),
        },
        errors: { kind: 'bootstrap', residuals, meanBlock: bootstrapBlock(check?.random ?? null) },
        offset: [],
      },
      report: {
        ...base,
        method: CANDIDATE_NAMES.seasonalNaive,
        model: 'seasonal naive, period 7',
        treatment: 'continuous',
        residualCheck: check?.sentence ?? null,
        residualsLookRandom: check?.random ?? null,
        components: { weekly: true, monthly: false, yearly: false },
        notes,
      },
    };
  }

  if (winner === CANDIDATE_NAMES.ets) {
    const fit = autoEts(window, { period: 7 });
    const check = residualCheck(fit.residuals, fit.informationParameters);
    return {
      component: {
        kind: 'residual',
        key,
        label,
        sign,
        model: etsToStateSpaceModel(fit),
        errors: {
          kind: 'bootstrap',
          residuals: Array.from(fit.residuals),
          meanBlock: bootstrapBlock(check?.random ?? null),
        },
        offset: [],
      },
      report: {
        ...base,
        method: CANDIDATE_NAMES.ets,
        model: fit.method,
        treatment: 'continuous',
        residualCheck: check?.sentence ?? null,
        residualsLookRandom: check?.random ?? null,
        components: { weekly: fit.spec.season === 'A', monthly: false, yearly: false },
        notes,
      },
    };
  }

  // Decomposition + ETS (also the fallback when a backtest could not run).
  const d = decomposeDaily(window, windowStart, { iterations: 2 });
  const fitted = fitDecompositionEts(window, { seasonal: seasonalSum(d), allowedModels: ['ANN', 'AAN', 'AAdN'] });
  const ets = fitted.adjustedModel;
  const projection = projectDailySeasonality(d, forecastStart, horizon);
  const check = residualCheck(ets.residuals, ets.informationParameters);
  return {
    component: {
      kind: 'residual',
      key,
      label,
      sign,
      model: etsToStateSpaceModel(ets),
      errors: {
        kind: 'bootstrap',
        residuals: Array.from(ets.residuals),
        meanBlock: bootstrapBlock(check?.random ?? null),
      },
      offset: Array.from(projection.total),
    },
    report: {
      ...base,
      method: CANDIDATE_NAMES.decomposition,
      model: `${ets.method} on the seasonally adjusted series`,
      treatment: 'continuous',
      residualCheck: check?.sentence ?? null,
      residualsLookRandom: check?.random ?? null,
      components: { weekly: true, monthly: d.monthly !== null, yearly: d.yearly !== null },
      notes: [...notes, ...d.notes],
    },
  };
}
