import { describe, expect, it } from 'vitest';
import { createRng, rngFromState, splitmix64 } from '../../engine/core/random';
import { EngineError } from '../../engine/core/errors';

/*
 * Reference values were produced by compiling the authors' published C code with gcc 12:
 *   splitmix64.c          (S. Vigna, prng.di.unimi.it): z = (x += 0x9e3779b97f4a7c15);
 *                          z = (z ^ z>>30) * 0xbf58476d1ce4e5b9; z = (z ^ z>>27) * 0x94d049bb133111eb;
 *                          return z ^ z>>31;
 *   xoshiro128starstar.c  (D. Blackman and S. Vigna, prng.di.unimi.it): result = rotl(s[1]*5, 7)*9;
 *                          t = s[1] << 9; s[2] ^= s[0]; s[3] ^= s[1]; s[1] ^= s[2]; s[0] ^= s[3];
 *                          s[2] ^= t; s[3] = rotl(s[3], 11);
 * with the state seeded as s[0] = low32(sm1), s[1] = high32(sm1), s[2] = low32(sm2), s[3] = high32(sm2).
 */
describe('splitmix64', () => {
  it('matches the reference splitmix64.c outputs for seed 0', () => {
    // Source: splitmix64.c (Vigna, prng.di.unimi.it), compiled and run with gcc, seed x = 0.
    expect(splitmix64(0, 3)).toEqual([0xe220a8397b1dcdafn, 0x6e789e6aa1b965f4n, 0x06c45d188009454fn]);
  });
  it('takes negative seeds modulo 2^64', () => {
    expect(splitmix64(-1, 2)).toEqual(splitmix64(0xffffffffffffffffn, 2));
  });
});

describe('createRng (xoshiro128** seeded by SplitMix64)', () => {
  it('fills the state from the first two SplitMix64 outputs, low half first', () => {
    // Source: splitmix64.c run with seed 0 (see the header of this file).
    expect(createRng(0).getState().words).toEqual([2065550767, 3793791033, 2713282036, 1853398634]);
  });

  it('matches xoshiro128starstar.c from the state 1, 2, 3, 4', () => {
    // Source: xoshiro128starstar.c (Blackman and Vigna, prng.di.unimi.it), s = {1, 2, 3, 4}, gcc.
    const rng = rngFromState({ words: [1, 2, 3, 4], spareNormal: null });
    const out = Array.from({ length: 6 }, () => rng.nextUint32());
    expect(out).toEqual([11520, 0, 5927040, 70819200, 2031721883, 1637235492]);
  });

  it('matches the reference first outputs for seeds 0, 42 and 20261031', () => {
    // Source: splitmix64.c + xoshiro128starstar.c compiled together with gcc (header of this file).
    const first4 = (seed: number) => {
      const rng = createRng(seed);
      return Array.from({ length: 4 }, () => rng.nextUint32());
    };
    expect(first4(0)).toEqual([3737715805, 2584255861, 2876756834, 3286328325]);
    expect(first4(42)).toEqual([1776835114, 4165204688, 17111135, 2317295270]);
    expect(first4(20261031)).toEqual([2695429380, 3715314105, 1089746066, 1442482496]);
  });

  it('gives the same sequence for the same seed and a different one for another seed', () => {
    const a = createRng(7);
    const b = createRng(7);
    const c = createRng(8);
    const sa = Array.from({ length: 1000 }, () => a.nextFloat());
    const sb = Array.from({ length: 1000 }, () => b.nextFloat());
    const sc = Array.from({ length: 1000 }, () => c.nextFloat());
    expect(sb).toEqual(sa);
    expect(sc).not.toEqual(sa);
  });

  it('refuses seeds that are not safe integers', () => {
    for (const bad of [1.5, Number.NaN, Infinity, 2 ** 60]) {
      expect(() => createRng(bad)).toThrow(EngineError);
    }
  });

  it('continues the same sequence from a state snapshot, including the spare normal', () => {
    const rng = createRng(99);
    rng.normal(); // leaves a spare behind
    const snapshot = rng.getState();
    expect(snapshot.spareNormal).not.toBeNull();
    const copy = rngFromState(JSON.parse(JSON.stringify(snapshot)));
    const x = Array.from({ length: 10 }, () => rng.normal());
    const y = Array.from({ length: 10 }, () => copy.normal());
    expect(y).toEqual(x);
  });

  it('refuses an all-zero or malformed state', () => {
    expect(() => rngFromState({ words: [0, 0, 0, 0], spareNormal: null })).toThrow(EngineError);
    expect(() => rngFromState({ words: [1, 2, 3, 2 ** 32], spareNormal: null })).toThrow(EngineError);
    expect(() => rngFromState({ words: [1, 2, 3, -1], spareNormal: null })).toThrow(EngineError);
  });
});

describe('nextFloat', () => {
  it('combines two outputs into 53 bits: (a >>> 5) * 2^26 + (b >>> 6), over 2^53', () => {
    const raw = createRng(42);
    const a = raw.nextUint32();
    const b = raw.nextUint32();
    expect(createRng(42).nextFloat()).toBe(((a >>> 5) * 2 ** 26 + (b >>> 6)) / 2 ** 53);
  });
  it('stays in [0, 1) with mean near 1/2', () => {
    const rng = createRng(3);
    let sum = 0;
    let outside = 0;
    const n = 100_000;
    for (let i = 0; i < n; i++) {
      const u = rng.nextFloat();
      if (!(u >= 0 && u < 1)) outside++;
      sum += u;
    }
    expect(outside).toBe(0);
    // Standard error of the mean of U(0,1) is 1/sqrt(12 n) ≈ 0.0009: allow 5 standard errors.
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(0.0046);
  });
});

describe('nextInt', () => {
  it('covers 0..n-1 evenly (chi-square below the 0.1% critical value)', () => {
    const rng = createRng(11);
    const n = 10;
    const counts = new Array<number>(n).fill(0);
    const draws = 100_000;
    let outside = 0;
    for (let i = 0; i < draws; i++) {
      const k = rng.nextInt(n);
      if (Number.isInteger(k) && k >= 0 && k < n) counts[k]!++;
      else outside++;
    }
    expect(outside).toBe(0);
    const expected = draws / n;
    const chi2 = counts.reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    // From memory: chi-square 0.999 quantile with 9 degrees of freedom ≈ 27.88.
    expect(chi2).toBeLessThan(27.88);
  });
  it('uses one output per draw when no rejection is needed (n = 1 and n = 2^32)', () => {
    const rng = createRng(5);
    const ref = createRng(5);
    expect(rng.nextInt(1)).toBe(0);
    ref.nextUint32();
    expect(rng.nextUint32()).toBe(ref.nextUint32());
    // n = 2^32 accepts every output unchanged.
    expect(createRng(5).nextInt(2 ** 32)).toBe(createRng(5).nextUint32());
  });
  it('refuses n outside 1..2^32 or fractional', () => {
    const rng = createRng(1);
    for (const bad of [0, -3, 2.5, 2 ** 32 + 1, Number.NaN]) expect(() => rng.nextInt(bad)).toThrow(EngineError);
  });
});

describe('normal', () => {
  it('has mean near 0 and variance near 1', () => {
    const rng = createRng(2026);
    const n = 200_000;
    let sum = 0;
    let sq = 0;
    let beyond196 = 0;
    for (let i = 0; i < n; i++) {
      const z = rng.normal();
      sum += z;
      sq += z * z;
      if (Math.abs(z) > 1.959964) beyond196++;
    }
    const mean = sum / n;
    const variance = sq / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(n));
    // Var of the sample variance of N(0,1) is 2/n: allow 5 standard errors.
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    // Common practice, no source: P(|Z| > 1.959964) = 0.05 for a standard normal.
    expect(Math.abs(beyond196 / n - 0.05)).toBeLessThan(5 * Math.sqrt((0.05 * 0.95) / n));
  });
});
