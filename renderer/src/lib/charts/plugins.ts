/**
 * Ebbline's Chart.js plugins, as plain `{ id, hooks }` objects (the way Chart.js writes its
 * own). Their options are typed in ./pluginOptions.ts.
 */
import type { Chart, Plugin } from 'chart.js';
import type { AsOfMarkerOptions, RenderedSignalOptions } from './pluginOptions';

/** Draws a thin vertical line at the as-of date, under the datasets' tooltips, with a label. */
export const asOfMarker: Plugin<'line'> = {
  id: 'asOfMarker',
  afterDatasetsDraw(chart: Chart, _args: unknown, options: AsOfMarkerOptions) {
    if (!options || options.x === null || options.x === undefined) return;
    const scale = chart.scales.x;
    if (!scale) return;
    const x = scale.getPixelForValue(options.x);
    const { top, bottom, left, right } = chart.chartArea;
    if (x < left || x > right) return;
    const ctx = chart.ctx;
    const color = options.color;
    ctx.save();
    ctx.strokeStyle = color;
    ctx.lineWidth = 1;
    ctx.setLineDash([2, 3]);
    ctx.beginPath();
    ctx.moveTo(Math.round(x) + 0.5, top);
    ctx.lineTo(Math.round(x) + 0.5, bottom);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.fillStyle = color;
    ctx.font = '600 11px system-ui, sans-serif';
    ctx.textBaseline = 'top';
    const width = ctx.measureText(options.label).width;
    const labelX = x + 6 + width > right ? x - 6 - width : x + 6;
    ctx.fillText(options.label, labelX, top + 4);
    ctx.restore();
  },
};

const lastStamp = new WeakMap<Chart, string>();

/**
 * Tells the screen when a chart has drawn new data: the first render with a new stamp
 * calls `onRendered`. Benchmarks and tests wait for it instead of guessing with timeouts.
 */
export const renderedSignal: Plugin = {
  id: 'renderedSignal',
  afterRender(chart: Chart, _args: unknown, options: RenderedSignalOptions) {
    if (!options || !options.stamp || !options.onRendered) return;
    if (lastStamp.get(chart) === options.stamp) return;
    lastStamp.set(chart, options.stamp);
    options.onRendered(options.stamp);
  },
};
