import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** One `stats::stl` case of test/fixtures/decompose/stl.json (written by test/oracles/stl.R). */
export interface StlFixtureCase {
  name: string;
  call: string;
  data: string;
  period: number;
  x: number[];
  win: { s: number; t: number; l: number };
  deg: { s: number; t: number; l: number };
  jump: { s: number; t: number; l: number };
  inner: number;
  outer: number;
  seasonal: number[];
  trend: number[];
  remainder: number[];
  weights: number[];
}

/** One `forecast::mstl` case of test/fixtures/decompose/mstl.json. */
export interface MstlFixtureCase {
  name: string;
  call: string;
  data: string;
  periods: number[];
  x: number[];
  columns: string[];
  warnings: string[];
  trend: number[];
  seasonal: { column: string; values: number[] }[];
  remainder: number[];
}

function load<T>(file: string): { source: string; cases: T[] } {
  const url = new URL(`../fixtures/decompose/${file}`, import.meta.url);
  return JSON.parse(readFileSync(fileURLToPath(url), 'utf8')) as { source: string; cases: T[] };
}

export const stlFixture = load<StlFixtureCase>('stl.json');
export const mstlFixture = load<MstlFixtureCase>('mstl.json');

export function stlCase(name: string): StlFixtureCase {
  const c = stlFixture.cases.find((k) => k.name === name);
  if (!c) throw new Error(`no STL fixture case ${name}`);
  return c;
}

export function mstlCase(name: string): MstlFixtureCase {
  const c = mstlFixture.cases.find((k) => k.name === name);
  if (!c) throw new Error(`no MSTL fixture case ${name}`);
  return c;
}
