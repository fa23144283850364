/**
 * The chart palette read from the theme's CSS variables (renderer/src/styles/theme.css).
 *
 * Reading a colour also reads `themeGeneration`, a reactive counter that a watcher bumps
 * whenever the theme changes (the `data-theme` attribute on <html>, or the system
 * preference). A chart config built in a `$derived` from this palette is therefore built
 * again with the new colours on a theme switch, and the chart attachment redraws the same
 * chart with it — every option, including the few Chart.js does not let be scriptable
 * (axis titles, borders), follows the theme.
 */
import type { ChartPalette } from './palette';

interface Resolved {
  band: string;
  median: string;
  threshold: string;
  inflow: string;
  outflow: string;
  text: string;
  muted: string;
  grid: string;
  surface: string;
}

let cache: Resolved | null = null;
let generation = $state(0);
let watching = false;

function watch(): void {
  if (watching || typeof MutationObserver === 'undefined') return;
  watching = true;
  const changed = () => {
    cache = null;
    generation++;
  };
  new MutationObserver(changed).observe(document.documentElement, {
    attributes: true,
    attributeFilter: ['data-theme', 'class', 'style'],
  });
  matchMedia('(prefers-color-scheme: dark)').addEventListener('change', changed);
}

function read(): Resolved {
  void generation; // the dependency that makes configs follow the theme
  if (cache) return cache;
  watch();
  const style = getComputedStyle(document.documentElement);
  const v = (name: string, fallback: string) => style.getPropertyValue(name).trim() || fallback;
  cache = {
    band: v('--band', '0, 114, 178'),
    median: v('--median', '#0b4f7a'),
    threshold: v('--threshold', '#d55e00'),
    inflow: v('--inflow', '#009e73'),
    outflow: v('--outflow', '#cc79a7'),
    text: v('--text', '#1c2a30'),
    muted: v('--text-muted', '#56656c'),
    grid: v('--border', '#d9d4c7'),
    surface: v('--surface', '#ffffff'),
  };
  return cache;
}

/** The palette of the current theme, read lazily and cached until the theme changes. */
export const cssPalette: ChartPalette = {
  band: (alpha) => `rgba(${read().band}, ${alpha})`,
  median: () => read().median,
  threshold: () => read().threshold,
  inflow: () => read().inflow,
  outflow: () => read().outflow,
  text: () => read().text,
  muted: () => read().muted,
  grid: () => read().grid,
  surface: () => read().surface,
};
