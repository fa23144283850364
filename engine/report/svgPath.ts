/**
 * A small builder for SVG path data (the `d` attribute): move, line and close commands
 * with coordinates rounded to 0.01 of a user unit, enough for print and screen and short
 * enough to keep a 730-day chart small.
 */
import { EngineError } from '../core/errors';

export type PathCommand = { readonly op: 'M' | 'L'; readonly x: number; readonly y: number } | { readonly op: 'Z' };

/** A coordinate with at most two decimals and no trailing zeros. @example coordinate(12.3456) // '12.35' */
export function coordinate(v: number): string {
  if (!Number.isFinite(v)) throw new EngineError('INVALID_ARGUMENT', `an SVG coordinate must be finite, got ${v}`);
  const r = Math.round(v * 100) / 100;
  return String(r === 0 ? 0 : r);
}

/**
 * Path data of a command list.
 * @throws EngineError INVALID_ARGUMENT for a non-finite coordinate.
 * @example pathData([{ op: 'M', x: 0, y: 0 }, { op: 'L', x: 10, y: 5 }, { op: 'Z' }]) // 'M0 0L10 5Z'
 */
export function pathData(commands: readonly PathCommand[]): string {
  let d = '';
  for (const c of commands) d += c.op === 'Z' ? 'Z' : `${c.op}${coordinate(c.x)} ${coordinate(c.y)}`;
  return d;
}

/**
 * An open line through (xs[i], ys[i]).
 * @throws EngineError INVALID_ARGUMENT when the arrays differ in length.
 * @example lineData([0, 1], [5, 6]) // 'M0 5L1 6'
 */
export function lineData(xs: ArrayLike<number>, ys: ArrayLike<number>): string {
  if (xs.length !== ys.length) throw new EngineError('INVALID_ARGUMENT', 'x and y need the same number of points');
  const commands: PathCommand[] = [];
  for (let i = 0; i < xs.length; i++)
    commands.push({ op: i === 0 ? 'M' : 'L', x: xs[i] as number, y: ys[i] as number });
  return pathData(commands);
}

/**
 * A closed band between two lines: along `upper` forwards, back along `lower`, closed.
 * @throws EngineError INVALID_ARGUMENT when the arrays differ in length.
 * @example bandData([0, 1], [1, 2], [3, 4]) // 'M0 3L1 4L1 2L0 1Z'
 */
export function bandData(xs: ArrayLike<number>, lower: ArrayLike<number>, upper: ArrayLike<number>): string {
  if (xs.length !== lower.length || xs.length !== upper.length) {
    throw new EngineError('INVALID_ARGUMENT', 'a band needs x, lower and upper of the same length');
  }
  const commands: PathCommand[] = [];
  for (let i = 0; i < xs.length; i++)
    commands.push({ op: i === 0 ? 'M' : 'L', x: xs[i] as number, y: upper[i] as number });
  for (let i = xs.length - 1; i >= 0; i--) commands.push({ op: 'L', x: xs[i] as number, y: lower[i] as number });
  if (xs.length > 0) commands.push({ op: 'Z' });
  return pathData(commands);
}
