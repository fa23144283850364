/**
 * Ordinary least squares by Householder QR, the small regression kernel behind the unit-root
 * tests. It mirrors what R's `lm` reports (coefficients, standard errors, residual sum of
 * squares) for full-rank designs.
 */
import { EngineError } from '../core/errors';

/** A fitted linear regression. */
export interface LeastSquaresFit {
  /** β̂, one per design column, in column order. */
  readonly coefficients: Float64Array;
  /** √(σ̂² [(XᵀX)⁻¹]_jj) with σ̂² = RSS/(n − p), as `summary(lm)`. */
  readonly standardErrors: Float64Array;
  /** Residual sum of squares Σ (y − Xβ̂)². */
  readonly rss: number;
  /** y − Xβ̂. */
  readonly residuals: Float64Array;
  /** Observations. */
  readonly n: number;
  /** Columns. */
  readonly p: number;
}

/** A column is taken as collinear when QR leaves less than this share of its norm (R's lm tol). */
const RANK_TOLERANCE = 1e-7;

/**
 * Least-squares fit of y on the design columns by Householder QR (Golub and Van Loan,
 * Matrix Computations, 4th ed. 2013, §5.3), numerically the route R's `lm` takes (LINPACK
 * dqrdc2) for full-rank designs.
 *
 * O(n p²).
 *
 * @param columns the design matrix as p columns of length n (include a column of ones for an intercept); not mutated
 * @param y the response, length n; not mutated
 * @throws EngineError NOT_ENOUGH_DATA when n ≤ p (no residual degree of freedom) or the
 *   design is rank-deficient (a column is, to within 1e-7 of its norm, a combination of the
 *   others — e.g. a constant series' lagged level next to the intercept);
 *   INVALID_ARGUMENT when columns differ in length from y or there are none.
 * @example leastSquares([Float64Array.of(1, 1, 1), Float64Array.of(1, 2, 3)], [1, 3, 5]).coefficients // [−1, 2]
 */
export function leastSquares(columns: readonly ArrayLike<number>[], y: ArrayLike<number>): LeastSquaresFit {
  const p = columns.length;
  const n = y.length;
  if (p === 0) throw new EngineError('INVALID_ARGUMENT', 'leastSquares: the design has no columns');
  for (const c of columns) {
    if (c.length !== n) {
      throw new EngineError('INVALID_ARGUMENT', `leastSquares: a column has ${c.length} rows, y has ${n}`);
    }
  }
  if (n <= p) {
    throw new EngineError(
      'NOT_ENOUGH_DATA',
      `leastSquares: ${p} coefficients need more than ${p} observations, got ${n}`,
    );
  }
  const a = columns.map((c) => Float64Array.from(c));
  const qty = Float64Array.from(y);
  const rDiagonal = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const col = a[j] as Float64Array;
    let originalNorm = 0;
    for (let i = 0; i < n; i++) originalNorm = Math.hypot(originalNorm, columns[j]?.[i] as number);
    let norm = 0;
    for (let i = j; i < n; i++) norm = Math.hypot(norm, col[i] as number);
    if (!(norm > RANK_TOLERANCE * originalNorm) || norm === 0) {
      throw new EngineError('NOT_ENOUGH_DATA', `leastSquares: design column ${j} is collinear with the others`);
    }
    const alpha = (col[j] as number) > 0 ? -norm : norm;
    // v = x − αe₁ stored in col[j..]; H = I − 2vvᵀ/(vᵀv) and vᵀv = 2(norm² − α x_j).
    const vTv = 2 * (norm * norm - alpha * (col[j] as number));
    col[j] = (col[j] as number) - alpha;
    const reflect = (target: Float64Array): void => {
      let dot = 0;
      for (let i = j; i < n; i++) dot += (col[i] as number) * (target[i] as number);
      const scale = (2 * dot) / vTv;
      for (let i = j; i < n; i++) target[i] = (target[i] as number) - scale * (col[i] as number);
    };
    for (let k = j + 1; k < p; k++) reflect(a[k] as Float64Array);
    reflect(qty);
    rDiagonal[j] = alpha;
  }
  // R is upper triangular: R[i][j] = a[j][i] for i < j, R[j][j] = rDiagonal[j].
  const r = (i: number, j: number): number =>
    i === j ? (rDiagonal[j] as number) : ((a[j] as Float64Array)[i] as number);
  const coefficients = new Float64Array(p);
  for (let i = p - 1; i >= 0; i--) {
    let s = qty[i] as number;
    for (let j = i + 1; j < p; j++) s -= r(i, j) * (coefficients[j] as number);
    coefficients[i] = s / r(i, i);
  }
  let rss = 0;
  for (let i = p; i < n; i++) rss += (qty[i] as number) * (qty[i] as number);
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let fitted = 0;
    for (let j = 0; j < p; j++) fitted += (columns[j]?.[i] as number) * (coefficients[j] as number);
    residuals[i] = (y[i] as number) - fitted;
  }
  // (XᵀX)⁻¹ = R⁻¹R⁻ᵀ; its diagonal is the row sums of squares of R⁻¹.
  const rInverse = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    rInverse[j * p + j] = 1 / r(j, j);
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += r(i, k) * (rInverse[k * p + j] as number);
      rInverse[i * p + j] = -s / r(i, i);
    }
  }
  const sigma2 = rss / (n - p);
  const standardErrors = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    let s = 0;
    for (let j = i; j < p; j++) s += (rInverse[i * p + j] as number) ** 2;
    standardErrors[i] = Math.sqrt(sigma2 * s);
  }
  return { coefficients, standardErrors, rss, residuals, n, p };
}
