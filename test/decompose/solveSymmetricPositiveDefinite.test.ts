import { describe, expect, it } from 'vitest';
import { solveSymmetricPositiveDefinite } from '../../engine/decompose/solveSymmetricPositiveDefinite';
import { expectAllClose } from '../helpers/expectAllClose';

describe('solveSymmetricPositiveDefinite', () => {
  it('solves a system whose solution is known by construction', () => {
    // A·[1, 2, 3] computed by hand: [4·1 + 2·2, 2·1 + 5·2 + 1·3, 1·2 + 3·3] = [8, 15, 11].
    const a = new Float64Array([4, 2, 0, 2, 5, 1, 0, 1, 3]);
    const b = new Float64Array([8, 15, 11]);
    expectAllClose(solveSymmetricPositiveDefinite(a, b), [1, 2, 3], 1e-14);
    expect(Array.from(a)).toEqual([4, 2, 0, 2, 5, 1, 0, 1, 3]);
  });

  it('refuses singular or mismatched systems', () => {
    expect(() => solveSymmetricPositiveDefinite([1, 1, 1, 1], [1, 2])).toThrowError(/positive definite/);
    expect(() => solveSymmetricPositiveDefinite([1, 0, 0], [1, 2])).toThrowError(/entries/);
  });
});
