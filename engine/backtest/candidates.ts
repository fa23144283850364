/**
 * The standard candidate models of Ebbline's forecast method (DESIGN.md section 4), ready
 * for {@link rollingOriginBacktest}: seasonal naive, ETS chosen by AICc, decomposition +
 * ETS, and SBA for intermittent flows.
 */
import { autoEts, type AutoEtsOptions } from '../models/autoEts';
import { decompositionEtsForecaster, type SeasonalDecomposer } from '../models/decompositionEts';
import { forecastEts } from '../models/etsForecast';
import { fitIntermittent, forecastIntermittent, type IntermittentConfig } from '../models/intermittent';
import { fitSeasonalNaive, forecastSeasonalNaive } from '../models/seasonalNaive';
import type { CandidateModel } from './rollingOrigin';

/**
 * Seasonal naive with period m (naive when m = 1).
 * @example seasonalNaiveCandidate(7).name // 'seasonal naive'
 */
export function seasonalNaiveCandidate(
  period: number,
  name = period === 1 ? 'naive' : 'seasonal naive',
): CandidateModel {
  return {
    name,
    fitForecast: (train, horizon, levels) =>
      forecastSeasonalNaive(fitSeasonalNaive(train, { period }), horizon, { levels }),
  };
}

/**
 * ETS chosen by AICc among the additive models (seasonal ones with period m > 1).
 * @example etsCandidate(7).name // 'ETS (AICc)'
 */
export function etsCandidate(
  period: number,
  options: Omit<AutoEtsOptions, 'period'> = {},
  name = 'ETS (AICc)',
): CandidateModel {
  return {
    name,
    fitForecast: (train, horizon, levels) => forecastEts(autoEts(train, { ...options, period }), horizon, { levels }),
  };
}

/**
 * Decomposition + ETS, the seasonal component re-estimated on each training window by `decompose`.
 * @example decompositionEtsCandidate(stlDecomposer).name // 'decomposition + ETS'
 */
export function decompositionEtsCandidate(decompose: SeasonalDecomposer, name = 'decomposition + ETS'): CandidateModel {
  return { name, fitForecast: decompositionEtsForecaster(decompose) };
}

/**
 * SBA (or Croston) for intermittent flows (magnitudes ≥ 0).
 * @example intermittentCandidate().name // 'SBA'
 */
export function intermittentCandidate(
  config: IntermittentConfig = {},
  name = config.variant === 'croston' ? 'Croston' : 'SBA',
): CandidateModel {
  return {
    name,
    fitForecast: (train, horizon, levels) => forecastIntermittent(fitIntermittent(train, config), horizon, { levels }),
  };
}
