/**
 * The one way Ebbline mounts a Chart.js chart: `<canvas {@attach chart(() => config)}>`.
 *
 * The attachment creates the chart soon after the canvas is mounted (one chart per
 * animation frame, so a screen of charts never blocks the window in one long task),
 * updates the same chart in place (no animation) whenever the config the getter returns
 * changes — a config built from the reactive palette (./cssPalette.svelte.ts) changes when
 * the theme does, so the chart redraws in the new colours — and destroys the chart when
 * the canvas is removed.
 *
 * Why a getter and not `chart(config)`: Svelte re-runs an attachment expression whose
 * value changes and tears the old attachment down, which would destroy and re-create the
 * chart (and its canvas state) on every new config. Reading the config inside a child
 * effect instead keeps one chart per canvas and only swaps its data and options, the
 * cheap path Chart.js offers.
 */
import type { Attachment } from 'svelte/attachments';
import type { Chart as ChartInstance, ChartConfiguration, ChartType, DefaultDataPoint } from 'chart.js';
import { untrack } from 'svelte';
import { registeredChart } from './registerCharts';

const waiting: (() => void)[] = [];
let frameRequested = false;

function createNext(): void {
  const job = waiting.shift();
  job?.();
  if (waiting.length > 0) requestAnimationFrame(createNext);
  else frameRequested = false;
}

/**
 * Runs `create` in a coming animation frame, one chart per frame: creating a chart measures
 * fonts and lays out its axes (tens of milliseconds), so a screen with several charts
 * would otherwise block the window for one long task.
 * @returns a function that cancels the creation if it has not run yet.
 */
function inItsOwnFrame(create: () => void): () => void {
  let cancelled = false;
  waiting.push(() => {
    if (!cancelled) create();
  });
  if (!frameRequested) {
    frameRequested = true;
    requestAnimationFrame(createNext);
  }
  return () => {
    cancelled = true;
  };
}

/**
 * Attachment factory for a canvas.
 * @param getConfig returns the chart's config; read reactively (a `$derived` is ideal).
 * @example <canvas {@attach chart(() => fanConfig)}></canvas>
 */
export function chart<TType extends ChartType, TData = DefaultDataPoint<TType>, TLabel = unknown>(
  getConfig: () => ChartConfiguration<TType, TData, TLabel>,
): Attachment<HTMLCanvasElement> {
  return (canvas) => {
    const Chart = registeredChart();
    let instance: ChartInstance<TType, TData, TLabel> | null = null;
    $effect(() => {
      const config = getConfig();
      untrack(() => {
        if (!instance) return; // created in its own frame, with the config current then
        instance.data = config.data;
        if (config.options) instance.options = config.options;
        instance.update('none');
      });
    });
    const cancel = inItsOwnFrame(() => {
      instance = new Chart(canvas, untrack(getConfig));
    });
    return () => {
      cancel();
      instance?.destroy();
      instance = null;
    };
  };
}
