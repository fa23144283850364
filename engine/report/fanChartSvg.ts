/**
 * The report's fan chart as inline SVG: the balance's P5–P95 and P25–P75 bands as two
 * opacities of one hue, the median as a line, the threshold as a dashed line in
 * vermillion. Colours from the Okabe–Ito palette (Okabe and Ito 2008, "Color Universal
 * Design"), which stays distinguishable with the common colour-vision deficiencies; the
 * bands differ in lightness, so they also survive a black-and-white print. No script, no
 * external reference: the SVG is part of a self-contained document.
 */
import { addDays, daysBetween } from '../core/dates';
import { exponentOf } from '../core/money';
import type { ForecastResult } from '../forecast/runForecast';
import { QUANTILE_LEVELS } from '../simulate/types';
import { monthTicks, niceTicks } from './axisTicks';
import { escapeHtml } from './escapeHtml';
import { formatAmount, formatDate } from './plainFormat';
import { bandData, coordinate, lineData } from './svgPath';

/** Okabe–Ito colours used by the report (from memory: blue rgb(0,114,178), vermillion rgb(213,94,0), orange rgb(230,159,0)). */
export const REPORT_COLOURS = { blue: '#0072B2', vermillion: '#D55E00', orange: '#E69F00', black: '#000000' } as const;

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const K = (level: number) => QUANTILE_LEVELS.indexOf(level as (typeof QUANTILE_LEVELS)[number]);

export interface FanChartOptions {
  readonly width?: number;
  readonly height?: number;
}

/**
 * @returns an `<svg>` element (text) with a title and a description for screen readers.
 * @example fanChartSvg(result) // '<svg viewBox="0 0 720 320" role="img" …'
 * Complexity: O(horizon).
 */
export function fanChartSvg(result: ForecastResult, options: FanChartOptions = {}): string {
  const width = options.width ?? 720;
  const height = options.height ?? 320;
  const m = { left: 84, right: 16, top: 14, bottom: 34 };
  const plotW = width - m.left - m.right;
  const plotH = height - m.top - m.bottom;
  const e = exponentOf(result.currency);
  const major = (minor: number) => minor / 10 ** e;
  const h = result.daily.length;
  // Day 0 is the as-of date, where every quantile is the starting balance.
  const column = (k: number) => [result.startBalance, ...result.daily.map((d) => d.quantiles[k] as number)].map(major);
  const p5 = column(K(0.05));
  const p25 = column(K(0.25));
  const p50 = column(K(0.5));
  const p75 = column(K(0.75));
  const p95 = column(K(0.95));
  const threshold = major(result.threshold);
  const lo = Math.min(threshold, ...p5);
  const hi = Math.max(threshold, ...p95);
  const ticks = niceTicks(lo, hi, 5);
  const yMin = ticks[0] as number;
  const yMax = ticks[ticks.length - 1] as number;
  const x = (day: number) => m.left + (plotW * day) / Math.max(1, h);
  const y = (v: number) => m.top + plotH - (plotH * (v - yMin)) / (yMax - yMin || 1);
  const xs = Array.from({ length: h + 1 }, (_, d) => x(d));
  const ys = (values: number[]) => values.map(y);
  const last = result.daily[h - 1];
  const end = last ? last.date : result.asOf;
  const monthStep = h > 400 ? 3 : h > 200 ? 2 : 1;
  const xTicks = monthTicks(result.asOf, end, monthStep);
  const money = (v: number) => formatAmount(v * 10 ** e, result.currency);
  const axisLabel = (v: number) =>
    Math.abs(ticks[1]! - ticks[0]!) >= 1
      ? formatAmount(Math.round(v) * 10 ** e, result.currency, { code: false }).replace(/\.\d+$/, '')
      : formatAmount(v * 10 ** e, result.currency, { code: false });

  const parts: string[] = [];
  const title = `Balance of the forecast, ${formatDate(addDays(result.asOf, 1))} to ${formatDate(end)}`;
  const desc =
    `Median balance from ${money(p50[0] as number)} on ${formatDate(result.asOf)} to ${money(p50[h] as number)} on ${formatDate(end)}; ` +
    `90% of the simulated paths end between ${money(p5[h] as number)} and ${money(p95[h] as number)}. ` +
    `Threshold ${money(threshold)}.`;
  parts.push(
    `<svg class="fan" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-labelledby="fan-title fan-desc">`,
    `<title id="fan-title">${escapeHtml(title)}</title>`,
    `<desc id="fan-desc">${escapeHtml(desc)}</desc>`,
  );
  for (const t of ticks) {
    const ty = coordinate(y(t));
    parts.push(
      `<line class="grid" x1="${m.left}" x2="${width - m.right}" y1="${ty}" y2="${ty}" stroke="#d0d0d0" stroke-width="0.5"/>`,
      `<text x="${m.left - 6}" y="${ty}" text-anchor="end" dominant-baseline="middle" font-size="11">${escapeHtml(axisLabel(t))}</text>`,
    );
  }
  for (const t of xTicks) {
    const day = daysBetween(result.asOf, t);
    const tx = coordinate(x(day));
    const month = MONTHS[Number(t.slice(5, 7)) - 1] as string;
    const label = t.slice(5, 7) === '01' || t === xTicks[0] ? `${month} ${t.slice(0, 4)}` : month;
    parts.push(
      `<line class="grid" x1="${tx}" x2="${tx}" y1="${m.top}" y2="${m.top + plotH}" stroke="#e4e4e4" stroke-width="0.5"/>`,
      `<text x="${tx}" y="${m.top + plotH + 16}" text-anchor="middle" font-size="11">${escapeHtml(label)}</text>`,
    );
  }
  parts.push(
    `<path class="band-outer" d="${bandData(xs, ys(p5), ys(p95))}" fill="${REPORT_COLOURS.blue}" fill-opacity="0.18" stroke="none"/>`,
    `<path class="band-inner" d="${bandData(xs, ys(p25), ys(p75))}" fill="${REPORT_COLOURS.blue}" fill-opacity="0.38" stroke="none"/>`,
    `<path class="median" d="${lineData(xs, ys(p50))}" fill="none" stroke="${REPORT_COLOURS.blue}" stroke-width="2"/>`,
    `<line class="threshold" x1="${m.left}" x2="${width - m.right}" y1="${coordinate(y(threshold))}" y2="${coordinate(y(threshold))}" stroke="${REPORT_COLOURS.vermillion}" stroke-width="1.5" stroke-dasharray="6 4"/>`,
    `<rect x="${m.left}" y="${m.top}" width="${plotW}" height="${plotH}" fill="none" stroke="#888" stroke-width="0.75"/>`,
    '</svg>',
  );
  return parts.join('\n');
}
