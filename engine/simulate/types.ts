/**
 * Plain-data descriptions of what the Monte Carlo balance simulation combines. Everything
 * here crosses the worker boundary as is: no classes, no closures. Amounts are minor units
 * of one currency; days are offsets from the first forecast day (0 = the day after as-of).
 */

/** A distribution of one flow's amount. `empirical` resamples past amounts with equal weight. */
export type AmountDistribution =
  | { readonly kind: 'fixed'; readonly value: number }
  | { readonly kind: 'normal'; readonly mean: number; readonly sd: number }
  | { readonly kind: 'empirical'; readonly values: readonly number[] };

/** Timing spread in days around a nominal date: offset `offsets[i]` with weight `weights[i]`. */
export interface TimingSpread {
  readonly offsets: readonly number[];
  readonly weights: readonly number[];
}

/** A recurring flow projected by its own schedule (rent, a salary, a quarterly tax). */
export interface RecurringComponent {
  readonly kind: 'recurring';
  /** Stable key: selects this component's random substream. */
  readonly key: string;
  readonly label: string;
  /** Nominal day offsets of the future occurrences (after business-day rules). */
  readonly days: readonly number[];
  /** Signed amount per occurrence (+ in, − out). */
  readonly amount: AmountDistribution;
  readonly timing: TimingSpread;
  /** Chance that an occurrence happens at all (missed occurrences in its history). */
  readonly probability: number;
}

/**
 * Innovations state-space model of a residual flow: additive error, trend N/A/Ad, additive
 * season (Hyndman, Koehler, Ord and Snyder 2008, class 1). Simulated forward from its last
 * states with errors drawn as set by `errors`.
 */
export interface StateSpaceModel {
  readonly alpha: number;
  readonly beta: number;
  readonly gamma: number;
  readonly phi: number;
  readonly level: number;
  readonly trend: number;
  /** Seasonal states, oldest first: season[m − 1] is the most recent (s_{t}). Empty: none. */
  readonly season: readonly number[];
  readonly sigma: number;
}

/** How the day-to-day errors of a residual flow are drawn. */
export type ErrorDraw =
  | { readonly kind: 'gaussian' }
  /** Stationary bootstrap (Politis and Romano 1994) of in-sample residuals, mean block length. */
  | { readonly kind: 'bootstrap'; readonly residuals: readonly number[]; readonly meanBlock: number };

/**
 * The flows left after recurring ones are taken out, one per direction. The daily value is
 * model point + innovations + `offset[d]` (calendar-monthly and yearly seasonality
 * projected), given its `sign`. A single day's value may come out below zero; it is not
 * clamped, because clamping would bias the cumulative balance (see simulateBalances).
 */
export interface ResidualComponent {
  readonly kind: 'residual';
  readonly key: string;
  readonly label: string;
  readonly sign: 1 | -1;
  readonly model: StateSpaceModel;
  readonly errors: ErrorDraw;
  /** Deterministic seasonal projection per day (length ≥ horizon), magnitudes. */
  readonly offset: readonly number[];
}

/**
 * Intermittent flows (many zero days): on each day a flow occurs with probability
 * `probability[d mod probability.length]` and then has a size drawn from `sizes` (magnitudes).
 */
export interface IntermittentComponent {
  readonly kind: 'intermittent';
  readonly key: string;
  readonly label: string;
  readonly sign: 1 | -1;
  readonly probability: readonly number[];
  /** Weekday phase: probability index of day 0 (so weekly occurrence patterns line up). */
  readonly phase: number;
  readonly sizes: readonly number[];
}

/** A flow the user knows about (an invoice due, a tax payment, a hire). */
export interface PlannedComponent {
  readonly kind: 'planned';
  readonly key: string;
  readonly label: string;
  /** Nominal day offsets (one for a one-off, several for a series). */
  readonly days: readonly number[];
  readonly amount: AmountDistribution;
  /** Delay spread uniformly over whole days min..max (late payments). */
  readonly delayMin: number;
  readonly delayMax: number;
  /** Share of paths on which the item happens (drawn once per path, not per occurrence). */
  readonly probability: number;
}

export type FlowComponent = RecurringComponent | ResidualComponent | IntermittentComponent | PlannedComponent;

export interface SimulationInput {
  readonly startBalance: number;
  readonly horizon: number;
  readonly paths: number;
  readonly seed: number;
  readonly threshold: number;
  readonly components: readonly FlowComponent[];
}

/** Quantile levels reported per day. */
export const QUANTILE_LEVELS = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95] as const;

/** Per-day summary of the simulated balance (minor units, probabilities in [0, 1]). */
export interface BalanceSummary {
  readonly horizon: number;
  readonly paths: number;
  readonly mean: Float64Array;
  /** quantiles[k][d] for QUANTILE_LEVELS[k]. */
  readonly quantiles: readonly Float64Array[];
  readonly pBelow: Float64Array;
  readonly pCrossed: Float64Array;
  /** Day offset by which a share q of all paths has crossed (null when fewer ever do). */
  readonly firstCrossing: { readonly p10: number | null; readonly p50: number | null; readonly p90: number | null };
  readonly drivers: readonly ShortfallDriver[];
  /** Monte Carlo standard error of the final pCrossed, √(p(1−p)/N). */
  readonly standardError: number;
}

/**
 * A flow that separates paths that fall below the threshold from those that do not:
 * mean total over the horizon in crossing paths minus in the other paths (negative = it
 * pushes towards the shortfall).
 */
export interface ShortfallDriver {
  readonly key: string;
  readonly label: string;
  readonly difference: number;
  readonly meanInCrossing: number;
  readonly meanOtherwise: number;
}
