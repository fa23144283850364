/**
 * What the patterns view and `ebbline decompose` show: for the inflows and outflows that
 * recurring flows do not explain, the trend, weekly, calendar-monthly and yearly
 * components, and diagnostics of the series and of what the decomposition leaves over,
 * with plain sentences.
 */
import { EngineError } from '../core/errors';
import { decomposeDaily, MIN_DAYS_WEEKLY, type DailyDecomposition } from '../decompose/dailyDecomposition';
import { detectRecurringFlows, type DetectedRecurringFlow } from '../recurring/detectRecurringFlows';
import { seasonalStrength } from '../stats/seasonalStrength';
import { seriesDiagnostics as runDiagnostics, type SeriesDiagnostics } from '../stats/diagnostics';
import type { ForecastHistory } from './history';
import { explainedEntryIds, type RecurringDecision } from './recurringComponents';
import { residualSeries } from './residualSeries';

export interface DirectionPatterns {
  readonly direction: 'inflow' | 'outflow';
  /** The residual daily series (minor units), from the history's start. */
  readonly series: Float64Array;
  readonly decomposition: DailyDecomposition | null;
  /** Diagnostics of the series itself (ACF/PACF with bands, ADF, KPSS, differencing). */
  readonly seriesDiagnostics: SeriesDiagnostics | null;
  /** Diagnostics of the decomposition's remainder (is anything left?). */
  readonly remainderDiagnostics: SeriesDiagnostics | null;
  readonly weeklyStrength: number | null;
  readonly notes: readonly string[];
}

export interface HistoryPatterns {
  readonly start: string;
  readonly asOf: string;
  readonly currency: string;
  readonly recurring: readonly DetectedRecurringFlow[];
  readonly inflow: DirectionPatterns;
  readonly outflow: DirectionPatterns;
}

function diagnostics(y: Float64Array, options: Parameters<typeof runDiagnostics>[1]): SeriesDiagnostics | null {
  try {
    return runDiagnostics(y, options);
  } catch (e) {
    if (e instanceof EngineError) return null;
    throw e;
  }
}

function direction(y: Float64Array, start: string, name: 'inflow' | 'outflow'): DirectionPatterns {
  const notes: string[] = [];
  let decomposition: DailyDecomposition | null = null;
  if (y.length >= MIN_DAYS_WEEKLY && y.some((v) => v !== 0)) {
    decomposition = decomposeDaily(y, start);
    notes.push(...decomposition.notes);
  } else {
    notes.push(
      y.some((v) => v !== 0)
        ? `The history is too short to separate patterns (${y.length} days, ${MIN_DAYS_WEEKLY} needed).`
        : `No ${name}s remain besides the recurring flows.`,
    );
  }
  const strength = decomposition ? seasonalStrength(decomposition.weekly, decomposition.remainder) : null;
  const maxLag = Math.min(35, Math.max(1, Math.floor(y.length / 4)));
  return {
    direction: name,
    series: y,
    decomposition,
    seriesDiagnostics: diagnostics(y, {
      period: 7,
      maxLag,
      subject: 'series',
      ...(strength === null ? {} : { seasonalStrength: strength }),
    }),
    remainderDiagnostics: decomposition
      ? diagnostics(decomposition.remainder, { period: 7, maxLag, subject: 'leftovers' })
      : null,
    weeklyStrength: strength,
    notes,
  };
}

/**
 * Decomposes the history's residual inflows and outflows and runs the diagnostics.
 * @example decomposeHistory(history).outflow.decomposition?.weeklyProfile
 */
export function decomposeHistory(
  history: ForecastHistory,
  decisions: readonly RecurringDecision[] = [],
): HistoryPatterns {
  const recurring = detectRecurringFlows(
    history.entries.map((e) => ({
      id: e.id,
      date: e.date,
      amount: e.amount,
      description: e.description,
      counterparty: e.counterparty,
    })),
    { asOf: history.asOf },
  );
  const residual = residualSeries(history, explainedEntryIds(recurring, decisions));
  return {
    start: history.start,
    asOf: history.asOf,
    currency: history.currency,
    recurring,
    inflow: direction(residual.inflow, history.start, 'inflow'),
    outflow: direction(residual.outflow, history.start, 'outflow'),
  };
}
