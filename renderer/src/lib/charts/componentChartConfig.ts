/**
 * Small multiples of a decomposition: the trend and the yearly component as lines over
 * calendar days, the weekly profile (Monday to Sunday) and the day-of-month profile as
 * bars. Values are minor units per day; ticks show whole major units.
 */
import type { ChartConfiguration, TooltipItem } from 'chart.js';
import { moneyAxis, timeAxis, tooltipLook } from './axes';
import { dayTime, formatDayTime } from './calendar';
import { downsampleMinMax, type XY } from './downsample';
import { moneyText } from './moneyText';
import type { ChartPalette } from './palette';
import './pluginOptions';

/** Most points a small line panel draws (about one per two pixel columns). */
export const SMALL_PANEL_POINTS = 240;

export interface SeriesPanelInput {
  /** Calendar date of values[0]. */
  readonly start: string;
  readonly values: ArrayLike<number>;
  readonly currency: string;
  readonly color: string;
  readonly palette: ChartPalette;
  readonly label: string;
  /** Only the last `lastDays` values (e.g. 365 for one yearly cycle); all by default. */
  readonly lastDays?: number;
}

/** Points of a daily series on the time axis, downsampled to SMALL_PANEL_POINTS. */
export function seriesPoints(start: string, values: ArrayLike<number>, lastDays?: number): XY[] {
  const t0 = dayTime(start);
  const from = lastDays === undefined ? 0 : Math.max(0, values.length - lastDays);
  const points: XY[] = [];
  // Local midnights are 24 h apart except across daylight-saving changes: step by dates.
  const base = new Date(t0);
  for (let i = from; i < values.length; i++) {
    const d = new Date(base.getFullYear(), base.getMonth(), base.getDate() + i);
    points.push({ x: d.getTime(), y: values[i] as number });
  }
  return downsampleMinMax(points, SMALL_PANEL_POINTS);
}

export function seriesPanelConfig(input: SeriesPanelInput): ChartConfiguration<'line', XY[]> {
  const data = seriesPoints(input.start, input.values, input.lastDays);
  const { palette, currency } = input;
  const min = data[0]?.x ?? 0;
  const max = data[data.length - 1]?.x ?? 0;
  return {
    type: 'line',
    data: {
      datasets: [
        {
          label: input.label,
          data,
          borderColor: input.color,
          backgroundColor: input.color,
          borderWidth: 1.75,
          pointRadius: 0,
          pointHoverRadius: 3,
          fill: false,
          tension: 0,
        },
      ],
    },
    options: {
      animation: false,
      parsing: false,
      normalized: true,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: { x: timeAxis(palette, min, max, 4), y: moneyAxis(palette, currency) },
      plugins: {
        tooltip: {
          ...tooltipLook(palette),
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => (items[0] ? formatDayTime(items[0].parsed.x ?? 0) : ''),
            label: (item: TooltipItem<'line'>) => `${input.label}: ${moneyText(item.parsed.y ?? 0, currency)} a day`,
          },
        },
      },
    },
  };
}

export interface ProfilePanelInput {
  readonly labels: readonly string[];
  readonly values: readonly number[];
  readonly currency: string;
  readonly color: string;
  readonly palette: ChartPalette;
  readonly label: string;
  /** Tooltip title of a bar, e.g. 'Monday' for 'Mon'. */
  readonly title?: (label: string) => string;
}

export function profilePanelConfig(input: ProfilePanelInput): ChartConfiguration<'bar', number[], string> {
  const { palette, currency } = input;
  return {
    type: 'bar',
    data: {
      labels: [...input.labels],
      datasets: [
        {
          label: input.label,
          data: [...input.values],
          backgroundColor: input.color,
          borderWidth: 0,
          barPercentage: 0.75,
          categoryPercentage: 0.9,
        },
      ],
    },
    options: {
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      scales: {
        x: {
          type: 'category',
          ticks: { color: palette.muted(), autoSkip: true, maxRotation: 0 },
          grid: { display: false },
          border: { color: palette.grid() },
        },
        y: moneyAxis(palette, currency),
      },
      plugins: {
        tooltip: {
          ...tooltipLook(palette),
          callbacks: {
            title: (items: TooltipItem<'bar'>[]) =>
              items[0] ? (input.title ? input.title(items[0].label) : items[0].label) : '',
            label: (item: TooltipItem<'bar'>) =>
              `${input.label}: ${moneyText(item.parsed.y ?? 0, currency, { signed: true })} a day`,
          },
        },
      },
    },
  };
}
