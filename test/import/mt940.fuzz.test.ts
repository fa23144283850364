/**
 * Fuzz: seeded mutations and truncations of valid MT940 files never throw and always end
 * either in a valid parse or in at least one error that names the file, a line and what is
 * wrong. Reproducible: fast-check with a fixed seed.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isCalendarDate } from '../../engine/core/dates';
import { isKnownCurrency } from '../../engine/core/currency';
import { mt940Importer } from '../../engine/import/mt940';
import { hasErrors } from '../../engine/import/types';
import { writeMt940 } from '../../engine/write/mt940';

const FIXTURES = join(__dirname, '..', 'fixtures', 'mt940');
const fixtures = ['two-messages-wrapped.sta', 'separators-lf.sta', 'jpy.sta', 'truncated.sta'].map((name) =>
  readFileSync(join(FIXTURES, name), 'utf8'),
);
const rewritten = fixtures.slice(0, 3).map((text) => {
  const parsed = mt940Importer.parse(text, { fileName: 'seed.sta' });
  return writeMt940(parsed.statements, { blockWrappers: true });
});
const SEEDS = [...fixtures, ...rewritten];

const NOISE = [
  ...":-{}/?,.+'\r\n 0123456789CDRNSFTEURJPY",
  '\t',
  'é',
  '\u0000',
  ':61:',
  ':20:',
  ':86:',
  ':62F:',
  '-}',
  '{4:',
  '//',
  '?2',
];

type Mutation =
  | {
      kind: 'delete' | 'insert' | 'replace' | 'truncate' | 'dupLine' | 'dropLine' | 'swapLines';
      at: number;
      noise: string;
    }
  | { kind: 'digits'; at: number; noise: string };

const mutationArb: fc.Arbitrary<Mutation> = fc.record({
  kind: fc.constantFrom('delete', 'insert', 'replace', 'truncate', 'dupLine', 'dropLine', 'swapLines', 'digits'),
  at: fc.nat(),
  noise: fc.constantFrom(...NOISE),
});

function mutate(text: string, m: Mutation): string {
  const pos = text.length === 0 ? 0 : m.at % (text.length + 1);
  switch (m.kind) {
    case 'delete':
      return text.slice(0, pos) + text.slice(pos + 1 + (m.at % 7));
    case 'insert':
      return text.slice(0, pos) + m.noise + text.slice(pos);
    case 'replace':
      return text.slice(0, pos) + m.noise + text.slice(pos + 1);
    case 'truncate':
      return text.slice(0, pos);
    case 'digits':
      return text.slice(0, pos) + '9'.repeat(1 + (m.at % 20)) + text.slice(pos);
    default: {
      const lines = text.split('\n');
      const i = m.at % Math.max(1, lines.length);
      if (m.kind === 'dupLine') lines.splice(i, 0, lines[i] ?? '');
      else if (m.kind === 'dropLine') lines.splice(i, 1);
      else if (i + 1 < lines.length) [lines[i], lines[i + 1]] = [lines[i + 1] as string, lines[i] as string];
      return lines.join('\n');
    }
  }
}

/** A plain assertion: `expect` costs more than the parse itself at 10,000 cases. */
function check(condition: boolean, what: string, text: string): void {
  if (!condition) throw new Error(`${what}\n--- input ---\n${text}`);
}

describe('MT940 fuzz', () => {
  it('never throws and ends in a valid parse or located errors (10,000 seeded cases)', () => {
    let refused = 0;
    fc.assert(
      fc.property(
        fc.constantFrom(...SEEDS),
        fc.array(mutationArb, { minLength: 1, maxLength: 4 }),
        (seed, mutations) => {
          const text = mutations.reduce(mutate, seed);
          const lineCount = text.split(/\r\n|\r|\n/).length;
          // The importer turns a throw of the reader into an "internal error" problem, which fails below.
          const result = mt940Importer.parse(text, { fileName: 'fuzz.sta' });
          for (const p of result.problems) {
            check(p.file === 'fuzz.sta', `problem without the file: ${p.message}`, text);
            check(
              Number.isInteger(p.line) && (p.line ?? 0) >= 1 && (p.line ?? 0) <= lineCount,
              `bad line ${p.line}: ${p.message}`,
              text,
            );
            check(
              p.message.length > 0 && !/internal error|undefined|NaN/.test(p.message),
              `bad message: ${p.message}`,
              text,
            );
          }
          if (hasErrors(result)) {
            refused++;
            return;
          }
          check(result.statements.length > 0, 'no error and no statement', text);
          for (const s of result.statements) {
            check(isKnownCurrency(s.currency), `currency ${s.currency}`, text);
            check(s.balances.length >= 2, 'opening and closing balance', text);
            for (const b of s.balances) {
              check(isCalendarDate(b.date) && Number.isSafeInteger(b.amount), `balance ${JSON.stringify(b)}`, text);
            }
            for (const e of s.entries) {
              check(
                isCalendarDate(e.bookingDate) && isCalendarDate(e.valueDate ?? e.bookingDate),
                `dates ${JSON.stringify(e)}`,
                text,
              );
              check(
                Number.isSafeInteger(e.amount) && typeof e.description === 'string',
                `entry ${JSON.stringify(e)}`,
                text,
              );
            }
          }
        },
      ),
      { seed: 9400, numRuns: 10_000 },
    );
    // Most mutations break something; a fuzz run that refuses nothing would test nothing.
    expect(refused).toBeGreaterThan(1000);
  });
});
