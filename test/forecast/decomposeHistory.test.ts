import { describe, expect, it } from 'vitest';
import { decomposeHistory } from '../../engine/forecast/decomposeHistory';
import { decomposeToJson } from '../../engine/forecast/decomposeJson';
import { buildHistory, everyDay, monthly, nonFiniteNumbers } from './histories';

describe('decomposeHistory and ebbline.decompose/1', () => {
  it('leaves the decomposition out of a history shorter than 15 days and says why', () => {
    const h = buildHistory({ days: 12, flows: [{ description: 'Card takings', flow: everyDay(1, 8_000, 3_000) }] });
    const p = decomposeHistory(h);
    expect(p.inflow.decomposition).toBeNull();
    expect(p.inflow.notes).toEqual(['The history is too short to separate patterns (12 days, 15 needed).']);
    expect(p.outflow.notes).toEqual(['No outflows remain besides the recurring flows.']);
    const json = decomposeToJson(p) as { inflow: { components: unknown; estimated: Record<string, boolean> } };
    expect(json.inflow.components).toBeNull();
    expect(json.inflow.estimated).toEqual({ trend: false, weekly: false, monthly: false, yearly: false });
    expect(nonFiniteNumbers(json)).toEqual([]);
  });

  it('takes the projected recurring flows out and keeps constant series free of NaN', () => {
    const h = buildHistory({
      days: 120,
      flows: [
        { description: 'Parking meter', flow: () => -1_500 },
        { description: 'Studio rent', counterparty: 'Landlord Ltd', flow: monthly(1, -90_000) },
      ],
    });
    const p = decomposeHistory(h);
    expect(p.recurring.map((f) => f.label)).toEqual(['Landlord Ltd']);
    // Only the parking meter is left: 15.00 every day.
    expect(new Set(p.outflow.series)).toEqual(new Set([1_500]));
    const json = decomposeToJson(p) as {
      outflow: { meanPerDay: number; total: number };
      recurring: { treatment: string }[];
    };
    expect(json.outflow.meanPerDay).toBe(15);
    expect(json.outflow.total).toBe(1800);
    expect(json.recurring[0]?.treatment).toBe('projected');
    expect(nonFiniteNumbers(json)).toEqual([]);
  });
});
