import { describe, expect, it } from 'vitest';
import { etsFromParameters } from '../../engine/models/ets';
import { etsForecastVariance, forecastEts } from '../../engine/models/etsForecast';
import { simulateEts } from '../../engine/models/etsSimulate';
import { etsToStateSpaceModel } from '../../engine/models/etsStateSpaceModel';
import { createRng } from '../../engine/core/random';

/** Standard normals from a seeded engine generator. */
function normalSource(seed: number): () => number {
  const rng = createRng(seed);
  return () => rng.normal();
}
import { EngineError } from '../../engine/core/errors';
import { expectAllClose } from '../helpers/expectAllClose';
import { loadFixture, type REtsFixture } from './fixtures';

const c = loadFixture<REtsFixture>('ets.json').cases.find((k) => k.name === 'synthetic-AAdA');
if (!c) throw new Error('fixture case missing');
const fit = etsFromParameters(
  c.y,
  { trend: 'Ad', season: 'A', period: 7 },
  { alpha: c.par.alpha, beta: c.par.beta ?? null, gamma: c.par.gamma ?? null, phi: c.par.phi ?? null },
  c.initstate,
);

describe('simulateEts', () => {
  it('with all errors zero every path is the point forecast', () => {
    const out = new Float64Array(3 * 20);
    simulateEts(fit, 20, 3, () => 0, out);
    const point = forecastEts(fit, 20).point;
    for (let p = 0; p < 3; p++) expectAllClose(out.subarray(p * 20, p * 20 + 20), point, 1e-12);
  });

  it('has the analytic mean and variance of the class 1 model (Monte Carlo, 4 standard errors)', () => {
    const paths = 20000;
    const h = 15;
    const out = new Float64Array(paths * h);
    simulateEts(fit, h, paths, normalSource(11), out);
    const point = forecastEts(fit, h).point;
    const variance = etsForecastVariance(fit, h);
    for (let step = 0; step < h; step++) {
      let sum = 0;
      let sumSq = 0;
      for (let p = 0; p < paths; p++) {
        const v = out[p * h + step] as number;
        sum += v;
        sumSq += v * v;
      }
      const mean = sum / paths;
      const sampleVar = (sumSq - paths * mean * mean) / (paths - 1);
      const v = variance[step] as number;
      expect(Math.abs(mean - (point[step] as number))).toBeLessThan(4 * Math.sqrt(v / paths));
      // Var of the sample variance of normals: 2v²/(N − 1).
      expect(Math.abs(sampleVar - v)).toBeLessThan(4 * v * Math.sqrt(2 / (paths - 1)));
    }
  });

  it('is reproducible from the seed of the injected generator', () => {
    const a = new Float64Array(50);
    const b = new Float64Array(50);
    simulateEts(fit, 10, 5, normalSource(3), a);
    simulateEts(fit, 10, 5, normalSource(3), b);
    expect(Array.from(a)).toEqual(Array.from(b));
  });

  it('checks its arguments', () => {
    expect(() => simulateEts(fit, 10, 5, () => 0, new Float64Array(49))).toThrow(EngineError);
    expect(() => simulateEts(fit, 0, 5, () => 0, new Float64Array(0))).toThrow(EngineError);
    expect(() => simulateEts(fit, 10, 0, () => 0, new Float64Array(0))).toThrow(EngineError);
  });
});

describe('etsToStateSpaceModel', () => {
  it('orders seasonal states oldest first and fills absent components', () => {
    const model = etsToStateSpaceModel(fit);
    const last = fit.lastState;
    expect(model.level).toBe(last[0]);
    expect(model.trend).toBe(last[1]);
    // The oldest state (last in forecast layout) is used next; it comes first here.
    expect(model.season[0]).toBe(last[8]);
    expect(model.season[6]).toBe(last[2]);
    expect(model.sigma).toBeCloseTo(Math.sqrt(fit.sigma2), 12);
    const nile = loadFixture<REtsFixture>('ets.json').cases.find((k) => k.name === 'Nile-ANN');
    if (!nile) throw new Error('fixture case missing');
    const ses = etsFromParameters(
      nile.y,
      { trend: 'N', season: 'N' },
      { alpha: nile.par.alpha, beta: null, gamma: null, phi: null },
      nile.initstate,
    );
    const m = etsToStateSpaceModel(ses);
    expect([m.beta, m.gamma, m.phi, m.trend, m.season.length]).toEqual([0, 0, 1, 0, 0]);
  });
});
