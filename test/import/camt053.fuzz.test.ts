import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { camt053Importer } from '../../engine/import/camt053';
import { hasErrors, type ImportResult } from '../../engine/import/types';

// Seeded mutation fuzzing: every mutated or truncated document must give a result (never a
// throw), and that result is either a clean parse or carries at least one error that names
// the file, where (element path or line) and what was wrong.

const FIXTURES = new URL('../fixtures/camt053/', import.meta.url);
const BASES = ['sps-layout-v04.xml', 'two-statements-v02.xml', 'jpy-v08.xml', 'kwd-v13.xml'].map((name) =>
  readFileSync(new URL(name, FIXTURES), 'utf8'),
);

/** Fragments that stress the parser and the element rules when spliced in. */
const TOKENS = [
  '<',
  '>',
  '</',
  '/>',
  '&',
  '&amp;',
  '&#0;',
  '&#x110000;',
  '&unknown;',
  '"',
  "'",
  '<![CDATA[',
  ']]>',
  '<!--',
  '-->',
  '<!DOCTYPE x [<!ENTITY a "b">]>',
  '<?xml version="1.0"?>',
  '<Ntry>',
  '</Ntry>',
  '<Stmt>',
  '</Stmt>',
  '<Amt Ccy="USD">1.00</Amt>',
  '<Amt Ccy="EUR">-5</Amt>',
  '<Amt>1</Amt>',
  '2025-02-30',
  '2025-04-31T10:00:00',
  'DBIT',
  'CRDT',
  'PDNG',
  'XXX',
  '9.999',
  'xmlns="urn:iso:std:iso:20022:tech:xsd:camt.054.001.08"',
  'p:',
  '\u0000',
  '\uD800',
  '\r\n',
];

type Mutation =
  | { kind: 'truncate'; at: number }
  | { kind: 'delete'; at: number; length: number }
  | { kind: 'insert'; at: number; token: string }
  | { kind: 'duplicate'; at: number; length: number }
  | { kind: 'replace'; at: number; token: string };

const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('delete' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 80 }) }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), token: fc.constantFrom(...TOKENS) }),
  fc.record({ kind: fc.constant('duplicate' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 400 }) }),
  fc.record({ kind: fc.constant('replace' as const), at: fc.nat(), token: fc.constantFrom(...TOKENS) }),
);

function mutate(text: string, m: Mutation): string {
  const at = m.at % (text.length + 1);
  switch (m.kind) {
    case 'truncate':
      return text.slice(0, at);
    case 'delete':
      return text.slice(0, at) + text.slice(at + m.length);
    case 'insert':
      return text.slice(0, at) + m.token + text.slice(at);
    case 'duplicate':
      return text.slice(0, at + m.length) + text.slice(at, at + m.length) + text.slice(at + m.length);
    case 'replace':
      return text.slice(0, at) + m.token + text.slice(at + m.token.length);
  }
}

function checkOutcome(r: ImportResult, file: string): void {
  expect(r.file).toBe(file);
  expect(r.format).toBe('camt.053');
  for (const p of r.problems) {
    expect(p.file).toBe(file);
    expect(p.message.length).toBeGreaterThan(0);
    expect(p.severity === 'error' || p.severity === 'notice').toBe(true);
  }
  // No problem is reported twice.
  const keys = r.problems.map((p) => `${p.line}|${p.element}|${p.message}`);
  expect(new Set(keys).size).toBe(keys.length);
  if (hasErrors(r)) {
    const located = r.problems.filter(
      (p) => p.severity === 'error' && ((p.element !== undefined && p.element !== '') || (p.line ?? 0) >= 1),
    );
    expect(located.length).toBeGreaterThanOrEqual(1);
  } else {
    // A clean parse: every statement has a currency and every entry a real date and an integer amount.
    expect(r.statements.length).toBeGreaterThanOrEqual(1);
    for (const s of r.statements) {
      expect(s.currency).toMatch(/^[A-Z]{3}$/);
      for (const e of s.entries) {
        expect(e.bookingDate).toMatch(/^\d{4}-\d{2}-\d{2}$/);
        expect(Number.isSafeInteger(e.amount)).toBe(true);
      }
    }
  }
}

describe('camt.053 importer under seeded mutation fuzzing', () => {
  it('never throws and always ends in a clean parse or located errors (10,000 files)', () => {
    let refused = 0;
    let accepted = 0;
    fc.assert(
      fc.property(fc.nat(BASES.length - 1), fc.array(mutationArb, { minLength: 1, maxLength: 3 }), (which, ms) => {
        const text = ms.reduce(mutate, BASES[which] as string);
        const file = `fuzz-${which}.xml`;
        const r = camt053Importer.parse(text, { fileName: file });
        checkOutcome(r, file);
        camt053Importer.sniff(text);
        if (hasErrors(r)) refused++;
        else accepted++;
      }),
      { seed: 20250331, numRuns: 10_000 },
    );
    // Both outcomes occur, so the check above exercised both branches.
    expect(refused).toBeGreaterThan(1000);
    expect(accepted).toBeGreaterThan(100);
  });

  it('reports every truncation point of a document as an error', () => {
    const text = BASES[2] as string;
    const end = text.lastIndexOf('</Document>');
    for (let at = 0; at < end; at += 7) {
      const r = camt053Importer.parse(text.slice(0, at), { fileName: 'cut.xml' });
      expect(hasErrors(r), `cut at ${at}`).toBe(true);
      checkOutcome(r, 'cut.xml');
    }
  });
});
