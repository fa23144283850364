// Fuzz test: seeded mutations and truncations of OFX 1.x and 2.x files. The importer must
// never throw and must end either in a valid parse or in at least one error that names the
// file and a line or element. All data is invented or generated.
import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isKnownCurrency } from '../../engine/core/currency';
import { isCalendarDate } from '../../engine/core/dates';
import { ofxImporter } from '../../engine/import/ofx';
import { hasErrors, type ParsedStatement } from '../../engine/import/types';
import { writeOfx } from '../../engine/write/ofx';

const FIXTURES = new URL('../fixtures/ofx/', import.meta.url);

const generated: ParsedStatement[] = [
  {
    account: { identifier: '4410-778', servicer: '990011223', kind: 'current' },
    currency: 'EUR',
    from: '2024-03-01',
    to: '2024-03-31',
    entries: [
      {
        bookingDate: '2024-03-01',
        amount: -85000,
        description: 'Harbour Lane Studios - Rent & <utilities>',
        counterparty: 'Harbour Lane Studios',
        bankRef: 'F1',
        status: 'booked',
        source: {},
      },
      {
        bookingDate: '2024-03-09',
        valueDate: '2024-03-11',
        amount: 4250,
        description: 'Saturday market',
        reference: '77',
        typeCode: 'DEP',
        status: 'booked',
        source: {},
      },
    ],
    balances: [{ kind: 'closing', date: '2024-03-31', at: 'end', amount: 19287, source: {} }],
  },
  {
    account: { identifier: '5500-0000-0000-0004', kind: 'card' },
    currency: 'KWD',
    from: '2024-03-01',
    to: '2024-03-31',
    entries: [{ bookingDate: '2024-03-05', amount: -1234, description: 'Glaze', status: 'booked', source: {} }],
    balances: [{ kind: 'available', date: '2024-03-31', at: 'end', amount: 50000, source: {} }],
  },
];

const CORPUS: readonly string[] = [
  ...readdirSync(FIXTURES)
    .filter((f) => f.endsWith('.ofx'))
    .sort()
    .map((f) => readFileSync(new URL(f, FIXTURES), 'utf8')),
  writeOfx(generated, { version: 1 }),
  writeOfx(generated, { version: 2 }),
];

const SNIPPETS = [
  '<',
  '>',
  '&',
  '/',
  '</STMTTRN>',
  '<STMTTRN>',
  '<TRNAMT>',
  '<TRNAMT>1,234.56',
  '<DTPOSTED>19960431',
  '</BANKTRANLIST>',
  '<BANKTRANLIST>',
  '</OFX>',
  '<OFX>',
  '<!--',
  '-->',
  '<?',
  '<![CDATA[',
  ']]>',
  '&#xFFFFFF;',
  '&#0;',
  '\r',
  '\n',
  '\u0000',
  '\uFEFF',
  '99999999999999999999',
  '[-5:EST',
  'OFXHEADER:100\n',
  '<?OFX OFXHEADER="200" VERSION="220"?>',
  '<CURDEF>XXX',
  '<CORRECTFITID>F1<CORRECTACTION>DELETE',
  '<SEVERITY>ERROR<CODE>2000',
];

type Mutation =
  | { kind: 'truncate'; at: number }
  | { kind: 'delete'; at: number; length: number }
  | { kind: 'duplicate'; at: number; length: number }
  | { kind: 'insert'; at: number; snippet: string }
  | { kind: 'replaceChar'; at: number; char: string }
  | { kind: 'swapLines'; at: number; other: number }
  | { kind: 'changeCase'; at: number; length: number }
  | { kind: 'digits'; at: number; length: number; digit: string };

const position = fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true });
const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('truncate' as const), at: position }),
  fc.record({ kind: fc.constant('delete' as const), at: position, length: fc.integer({ min: 1, max: 80 }) }),
  fc.record({ kind: fc.constant('duplicate' as const), at: position, length: fc.integer({ min: 1, max: 200 }) }),
  fc.record({ kind: fc.constant('insert' as const), at: position, snippet: fc.constantFrom(...SNIPPETS) }),
  fc.record({
    kind: fc.constant('replaceChar' as const),
    at: position,
    char: fc.constantFrom(...'<>/&;:.,-+[]0 9AZ\n'),
  }),
  fc.record({ kind: fc.constant('swapLines' as const), at: position, other: position }),
  fc.record({ kind: fc.constant('changeCase' as const), at: position, length: fc.integer({ min: 1, max: 40 }) }),
  fc.record({
    kind: fc.constant('digits' as const),
    at: position,
    length: fc.integer({ min: 1, max: 40 }),
    digit: fc.constantFrom(...'0123456789'),
  }),
);

function mutate(text: string, m: Mutation): string {
  const at = Math.floor(m.at * (text.length + 1));
  switch (m.kind) {
    case 'truncate':
      return text.slice(0, at);
    case 'delete':
      return text.slice(0, at) + text.slice(at + m.length);
    case 'duplicate':
      return text.slice(0, at + m.length) + text.slice(at, at + m.length) + text.slice(at + m.length);
    case 'insert':
      return text.slice(0, at) + m.snippet + text.slice(at);
    case 'replaceChar':
      return text.slice(0, at) + m.char + text.slice(at + 1);
    case 'swapLines': {
      const lines = text.split('\n');
      const i = Math.floor(m.at * lines.length);
      const j = Math.floor(m.other * lines.length);
      const a = lines[i] as string;
      lines[i] = lines[j] as string;
      lines[j] = a;
      return lines.join('\n');
    }
    case 'changeCase': {
      const span = text.slice(at, at + m.length);
      const flipped = span === span.toUpperCase() ? span.toLowerCase() : span.toUpperCase();
      return text.slice(0, at) + flipped + text.slice(at + m.length);
    }
    case 'digits':
      return text.slice(0, at) + text.slice(at, at + m.length).replace(/\d/g, m.digit) + text.slice(at + m.length);
  }
}

/** Parses `text`; says why the result breaks the importer's contract, or undefined when it keeps it. */
function contractBreach(text: string, fileName: string, outcome?: { refused: boolean }): string | undefined {
  const r = ofxImporter.parse(text, { fileName });
  if (outcome) outcome.refused = hasErrors(r);
  if (r.file !== fileName || r.format !== 'ofx') return 'wrong file or format';
  const lineCount = text.split(/\r\n|\n|\r/).length;
  for (const p of r.problems) {
    if (p.file !== fileName) return `problem without the file: ${JSON.stringify(p)}`;
    if (typeof p.message !== 'string' || p.message.trim() === '') return 'problem without a message';
    if (p.message.startsWith('internal error')) return p.message;
    if (p.severity !== 'error' && p.severity !== 'notice') return `bad severity ${String(p.severity)}`;
    if (p.line !== undefined && (!Number.isInteger(p.line) || p.line < 1 || p.line > lineCount)) {
      return `line ${p.line} outside 1..${lineCount}`;
    }
    if (p.element !== undefined && p.element === '') return 'empty element path';
  }
  if (hasErrors(r)) {
    const located = r.problems.some(
      (p) => p.severity === 'error' && (p.line !== undefined || (p.element !== undefined && p.element !== '')),
    );
    return located ? undefined : 'errors, but none names a line or element';
  }
  if (r.statements.length === 0) return 'no errors and no statements';
  for (const s of r.statements) {
    if (!isKnownCurrency(s.currency)) return `currency ${s.currency}`;
    if (s.account.identifier === undefined || s.account.identifier === '') return 'statement without account';
    for (const d of [s.from, s.to]) if (d !== undefined && !isCalendarDate(d)) return `statement date ${d}`;
    for (const e of s.entries) {
      if (!isCalendarDate(e.bookingDate)) return `booking date ${e.bookingDate}`;
      if (e.valueDate !== undefined && !isCalendarDate(e.valueDate)) return `value date ${e.valueDate}`;
      if (!Number.isSafeInteger(e.amount)) return `amount ${e.amount}`;
      if (typeof e.description !== 'string' || e.status !== 'booked') return 'entry shape';
      if (e.bankRef === undefined || e.bankRef === '') return 'entry without FITID';
      if (e.source.line === undefined || e.source.line < 1 || e.source.element === undefined) return 'entry source';
    }
    for (const b of s.balances) {
      if (!isCalendarDate(b.date) || !Number.isSafeInteger(b.amount)) return `balance ${JSON.stringify(b)}`;
    }
  }
  return undefined;
}

describe('OFX importer fuzz', () => {
  it('keeps every unmutated corpus file valid', () => {
    for (const [i, text] of CORPUS.entries()) {
      const r = ofxImporter.parse(text, { fileName: `corpus-${i}.ofx` });
      // The investment-only fixture is refused on purpose; every other one must parse.
      if (text.includes('INVSTMTMSGSRSV1')) expect(hasErrors(r)).toBe(true);
      else expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
      expect(contractBreach(text, `corpus-${i}.ofx`)).toBeUndefined();
    }
  });

  it('never throws on 10,000 seeded mutated or truncated files and always ends in a parse or a located error', () => {
    let valid = 0;
    let refused = 0;
    fc.assert(
      fc.property(
        fc.nat({ max: CORPUS.length - 1 }),
        fc.array(mutationArb, { minLength: 1, maxLength: 3 }),
        (base, mutations) => {
          const text = mutations.reduce(mutate, CORPUS[base] as string);
          const outcome = { refused: false };
          const breach = contractBreach(text, 'fuzz.ofx', outcome);
          if (breach !== undefined) throw new Error(breach);
          if (outcome.refused) refused++;
          else valid++;
        },
      ),
      { numRuns: 10_000, seed: 1996_10_05 },
    );
    // Both outcomes occur: the mutations neither all break the files nor all miss.
    expect(valid).toBeGreaterThan(100);
    expect(refused).toBeGreaterThan(1000);
  });
});
