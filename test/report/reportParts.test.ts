import { describe, expect, it } from 'vitest';
import { monthTicks, niceTicks } from '../../engine/report/axisTicks';
import { escapeHtml } from '../../engine/report/escapeHtml';
import {
  formatAmount,
  formatDate,
  formatPercent,
  formatPercentError,
  formatWeeks,
} from '../../engine/report/plainFormat';
import { bandData, coordinate, lineData } from '../../engine/report/svgPath';

describe('escapeHtml', () => {
  it('escapes markup and quotes so text cannot open an element or leave an attribute', () => {
    expect(escapeHtml('<script>alert("x")</script>')).toBe('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;');
    expect(escapeHtml(`a & b ' c`)).toBe('a &amp; b &#39; c');
    expect(escapeHtml('bell\u0007 tab\t')).toBe('bell\uFFFD tab\t');
  });
});

describe('plain formats', () => {
  it('groups digits and keeps the currency’s decimals', () => {
    expect(formatAmount(-215000, 'EUR')).toBe('-2,150.00 EUR');
    expect(formatAmount(123456789, 'JPY')).toBe('123,456,789 JPY');
    expect(formatAmount(1234567, 'KWD', { code: false })).toBe('1,234.567');
    expect(formatAmount(-0.4, 'EUR')).toBe('0.00 EUR');
    expect(formatAmount(99.5, 'EUR')).toBe('1.00 EUR');
  });
  it('writes shares without hiding a small risk as 0%', () => {
    expect(formatPercent(0.0712)).toBe('7%');
    expect(formatPercent(0.004)).toBe('0.4%');
    expect(formatPercent(0.0001)).toBe('0.1%');
    expect(formatPercent(0)).toBe('0%');
    expect(formatPercent(0.9996)).toBe('99.9%');
    expect(formatPercentError(0.00436)).toBe('0.4%');
    expect(() => formatPercent(1.2)).toThrow();
  });
  it('writes dates and weeks for people', () => {
    expect(formatDate('2027-01-31')).toBe('31 Jan 2027');
    expect(formatWeeks(43 / 7)).toBe('6.1 weeks');
    expect(formatWeeks(1)).toBe('1 week');
  });
});

describe('svg path data', () => {
  it('builds lines and closed bands with rounded coordinates', () => {
    expect(lineData([0, 1.005, 2], [5, 6.123, -0.004])).toBe('M0 5L1 6.12L2 0');
    expect(bandData([0, 1], [1, 2], [3, 4])).toBe('M0 3L1 4L1 2L0 1Z');
    expect(coordinate(-0.001)).toBe('0');
    expect(() => lineData([0], [NaN])).toThrow(/finite/);
    expect(() => bandData([0, 1], [1], [2, 3])).toThrow(/same length/);
  });
});

describe('axis ticks', () => {
  it('covers the range with steps of 1, 2 or 5 times a power of ten', () => {
    for (const [lo, hi] of [
      [1234, 9876],
      [-5300, 12_001],
      [0.013, 0.087],
      [250_000, 250_000],
    ] as const) {
      const t = niceTicks(lo, hi, 5);
      expect(t[0]!).toBeLessThanOrEqual(lo);
      expect(t[t.length - 1]!).toBeGreaterThanOrEqual(hi);
      const step = t[1]! - t[0]!;
      const mantissa = step / 10 ** Math.floor(Math.log10(step));
      expect([1, 2, 5, 10].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
      expect(t.length).toBeLessThanOrEqual(9);
    }
    expect(niceTicks(1234, 9876, 5)).toEqual([0, 2000, 4000, 6000, 8000, 10000]);
  });
  it('puts date ticks on the first of each month after the start', () => {
    expect(monthTicks('2026-10-31', '2027-01-30')).toEqual(['2026-11-01', '2026-12-01', '2027-01-01']);
    expect(monthTicks('2026-11-01', '2027-05-01', 2)).toEqual(['2026-12-01', '2027-02-01', '2027-04-01']);
  });
});
