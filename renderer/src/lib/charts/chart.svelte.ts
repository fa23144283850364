/**
 * The one way Ebbline mounts a Chart.js chart: `<canvas {@attach chart(() => config)}>`.
 *
 * The attachment creates the chart right after the canvas is mounted, updates the same
 * chart in place (no animation) whenever the config the getter returns changes — a config
 * built from the reactive palette (./cssPalette.svelte.ts) changes when the theme does, so
 * the chart redraws in the new colours — and destroys the chart when the canvas is
 * removed. Each creation and update runs in a task of its own (see inATaskOfItsOwn).
 *
 * Why a getter and not `chart(config)`: Svelte re-runs an attachment expression whose
 * value changes and tears the old attachment down, which would destroy and re-create the
 * chart (and its canvas state) on every new config. Reading the config inside a child
 * effect instead keeps one chart per canvas and only swaps its data and options, the
 * cheap path Chart.js offers.
 */
import type { Attachment } from 'svelte/attachments';
import type { Chart as ChartInstance, ChartConfiguration, ChartType, DefaultDataPoint } from 'chart.js';
import { registeredChart } from './registerCharts';

const jobs: (() => void)[] = [];
let channel: MessageChannel | null = null;
let pumping = false;

function runNext(): void {
  jobs.shift()?.();
  if (jobs.length > 0) channel?.port2.postMessage(null);
  else pumping = false;
}

/**
 * Runs `job` in a task of its own, after the tasks already waiting: one chart is created or
 * updated per task, so mounting a screen of charts, or a new forecast that redraws two
 * charts, never holds the window in one long task. (A message channel, not setTimeout,
 * which is clamped to 4 ms when nested; not requestAnimationFrame, whose callbacks run in
 * the same task as the rendering they precede.)
 */
function inATaskOfItsOwn(job: () => void): void {
  if (!channel) {
    channel = new MessageChannel();
    channel.port1.onmessage = runNext;
  }
  jobs.push(job);
  if (!pumping) {
    pumping = true;
    channel.port2.postMessage(null);
  }
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
    let removed = false;
    /** The newest config not drawn yet; several changes before the chart's turn draw once. */
    let pending: ChartConfiguration<TType, TData, TLabel> | null = null;
    const draw = () => {
      const config = pending;
      pending = null;
      if (removed || !config) return;
      if (!instance) {
        instance = new Chart(canvas, config);
        return;
      }
      instance.data = config.data;
      if (config.options) instance.options = config.options;
      instance.update('none');
    };
    $effect(() => {
      const config = getConfig();
      const queued = pending !== null;
      pending = config;
      if (!queued) inATaskOfItsOwn(draw);
    });
    return () => {
      removed = true;
      instance?.destroy();
      instance = null;
    };
  };
}
