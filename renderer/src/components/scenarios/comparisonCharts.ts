/**
 * Chart.js configurations of the scenario comparison: the median balance of every column
 * overlaid, with the P10–P90 band of one chosen column, and the estimated chance of having
 * gone below the threshold by each date, one line per column.
 *
 * Columns are told apart by colour (Okabe–Ito, Okabe and Ito 2008) and by dash pattern, so
 * no one depends on telling hues apart. The reference is the body-text colour, solid; the
 * threshold keeps its own colour and long dash from the theme. Amounts stay minor units;
 * only tick and tooltip text is written in major units.
 */
import type { ChartConfiguration, ChartDataset, TooltipItem } from 'chart.js';
import type { ForecastResult } from '../../../../engine/forecast/runForecast';
import { moneyAxis, timeAxis, tooltipLook } from '../../lib/charts/axes';
import { dayTime, formatDay, formatDayTime } from '../../lib/charts/calendar';
import { moneyText } from '../../lib/charts/moneyText';
import type { ChartPalette } from '../../lib/charts/palette';
import { percentText } from '../../lib/charts/percentText';
import '../../lib/charts/pluginOptions';

/** Index of P10, P50 and P90 in DailyOutlook.quantiles (QUANTILE_LEVELS). */
const P10 = 1;
const P50 = 3;
const P90 = 5;

/** Dash pattern of each column: the reference solid, then four others. */
export const COLUMN_DASHES: readonly (readonly number[])[] = [[], [7, 3], [2, 3], [10, 3, 2, 3], [4, 2, 4, 6]];

/**
 * The colour of each column: body text for the reference, then blue, bluish green, reddish
 * purple and whichever of orange and vermillion the threshold does not use.
 */
export function columnColours(palette: ChartPalette): string[] {
  const threshold = palette.threshold().toLowerCase();
  const warm = threshold === '#e69f00' ? '#d55e00' : '#e69f00';
  return [palette.text(), palette.band(1), '#009e73', '#cc79a7', warm];
}

/** `#rrggbb` or `rgba(r, g, b, a)` at another opacity. */
export function withAlpha(colour: string, alpha: number): string {
  const hex = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(colour.trim());
  if (hex) return `rgba(${parseInt(hex[1]!, 16)}, ${parseInt(hex[2]!, 16)}, ${parseInt(hex[3]!, 16)}, ${alpha})`;
  const rgb = /^rgba?\(([^,]+),([^,]+),([^,)]+)/i.exec(colour.trim());
  if (rgb) return `rgba(${rgb[1]!.trim()}, ${rgb[2]!.trim()}, ${rgb[3]!.trim()}, ${alpha})`;
  return colour;
}

export interface ComparedColumn {
  readonly name: string;
  readonly result: ForecastResult;
}

type Point = { x: number; y: number };

function series(r: ForecastResult, pick: (d: ForecastResult['daily'][number]) => number, start: number): Point[] {
  return [{ x: dayTime(r.asOf), y: start }, ...r.daily.map((d) => ({ x: dayTime(d.date), y: pick(d) }))];
}

function range(columns: readonly ComparedColumn[]): { min: number; max: number } {
  const first = columns[0]?.result;
  if (!first) return { min: 0, max: 0 };
  const last = first.daily[first.daily.length - 1];
  return { min: dayTime(first.asOf), max: dayTime(last ? last.date : first.asOf) };
}

/** Medians of every column, the chosen column's P10–P90 band, the threshold. */
export function medianOverlayConfig(
  columns: readonly ComparedColumn[],
  highlight: number,
  palette: ChartPalette,
): ChartConfiguration<'line', Point[]> {
  const colours = columnColours(palette);
  const chosen = columns[highlight] ?? columns[0];
  const currency = chosen?.result.currency ?? 'EUR';
  const { min, max } = range(columns);
  const datasets: ChartDataset<'line', Point[]>[] = [];
  if (chosen) {
    const colour = colours[columns.indexOf(chosen)] ?? colours[0]!;
    const band = withAlpha(colour, 0.16);
    datasets.push(
      {
        label: `${chosen.name}: P90 (high end)`,
        data: series(chosen.result, (d) => d.quantiles[P90] as number, chosen.result.startBalance),
        borderWidth: 0,
        borderColor: band,
        backgroundColor: band,
        pointRadius: 0,
        pointHoverRadius: 0,
        fill: false,
        tension: 0,
      },
      {
        label: `${chosen.name}: P10 (low end)`,
        data: series(chosen.result, (d) => d.quantiles[P10] as number, chosen.result.startBalance),
        borderWidth: 0,
        borderColor: band,
        backgroundColor: band,
        pointRadius: 0,
        pointHoverRadius: 0,
        fill: 0,
        tension: 0,
      },
    );
  }
  columns.forEach((c, i) => {
    const colour = colours[i] ?? colours[0]!;
    datasets.push({
      label: `${c.name}: median`,
      data: series(c.result, (d) => d.quantiles[P50] as number, c.result.startBalance),
      borderColor: colour,
      backgroundColor: colour,
      borderWidth: i === highlight ? 2.5 : 1.75,
      borderDash: [...(COLUMN_DASHES[i] ?? [])],
      pointRadius: 0,
      pointHoverRadius: 3,
      fill: false,
      tension: 0,
    });
  });
  const threshold = chosen?.result.threshold ?? 0;
  datasets.push({
    label: 'Threshold',
    data: [
      { x: min, y: threshold },
      { x: max, y: threshold },
    ],
    borderColor: palette.threshold(),
    backgroundColor: palette.threshold(),
    borderWidth: 2,
    borderDash: [12, 6],
    pointRadius: 0,
    pointHoverRadius: 0,
    fill: false,
  });
  return {
    type: 'line',
    data: { datasets },
    options: {
      animation: false,
      parsing: false,
      normalized: true,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: { x: timeAxis(palette, min, max), y: moneyAxis(palette, currency, currency) },
      plugins: {
        legend: { display: false },
        tooltip: {
          ...tooltipLook(palette),
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => (items[0] ? formatDayTime(items[0].parsed.x ?? 0) : ''),
            label: (item: TooltipItem<'line'>) => `${item.dataset.label}: ${moneyText(item.parsed.y ?? 0, currency)}`,
          },
        },
        asOfMarker: { x: min, label: '', color: palette.muted() },
      },
    },
  };
}

/** The y-axis top (percent) for chances: at least 10, rounded up to tens, at most 100. */
export function chanceAxisMax(columns: readonly ComparedColumn[]): number {
  let top = 0;
  for (const c of columns) for (const d of c.result.daily) top = Math.max(top, d.pCrossed);
  return Math.min(100, Math.max(10, Math.ceil((top * 100 * 1.15) / 10) * 10));
}

/** The chance of having gone below the threshold by each date, one line per column. */
export function shortfallOverlayConfig(
  columns: readonly ComparedColumn[],
  palette: ChartPalette,
): ChartConfiguration<'line', Point[]> {
  const colours = columnColours(palette);
  const { min, max } = range(columns);
  const datasets: ChartDataset<'line', Point[]>[] = columns.map((c, i) => ({
    label: c.name,
    data: series(c.result, (d) => 100 * d.pCrossed, 0),
    borderColor: colours[i] ?? colours[0]!,
    backgroundColor: colours[i] ?? colours[0]!,
    borderWidth: 2,
    borderDash: [...(COLUMN_DASHES[i] ?? [])],
    pointRadius: 0,
    pointHoverRadius: 3,
    fill: false,
    tension: 0,
  }));
  return {
    type: 'line',
    data: { datasets },
    options: {
      animation: false,
      parsing: false,
      normalized: true,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: {
        x: timeAxis(palette, min, max),
        y: {
          type: 'linear',
          min: 0,
          max: chanceAxisMax(columns),
          ticks: { color: palette.muted(), maxTicksLimit: 5, callback: (v) => `${v}%` },
          grid: { color: palette.grid(), drawTicks: false },
          border: { display: false },
        },
      },
      plugins: {
        legend: { display: false },
        tooltip: {
          ...tooltipLook(palette),
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => (items[0] ? formatDayTime(items[0].parsed.x ?? 0) : ''),
            label: (item: TooltipItem<'line'>) => `${item.dataset.label}: ${percentText((item.parsed.y ?? 0) / 100)}`,
          },
        },
        asOfMarker: { x: min, label: '', color: palette.muted() },
      },
    },
  };
}

/** One sentence per chart for screen readers. */
export function overlaySummary(columns: readonly ComparedColumn[]): string {
  const parts = columns.map((c) => {
    const last = c.result.daily[c.result.daily.length - 1];
    if (!last) return `${c.name}: no days.`;
    return `${c.name}: median ${moneyText(last.quantiles[P50] as number, c.result.currency)} on ${formatDay(last.date)}, chance of having gone below the threshold by then ${percentText(last.pCrossed)}.`;
  });
  return `Scenario comparison. ${parts.join(' ')}`;
}
