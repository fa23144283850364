/**
 * Properties of the ETS recursions and forecasts that hold for any data and parameters.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { etsFilter } from '../../engine/models/etsRecursions';
import { etsSpec, type EtsTrend } from '../../engine/models/etsModel';
import { etsFromParameters } from '../../engine/models/ets';
import { forecastEts } from '../../engine/models/etsForecast';
import { expectAllClose } from '../helpers/expectAllClose';

const trend = fc.constantFrom<EtsTrend>('N', 'A', 'Ad');
const seasonal = fc.boolean();
const series = fc.array(fc.double({ min: -1000, max: 1000, noNaN: true }), { minLength: 30, maxLength: 60 });
const parameters = fc.record({
  alpha: fc.double({ min: 0.01, max: 0.99, noNaN: true }),
  beta: fc.double({ min: 0.001, max: 0.2, noNaN: true }),
  gamma: fc.double({ min: 0.001, max: 0.2, noNaN: true }),
  phi: fc.double({ min: 0.8, max: 0.98, noNaN: true }),
});

describe('ETS recursions: properties', () => {
  it('are affine equivariant: y → a + b·y with the state mapped alike scales the errors by b', () => {
    fc.assert(
      fc.property(
        series,
        trend,
        seasonal,
        parameters,
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (y, tr, s, p, a, b) => {
          const spec = etsSpec({ trend: tr, season: s ? 'A' : 'N', period: 7 });
          const params = {
            alpha: p.alpha,
            beta: tr === 'N' ? null : p.beta,
            gamma: s ? p.gamma : null,
            phi: tr === 'Ad' ? p.phi : null,
          };
          const width = 1 + (tr === 'N' ? 0 : 1) + (s ? 7 : 0);
          const state = Array.from({ length: width }, (_, j) => (j === 0 ? (y[0] as number) : 0.5 * j - 1));
          const mapped = state.map((v, j) => (j === 0 ? a + b * v : b * v));
          const base = etsFilter(y, spec, params, state);
          const moved = etsFilter(
            y.map((v) => a + b * v),
            spec,
            params,
            mapped,
          );
          expectAllClose(
            moved.residuals,
            Array.from(base.residuals, (e) => b * e),
            1e-9 * Math.max(1, b * 1000),
          );
        },
      ),
      { numRuns: 60, seed: 20240601 },
    );
  });

  it('give nested intervals that widen with the horizon and are centred on the point forecast', () => {
    fc.assert(
      fc.property(series, trend, seasonal, parameters, (y, tr, s, p) => {
        const width = 1 + (tr === 'N' ? 0 : 1) + (s ? 7 : 0);
        const fit = etsFromParameters(
          y,
          { trend: tr, season: s ? 'A' : 'N', period: 7 },
          {
            alpha: p.alpha,
            beta: tr === 'N' ? null : p.beta,
            gamma: s ? p.gamma : null,
            phi: tr === 'Ad' ? p.phi : null,
          },
          new Array<number>(width).fill(0).map((_, j) => (j === 0 ? (y[0] as number) : 0)),
        );
        const f = forecastEts(fit, 15, { levels: [0.5, 0.8, 0.95] });
        for (let h = 0; h < 15; h++) {
          const [i50, i80, i95] = f.intervals as [
            (typeof f.intervals)[0],
            (typeof f.intervals)[0],
            (typeof f.intervals)[0],
          ];
          expect(i95.lower[h]).toBeLessThanOrEqual(i80.lower[h] as number);
          expect(i80.lower[h]).toBeLessThanOrEqual(i50.lower[h] as number);
          expect(i50.upper[h]).toBeLessThanOrEqual(i80.upper[h] as number);
          expect(i80.upper[h]).toBeLessThanOrEqual(i95.upper[h] as number);
          const mid = ((i80.lower[h] as number) + (i80.upper[h] as number)) / 2;
          expect(Math.abs(mid - (f.point[h] as number))).toBeLessThan(1e-9 * Math.max(1, Math.abs(mid)));
          if (h > 0) {
            const w = (i95.upper[h] as number) - (i95.lower[h] as number);
            const wPrev = (i95.upper[h - 1] as number) - (i95.lower[h - 1] as number);
            expect(w).toBeGreaterThanOrEqual(wPrev * (1 - 1e-12));
          }
        }
      }),
      { numRuns: 60, seed: 7 },
    );
  });
});
