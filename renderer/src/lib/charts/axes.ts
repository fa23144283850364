/**
 * Shared pieces of chart options: a calm look (no animation, thin grid, muted ticks) with
 * colours taken from the palette when the config is built.
 */
import type { ScaleOptions } from 'chart.js';
import { formatDayTime } from './calendar';
import { moneyText } from './moneyText';
import type { ChartPalette } from './palette';

type TimeScaleOptions = ScaleOptions<'time'>;
type LinearScaleOptions = ScaleOptions<'linear'>;

/** A time axis over calendar days, from `min` to `max` (local-midnight ms). */
export function timeAxis(palette: ChartPalette, min: number, max: number, maxTicks = 8): TimeScaleOptions {
  return {
    type: 'time',
    min,
    max,
    time: {
      unit: undefined,
      minUnit: 'day',
      displayFormats: { day: 'd MMM', week: 'd MMM', month: 'MMM yyyy', quarter: 'MMM yyyy', year: 'yyyy' },
    },
    ticks: {
      color: palette.muted(),
      maxTicksLimit: maxTicks,
      maxRotation: 0,
      autoSkipPadding: 12,
      // Measure a few labels, not all of them, to decide how many fit: laying out a time
      // axis otherwise measures one label per generated tick.
      sampleSize: 8,
      // Over about a year or more the year matters more than the day.
      callback: (value) => formatDayTime(Number(value), max - min > 300 * 86_400_000 ? 'MMM yyyy' : 'd MMM'),
    },
    grid: { color: palette.grid(), drawTicks: false },
    border: { color: palette.grid() },
  };
}

/** Width of the y axis of the Outlook's stacked charts, so their plot areas line up. */
export const Y_AXIS_WIDTH = 72;

/** A money axis in minor units, labelled in whole major units with grouping. */
export function moneyAxis(palette: ChartPalette, currency: string, title?: string): LinearScaleOptions {
  return {
    type: 'linear',
    ticks: {
      color: palette.muted(),
      maxTicksLimit: 6,
      sampleSize: 8,
      callback: (value) => moneyText(Number(value), currency, { whole: true, code: false }),
    },
    grid: { color: palette.grid(), drawTicks: false },
    border: { display: false },
    title: title ? { display: true, text: title, color: palette.muted(), font: { size: 11 } } : { display: false },
  };
}

/** The tooltip look shared by every chart. */
export function tooltipLook(palette: ChartPalette) {
  return {
    backgroundColor: palette.surface(),
    titleColor: palette.text(),
    bodyColor: palette.text(),
    borderColor: palette.grid(),
    borderWidth: 1,
    padding: 10,
    boxPadding: 4,
    usePointStyle: true,
  };
}
