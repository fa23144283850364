/**
 * Window math of a virtualised list with a fixed row height: which rows a viewport shows,
 * so only those (plus a few above and below) are in the document.
 */

export interface WindowInput {
  /** Scroll offset of the viewport, px. */
  readonly scrollTop: number;
  /** Height of the viewport, px. */
  readonly viewportHeight: number;
  /** Height of every row, px (> 0). */
  readonly rowHeight: number;
  readonly count: number;
  /** Rows rendered beyond each edge, so fast scrolling shows no gap (default 8). */
  readonly overscan?: number;
}

export interface VisibleWindow {
  /** First rendered row (inclusive). */
  readonly start: number;
  /** Last rendered row + 1 (exclusive). */
  readonly end: number;
  /** Offset of row `start` from the top of the list, px. */
  readonly offsetTop: number;
  /** Height of the whole list, px. */
  readonly totalHeight: number;
}

/**
 * The rows to render.
 *
 * @throws RangeError for a row height that is not a positive number.
 * @example visibleWindow({ scrollTop: 3600, viewportHeight: 360, rowHeight: 36, count: 100_000, overscan: 2 })
 * // { start: 98, end: 112, offsetTop: 3528, totalHeight: 3_600_000 }
 */
export function visibleWindow(input: WindowInput): VisibleWindow {
  const { rowHeight, count } = input;
  if (!(rowHeight > 0) || !Number.isFinite(rowHeight)) throw new RangeError(`row height ${rowHeight} must be > 0`);
  const overscan = Math.max(0, Math.floor(input.overscan ?? 8));
  const totalHeight = Math.max(0, count) * rowHeight;
  if (count <= 0) return { start: 0, end: 0, offsetTop: 0, totalHeight: 0 };
  const maxTop = Math.max(0, totalHeight - Math.max(0, input.viewportHeight));
  const top = Math.min(Math.max(0, input.scrollTop || 0), maxTop);
  const first = Math.floor(top / rowHeight);
  const last = Math.ceil((top + Math.max(0, input.viewportHeight)) / rowHeight);
  const start = Math.max(0, first - overscan);
  const end = Math.min(count, Math.max(last, first + 1) + overscan);
  return { start, end, offsetTop: start * rowHeight, totalHeight };
}

/**
 * The scroll offset that brings row `index` into view with the least movement.
 * @example scrollToReveal(50, { scrollTop: 0, viewportHeight: 360, rowHeight: 36 }) // 1476
 */
export function scrollToReveal(
  index: number,
  view: { readonly scrollTop: number; readonly viewportHeight: number; readonly rowHeight: number },
): number {
  const top = index * view.rowHeight;
  const bottom = top + view.rowHeight;
  if (top < view.scrollTop) return top;
  if (bottom > view.scrollTop + view.viewportHeight) return bottom - view.viewportHeight;
  return view.scrollTop;
}
