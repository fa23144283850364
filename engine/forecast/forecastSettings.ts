/**
 * Defaults and bounds of a forecast's settings, checked in one place for every entry point
 * (runForecast, scenario forecasts, the CLI, the app's worker).
 */
import { EngineError } from '../core/errors';
import { toDayNumber } from '../core/dates';
import { MAX_HORIZON, MAX_PATHS, MIN_PATHS } from '../simulate/simulateBalances';
import type { ForecastHistory } from './history';

export const DEFAULT_HORIZON = 90;
export const DEFAULT_PATHS = 5000;
export const DEFAULT_SEED = 1;
/** Fewest days of history a forecast accepts. */
export const MIN_HISTORY_DAYS = 28;

/** @throws EngineError INVALID_ARGUMENT outside 1..MAX_HORIZON. */
export function checkHorizon(horizon: number): number {
  if (!Number.isInteger(horizon) || horizon < 1 || horizon > MAX_HORIZON) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `horizon must be a whole number of days from 1 to ${MAX_HORIZON}, got ${horizon}`,
    );
  }
  return horizon;
}

/** @throws EngineError INVALID_ARGUMENT for paths, seed or threshold outside their bounds. */
export function checkSimulationSettings(paths: number, seed: number, threshold: number): void {
  if (!Number.isInteger(paths) || paths < MIN_PATHS || paths > MAX_PATHS) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `paths must be a whole number from ${MIN_PATHS} to ${MAX_PATHS}, got ${paths}`,
    );
  }
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) {
    throw new EngineError('INVALID_ARGUMENT', `seed must be a whole number from 0 to 4294967295, got ${seed}`);
  }
  if (!Number.isFinite(threshold)) throw new EngineError('INVALID_ARGUMENT', 'threshold must be a finite amount');
}

/** @throws EngineError NOT_ENOUGH_DATA when the history is shorter than MIN_HISTORY_DAYS. */
export function checkHistoryLength(history: ForecastHistory): void {
  const days = toDayNumber(history.asOf) - toDayNumber(history.start) + 1;
  if (days < MIN_HISTORY_DAYS) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `a forecast needs at least ${MIN_HISTORY_DAYS} days of history, the statements cover ${days}`,
    );
  }
}
