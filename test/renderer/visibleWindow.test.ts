import { describe, expect, it } from 'vitest';
import { scrollToReveal, visibleWindow } from '../../renderer/src/lib/virtual/visibleWindow';

describe('visibleWindow', () => {
  it('renders the rows in view plus the overscan', () => {
    expect(visibleWindow({ scrollTop: 3600, viewportHeight: 360, rowHeight: 36, count: 100_000, overscan: 2 })).toEqual(
      {
        start: 98,
        end: 112,
        offsetTop: 3528,
        totalHeight: 3_600_000,
      },
    );
  });

  it('clamps at the top and the bottom', () => {
    expect(
      visibleWindow({ scrollTop: -50, viewportHeight: 100, rowHeight: 10, count: 1000, overscan: 3 }),
    ).toMatchObject({ start: 0, end: 13 });
    const end = visibleWindow({ scrollTop: 1e9, viewportHeight: 100, rowHeight: 10, count: 1000, overscan: 3 });
    expect(end).toMatchObject({ start: 987, end: 1000, offsetTop: 9870 });
  });

  it('handles empty and short lists', () => {
    expect(visibleWindow({ scrollTop: 0, viewportHeight: 500, rowHeight: 40, count: 0 })).toEqual({
      start: 0,
      end: 0,
      offsetTop: 0,
      totalHeight: 0,
    });
    expect(visibleWindow({ scrollTop: 0, viewportHeight: 500, rowHeight: 40, count: 3 })).toMatchObject({
      start: 0,
      end: 3,
    });
    expect(visibleWindow({ scrollTop: 0, viewportHeight: 0, rowHeight: 40, count: 3, overscan: 0 })).toMatchObject({
      start: 0,
      end: 1,
    });
  });

  it('renders a bounded number of rows however long the list', () => {
    for (const count of [10, 1000, 100_000, 1_000_000]) {
      const w = visibleWindow({ scrollTop: count * 20, viewportHeight: 800, rowHeight: 40, count, overscan: 10 });
      expect(w.end - w.start).toBeLessThanOrEqual(Math.ceil(800 / 40) + 1 + 20);
    }
  });

  it('refuses a row height that is not positive', () => {
    expect(() => visibleWindow({ scrollTop: 0, viewportHeight: 10, rowHeight: 0, count: 5 })).toThrow(RangeError);
  });
});

describe('scrollToReveal', () => {
  const view = { scrollTop: 360, viewportHeight: 360, rowHeight: 36 };
  it('moves the least to show a row', () => {
    expect(scrollToReveal(5, view)).toBe(180);
    expect(scrollToReveal(12, view)).toBe(360);
    expect(scrollToReveal(25, view)).toBe(576);
  });
});
