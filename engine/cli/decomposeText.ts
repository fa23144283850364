/**
 * The plain-words summary of `ebbline decompose`: the recurring flows found, then for the
 * other inflows and outflows their level and trend, the weekly rhythm, the calendar-monthly
 * and yearly patterns (or why they were left out), and what the diagnostics say about the
 * series and about what the patterns leave over.
 */
import { CAUTION } from '../core/caution';
import { exponentOf, formatMinor } from '../core/money';
import type { DirectionPatterns, HistoryPatterns } from '../forecast/decomposeHistory';
import { WEEKDAY_NAMES } from '../forecast/decomposeJson';
import { recurringSelection } from '../forecast/recurringComponents';
import { describeCadence } from '../recurring/cadence';
import { percent } from './forecastText';
import { textTable } from './textTable';

const TREATMENT_WORDS = {
  projected: 'projected by its schedule',
  ended: 'ended',
  dismissed: 'dismissed',
  unconfirmed: 'kept with the other flows until confirmed',
} as const;

function range(values: ArrayLike<number>): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i] as number;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return { min, max };
}

function directionText(name: string, p: DirectionPatterns, money: (x: number) => string, currency: string): string[] {
  const out: string[] = [];
  let total = 0;
  for (let i = 0; i < p.series.length; i++) total += p.series[i] as number;
  out.push(
    `${name}: ${money(total)} ${currency} over ${p.series.length} days, ${money(total / Math.max(1, p.series.length))} a day on average.`,
  );
  const d = p.decomposition;
  if (d) {
    const first = d.trend[0] as number;
    const last = d.trend[d.length - 1] as number;
    out.push(`  Trend: the underlying level went from ${money(first)} to ${money(last)} a day over the history.`);
    const profile = Array.from(d.weeklyProfile);
    const order = profile.map((v, i) => ({ v, i })).sort((a, b) => b.v - a.v);
    const strongest = order[0] as { v: number; i: number };
    const weakest = order[order.length - 1] as { v: number; i: number };
    out.push(
      `  Weekly rhythm: ${WEEKDAY_NAMES.map((w, i) => `${w.slice(0, 3)} ${(profile[i] as number) >= 0 ? '+' : ''}${money(profile[i] as number)}`).join(', ')} ` +
        `(${WEEKDAY_NAMES[strongest.i]} is the busiest day, ${WEEKDAY_NAMES[weakest.i]} the quietest` +
        `${p.weeklyStrength !== null ? `; the weekly pattern explains ${percent(Math.max(0, p.weeklyStrength))} of what is not trend` : ''}).`,
    );
    const pattern = (what: string, values: Float64Array | null, around: string) => {
      if (values === null) return;
      const r = range(values);
      if (Math.round(r.max) === 0 && Math.round(r.min) === 0) {
        out.push(`  ${what}: estimated, but none stands out (below one minor unit a day).`);
      } else {
        out.push(`  ${what}: from ${money(r.min)} to +${money(r.max)} a day around ${around}.`);
      }
    };
    pattern('Calendar-monthly pattern (day of month, month end)', d.monthly, "the month's average");
    pattern('Yearly pattern', d.yearly, "the year's average");
  }
  for (const n of p.notes) out.push(`  ${n}`);
  const series = p.seriesDiagnostics?.sentences ?? [];
  if (series.length) out.push(`  About the series: ${series.join(' ')}`);
  const leftover = p.remainderDiagnostics?.sentences ?? [];
  if (leftover.length) out.push(`  What the patterns leave over: ${leftover.join(' ')}`);
  return out;
}

/**
 * The text summary of a history's patterns.
 * @example decomposeText(decomposeHistory(history), 'account NL21HRBL0412345670 (EUR)')
 */
export function decomposeText(
  patterns: HistoryPatterns,
  scopeDescription: string,
  notes: readonly string[] = [],
): string {
  const e = exponentOf(patterns.currency);
  const money = (minor: number) => formatMinor(Math.round(minor), e);
  const c = patterns.currency;
  const out: string[] = [];
  out.push(`Patterns of ${scopeDescription} from ${patterns.start} to ${patterns.asOf}.`);
  for (const n of notes) out.push(n);
  out.push('');
  if (patterns.recurring.length) {
    out.push(
      `Recurring flows found (${patterns.recurring.length}); the ones projected or ended are taken out before the patterns below:`,
    );
    out.push(
      textTable(
        ['flow', 'cadence', `typical (${c})`, 'seen', 'last', 'confidence', 'in a forecast'],
        patterns.recurring.map((f) => [
          f.label,
          describeCadence(f.cadence),
          money(f.typicalAmount),
          `${f.occurrences}×`,
          f.lastDate,
          percent(f.confidence),
          TREATMENT_WORDS[recurringSelection(f, undefined)],
        ]),
        ['left', 'left', 'right', 'right', 'left', 'right', 'left'],
      )
        .split('\n')
        .map((l) => `  ${l}`)
        .join('\n'),
    );
  } else {
    out.push('No recurring flows were found.');
  }
  out.push('');
  out.push(...directionText('Other inflows', patterns.inflow, money, c));
  out.push('');
  out.push(...directionText('Other outflows', patterns.outflow, money, c));
  out.push('');
  out.push(CAUTION);
  return out.join('\n') + '\n';
}
