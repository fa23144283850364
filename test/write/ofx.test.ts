import { describe, expect, it } from 'vitest';
import { ofxImporter } from '../../engine/import/ofx';
import type { ParsedStatement, StatementEntry } from '../../engine/import/types';
import { stableFitId, writeOfx } from '../../engine/write/ofx';

// Invented demo data.
const entry = (over: Partial<StatementEntry>): StatementEntry => ({
  bookingDate: '2024-03-01',
  amount: -85000,
  description: 'Harbour Lane Studios - Studio rent March',
  counterparty: 'Harbour Lane Studios',
  status: 'booked',
  source: {},
  ...over,
});

const current: ParsedStatement = {
  account: { identifier: '4410-778', servicer: '990011223', kind: 'current' },
  currency: 'EUR',
  from: '2024-03-01',
  to: '2024-03-31',
  entries: [
    entry({ bankRef: 'T1' }),
    entry({
      bookingDate: '2024-03-09',
      valueDate: '2024-03-11',
      amount: 4250,
      description: 'Fish & <Chips> "Co" - market stall',
      counterparty: 'Fish & <Chips> "Co"',
      reference: '1042',
      typeCode: 'CHECK',
      bankRef: 'T2&<3>',
    }),
    entry({ bookingDate: '2024-03-31', amount: 37, description: 'Interest', counterparty: undefined, typeCode: 'INT' }),
    entry({ bookingDate: '2024-03-20', amount: -500, status: 'pending', bankRef: 'P1' }),
  ],
  balances: [
    { kind: 'opening', date: '2024-03-01', at: 'start', amount: 100000, source: {} },
    { kind: 'closing', date: '2024-03-31', at: 'end', amount: 19287, source: {} },
    { kind: 'available', date: '2024-03-31', at: 'end', amount: 15000, source: {} },
  ],
};

const card: ParsedStatement = {
  account: { identifier: '5500-0000-0000-0004', kind: 'card' },
  currency: 'EUR',
  from: '2024-03-01',
  to: '2024-03-31',
  entries: [
    entry({ amount: -4590, description: 'Fernhill Hardware', counterparty: 'Fernhill Hardware', bankRef: 'C1' }),
  ],
  balances: [{ kind: 'closing', date: '2024-03-31', at: 'end', amount: -4590, source: {} }],
};

/** Start and end tags in order, e.g. ['OFX', 'SIGNONMSGSRSV1', …, '/OFX']. */
function tags(text: string): string[] {
  return [...text.matchAll(/<(\/?[A-Z0-9.]+)>/g)].map((m) => m[1] as string);
}

describe('writeOfx version 1 (OFX 1.0.2 SGML)', () => {
  const text = writeOfx([current, card], { version: 1 });
  const lines = text.split('\r\n');

  it('starts with the 1.0.2 header lines and a blank line', () => {
    // Source: OFX 1.0.2 specification, section 2.2 "Open Financial Exchange Headers" (from
    // memory): OFXHEADER:100, DATA:OFXSGML, VERSION:102, SECURITY, ENCODING, CHARSET,
    // COMPRESSION, OLDFILEUID, NEWFILEUID, then a blank line before <OFX>.
    expect(lines.slice(0, 11)).toEqual([
      'OFXHEADER:100',
      'DATA:OFXSGML',
      'VERSION:102',
      'SECURITY:NONE',
      'ENCODING:UTF-8',
      'CHARSET:NONE',
      'COMPRESSION:NONE',
      'OLDFILEUID:NONE',
      'NEWFILEUID:NONE',
      '',
      '<OFX>',
    ]);
  });

  it('writes leaf elements without end tags and closes every aggregate', () => {
    // Source: OFX 1.0.2 specification, chapter 2 (from memory): SGML leaves have no end tags.
    expect(text).toContain('<TRNAMT>-850.00\r\n');
    expect(text).not.toContain('</TRNAMT>');
    const stack: string[] = [];
    for (const t of tags(text)) {
      if (t.startsWith('/')) expect(stack.pop()).toBe(t.slice(1));
      else if (text.includes(`</${t}>`)) stack.push(t);
    }
    expect(stack).toEqual([]);
  });

  it('escapes & < > in values', () => {
    expect(text).toContain('<NAME>Fish &amp; &lt;Chips&gt; "Co"\r\n');
    expect(text).toContain('<FITID>T2&amp;&lt;3&gt;\r\n');
  });
});

describe('writeOfx version 2 (OFX 2.2 XML)', () => {
  const text = writeOfx([current, card], { version: 2 });

  it('starts with the XML declaration and the OFX processing instruction', () => {
    // Source: OFX Banking Specification 2.3, section 2.2 (from memory): <?OFX OFXHEADER="200" VERSION="220" …?>.
    const [xmlDecl, ofxPi, root] = text.split('\r\n');
    expect(xmlDecl).toBe('<?xml version="1.0" encoding="UTF-8" standalone="no"?>');
    expect(ofxPi).toBe('<?OFX OFXHEADER="200" VERSION="220" SECURITY="NONE" OLDFILEUID="NONE" NEWFILEUID="NONE"?>');
    expect(root).toBe('<OFX>');
  });

  it('is well-formed: every start tag has its end tag, properly nested', () => {
    const stack: string[] = [];
    for (const t of tags(text)) {
      if (t.startsWith('/')) expect(stack.pop()).toBe(t.slice(1));
      else stack.push(t);
    }
    expect(stack).toEqual([]);
    expect(text.replace(/<[^>]*>/g, '')).not.toMatch(/[<>]|&(?!amp;|lt;|gt;)/);
  });
});

describe('writeOfx content', () => {
  it('puts bank statements in BANKMSGSRSV1 and card statements in CREDITCARDMSGSRSV1', () => {
    // Source: OFX Banking Specification 2.3: STMTTRNRS/STMTRS/BANKACCTFROM for banks,
    // CCSTMTTRNRS/CCSTMTRS/CCACCTFROM for cards.
    const t = tags(writeOfx([card, current], { version: 2 })).filter((x) => !x.startsWith('/'));
    expect(t.filter((x) => /MSGSRSV1$|STMTTRNRS$|STMTRS$|ACCTFROM$/.test(x))).toEqual([
      'SIGNONMSGSRSV1',
      'BANKMSGSRSV1',
      'STMTTRNRS',
      'STMTRS',
      'BANKACCTFROM',
      'CREDITCARDMSGSRSV1',
      'CCSTMTTRNRS',
      'CCSTMTRS',
      'CCACCTFROM',
    ]);
  });

  it('writes LEDGERBAL from the closing balance and AVAILBAL from the available one', () => {
    const text = writeOfx([current], { version: 2 });
    expect(text).toMatch(/<LEDGERBAL>\s*<BALAMT>192.87<\/BALAMT>\s*<DTASOF>20240331<\/DTASOF>\s*<\/LEDGERBAL>/);
    expect(text).toMatch(/<AVAILBAL>\s*<BALAMT>150.00<\/BALAMT>\s*<DTASOF>20240331<\/DTASOF>\s*<\/AVAILBAL>/);
    const back = ofxImporter.parse(text, { fileName: 'w.ofx' }).statements[0];
    expect(back?.balances.map((b) => [b.kind, b.date, b.amount])).toEqual([
      ['closing', '2024-03-31', 19287],
      ['available', '2024-03-31', 15000],
    ]);
  });

  it('leaves pending entries out and maps the rest', () => {
    const back = ofxImporter.parse(writeOfx([current], { version: 1 }), { fileName: 'w.ofx' });
    expect(back.problems).toEqual([]);
    const s = back.statements[0];
    expect(s?.entries.map((e) => e.bankRef?.startsWith('P1'))).toEqual([false, false, false]);
    expect(s?.entries[1]).toMatchObject({
      bookingDate: '2024-03-09',
      valueDate: '2024-03-11',
      amount: 4250,
      description: 'Fish & <Chips> "Co" - market stall',
      counterparty: 'Fish & <Chips> "Co"',
      reference: '1042',
      typeCode: 'CHECK',
      bankRef: 'T2&<3>',
    });
    expect(writeOfx([current], { version: 1 })).toContain('<CHECKNUM>1042');
  });

  it('derives TRNTYPE from the sign when typeCode is not an OFX type', () => {
    const s: ParsedStatement = {
      ...current,
      entries: [entry({ typeCode: 'NTRF', bankRef: 'a' }), entry({ amount: 5, typeCode: undefined, bankRef: 'b' })],
    };
    const text = writeOfx([s], { version: 2 });
    expect([...text.matchAll(/<TRNTYPE>(\w+)</g)].map((m) => m[1])).toEqual(['DEBIT', 'CREDIT']);
  });

  it('generates stable, distinct FITIDs for entries without a bank reference', () => {
    const twin = entry({ bankRef: undefined });
    const s: ParsedStatement = { ...current, entries: [twin, twin, entry({ bankRef: undefined, amount: -1 })] };
    const first = writeOfx([s], { version: 2 });
    expect(writeOfx([s], { version: 2 })).toBe(first);
    const ids = [...first.matchAll(/<FITID>([^<]+)</g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(3);
    expect(ids[0]).toBe(stableFitId(twin, 1));
    expect(ids[1]).toBe(stableFitId(twin, 2));
    // An explicit bankRef equal to a generated id is not reused.
    const clash: ParsedStatement = { ...current, entries: [entry({ bankRef: stableFitId(twin, 1) }), twin] };
    const clashIds = [...writeOfx([clash], { version: 1 }).matchAll(/<FITID>([^\r\n]+)/g)].map((m) => m[1]);
    expect(new Set(clashIds).size).toBe(2);
  });

  it('is deterministic: DTSERVER comes from the statements, not the clock', () => {
    expect(writeOfx([current], { version: 1 })).toContain('<DTSERVER>20240331\r\n');
  });

  it('throws on input it cannot write', () => {
    expect(() => writeOfx([{ ...current, currency: 'EUX' }], { version: 1 })).toThrow(/unknown ISO 4217 currency/);
    expect(() => writeOfx([{ ...current, entries: [entry({ bookingDate: '2024-02-30' })] }], { version: 1 })).toThrow(
      /not a calendar date/,
    );
    expect(() => writeOfx([{ ...current, entries: [entry({ amount: 1.5 })] }], { version: 2 })).toThrow(/safe integer/);
    expect(() => writeOfx([{ ...current, account: { kind: 'current' } }], { version: 2 })).toThrow(/ACCTID/);
  });

  it('writes a statement without entries or dates as a valid empty list', () => {
    const empty: ParsedStatement = { account: { identifier: 'X1' }, currency: 'JPY', entries: [], balances: [] };
    const r = ofxImporter.parse(writeOfx([empty], { version: 2 }), { fileName: 'e.ofx' });
    expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
    expect(r.statements[0]).toMatchObject({ currency: 'JPY', entries: [], from: '1970-01-01', to: '1970-01-01' });
  });
});
