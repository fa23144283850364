/**
 * Probabilities as percentages a person reads at a glance: one decimal below 10%, whole
 * percent above, and "< 0.1%" rather than a misleading "0.0%" for tiny non-zero chances.
 * @example percentText(0.0423) // '4.2%'
 * @example percentText(0.456) // '46%'
 * @example percentText(0.0004) // '< 0.1%'
 */
export function percentText(p: number): string {
  if (!Number.isFinite(p)) return '–';
  const pct = p * 100;
  if (pct === 0) return '0%';
  if (pct < 0.1) return '< 0.1%';
  if (pct > 99.9 && pct < 100) return '> 99.9%';
  if (pct < 9.95) return `${pct.toFixed(1)}%`;
  return `${Math.round(pct)}%`;
}
