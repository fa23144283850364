/**
 * ACF and PACF bar charts: one bar per lag, with the white-noise band ±z/√n drawn as a
 * pair of dashed lines and, for the ACF, Bartlett's widening band (R `ci.type = "ma"`)
 * as a pair of dotted lines. Bars that leave the white-noise band are drawn at full
 * strength and the others lighter, so the band lines and the bars' strength both tell
 * which lags stand out, not colour alone.
 */
import type { ChartConfiguration, ChartDataset, TooltipItem } from 'chart.js';
import { tooltipLook } from './axes';
import type { ChartPalette } from './palette';
import './pluginOptions';

export interface CorrelogramInput {
  /** values[k − 1] is the correlation at lag k. */
  readonly values: ArrayLike<number>;
  /** ± band inside which white noise falls (≈ 1.96/√n). */
  readonly whiteNoiseBand: number;
  /** Bartlett bands per lag (ACF only). */
  readonly bartlettBands?: ArrayLike<number> | null;
  readonly kind: 'acf' | 'pacf';
  readonly palette: ChartPalette;
}

type MixedDataset = ChartDataset<'bar', number[]> | ChartDataset<'line', number[]>;

/** Lags 1..k as axis labels. */
export function lagLabels(count: number): string[] {
  return Array.from({ length: count }, (_, i) => String(i + 1));
}

/** Bars first, then the band lines: white noise (+, −) and, for the ACF, Bartlett (+, −). */
export function correlogramDatasets(input: CorrelogramInput): MixedDataset[] {
  const { palette } = input;
  const values = Array.from(input.values);
  const band = input.whiteNoiseBand;
  const bar: ChartDataset<'bar', number[]> = {
    type: 'bar',
    label: input.kind === 'acf' ? 'Autocorrelation' : 'Partial autocorrelation',
    data: values,
    backgroundColor: values.map((v) => palette.band(Math.abs(v) > band ? 0.95 : 0.4)),
    borderWidth: 0,
    barPercentage: 0.7,
    categoryPercentage: 1,
    order: 2,
  };
  const line = (label: string, data: number[], dash: number[]): ChartDataset<'line', number[]> => ({
    type: 'line',
    label,
    data,
    borderColor: palette.text(),
    borderWidth: 1.25,
    borderDash: dash,
    pointRadius: 0,
    pointHoverRadius: 0,
    fill: false,
    stepped: 'middle',
    order: 1,
  });
  const datasets: MixedDataset[] = [
    bar,
    line(
      'White-noise band (upper)',
      values.map(() => band),
      [5, 4],
    ),
    line(
      'White-noise band (lower)',
      values.map(() => -band),
      [5, 4],
    ),
  ];
  if (input.kind === 'acf' && input.bartlettBands) {
    const b = Array.from(input.bartlettBands);
    datasets.push(
      line('Bartlett band (upper)', b, [1.5, 3]),
      line(
        'Bartlett band (lower)',
        b.map((v) => -v),
        [1.5, 3],
      ),
    );
  }
  return datasets;
}

export function correlogramConfig(input: CorrelogramInput): ChartConfiguration<'bar', number[], string> {
  const { palette } = input;
  const datasets = correlogramDatasets(input);
  let extent = input.whiteNoiseBand;
  for (const v of Array.from(input.values)) extent = Math.max(extent, Math.abs(v));
  if (input.bartlettBands) for (const v of Array.from(input.bartlettBands)) extent = Math.max(extent, v);
  const top = Math.min(1, Math.ceil((extent * 1.1) / 0.1) * 0.1);
  return {
    type: 'bar',
    data: { labels: lagLabels(input.values.length), datasets: datasets as ChartDataset<'bar', number[]>[] },
    options: {
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'index', intersect: false },
      scales: {
        x: {
          type: 'category',
          ticks: { color: palette.muted(), autoSkip: true, maxTicksLimit: 12, maxRotation: 0 },
          grid: { display: false },
          border: { color: palette.grid() },
          title: { display: true, text: 'Lag (days)', color: palette.muted(), font: { size: 11 } },
        },
        y: {
          type: 'linear',
          min: -top,
          max: top,
          ticks: { color: palette.muted(), maxTicksLimit: 5 },
          grid: { color: palette.grid(), drawTicks: false },
          border: { display: false },
        },
      },
      plugins: {
        tooltip: {
          ...tooltipLook(palette),
          filter: (item: TooltipItem<'bar'>) =>
            item.datasetIndex === 0 || item.dataset.label?.includes('upper') === true,
          callbacks: {
            title: (items: TooltipItem<'bar'>[]) => (items[0] ? `Lag ${items[0].label} days` : ''),
            label: (item: TooltipItem<'bar'>) =>
              item.datasetIndex === 0
                ? `${item.dataset.label}: ${(item.parsed.y ?? 0).toFixed(3)}`
                : `${item.dataset.label?.replace(' (upper)', '')}: ±${(item.parsed.y ?? 0).toFixed(3)}`,
          },
        },
      },
    },
  };
}

/** One sentence for screen readers: which lags leave the white-noise band. */
export function correlogramSummary(input: Pick<CorrelogramInput, 'values' | 'whiteNoiseBand' | 'kind'>): string {
  const name = input.kind === 'acf' ? 'Autocorrelation' : 'Partial autocorrelation';
  const outside: number[] = [];
  const values = Array.from(input.values);
  values.forEach((v, i) => {
    if (Math.abs(v) > input.whiteNoiseBand) outside.push(i + 1);
  });
  const lags =
    outside.length === 0 ? 'no lag' : outside.length === 1 ? `lag ${outside[0]}` : `lags ${outside.join(', ')}`;
  return `${name} for lags 1 to ${values.length}: ${lags} outside the white-noise band of ±${input.whiteNoiseBand.toFixed(3)}.`;
}
