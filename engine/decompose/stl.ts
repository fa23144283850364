/**
 * STL: Seasonal-Trend decomposition by Loess.
 *
 * Method: R. B. Cleveland, W. S. Cleveland, J. E. McRae and I. Terpenning (1990), "STL: A
 * Seasonal-Trend Decomposition Procedure Based on Loess", Journal of Official Statistics
 * 6(1), 3–73.
 *
 * This is a line-by-line port of the Fortran that R's `stats::stl` calls (R's
 * src/library/stats/src/stl.f: `stl`, `stlstp`, `stlss`, `stlfts`, `stlma`, `stless`,
 * `stlest`, `stlrwt`, `psort`), together with the defaults and post-processing that
 * `stats::stl` applies in R code. The numbers agree with R 4.2.2 to about 1e-12
 * (checked against fixtures from test/oracles/stl.R).
 *
 * Robustness weights and the median: R's `stlrwt` takes the "median" absolute residual from
 * the Fortran partial sort `psort(rw, n, mid, 2)` with `mid = (n/2 + 1, n − n/2)`. For even
 * n those two indices are passed in descending order, which `psort` does not expect, so it
 * does not always place both order statistics and the value used is then not the exact
 * median. Ebbline ports `psort` exactly as R has it, so robust fits match R (a true median
 * would drift from R by up to ~0.08 after 15 outer iterations). The difference is a
 * property of the reference implementation, not a statistical choice; the weights are
 * Tukey's bisquare of |residual| / (6 · that value), as in the paper.
 */
import { EngineError } from '../core/errors';

/** Configuration of one STL fit. Field names follow R's `stats::stl` arguments. */
export interface StlConfig {
  /**
   * Number of observations per cycle (R: `frequency(x)`), at least 2. A non-integer period
   * such as 365.25 is accepted as R accepts it: the cycle length used by the Fortran is
   * its integer part (R's `as.integer(period)`), while the default `lWindow`, `tWindow` and
   * the "two full periods" check use the value as given.
   */
  readonly period: number;
  /**
   * Seasonal smoothing span (odd, at least 3; an even span is raised by one, as R does), or
   * `'periodic'`: then R uses span 10·n + 1 with degree 0, and the seasonal component is
   * replaced by its cycle-position means after the fit. `'periodic'` needs an integer period.
   */
  readonly sWindow: number | 'periodic';
  /** Degree of the seasonal loess, 0 or 1 (default 0; forced to 0 when periodic). */
  readonly sDegree?: 0 | 1;
  /** Trend span; default nextodd(ceiling(1.5 · period / (1 − 1.5 / sWindow))). */
  readonly tWindow?: number;
  /** Degree of the trend loess, 0 or 1 (default 1). */
  readonly tDegree?: 0 | 1;
  /** Span of the low-pass filter's loess; default nextodd(period). */
  readonly lWindow?: number;
  /** Degree of the low-pass loess, 0 or 1 (default: `tDegree`). */
  readonly lDegree?: 0 | 1;
  /** Loess evaluated every `sJump` points, linear interpolation between; default ceiling(sWindow / 10). */
  readonly sJump?: number;
  /** Default ceiling(tWindow / 10). */
  readonly tJump?: number;
  /** Default ceiling(lWindow / 10). */
  readonly lJump?: number;
  /** Robust fitting: default inner 1 and outer 15 instead of 2 and 0. */
  readonly robust?: boolean;
  /** Inner (backfitting) passes, at least 1; default 2, or 1 when robust. */
  readonly inner?: number;
  /** Outer (robustness) passes, at least 0; default 0, or 15 when robust. */
  readonly outer?: number;
}

/** Spans, degrees or jumps of the three smoothers, as used by the Fortran. */
export interface StlTriple {
  readonly s: number;
  readonly t: number;
  readonly l: number;
}

/** Result of {@link stl}. Plain data: it may cross the worker boundary. */
export interface StlResult {
  readonly seasonal: Float64Array;
  readonly trend: Float64Array;
  /** y − seasonal − trend. */
  readonly remainder: Float64Array;
  /** Robustness weights of the last pass (all 1 when `outer` is 0), as R's `fit$weights`. */
  readonly weights: Float64Array;
  /** Cycle length used by the smoother (integer part of `period`). */
  readonly cycleLength: number;
  /** True when `sWindow` was `'periodic'`. */
  readonly periodic: boolean;
  /** Spans actually used (odd, at least 3). */
  readonly windows: StlTriple;
  readonly degrees: StlTriple;
  readonly jumps: StlTriple;
  readonly inner: number;
  readonly outer: number;
}

/**
 * Decomposes a series into seasonal, trend and remainder by STL, exactly as R's
 * `stats::stl` does (same defaults, same Fortran arithmetic, same periodic post-step).
 *
 * Source: Cleveland, Cleveland, McRae and Terpenning (1990), J. Official Statistics 6(1),
 * 3–73; port of R's stl.f (see the module comment, including the robust-median note).
 *
 * Complexity: O((outer + 1) · inner · n · (sWindow/sJump + tWindow/tJump + lWindow/lJump))
 * time, which is O(n) per pass with the default jumps (about ten loess points per span);
 * O(n + period) memory.
 *
 * @param y the series, finite values, at least 2·period + 1 of them; never mutated.
 * @param config period and smoothing parameters (R's argument names in camelCase).
 * @returns seasonal, trend, remainder and weights as new Float64Arrays, plus the
 *   parameters used.
 * @throws EngineError NOT_ENOUGH_DATA when n ≤ 2 · period (R: "series is not periodic or
 *   has less than two periods").
 * @throws EngineError INVALID_ARGUMENT for a non-finite value in y, period < 2, a span
 *   below 3, a degree other than 0/1, a jump below 1, inner < 1, outer < 0, or 'periodic'
 *   with a non-integer period.
 *
 * @example
 * // R: stl(nottem, s.window = "periodic")
 * const fit = stl(nottem, { period: 12, sWindow: 'periodic' });
 * fit.seasonal[0]; // -9.347198… (January)
 */
export function stl(y: ArrayLike<number>, config: StlConfig): StlResult {
  const n = y.length;
  const period = config.period;
  if (!Number.isFinite(period) || period < 2) {
    throw new EngineError('INVALID_ARGUMENT', `STL period must be a number of at least 2, got ${period}`);
  }
  if (n <= 2 * period) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `STL needs more than two full periods: ${n} observations for period ${period}`,
    );
  }
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = y[i] as number;
    if (!Number.isFinite(v)) {
      throw new EngineError('INVALID_ARGUMENT', `STL input must be finite; value ${i} is ${v}`);
    }
    x[i] = v;
  }

  const periodic = config.sWindow === 'periodic';
  if (periodic && !Number.isInteger(period)) {
    throw new EngineError('INVALID_ARGUMENT', `s.window 'periodic' needs an integer period, got ${period}`);
  }
  const sWindowRaw = periodic ? 10 * n + 1 : (config.sWindow as number);
  checkSpan('sWindow', sWindowRaw);
  const sDegree = periodic ? 0 : checkDegree('sDegree', config.sDegree ?? 0);
  const tDegree = checkDegree('tDegree', config.tDegree ?? 1);
  const lDegree = checkDegree('lDegree', config.lDegree ?? tDegree);
  const tWindowRaw = config.tWindow ?? nextOdd(Math.ceil((1.5 * period) / (1 - 1.5 / sWindowRaw)));
  checkSpan('tWindow', tWindowRaw);
  const lWindowRaw = config.lWindow ?? nextOdd(period);
  checkSpan('lWindow', lWindowRaw);
  // R evaluates the jump defaults lazily, after s.window has become 10·n + 1 when periodic.
  const sJump = checkJump('sJump', config.sJump ?? Math.ceil(sWindowRaw / 10));
  const tJump = checkJump('tJump', config.tJump ?? Math.ceil(tWindowRaw / 10));
  const lJump = checkJump('lJump', config.lJump ?? Math.ceil(lWindowRaw / 10));
  const robust = config.robust ?? false;
  const inner = Math.trunc(config.inner ?? (robust ? 1 : 2));
  const outer = Math.trunc(config.outer ?? (robust ? 15 : 0));
  if (!(inner >= 1)) throw new EngineError('INVALID_ARGUMENT', `STL inner must be at least 1, got ${config.inner}`);
  if (!(outer >= 0)) throw new EngineError('INVALID_ARGUMENT', `STL outer must be at least 0, got ${config.outer}`);

  // Fortran `stl`: spans at least 3 and odd, period at least 2.
  const ns = oddSpan(sWindowRaw);
  const nt = oddSpan(tWindowRaw);
  const nl = oddSpan(lWindowRaw);
  const np = Math.max(2, Math.trunc(period));

  const seasonal = new Float64Array(n);
  const trend = new Float64Array(n);
  const weights = new Float64Array(n);
  const work = new StlWork(n, np);
  const p: StepParams = {
    n,
    np,
    ns,
    nt,
    nl,
    isdeg: sDegree,
    itdeg: tDegree,
    ildeg: lDegree,
    sJump,
    tJump,
    lJump,
    inner,
  };

  let userw = false;
  for (let k = 0; ;) {
    stlStep(x, p, userw, weights, seasonal, trend, work);
    k++;
    if (k > outer) break;
    const fit = work.w1;
    for (let i = 0; i < n; i++) fit[i] = (trend[i] as number) + (seasonal[i] as number);
    robustnessWeights(x, n, fit, weights);
    userw = true;
  }
  if (outer <= 0) weights.fill(1);

  if (periodic) replaceByCycleMeans(seasonal, np);

  const remainder = new Float64Array(n);
  for (let i = 0; i < n; i++) remainder[i] = (x[i] as number) - (seasonal[i] as number) - (trend[i] as number);

  return {
    seasonal,
    trend,
    remainder,
    weights,
    cycleLength: np,
    periodic,
    windows: { s: ns, t: nt, l: nl },
    degrees: { s: sDegree, t: tDegree, l: lDegree },
    jumps: { s: sJump, t: tJump, l: lJump },
    inner,
    outer,
  };
}

/** R's `nextodd`: round (half to even, like R's round) and add one when even. */
function nextOdd(v: number): number {
  let r = Math.round(v);
  if (Math.abs(v - Math.trunc(v)) === 0.5 && r % 2 !== 0) r -= 1; // R rounds halves to even
  if (r % 2 === 0) r += 1;
  return r;
}

function checkSpan(name: string, v: number): void {
  if (!Number.isFinite(v) || v < 3) {
    throw new EngineError('INVALID_ARGUMENT', `STL ${name} must be a finite span of at least 3, got ${v}`);
  }
}

function checkDegree(name: string, v: number): 0 | 1 {
  if (v !== 0 && v !== 1) throw new EngineError('INVALID_ARGUMENT', `STL ${name} must be 0 or 1, got ${v}`);
  return v;
}

function checkJump(name: string, v: number): number {
  const j = Math.trunc(v);
  if (!Number.isFinite(v) || j < 1) {
    throw new EngineError('INVALID_ARGUMENT', `STL ${name} must be at least 1, got ${v}`);
  }
  return j;
}

/** R's as.integer (truncation), then the Fortran's "at least 3 and odd". */
function oddSpan(v: number): number {
  let s = Math.max(3, Math.trunc(v));
  if (s % 2 === 0) s += 1;
  return s;
}

interface StepParams {
  readonly n: number;
  readonly np: number;
  readonly ns: number;
  readonly nt: number;
  readonly nl: number;
  readonly isdeg: number;
  readonly itdeg: number;
  readonly ildeg: number;
  readonly sJump: number;
  readonly tJump: number;
  readonly lJump: number;
  readonly inner: number;
}

/** The Fortran's `work(n + 2·np, 5)` plus the scratch the subroutines receive. */
class StlWork {
  readonly w1: Float64Array;
  readonly w2: Float64Array;
  readonly w3: Float64Array;
  readonly w4: Float64Array;
  readonly w5: Float64Array;
  /** Scratch that R passes as `season` to `stlss` (overwritten afterwards). */
  readonly w6: Float64Array;
  constructor(n: number, np: number) {
    const len = n + 2 * np;
    this.w1 = new Float64Array(len);
    this.w2 = new Float64Array(len);
    this.w3 = new Float64Array(len);
    this.w4 = new Float64Array(len);
    this.w5 = new Float64Array(len);
    this.w6 = new Float64Array(len);
  }
}

/** Fortran `stlstp`: `inner` passes of seasonal smoothing, low-pass filter and trend smoothing. */
function stlStep(
  y: Float64Array,
  p: StepParams,
  userw: boolean,
  rw: Float64Array,
  season: Float64Array,
  trend: Float64Array,
  work: StlWork,
): void {
  const { n, np } = p;
  const { w1, w2, w3, w4, w5, w6 } = work;
  for (let pass = 0; pass < p.inner; pass++) {
    for (let i = 0; i < n; i++) w1[i] = (y[i] as number) - (trend[i] as number);
    seasonalSmooth(w1, n, np, p.ns, p.isdeg, p.sJump, userw, rw, w2, w3, w4, w5, w6);
    lowPassFilter(w2, n + 2 * np, np, w3, w1);
    loessSmooth(w3, 0, n, p.nl, p.ildeg, p.lJump, false, w4, 0, w1, 0, w5);
    for (let i = 0; i < n; i++) season[i] = (w2[np + i] as number) - (w1[i] as number);
    for (let i = 0; i < n; i++) w1[i] = (y[i] as number) - (season[i] as number);
    loessSmooth(w1, 0, n, p.nt, p.itdeg, p.tJump, userw, rw, 0, trend, 0, w3);
  }
}

/**
 * Fortran `stlss`: smooths each cycle-subseries by loess and extends it by one value at
 * each end, writing the result (length n + 2·np) into `season`.
 */
function seasonalSmooth(
  y: Float64Array,
  n: number,
  np: number,
  ns: number,
  isdeg: number,
  nsjump: number,
  userw: boolean,
  rw: Float64Array,
  season: Float64Array,
  work1: Float64Array,
  work2: Float64Array,
  work3: Float64Array,
  work4: Float64Array,
): void {
  for (let j = 1; j <= np; j++) {
    const k = Math.trunc((n - j) / np) + 1;
    for (let i = 1; i <= k; i++) work1[i - 1] = y[(i - 1) * np + j - 1] as number;
    if (userw) {
      for (let i = 1; i <= k; i++) work3[i - 1] = rw[(i - 1) * np + j - 1] as number;
    }
    // work2(2..k+1) holds the smoothed subseries; work2(1) and work2(k+2) the extensions.
    loessSmooth(work1, 0, k, ns, isdeg, nsjump, userw, work3, 0, work2, 1, work4);
    const nright = Math.min(ns, k);
    const first = loessAt(work1, 0, k, ns, isdeg, 0, 1, nright, work4, userw, work3, 0);
    work2[0] = Number.isNaN(first) ? (work2[1] as number) : first;
    const nleft = Math.max(1, k - ns + 1);
    const last = loessAt(work1, 0, k, ns, isdeg, k + 1, nleft, k, work4, userw, work3, 0);
    work2[k + 1] = Number.isNaN(last) ? (work2[k] as number) : last;
    for (let m = 1; m <= k + 2; m++) season[(m - 1) * np + j - 1] = work2[m - 1] as number;
  }
}

/** Fortran `stlfts`: moving averages of lengths np, np and 3 (n → n − 2·np values). */
function lowPassFilter(x: Float64Array, n: number, np: number, trend: Float64Array, work: Float64Array): void {
  movingAverage(x, n, np, trend);
  movingAverage(trend, n - np + 1, np, work);
  movingAverage(work, n - 2 * np + 2, 3, trend);
}

/** Fortran `stlma`: running mean of length `len` by a running sum (same order of operations). */
function movingAverage(x: Float64Array, n: number, len: number, ave: Float64Array): void {
  const newn = n - len + 1;
  let v = 0;
  for (let i = 0; i < len; i++) v += x[i] as number;
  ave[0] = v / len;
  if (newn > 1) {
    let k = len - 1;
    let m = -1;
    for (let j = 1; j < newn; j++) {
      k++;
      m++;
      v = v - (x[m] as number) + (x[k] as number);
      ave[j] = v / len;
    }
  }
}

/**
 * Fortran `stless`: loess smoothing of y[yOff .. yOff+n) into ys[ysOff .. ysOff+n), fitting
 * every `njump`-th point and interpolating linearly between.
 */
function loessSmooth(
  y: Float64Array,
  yOff: number,
  n: number,
  len: number,
  ideg: number,
  njump: number,
  userw: boolean,
  rw: Float64Array,
  rwOff: number,
  ys: Float64Array,
  ysOff: number,
  res: Float64Array,
): void {
  if (n < 2) {
    ys[ysOff] = y[yOff] as number;
    return;
  }
  const newnj = Math.min(njump, n - 1);
  let nleft = 1;
  let nright = n;
  const fitAt = (i: number): void => {
    const v = loessAt(y, yOff, n, len, ideg, i, nleft, nright, res, userw, rw, rwOff);
    ys[ysOff + i - 1] = Number.isNaN(v) ? (y[yOff + i - 1] as number) : v;
  };
  if (len >= n) {
    nleft = 1;
    nright = n;
    for (let i = 1; i <= n; i += newnj) fitAt(i);
  } else if (newnj === 1) {
    const nsh = Math.trunc((len + 1) / 2);
    nleft = 1;
    nright = len;
    for (let i = 1; i <= n; i++) {
      if (i > nsh && nright !== n) {
        nleft++;
        nright++;
      }
      fitAt(i);
    }
  } else {
    const nsh = Math.trunc((len + 1) / 2);
    for (let i = 1; i <= n; i += newnj) {
      if (i < nsh) {
        nleft = 1;
        nright = len;
      } else if (i >= n - nsh + 1) {
        nleft = n - len + 1;
        nright = n;
      } else {
        nleft = i - nsh + 1;
        nright = len + i - nsh;
      }
      fitAt(i);
    }
  }
  if (newnj !== 1) {
    for (let i = 1; i <= n - newnj; i += newnj) {
      const a = ys[ysOff + i - 1] as number;
      const delta = ((ys[ysOff + i + newnj - 1] as number) - a) / newnj;
      for (let j = i + 1; j <= i + newnj - 1; j++) ys[ysOff + j - 1] = a + delta * (j - i);
    }
    const k = Math.trunc((n - 1) / newnj) * newnj + 1;
    if (k !== n) {
      // As in the Fortran, the last window of the loop above is reused for the final point.
      fitAt(n);
      if (k !== n - 1) {
        const a = ys[ysOff + k - 1] as number;
        const delta = ((ys[ysOff + n - 1] as number) - a) / (n - k);
        for (let j = k + 1; j <= n - 1; j++) ys[ysOff + j - 1] = a + delta * (j - k);
      }
    }
  }
}

/**
 * Fortran `stlest`: the loess fit at abscissa `xs` (1-based positions) from points
 * nleft..nright with tricube weights (times robustness weights when `userw`). Returns NaN
 * where the Fortran reports `ok = .false.` (all weights zero); inputs are finite, so NaN
 * never means anything else. `w` is scratch indexed by position − 1.
 */
function loessAt(
  y: Float64Array,
  yOff: number,
  n: number,
  len: number,
  ideg: number,
  xs: number,
  nleft: number,
  nright: number,
  w: Float64Array,
  userw: boolean,
  rw: Float64Array,
  rwOff: number,
): number {
  const range = n - 1;
  let h = Math.max(xs - nleft, nright - xs);
  if (len > n) h += Math.trunc((len - n) / 2);
  const h9 = 0.999 * h;
  const h1 = 0.001 * h;
  let a = 0;
  for (let j = nleft; j <= nright; j++) {
    const r = Math.abs(j - xs);
    if (r <= h9) {
      let wj: number;
      if (r <= h1) {
        wj = 1;
      } else {
        const q = r / h;
        const t = 1 - q * q * q;
        wj = t * t * t;
      }
      if (userw) wj = (rw[rwOff + j - 1] as number) * wj;
      w[j - 1] = wj;
      a += wj;
    } else {
      w[j - 1] = 0;
    }
  }
  if (a <= 0) return Number.NaN;
  for (let j = nleft; j <= nright; j++) w[j - 1] = (w[j - 1] as number) / a;
  if (h > 0 && ideg > 0) {
    let mean = 0;
    for (let j = nleft; j <= nright; j++) mean += (w[j - 1] as number) * j;
    let b = xs - mean;
    let c = 0;
    for (let j = nleft; j <= nright; j++) {
      const d = j - mean;
      c += (w[j - 1] as number) * (d * d);
    }
    if (Math.sqrt(c) > 0.001 * range) {
      b = b / c;
      for (let j = nleft; j <= nright; j++) w[j - 1] = (w[j - 1] as number) * (b * (j - mean) + 1);
    }
  }
  let ys = 0;
  for (let j = nleft; j <= nright; j++) ys += (w[j - 1] as number) * (y[yOff + j - 1] as number);
  return ys;
}

/**
 * Fortran `stlrwt`: bisquare robustness weights B(|y − fit| / (6·M)), with M taken from
 * R's `psort` (see the module comment).
 */
function robustnessWeights(y: Float64Array, n: number, fit: Float64Array, rw: Float64Array): void {
  // psort works on a 1-based copy: index 0 is unused.
  const a = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) a[i + 1] = Math.abs((y[i] as number) - (fit[i] as number));
  const mid1 = Math.trunc(n / 2) + 1;
  const mid2 = n - mid1 + 1;
  partialSort(a, n, [0, mid1, mid2]);
  const cmad = 3 * ((a[mid1] as number) + (a[mid2] as number));
  const c9 = 0.999 * cmad;
  const c1 = 0.001 * cmad;
  for (let i = 0; i < n; i++) {
    const r = Math.abs((y[i] as number) - (fit[i] as number));
    if (r <= c1) {
      rw[i] = 1;
    } else if (r <= c9) {
      const u = r / cmad;
      const t = 1 - u * u;
      rw[i] = t * t;
    } else {
      rw[i] = 0;
    }
  }
}

/**
 * Fortran `psort` (R's stl.f; a Singleton-style partial quicksort): permutes a[1..n] so
 * that the entries at the positions listed in ind[1..ni] are those of a sorted array, when
 * ind is ascending. Ported control flow for control flow, labels as states, so that R's
 * behaviour with a descending `ind` is reproduced too.
 */
function partialSort(a: Float64Array, n: number, ind: readonly number[]): void {
  const ni = ind.length - 1;
  if (n < 2 || ni === 0) return;
  const indu = new Int32Array(17);
  const indl = new Int32Array(17);
  const iu = new Int32Array(17);
  const il = new Int32Array(17);
  let jl = 1;
  let ju = ni;
  indl[1] = 1;
  indu[1] = ni;
  let i = 1;
  let j = n;
  let m = 1;
  let k = 0;
  let l = 0;
  let t = 0;
  const at = (q: number): number => a[q] as number;
  const ix = (q: number): number => ind[q] as number;

  let label = 161;
  for (;;) {
    switch (label) {
      case 161:
        label = i < j ? 10 : 166;
        break;
      case 166:
        m = m - 1;
        if (m === 0) return;
        i = il[m] as number;
        j = iu[m] as number;
        jl = indl[m] as number;
        ju = indu[m] as number;
        label = jl <= ju ? 173 : 166;
        break;
      case 173:
        label = j - i > 10 ? 10 : 174;
        break;
      case 10: {
        k = i;
        const ij = Math.trunc((i + j) / 2);
        t = at(ij);
        if (at(i) > t) {
          a[ij] = at(i);
          a[i] = t;
          t = at(ij);
        }
        l = j;
        if (at(j) < t) {
          a[ij] = at(j);
          a[j] = t;
          t = at(ij);
          if (at(i) > t) {
            a[ij] = at(i);
            a[i] = t;
            t = at(ij);
          }
        }
        label = 181;
        break;
      }
      case 181:
        l = l - 1;
        if (at(l) <= t) {
          const tt = at(l);
          do {
            k = k + 1;
          } while (!(at(k) >= t));
          if (k > l) {
            label = 183;
            break;
          }
          a[l] = at(k);
          a[k] = tt;
        }
        label = 181;
        break;
      case 183: {
        indl[m] = jl;
        indu[m] = ju;
        const p = m;
        m = m + 1;
        if (l - i <= j - k) {
          il[p] = k;
          iu[p] = j;
          j = l;
          for (;;) {
            if (jl > ju) {
              label = 166;
              break;
            }
            if (ix(ju) > j) {
              ju = ju - 1;
              continue;
            }
            indl[p] = ju + 1;
            label = 173;
            break;
          }
        } else {
          il[p] = i;
          iu[p] = l;
          i = k;
          for (;;) {
            if (jl > ju) {
              label = 166;
              break;
            }
            if (ix(jl) < i) {
              jl = jl + 1;
              continue;
            }
            indu[p] = jl - 1;
            label = 173;
            break;
          }
        }
        break;
      }
      case 174:
        if (i !== 1) {
          i = i - 1;
          for (;;) {
            i = i + 1;
            if (i === j) break;
            t = at(i + 1);
            if (at(i) > t) {
              k = i;
              do {
                a[k + 1] = at(k);
                k = k - 1;
              } while (!(t >= at(k)));
              a[k + 1] = t;
            }
          }
          label = 166;
          break;
        }
        label = 161;
        break;
      default:
        throw new EngineError('INVALID_ARGUMENT', `psort: unreachable state ${label}`);
    }
  }
}

/**
 * R's periodic post-step: `tapply(seasonal, cycle(x), mean)[cycle(x)]`. The mean is R's
 * two-pass mean (sum / n, then the mean of the deviations added back).
 */
function replaceByCycleMeans(seasonal: Float64Array, np: number): void {
  const n = seasonal.length;
  for (let j = 0; j < np; j++) {
    let s = 0;
    let count = 0;
    for (let i = j; i < n; i += np) {
      s += seasonal[i] as number;
      count++;
    }
    s /= count;
    let dev = 0;
    for (let i = j; i < n; i += np) dev += (seasonal[i] as number) - s;
    const mean = s + dev / count;
    for (let i = j; i < n; i += np) seasonal[i] = mean;
  }
}
