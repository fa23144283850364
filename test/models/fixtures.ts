/**
 * Typed access to the reference fixtures in test/fixtures/models, produced by
 * test/oracles/ets.R (R 4.2.2, forecast 8.20, Debian).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

const dir = join(__dirname, '..', 'fixtures', 'models');

/** Reads one fixture file as parsed JSON. */
export function loadFixture<T>(name: string): T {
  return JSON.parse(readFileSync(join(dir, name), 'utf8')) as T;
}

export interface RForecast {
  h: number;
  mean: number[];
  lower80: number[];
  upper80: number[];
  lower95: number[];
  upper95: number[];
}

export interface REtsCase {
  name: string;
  call: string;
  y: number[];
  frequency: number;
  method: string;
  components: { error: string; trend: string; season: string; damped: boolean };
  par: { alpha: number; beta?: number; gamma?: number; phi?: number };
  initstate: number[];
  stateWidth: number;
  states: number[];
  loglik: number;
  aic: number;
  aicc: number;
  bic: number;
  sigma2: number;
  mse: number;
  nmEvaluations: number | null;
  residuals: number[];
  fitted: number[];
  forecast: RForecast;
}

export interface REtsFixture {
  source: string;
  cases: REtsCase[];
  auto: { name: string; call: string; y: number[]; frequency: number; method: string; aicc: number }[];
}
