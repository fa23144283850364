/**
 * The colours a chart config is built with. The screen's palette reads the theme's CSS
 * variables and is reactive (./cssPalette.svelte.ts), so configs built from it in a
 * `$derived` are rebuilt on a theme switch; tests pass fixed colours.
 */
export interface ChartPalette {
  /** The balance band hue (Okabe–Ito blue) at an opacity, e.g. `rgba(0, 114, 178, 0.2)`. */
  band(alpha: number): string;
  /** Median line. */
  median(): string;
  /** Threshold line (Okabe–Ito vermillion, dashed wherever it is drawn). */
  threshold(): string;
  /** Money in. */
  inflow(): string;
  /** Money out. */
  outflow(): string;
  /** Body text: the actual balance line, the as-of marker. */
  text(): string;
  /** Axis labels and ticks. */
  muted(): string;
  /** Grid lines. */
  grid(): string;
  /** Tooltip background. */
  surface(): string;
}
