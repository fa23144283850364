import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/**
 * Reads one JSON fixture written by test/oracles/diagnostics.R or diagnostics.py. Parsed at
 * run time (not imported) so TypeScript does not build literal types for thousands of numbers.
 */
const cache = new Map<string, unknown>();

export function loadStatsFixture<T>(name: string): T {
  if (!cache.has(name)) {
    const path = fileURLToPath(new URL(`../fixtures/stats/${name}`, import.meta.url));
    cache.set(name, JSON.parse(readFileSync(path, 'utf8')));
  }
  return cache.get(name) as T;
}

export interface SeriesFixture {
  series: Record<string, { name: string; source: string; expr: string; frequency: number; values: number[] }>;
}

/** The input series shared by all fixtures, by name. */
export function seriesValues(name: string): readonly number[] {
  const s = loadStatsFixture<SeriesFixture>('series.json').series[name];
  if (!s) throw new Error(`no series ${name} in series.json`);
  return Object.freeze([...s.values]);
}

/** The series' frequency (12 monthly, 4 quarterly, 7 for the synthetic daily series, 1 for Nile). */
export function seriesFrequency(name: string): number {
  const s = loadStatsFixture<SeriesFixture>('series.json').series[name];
  if (!s) throw new Error(`no series ${name} in series.json`);
  return s.frequency;
}
