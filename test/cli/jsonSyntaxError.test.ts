import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { jsonSyntaxError } from '../../engine/cli/jsonSyntaxError';

function parses(text: string): boolean {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
}

describe('jsonSyntaxError', () => {
  it('locates the first error by line and column', () => {
    expect(jsonSyntaxError('{\n  "schema": ,\n}')).toEqual({ line: 2, column: 13, found: '","' });
    expect(jsonSyntaxError('{"items": [1, 2')).toEqual({ line: 1, column: 16, found: 'end of text' });
    expect(jsonSyntaxError('{"a": 01}')?.column).toBe(8);
    expect(jsonSyntaxError('\uFEFF{"a": [true, false, null, -1.5e3, "x\\u00e9"]}')).toBeNull();
  });

  it('agrees with JSON.parse on generated documents and on their truncations and mutations', () => {
    fc.assert(
      fc.property(fc.json(), fc.nat(), fc.string({ maxLength: 2 }), (text, cut, insert) => {
        expect(jsonSyntaxError(text)).toBeNull();
        const at = cut % (text.length + 1);
        const mutated = text.slice(0, at) + insert + text.slice(at + (cut % 2));
        expect(jsonSyntaxError(mutated) === null).toBe(parses(mutated));
      }),
      { numRuns: 2000 },
    );
  });
});
