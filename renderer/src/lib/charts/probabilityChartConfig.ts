/**
 * The shortfall chart under the fan: by each date, the estimated chance of having gone
 * below the threshold at least once so far (pCrossed, solid) and of being below on that
 * very day (pBelow, dashed). The two lines differ by dash as well as by colour.
 */
import type { ChartConfiguration, ChartDataset, TooltipItem } from 'chart.js';
import type { DailyOutlook } from '../../../../engine/forecast/runForecast';
import { timeAxis, tooltipLook, Y_AXIS_WIDTH } from './axes';
import { dayTime, formatDay, formatDayTime } from './calendar';
import { moneyText } from './moneyText';
import type { ChartPalette } from './palette';
import { percentText } from './percentText';
import './pluginOptions';

export interface ProbabilityChartInput {
  readonly asOf: string;
  readonly currency: string;
  readonly threshold: number;
  readonly daily: readonly DailyOutlook[];
  readonly palette: ChartPalette;
  /** Start of the x axis, to line up with the fan chart above (local-midnight ms). */
  readonly min?: number;
}

type Point = { x: number; y: number };

/** Smallest top of the y axis (percent): a 2% chance should not fill the whole panel. */
export const MIN_PROBABILITY_AXIS = 10;

/** The y axis top in percent: at least MIN_PROBABILITY_AXIS, rounded up to a step of 10, at most 100. */
export function probabilityAxisMax(daily: readonly DailyOutlook[]): number {
  let top = 0;
  for (const d of daily) top = Math.max(top, d.pCrossed, d.pBelow);
  return Math.min(100, Math.max(MIN_PROBABILITY_AXIS, Math.ceil((top * 100 * 1.15) / 10) * 10));
}

export function probabilityDatasets(input: ProbabilityChartInput): ChartDataset<'line', Point[]>[] {
  const { palette } = input;
  const start = { x: dayTime(input.asOf), y: 0 };
  return [
    {
      label: 'Gone below by this date',
      data: [start, ...input.daily.map((d) => ({ x: dayTime(d.date), y: 100 * d.pCrossed }))],
      borderColor: palette.threshold(),
      backgroundColor: palette.threshold(),
      borderWidth: 2,
      pointRadius: 0,
      pointHoverRadius: 3,
      fill: false,
      tension: 0,
    },
    {
      label: 'Below on this date',
      data: [start, ...input.daily.map((d) => ({ x: dayTime(d.date), y: 100 * d.pBelow }))],
      borderColor: palette.median(),
      backgroundColor: palette.median(),
      borderWidth: 2,
      borderDash: [4, 4],
      pointRadius: 0,
      pointHoverRadius: 3,
      fill: false,
      tension: 0,
    },
  ];
}

export function probabilityChartConfig(input: ProbabilityChartInput): ChartConfiguration<'line', Point[]> {
  const { palette } = input;
  const last = input.daily[input.daily.length - 1];
  const max = last ? dayTime(last.date) : dayTime(input.asOf);
  return {
    type: 'line',
    data: { datasets: probabilityDatasets(input) },
    options: {
      animation: false,
      parsing: false,
      normalized: true,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: {
        x: timeAxis(palette, input.min ?? dayTime(input.asOf), max),
        y: {
          type: 'linear',
          min: 0,
          max: probabilityAxisMax(input.daily),
          ticks: { color: palette.muted(), maxTicksLimit: 5, callback: (v) => `${v}%` },
          grid: { color: palette.grid(), drawTicks: false },
          border: { display: false },
          afterFit: (scale) => {
            scale.width = Y_AXIS_WIDTH;
          },
        },
      },
      plugins: {
        tooltip: {
          ...tooltipLook(palette),
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => (items[0] ? formatDayTime(items[0].parsed.x ?? 0) : ''),
            label: (item: TooltipItem<'line'>) => `${item.dataset.label}: ${percentText((item.parsed.y ?? 0) / 100)}`,
          },
        },
        asOfMarker: { x: dayTime(input.asOf), label: '', color: palette.muted() },
      },
    },
  };
}

/** One sentence for screen readers. */
export function probabilityChartSummary(
  input: Pick<ProbabilityChartInput, 'currency' | 'threshold' | 'daily'>,
): string {
  const last = input.daily[input.daily.length - 1];
  if (!last) return 'No outlook yet.';
  let peakBelow = input.daily[0] as DailyOutlook;
  for (const d of input.daily) if (d.pBelow > peakBelow.pBelow) peakBelow = d;
  return (
    `Estimated chance of having gone below ${moneyText(input.threshold, input.currency)}: ` +
    `${percentText(last.pCrossed)} by ${formatDay(last.date)}. ` +
    `The chance of being below on a given day is highest on ${formatDay(peakBelow.date)} at ${percentText(peakBelow.pBelow)}.`
  );
}
