/**
 * Automatic choice among the six additive ETS models by an information criterion, as
 * forecast::ets(y, additive.only = TRUE) does (Hyndman, Koehler, Snyder and Grose 2002,
 * IJF 18(3); Hyndman et al. 2008, section 7.2; FPP3 section 8.6).
 */
import { EngineError } from '../core/errors';
import { checkFinite, type Series } from './forecastTypes';
import { estimateEts } from './ets';
import { MAX_ETS_PERIOD, type EtsBounds, type EtsSeason, type EtsTrend, type FittedEts } from './etsModel';

/** A model name of the family: 'ANN', 'AAN', 'AAdN', 'ANA', 'AAA', 'AAdA'. */
export type EtsModelCode = 'ANN' | 'AAN' | 'AAdN' | 'ANA' | 'AAA' | 'AAdA';

/** Options of {@link autoEts}. */
export interface AutoEtsOptions {
  /** Seasonal period m (1 or absent: non-seasonal data). */
  readonly period?: number;
  /** Models to consider. Default all six. */
  readonly allowedModels?: readonly EtsModelCode[];
  /** Selection criterion. Default 'aicc' (forecast's default). */
  readonly ic?: 'aicc' | 'aic' | 'bic';
  readonly bounds?: EtsBounds;
  readonly maxEvaluations?: number;
  /** Optimiser strategy, see EtsConfig.optimizer. Default 'refined'. */
  readonly optimizer?: 'forecast' | 'refined';
}

/** One candidate's outcome. */
export interface EtsCandidate {
  readonly model: EtsModelCode;
  readonly method: string;
  /** Criterion value, or null when the model could not be fitted. */
  readonly criterion: number | null;
  /** Why it was skipped or failed, or null. */
  readonly note: string | null;
}

/** The selected model with the record of the selection. */
export type AutoEtsFit = FittedEts & {
  readonly selection: { readonly ic: 'aicc' | 'aic' | 'bic'; readonly candidates: readonly EtsCandidate[] };
};

// forecast's search order (trend N, A; season N, A; damped before undamped); with a strict
// "<" the first of equal criteria wins, as in forecast.
const ORDER: readonly { code: EtsModelCode; trend: EtsTrend; season: EtsSeason }[] = [
  { code: 'ANN', trend: 'N', season: 'N' },
  { code: 'ANA', trend: 'N', season: 'A' },
  { code: 'AAdN', trend: 'Ad', season: 'N' },
  { code: 'AAN', trend: 'A', season: 'N' },
  { code: 'AAdA', trend: 'Ad', season: 'A' },
  { code: 'AAA', trend: 'A', season: 'A' },
];

/**
 * Fits each allowed model by maximum likelihood and returns the one with the lowest
 * criterion (AICc by default). Seasonal models are considered only when the period is
 * 2..24 and there are more observations than one period (forecast's rules); a model with at
 * least n − 1 values to estimate is skipped. A constant series gives the exact ETS(A,N,N)
 * fit (see fitEts).
 *
 * Complexity: up to six fits, each O(n) per likelihood evaluation × at most 2000 evaluations.
 *
 * @throws EngineError NOT_ENOUGH_DATA when no allowed model can be fitted; INVALID_ARGUMENT for
 *   unknown model codes or non-finite data.
 * @example autoEts(weeklySales, { period: 7 }).method // e.g. 'ETS(A,N,A)'
 */
export function autoEts(y: Series, options: AutoEtsOptions = {}): AutoEtsFit {
  checkFinite(y, 'y');
  const ic = options.ic ?? 'aicc';
  const period = options.period ?? 1;
  if (!Number.isInteger(period) || period < 1) {
    throw new EngineError('INVALID_ARGUMENT', `period must be a positive integer, got ${period}`);
  }
  const allowed = new Set<EtsModelCode>(options.allowedModels ?? ORDER.map((o) => o.code));
  for (const code of allowed) {
    if (!ORDER.some((o) => o.code === code)) throw new EngineError('INVALID_ARGUMENT', `unknown ETS model ${code}`);
  }
  const n = y.length;
  const seasonalPossible = period > 1 && period <= MAX_ETS_PERIOD && n > period;
  const candidates: EtsCandidate[] = [];
  let best: FittedEts | null = null;
  let bestValue = Infinity;
  for (const { code, trend, season } of ORDER) {
    if (!allowed.has(code)) continue;
    const method = `ETS(A,${trend},${season})`;
    if (season === 'A' && !seasonalPossible) {
      const why =
        period <= 1
          ? 'non-seasonal data (period 1)'
          : period > MAX_ETS_PERIOD
            ? `period ${period} is above ${MAX_ETS_PERIOD}`
            : `only ${n} values for period ${period}`;
      candidates.push({ model: code, method, criterion: null, note: `seasonal model skipped: ${why}` });
      continue;
    }
    try {
      const fit = estimateEts(
        y,
        {
          trend,
          season,
          period: season === 'A' ? period : 1,
          ...(options.bounds !== undefined ? { bounds: options.bounds } : {}),
          ...(options.maxEvaluations !== undefined ? { maxEvaluations: options.maxEvaluations } : {}),
          ...(options.optimizer !== undefined ? { optimizer: options.optimizer } : {}),
        },
        false,
      );
      if (fit.constant) {
        candidates.push({ model: 'ANN', method: fit.method, criterion: fit[ic], note: 'constant series: exact fit' });
        return { ...fit, selection: { ic, candidates } };
      }
      const value = fit[ic];
      candidates.push({ model: code, method, criterion: Number.isFinite(value) ? value : null, note: null });
      if (value < bestValue) {
        bestValue = value;
        best = fit;
      }
    } catch (error) {
      if (!(error instanceof EngineError)) throw error;
      candidates.push({ model: code, method, criterion: null, note: error.message });
    }
  }
  if (best === null) {
    throw new EngineError('NOT_ENOUGH_DATA', `no ETS model could be fitted to ${n} values`);
  }
  return { ...best, selection: { ic, candidates } };
}
