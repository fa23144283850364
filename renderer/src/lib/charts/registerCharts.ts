/**
 * The Chart.js pieces Ebbline draws with, registered once. Only these are bundled: line
 * and bar charts on time, linear and category axes, the filler (quantile bands are filled
 * between datasets), the tooltip and our own plugins. No legend plugin: legends are HTML,
 * so they can be read, translated and reached by keyboard like the rest of the screen.
 */
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Filler,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  TimeScale,
  Tooltip,
} from 'chart.js';
import 'chartjs-adapter-date-fns';
import { asOfMarker, renderedSignal } from './plugins';

let registered = false;

/** Registers the pieces (idempotent) and returns Chart. */
export function registeredChart(): typeof Chart {
  if (!registered) {
    Chart.register(
      LineController,
      LineElement,
      PointElement,
      BarController,
      BarElement,
      LinearScale,
      TimeScale,
      CategoryScale,
      Filler,
      Tooltip,
      asOfMarker,
      renderedSignal,
    );
    registered = true;
  }
  return Chart;
}
