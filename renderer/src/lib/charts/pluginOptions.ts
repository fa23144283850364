/**
 * Options of Ebbline's own Chart.js plugins (engine-free, DOM-free, so the chart config
 * builders that set them can be unit-tested in Node). Typed into Chart.js by declaration
 * merging, the way Chart.js types its own plugins.
 */
import type { ChartType } from 'chart.js';

/** A vertical marker at one x value (the as-of date), with a short label at the top. */
export interface AsOfMarkerOptions {
  /** x value (ms of local midnight on a time axis); nothing is drawn when null. */
  readonly x: number | null;
  readonly label: string;
  readonly color: string;
}

/** Calls `onRendered(stamp)` once after the chart first draws with a new `stamp`. */
export interface RenderedSignalOptions {
  readonly stamp: string | null;
  readonly onRendered: ((stamp: string) => void) | null;
}

declare module 'chart.js' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface PluginOptionsByType<TType extends ChartType> {
    asOfMarker?: AsOfMarkerOptions | false;
    renderedSignal?: RenderedSignalOptions | false;
  }
}
