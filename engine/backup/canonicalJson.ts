/**
 * Canonical JSON text of plain data: object keys sorted by UTF-16 code units, no white
 * space, strings and numbers as ECMAScript's JSON.stringify writes them. This is the key
 * order and number form of RFC 8785 (JSON Canonicalization Scheme), which the backup
 * checksum is computed over, so the same data always gives the same checksum whatever
 * order its keys were stored in.
 *
 * Only data that survives a JSON round trip unchanged is accepted: null, booleans,
 * strings, finite numbers within ±(2^53 − 1) (larger ones cannot be kept exactly, and
 * money must stay exact), arrays without holes and plain objects. Anything else (functions,
 * bigint, Date, Map, class instances, cycles, undefined inside an array) is refused with
 * its path instead of being silently changed, as JSON.stringify would. Two things JSON
 * cannot say are normalised instead: an object property whose value is undefined is left
 * out (IndexedDB keeps such properties; absent and undefined mean the same for an optional
 * field), and −0 is written as 0.
 */
import { EngineError } from '../core/errors';

/**
 * The JSON path of a key: `$.a.b`, `$.list[3]`, `$["odd key"]`.
 * @example childPath('$.tables', 'csv mappings') // '$.tables["csv mappings"]'
 */
export function childPath(path: string, key: string | number): string {
  if (typeof key === 'number') return `${path}[${key}]`;
  return /^[A-Za-z_$][A-Za-z0-9_$]*$/.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
}

/**
 * Why a value cannot be stored (the value itself is checked, not its children), or null.
 * @example unstorable(2 ** 53) // '9007199254740992 is too large to be kept exactly (limit ±9007199254740991)'
 */
export function unstorable(value: unknown): string | null {
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return null;
    case 'number':
      if (!Number.isFinite(value)) return `${value} is not a JSON number`;
      if (Math.abs(value) > Number.MAX_SAFE_INTEGER)
        return `${value} is too large to be kept exactly (limit ±9007199254740991)`;
      return null;
    case 'bigint':
      return 'is a bigint; store it as a number within ±(2^53 − 1) or as text';
    case 'undefined':
      return 'is undefined; leave the field out or use null';
    case 'function':
    case 'symbol':
      return `is a ${typeof value}, not data`;
    case 'object': {
      if (value === null || Array.isArray(value)) return null;
      const proto = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) {
        const name = (value as { constructor?: { name?: string } }).constructor?.name ?? 'object';
        return `is a ${name}, not a plain object`;
      }
      return null;
    }
  }
  return 'is not JSON data';
}

function write(value: unknown, path: string, ancestors: Set<object>, out: string[]): void {
  const problem = unstorable(value);
  if (problem) throw new EngineError('INVALID_ARGUMENT', `${path} ${problem}`);
  if (value === null || typeof value !== 'object') {
    out.push(JSON.stringify(value));
    return;
  }
  if (ancestors.has(value)) throw new EngineError('INVALID_ARGUMENT', `${path} refers back to itself`);
  ancestors.add(value);
  if (Array.isArray(value)) {
    out.push('[');
    for (let i = 0; i < value.length; i++) {
      if (i > 0) out.push(',');
      if (!(i in value)) throw new EngineError('INVALID_ARGUMENT', `${childPath(path, i)} is a hole in the array`);
      write(value[i], childPath(path, i), ancestors, out);
    }
    out.push(']');
  } else {
    const record = value as Record<string, unknown>;
    const keys = Object.keys(record)
      .filter((k) => record[k] !== undefined)
      .sort();
    out.push('{');
    keys.forEach((k, i) => {
      if (i > 0) out.push(',');
      out.push(JSON.stringify(k), ':');
      write(record[k], childPath(path, k), ancestors, out);
    });
    out.push('}');
  }
  ancestors.delete(value);
}

/**
 * @param path the path named in errors (default `$`).
 * @throws EngineError INVALID_ARGUMENT naming the first value that is not plain JSON data.
 * @example canonicalJson({ b: 1, a: [true, null, 'x'] }) // '{"a":[true,null,"x"],"b":1}'
 * Complexity: O(n + k log k) for n values and k keys per object.
 */
export function canonicalJson(value: unknown, path = '$'): string {
  const out: string[] = [];
  write(value, path, new Set(), out);
  return out.join('');
}
