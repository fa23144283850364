/**
 * The Patterns screen's figures: the weekly and day-of-month profiles to draw, the yearly
 * note when the component was left out, and the specialists' table of test statistics.
 * Pure functions (no DOM, no Svelte), unit-tested in Node.
 */
import type { CalendarMonthlyFit } from '../../../../engine/decompose/calendarSeasonality';
import type { DailyDecomposition } from '../../../../engine/decompose/dailyDecomposition';
import type { SeriesDiagnostics } from '../../../../engine/stats/diagnostics';

export const WEEKDAY_LABELS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const;
export const WEEKDAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

/** The weekly effect Monday..Sunday (minor units a day), from the decomposition's weekly profile. */
export function weeklyBars(decomposition: Pick<DailyDecomposition, 'weeklyProfile'>): number[] {
  return Array.from(decomposition.weeklyProfile);
}

export interface DayOfMonthProfile {
  /** '1' … '30', 'End' (the last day of the month) and, when estimated, 'LBD'. */
  readonly labels: string[];
  /** Effect per label, minor units a day, centred so a typical month's days average zero. */
  readonly values: number[];
  readonly lastBusinessDay: boolean;
}

/**
 * The calendar-monthly profile as bars: the effect of each day of the month (days 1–30 and
 * the month end, each bucket's effect minus the mean effect weighted by how often each
 * bucket occurs, which is how the component is centred), and the extra effect of the last
 * business day when it was estimated.
 */
export function dayOfMonthProfile(fit: CalendarMonthlyFit): DayOfMonthProfile {
  const effects = Array.from(fit.dayEffects);
  const counts = Array.from(fit.bucketCounts);
  let weight = 0;
  let sum = 0;
  effects.forEach((e, i) => {
    const c = counts[i] ?? 0;
    weight += c;
    sum += c * e;
  });
  const mean = weight > 0 ? sum / weight : 0;
  const labels = effects.map((_, i) => (i === effects.length - 1 ? 'End' : String(i + 1)));
  const values = effects.map((e) => e - mean);
  if (fit.lastBusinessDayEstimated) {
    labels.push('LBD');
    values.push(fit.lastBusinessDayEffect);
  }
  return { labels, values, lastBusinessDay: fit.lastBusinessDayEstimated };
}

/** Tooltip title of a day-of-month bar. */
export function dayOfMonthTitle(label: string): string {
  if (label === 'End') return 'Last day of the month';
  if (label === 'LBD') return 'Extra on the last business day (Monday–Friday)';
  return `Day ${label} of the month`;
}

/**
 * Why the yearly component is missing, in the decomposition's own words (its notes name the
 * component and the data it needs), or a general sentence when no note says.
 */
export function yearlyLeftOutNote(decomposition: Pick<DailyDecomposition, 'notes' | 'estimated'>): string | null {
  if (decomposition.estimated.yearly) return null;
  const note = decomposition.notes.find((n) => /year/i.test(n));
  return note ?? 'The yearly pattern was left out: it needs more than two full years of history.';
}

/**
 * p-values as specialists read them: four decimals, "< 0.0001" below that, and ≤/≥ where a
 * table only bounds the value (KPSS tables end at 0.01 and 0.1).
 * @example pValueText(0.0876261) // '0.0876'
 * @example pValueText(0.1, 'atLeast') // '≥ 0.1'
 */
export function pValueText(p: number, bound: 'atMost' | 'atLeast' | null = null): string {
  if (!Number.isFinite(p)) return '–';
  if (p < 1e-4) return '< 0.0001';
  const text = p.toFixed(4).replace(/0+$/, '').replace(/\.$/, '');
  return `${bound === 'atMost' ? '≤ ' : bound === 'atLeast' ? '≥ ' : ''}${text}`;
}

/**
 * "p = …" with the right relation: `p < 0.0001`, `p ≥ 0.1` for a bound, `p = 0.0876` otherwise.
 * @example pClause(0.1, 'atLeast') // 'p ≥ 0.1'
 */
export function pClause(p: number, bound: 'atMost' | 'atLeast' | null = null): string {
  const text = pValueText(p, bound);
  return /^[<≤≥]/.test(text) ? `p ${text}` : `p = ${text}`;
}

function statistic(x: number): string {
  return Number.isFinite(x) ? x.toFixed(3) : '–';
}

export interface SpecialistRow {
  readonly name: string;
  /** Settings of the test, e.g. '14 lags, df 14'; empty when there are none. */
  readonly detail: string;
  readonly value: string;
  /** What the figure means, in a few words. */
  readonly reading: string;
}

/**
 * The "for specialists" rows of one series' diagnostics: Ljung–Box Q with degrees of
 * freedom and p, ADF and KPSS statistics with lags and p-values, and the differencing
 * suggestion; parts left out say why.
 */
export function specialistRows(d: SeriesDiagnostics): SpecialistRow[] {
  const rows: SpecialistRow[] = [];
  const omitted = (component: string) => d.omitted.find((o) => o.component === component)?.reason ?? 'Not computed.';
  if (d.whiteNoise) {
    const lb = d.whiteNoise.ljungBox;
    rows.push({
      name: 'Ljung–Box Q',
      detail: `${lb.lag} lags, df ${lb.df}`,
      value: `Q = ${statistic(lb.statistic)}, ${pClause(lb.pValue)}`,
      reading: d.whiteNoise.isWhiteNoise ? 'consistent with white noise' : 'autocorrelation remains',
    });
  } else rows.push({ name: 'Ljung–Box Q', detail: '', value: '–', reading: omitted('whiteNoise') });
  if (d.adf) {
    rows.push({
      name: 'ADF',
      detail: `${d.adf.deterministic}, lag ${d.adf.lag}`,
      value: `τ = ${statistic(d.adf.statistic)}, ${pClause(d.adf.pValue)}`,
      reading: d.adf.pValue < 0.05 ? 'unit root rejected at 5%' : 'unit root not rejected at 5%',
    });
  } else rows.push({ name: 'ADF', detail: '', value: '–', reading: omitted('adf') });
  if (d.kpss) {
    rows.push({
      name: 'KPSS',
      detail: `${d.kpss.null}, lag ${d.kpss.lag}`,
      value: `η = ${statistic(d.kpss.statistic)}, ${pClause(d.kpss.pValue, d.kpss.pValueBound)}`,
      reading: d.kpss.pValue < 0.05 ? 'stationarity rejected at 5%' : 'stationarity not rejected at 5%',
    });
  } else rows.push({ name: 'KPSS', detail: '', value: '–', reading: omitted('kpss') });
  rows.push({
    name: 'Differencing suggested',
    detail: '',
    value: differencingText(d.ndiffs, d.nsdiffs, d.period),
    reading:
      d.ndiffs === null && d.nsdiffs === null
        ? omitted('ndiffs')
        : d.nsdiffs === null
          ? 'ndiffs by KPSS'
          : 'ndiffs by KPSS, nsdiffs by seasonal strength',
  });
  return rows;
}

/**
 * The differencing suggestion in a few words.
 * @example differencingText(1, 0, 7) // 'd = 1, D = 0 (period 7)'
 */
export function differencingText(ndiffs: number | null, nsdiffs: 0 | 1 | null, period: number | null): string {
  const d = ndiffs === null ? 'd not computed' : `d = ${ndiffs}`;
  const s = nsdiffs === null ? 'D not computed' : `D = ${nsdiffs}`;
  return `${d}, ${s}${period ? ` (period ${period})` : ''}`;
}
