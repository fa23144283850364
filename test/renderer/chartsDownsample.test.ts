import { describe, expect, it } from 'vitest';
import { downsampleMinMax, type XY } from '../../renderer/src/lib/charts/downsample';
import { SMALL_PANEL_POINTS, seriesPoints } from '../../renderer/src/lib/charts/componentChartConfig';

function series(n: number, f: (i: number) => number): readonly XY[] {
  return Object.freeze(Array.from({ length: n }, (_, i) => Object.freeze({ x: i, y: f(i) })));
}

describe('downsampleMinMax', () => {
  it('returns short series unchanged (as a copy)', () => {
    const s = series(10, (i) => i);
    const out = downsampleMinMax(s, 20);
    expect(out).toEqual(s);
    expect(out).not.toBe(s);
  });

  it('keeps at most maxPoints, the first and last point, in x order', () => {
    const s = series(1097, (i) => Math.sin(i / 9) * 100);
    const out = downsampleMinMax(s, 240);
    expect(out.length).toBeLessThanOrEqual(240);
    expect(out.length).toBeGreaterThan(200);
    expect(out[0]).toBe(s[0]);
    expect(out.at(-1)).toBe(s.at(-1));
    for (let i = 1; i < out.length; i++) expect(out[i]!.x).toBeGreaterThan(out[i - 1]!.x);
  });

  it('keeps spikes and dips that an average would flatten', () => {
    const s = series(1000, (i) => (i === 437 ? 5000 : i === 812 ? -3000 : 1));
    const out = downsampleMinMax(s, 50);
    expect(out).toContainEqual({ x: 437, y: 5000 });
    expect(out).toContainEqual({ x: 812, y: -3000 });
  });

  it('returns only input points and leaves the input as it was', () => {
    const s = series(500, (i) => (i * 7919) % 101);
    const copy = s.map((p) => ({ ...p }));
    const out = downsampleMinMax(s, 40);
    for (const p of out) expect(s).toContain(p);
    expect(s).toEqual(copy);
  });

  it('refuses fewer than 4 points', () => {
    expect(() =>
      downsampleMinMax(
        series(10, (i) => i),
        3,
      ),
    ).toThrow(RangeError);
  });

  it('serves the small line panels: a daily series from its start date, at most SMALL_PANEL_POINTS', () => {
    const values = Float64Array.from({ length: 1097 }, (_, i) => i);
    const points = seriesPoints('2023-10-31', values);
    expect(points.length).toBeLessThanOrEqual(SMALL_PANEL_POINTS);
    expect(points[0]).toEqual({ x: new Date(2023, 9, 31).getTime(), y: 0 });
    expect(points.at(-1)).toEqual({ x: new Date(2026, 9, 31).getTime(), y: 1096 });
    expect(seriesPoints('2026-01-01', values, 365)[0]).toEqual({ x: new Date(2026, 0, 1 + 732).getTime(), y: 732 });
  });
});
