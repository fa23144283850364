/**
 * The engine's one source of randomness: a seeded xoshiro128** generator. The same seed
 * gives the same sequence everywhere (Node, a Web Worker, the CLI), so every forecast is
 * reproducible from its seed.
 *
 * Algorithm: D. Blackman and S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM Transactions on Mathematical Software 47(4), 2021; reference code
 * `xoshiro128starstar.c` at prng.di.unimi.it. 128 bits of state, 32-bit outputs, period
 * 2^128 − 1. The state is filled from the seed with SplitMix64 (`splitmix64.c`, same site),
 * as the authors recommend: the first two 64-bit SplitMix64 outputs give the four state
 * words (low half first). SplitMix64 is a bijection of its counter, so two consecutive
 * outputs are never both zero and the all-zero state cannot occur.
 *
 * Not for cryptography.
 */
import { EngineError } from './errors';

/** The complete state of a generator, as plain data (it may cross the worker boundary). */
export interface RngState {
  /** The four xoshiro128** state words, unsigned 32-bit. */
  readonly words: readonly [number, number, number, number];
  /** A second standard normal deviate kept from the last polar-method draw, or null. */
  readonly spareNormal: number | null;
}

/** A seeded pseudo-random generator. */
export interface Rng {
  /** Next raw output, an unsigned 32-bit integer. */
  nextUint32(): number;
  /** Uniform in [0, 1) with 53 random bits (two raw outputs). */
  nextFloat(): number;
  /**
   * Uniform integer in [0, n), exactly unbiased (rejection of the top remainder).
   * @throws EngineError INVALID_ARGUMENT unless n is an integer from 1 to 2^32.
   */
  nextInt(n: number): number;
  /** Standard normal deviate (Marsaglia polar method; every second call uses the spare). */
  normal(): number;
  /** A snapshot of the state; `rngFromState(snapshot)` continues the same sequence. */
  getState(): RngState;
}

const TWO_POW_32 = 4294967296;
const TWO_POW_53 = 9007199254740992;
const TWO_POW_26 = 67108864;

const MASK64 = (1n << 64n) - 1n;

/**
 * SplitMix64 outputs for a 64-bit seed (Steele, Lea and Flood 2014; Vigna's
 * `splitmix64.c`). Used to fill the xoshiro state; exported for tests and for callers that
 * need to derive seeds.
 *
 * @param seed an integer; negative seeds are taken modulo 2^64.
 * @param count how many outputs.
 * @example splitmix64(0, 1)[0] // 0xe220a8397b1dcdafn
 */
export function splitmix64(seed: number | bigint, count: number): bigint[] {
  let x = BigInt.asUintN(64, typeof seed === 'bigint' ? seed : BigInt(seed));
  const out: bigint[] = [];
  for (let i = 0; i < count; i++) {
    x = (x + 0x9e3779b97f4a7c15n) & MASK64;
    let z = x;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
    out.push(z ^ (z >> 31n));
  }
  return out;
}

class Xoshiro128StarStar implements Rng {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare: number;
  private hasSpare: boolean;

  constructor(words: readonly [number, number, number, number], spareNormal: number | null) {
    this.s0 = words[0] | 0;
    this.s1 = words[1] | 0;
    this.s2 = words[2] | 0;
    this.s3 = words[3] | 0;
    this.spare = spareNormal ?? 0;
    this.hasSpare = spareNormal !== null;
  }

  nextUint32(): number {
    const s1 = this.s1;
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= s1;
    this.s1 = s1 ^ this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    const s3 = this.s3;
    this.s3 = (s3 << 11) | (s3 >>> 21);
    return result;
  }

  nextFloat(): number {
    const a = this.nextUint32() >>> 5;
    const b = this.nextUint32() >>> 6;
    return (a * TWO_POW_26 + b) / TWO_POW_53;
  }

  nextInt(n: number): number {
    if (!(n >= 1 && n <= TWO_POW_32) || Math.floor(n) !== n) {
      throw new EngineError('INVALID_ARGUMENT', `nextInt needs a whole number from 1 to 2^32, got ${n}`);
    }
    // Largest multiple of n not above 2^32: outputs at or above it are drawn again.
    const limit = TWO_POW_32 - (TWO_POW_32 % n);
    let r = this.nextUint32();
    while (r >= limit) r = this.nextUint32();
    return r % n;
  }

  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * this.nextFloat() - 1;
      v = 2 * this.nextFloat() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    this.spare = v * f;
    this.hasSpare = true;
    return u * f;
  }

  getState(): RngState {
    return {
      words: [this.s0 >>> 0, this.s1 >>> 0, this.s2 >>> 0, this.s3 >>> 0],
      spareNormal: this.hasSpare ? this.spare : null,
    };
  }
}

/**
 * Creates a generator from an integer seed. Seeds that differ give unrelated sequences;
 * the same seed always gives the same sequence.
 *
 * Cost: O(1) per draw; `nextFloat` uses two raw outputs, `normal` about 2.5 on average.
 *
 * @param seed any safe integer (negative seeds are taken modulo 2^64).
 * @throws EngineError INVALID_ARGUMENT for a non-integer or unsafe seed.
 * @example
 * const rng = createRng(42);
 * rng.nextUint32(); // 1776835114
 * rng.nextInt(6); // a die roll 0..5
 */
export function createRng(seed: number): Rng {
  if (!Number.isSafeInteger(seed)) {
    throw new EngineError('INVALID_ARGUMENT', `a random seed must be a safe integer, got ${seed}`);
  }
  const [a, b] = splitmix64(seed, 2) as [bigint, bigint];
  const words: [number, number, number, number] = [
    Number(a & 0xffffffffn),
    Number(a >> 32n),
    Number(b & 0xffffffffn),
    Number(b >> 32n),
  ];
  return new Xoshiro128StarStar(words, null);
}

/**
 * Recreates a generator from a snapshot taken with `getState()`.
 * @throws EngineError INVALID_ARGUMENT for words that are not unsigned 32-bit integers or
 *   are all zero (a state xoshiro never leaves).
 * @example rngFromState(createRng(1).getState()).nextUint32() === createRng(1).nextUint32() // true
 */
export function rngFromState(state: RngState): Rng {
  const w = state.words;
  if (w.length !== 4 || w.some((x) => !Number.isInteger(x) || x < 0 || x >= TWO_POW_32)) {
    throw new EngineError('INVALID_ARGUMENT', 'random state needs four unsigned 32-bit words');
  }
  if (w.every((x) => x === 0)) throw new EngineError('INVALID_ARGUMENT', 'random state must not be all zero');
  if (state.spareNormal !== null && !Number.isFinite(state.spareNormal)) {
    throw new EngineError('INVALID_ARGUMENT', 'random state has a non-finite spare normal');
  }
  return new Xoshiro128StarStar(w, state.spareNormal);
}
