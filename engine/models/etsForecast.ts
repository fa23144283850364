/**
 * Forecasts with analytic prediction intervals for the additive (class 1) ETS models.
 */
import { checkHorizon, type Forecast, type ForecastOptions } from './forecastTypes';
import { gaussianIntervals } from './gaussianIntervals';
import type { FittedEts } from './etsModel';
import { etsPointForecast } from './etsRecursions';

/**
 * Variance of the h-step forecast error for class 1 models (Hyndman et al. 2008, chapter 6,
 * equation 6.1; FPP3 table 8.8): v_h = σ² (1 + Σ_{j=1}^{h−1} c_j²) with
 * c_j = α + β φ_j + γ·[j mod m = 0] and φ_j = φ + φ² + … + φ^j (j when undamped). This is
 * forecast's `class1` (c_j = H F^{j−1} G) in closed form.
 *
 * Complexity: O(horizon).
 *
 * @example etsForecastVariance(annFit, 3) // σ²·[1, 1 + α², 1 + 2α²]
 */
export function etsForecastVariance(fitted: FittedEts, horizon: number): Float64Array {
  checkHorizon(horizon);
  const { alpha } = fitted.parameters;
  const beta = fitted.parameters.beta ?? 0;
  const gamma = fitted.parameters.gamma ?? 0;
  const phi = fitted.spec.trend === 'Ad' ? (fitted.parameters.phi ?? 1) : 1;
  const m = fitted.spec.season === 'A' ? fitted.spec.period : 0;
  const out = new Float64Array(horizon);
  let cumulative = 0;
  let phiJ = 0;
  let power = 1;
  out[0] = fitted.sigma2;
  for (let j = 1; j < horizon; j++) {
    power *= phi;
    phiJ += power;
    const c = alpha + beta * phiJ + (m > 0 && j % m === 0 ? gamma : 0);
    cumulative += c * c;
    out[j] = fitted.sigma2 * (1 + cumulative);
  }
  return out;
}

/**
 * Point forecasts and Gaussian prediction intervals ŷ ± z·√v_h from a fitted ETS model
 * (FPP3 section 8.7; Hyndman et al. 2008, chapter 6). Matches R's
 * `forecast(ets_fit, h, level)` for these models.
 *
 * Complexity: O(horizon · levels).
 *
 * @param options.levels interval coverage levels in (0, 1); default [0.8, 0.95].
 * @throws EngineError INVALID_ARGUMENT for a bad horizon or level.
 * @example forecastEts(fitEts(y, { trend: 'N', season: 'N' }), 14, { levels: [0.8, 0.9] })
 */
export function forecastEts(fitted: FittedEts, horizon: number, options: ForecastOptions = {}): Forecast {
  checkHorizon(horizon);
  const point = etsPointForecast(fitted.spec, fitted.parameters.phi ?? 1, fitted.lastState, horizon);
  const variance = etsForecastVariance(fitted, horizon);
  const sd = variance.map(Math.sqrt);
  return { point, intervals: gaussianIntervals(point, sd, options.levels), model: fitted.method };
}
