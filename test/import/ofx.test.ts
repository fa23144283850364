import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { MAX_OFX_PROBLEMS, ofxImporter, sniffOfx } from '../../engine/import/ofx';
import { hasErrors, type ImportProblem, type ImportResult } from '../../engine/import/types';

const FIXTURES = new URL('../fixtures/ofx/', import.meta.url);

function fixture(name: string): string {
  return readFileSync(new URL(name, FIXTURES), 'utf8');
}

function parse(text: string, fileName = 'test.ofx'): ImportResult {
  return ofxImporter.parse(text, { fileName });
}

function errors(r: ImportResult): ImportProblem[] {
  return r.problems.filter((p) => p.severity === 'error');
}

/** 1-based line of the n-th (1-based) line that contains `needle`. */
function lineOf(text: string, needle: string, n = 1): number {
  const lines = text.split(/\r\n|\n|\r/);
  let seen = 0;
  for (let i = 0; i < lines.length; i++) {
    if ((lines[i] as string).includes(needle) && ++seen === n) return i + 1;
  }
  throw new Error(`"${needle}" #${n} not found`);
}

const SGML_HEADER = [
  'OFXHEADER:100',
  'DATA:OFXSGML',
  'VERSION:102',
  'SECURITY:NONE',
  'ENCODING:USASCII',
  'CHARSET:1252',
  'COMPRESSION:NONE',
  'OLDFILEUID:NONE',
  'NEWFILEUID:NONE',
  '',
  '',
].join('\n');

/** An OFX 1.0.2 bank statement around the given STMTTRN bodies (invented test data). */
function sgmlStatement(transactions: readonly string[], options: { curdef?: string; status?: string } = {}): string {
  const curdef = options.curdef === undefined ? '<CURDEF>EUR\n' : options.curdef;
  return (
    SGML_HEADER +
    '<OFX>\n<SIGNONMSGSRSV1>\n<SONRS>\n<STATUS>\n<CODE>0\n<SEVERITY>INFO\n</STATUS>\n<DTSERVER>20240201\n<LANGUAGE>ENG\n</SONRS>\n</SIGNONMSGSRSV1>\n' +
    '<BANKMSGSRSV1>\n<STMTTRNRS>\n<TRNUID>1\n' +
    (options.status ?? '<STATUS>\n<CODE>0\n<SEVERITY>INFO\n</STATUS>\n') +
    '<STMTRS>\n' +
    curdef +
    '<BANKACCTFROM>\n<BANKID>990011223\n<ACCTID>4410-778\n<ACCTTYPE>CHECKING\n</BANKACCTFROM>\n' +
    '<BANKTRANLIST>\n<DTSTART>20240101\n<DTEND>20240131\n' +
    transactions.map((t) => `<STMTTRN>\n${t}</STMTTRN>\n`).join('') +
    '</BANKTRANLIST>\n<LEDGERBAL>\n<BALAMT>100.00\n<DTASOF>20240131\n</LEDGERBAL>\n</STMTRS>\n</STMTTRNRS>\n</BANKMSGSRSV1>\n</OFX>\n'
  );
}

const GOOD_TRN = '<TRNTYPE>DEBIT\n<DTPOSTED>20240105\n<TRNAMT>-10.00\n<FITID>A1\n<NAME>Clay delivery\n';
const TRN_PATH = 'OFX/BANKMSGSRSV1/STMTTRNRS/STMTRS/BANKTRANLIST/STMTTRN';

/** The OFX 1.0.2 SGML form of an OFX 2 body: the same elements, leaf end tags dropped. */
function toSgml(xml: string): string {
  const body = xml.slice(xml.indexOf('<OFX>'));
  const aggregates = new Set<string>();
  for (const m of body.matchAll(/<([A-Z0-9.]+)>(?=\s*<)/g)) aggregates.add(m[1] as string);
  return SGML_HEADER + body.replace(/<\/([A-Z0-9.]+)>/g, (whole, name: string) => (aggregates.has(name) ? whole : ''));
}

describe('OFX importer: the specification example', () => {
  // Source: OFX Banking Specification 2.3, section 11.14.1 (examples: statement download
  // response), checked against a public reproduction of the example, not the PDF itself.
  // The OFX 2 header lines in the fixture are ours; the body is the example's.
  const text = fixture('spec-11.14.1-statement-response.ofx');

  it('reads the OFX 2.x XML example', () => {
    const r = parse(text, 'spec.ofx');
    expect(r.problems).toEqual([]);
    expect(r.format).toBe('ofx');
    expect(r.statements).toHaveLength(1);
    const s = r.statements[0]!;
    expect(s.account).toEqual({ identifier: '999988', servicer: '121099999', kind: 'current' });
    expect(s.currency).toBe('USD');
    expect([s.from, s.to]).toEqual(['2005-10-01', '2005-10-28']);
    expect(s.entries.map((e) => [e.bookingDate, e.amount, e.bankRef, e.reference, e.typeCode])).toEqual([
      ['2005-10-04', -20000, '00002', '1000', 'CHECK'],
      ['2005-10-20', -30000, '00003', undefined, 'ATM'],
    ]);
    expect(s.balances.map((b) => [b.kind, b.date, b.at, b.amount])).toEqual([
      ['closing', '2005-10-29', 'end', 20029],
      ['available', '2005-10-29', 'end', 20029],
    ]);
    expect(s.entries[0]?.source).toEqual({ line: lineOf(text, '<STMTTRN>', 1), element: `${TRN_PATH}[1]` });
  });

  it('reads the same example written as OFX 1.0.2 SGML (leaves without end tags) to the same statement', () => {
    // Source: OFX 1.0.2 specification, chapter 2 (from memory): SGML leaves need no end tags.
    const sgml = toSgml(text);
    expect(sgml).not.toContain('</TRNAMT>');
    const a = parse(text);
    const b = parse(sgml);
    expect(b.problems).toEqual([]);
    const strip = (r: ImportResult) =>
      r.statements.map((s) => ({ ...s, entries: s.entries.map((e) => ({ ...e, source: {} })), balances: [] }));
    expect(strip(b)).toEqual(strip(a));
    expect(b.statements[0]?.balances.map((x) => x.amount)).toEqual([20029, 20029]);
  });

  it('refuses the request half of the same example: it is not a statement', () => {
    const request =
      '<?xml version="1.0"?>\n<?OFX OFXHEADER="200" VERSION="220"?>\n<OFX><SIGNONMSGSRQV1><SONRQ><DTCLIENT>20051029101000</DTCLIENT></SONRQ></SIGNONMSGSRQV1>' +
      '<BANKMSGSRQV1><STMTTRNRQ><TRNUID>1001</TRNUID><STMTRQ><BANKACCTFROM><BANKID>121099999</BANKID><ACCTID>999988</ACCTID>' +
      '<ACCTTYPE>CHECKING</ACCTTYPE></BANKACCTFROM><INCTRAN><INCLUDE>Y</INCLUDE></INCTRAN></STMTRQ></STMTTRNRQ></BANKMSGSRQV1></OFX>';
    const r = parse(request);
    expect(errors(r).map((p) => p.message)).toEqual([
      'this is an OFX request (SIGNONMSGSRQV1, BANKMSGSRQV1), expected a statement download (a response)',
    ]);
  });
});

describe('OFX importer: an OFX 1.0.2 SGML bank statement', () => {
  const text = fixture('bank-sgml-102.ofx');
  const r = parse(text, 'bank.ofx');
  const s = r.statements[0]!;
  const byFitId = (id: string) => s.entries.find((e) => e.bankRef === id)!;

  it('parses without problems, with CRLF line numbers', () => {
    expect(r.problems).toEqual([]);
    expect(r.statements).toHaveLength(1);
    expect(s.entries).toHaveLength(5);
    expect(s.entries.map((e) => e.source.line)).toEqual([1, 2, 3, 4, 5].map((n) => lineOf(text, '<STMTTRN>', n)));
  });

  it('maps BANKACCTFROM and CURDEF', () => {
    // Source: OFX Banking Specification 2.3, BANKACCTFROM aggregate: BANKID, ACCTID, ACCTTYPE.
    expect(s.account).toEqual({ identifier: '4410-778', servicer: '990011223', kind: 'current' });
    expect(s.currency).toBe('EUR');
  });

  it('takes booking dates as written, even for a posting late in the evening in a time zone behind UTC', () => {
    // Source: OFX Banking Specification 2.3, section 3.2.8.1 (date format); the local-date
    // reading is our documented choice (see parseOfxDate).
    expect(byFitId('202401310007').bookingDate).toBe('2024-01-31');
    expect(s.to).toBe('2024-01-31'); // DTEND 20240131235959.999[-5:EST]
    expect(s.from).toBe('2024-01-01');
  });

  it('decodes entities and combines NAME and MEMO', () => {
    const pos = byFitId('202401310007');
    expect(pos.counterparty).toBe('Kiln & Clay Supply');
    expect(pos.description).toBe('Kiln & Clay Supply - Card 4410 <glaze>');
    expect(byFitId('202401200004').description).toBe('Saturday market - Market takings € cash');
    expect(byFitId('202401310008')).toMatchObject({ description: 'Interest', typeCode: 'INT', amount: 37 });
    expect(byFitId('202401310008').counterparty).toBeUndefined();
  });

  it('reads PAYEE/NAME, CHECKNUM, REFNUM, DTAVAIL and a decimal comma', () => {
    // Source: OFX Banking Specification 2.3, STMTTRN aggregate: NAME or PAYEE, CHECKNUM, REFNUM, DTAVAIL.
    expect(byFitId('202401150003')).toMatchObject({
      counterparty: 'Northgate Print Shop',
      description: 'Northgate Print Shop',
      reference: '1042',
      typeCode: 'CHECK',
      amount: -12000,
    });
    expect(byFitId('202401200004')).toMatchObject({
      amount: 123456,
      reference: 'MKT-2024-03',
      valueDate: '2024-01-22',
      bookingDate: '2024-01-20',
    });
    expect(byFitId('202401010001').valueDate).toBeUndefined();
  });

  it('reads LEDGERBAL as the closing balance at the end of DTASOF, AVAILBAL as available', () => {
    // Source: OFX Banking Specification 2.3, STMTRS aggregate: LEDGERBAL and AVAILBAL with BALAMT and DTASOF.
    expect(s.balances).toEqual([
      {
        kind: 'closing',
        date: '2024-01-31',
        at: 'end',
        amount: 225253,
        source: { line: lineOf(text, '<LEDGERBAL>'), element: 'OFX/BANKMSGSRSV1/STMTTRNRS/STMTRS/LEDGERBAL' },
      },
      {
        kind: 'available',
        date: '2024-02-01',
        at: 'end',
        amount: 210000,
        source: { line: lineOf(text, '<AVAILBAL>'), element: 'OFX/BANKMSGSRSV1/STMTTRNRS/STMTRS/AVAILBAL' },
      },
    ]);
  });

  it('marks every entry booked', () => {
    expect(new Set(s.entries.map((e) => e.status))).toEqual(new Set(['booked']));
  });
});

describe('OFX importer: card statements, several statements, foreign currency', () => {
  it('reads an OFX 2.2 card statement as kind card', () => {
    // Source: OFX Banking Specification 2.3, CREDITCARDMSGSRSV1/CCSTMTTRNRS/CCSTMTRS with CCACCTFROM.
    const r = parse(fixture('card-xml-220.ofx'));
    expect(errors(r)).toEqual([]);
    const s = r.statements[0]!;
    expect(s.account).toEqual({ identifier: '5500-0000-0000-0004', kind: 'card' });
    expect(s.entries.map((e) => e.amount)).toEqual([-4590, -2160, -3510, 20000]);
    expect(s.balances.map((b) => [b.kind, b.amount])).toEqual([
      ['closing', -15260],
      ['available', 284740],
    ]);
  });

  it('notes ORIGCURRENCY and converts a CURRENCY amount into CURDEF at CURRATE', () => {
    // From memory: OFX Banking Specification 2.3, CURRENCY/ORIGCURRENCY aggregates: with
    // CURRENCY the amount is in CURSYM and CURRATE converts it to CURDEF; with ORIGCURRENCY
    // the amount is already in CURDEF.
    const r = parse(fixture('card-xml-220.ofx'));
    const notices = r.problems.filter((p) => p.severity === 'notice');
    expect(notices.map((p) => [p.element, p.message])).toEqual([
      [
        'OFX/CREDITCARDMSGSRSV1/CCSTMTTRNRS/CCSTMTRS/BANKTRANLIST/STMTTRN[2]/ORIGCURRENCY',
        'originally in USD at rate 0.9; TRNAMT is already in EUR',
      ],
      [
        'OFX/CREDITCARDMSGSRSV1/CCSTMTTRNRS/CCSTMTRS/BANKTRANLIST/STMTTRN[3]/CURRENCY',
        'TRNAMT -30.00 GBP converted at CURRATE 1.17 to -35.10 EUR',
      ],
    ]);
  });

  it('returns one statement per STMTTRNRS and CCSTMTTRNRS, in file order', () => {
    const r = parse(fixture('multi-statement-sgml-102.ofx'));
    expect(r.problems).toEqual([]);
    expect(r.statements.map((s) => [s.account.identifier, s.account.kind, s.entries.length])).toEqual([
      ['4410-778', 'current', 2],
      ['4410-900', 'savings', 2],
      ['5500-0000-0000-0004', 'card', 1],
    ]);
    expect(r.statements[1]?.entries[0]?.source.element).toBe(
      'OFX/BANKMSGSRSV1/STMTTRNRS[2]/STMTRS/BANKTRANLIST/STMTTRN[1]',
    );
  });
});

describe('OFX importer: corrections', () => {
  // Source: OFX Banking Specification 2.3, STMTTRN: CORRECTFITID names the FITID of an
  // earlier transaction that this one corrects; CORRECTACTION is REPLACE or DELETE.
  const r = parse(fixture('corrections-sgml-102.ofx'));

  it('applies REPLACE and DELETE to the earlier FITIDs in the file', () => {
    expect(errors(r)).toEqual([]);
    expect(r.statements[0]?.entries.map((e) => [e.bankRef, e.amount])).toEqual([
      ['T1', -85000],
      ['T2-FIX', -4600],
      ['T0-FIX', 7500],
    ]);
  });

  it('says what it did, including for a FITID that is not in the file', () => {
    expect(r.problems.map((p) => p.message)).toEqual([
      expect.stringMatching(/^CORRECTACTION REPLACE: replaces FITID "T2" \(line \d+\); the earlier entry was left out/),
      expect.stringMatching(/^CORRECTACTION DELETE: deletes FITID "T3" \(line \d+\); both that entry and this record/),
      expect.stringMatching(/^CORRECTACTION REPLACE of FITID "T0", which is not in this file: this entry is kept/),
    ]);
    expect(r.problems.every((p) => p.severity === 'notice')).toBe(true);
  });

  it('applies a correction to an entry of an earlier statement of the same account in the file', () => {
    const first = sgmlStatement([GOOD_TRN, GOOD_TRN.replace('A1', 'A2')]);
    const second = sgmlStatement([GOOD_TRN.replace('A1', 'B1') + '<CORRECTFITID>A2\n<CORRECTACTION>DELETE\n']);
    const block = second.slice(second.indexOf('<STMTTRNRS>'), second.indexOf('</STMTTRNRS>') + '</STMTTRNRS>\n'.length);
    const text = first.replace('</BANKMSGSRSV1>', block + '</BANKMSGSRSV1>');
    const r = parse(text);
    expect(errors(r)).toEqual([]);
    expect(r.statements.map((st) => st.entries.map((e) => e.bankRef))).toEqual([['A1'], []]);
    expect(r.problems[0]).toMatchObject({
      element: `OFX/BANKMSGSRSV1/STMTTRNRS[2]/STMTRS/BANKTRANLIST/STMTTRN`,
      message: `CORRECTACTION DELETE: deletes FITID "A2" (line ${lineOf(text, '<STMTTRN>', 2)}); both that entry and this record were left out`,
    });
  });

  it('refuses an unknown CORRECTACTION and a CORRECTACTION without CORRECTFITID', () => {
    const bad = parse(sgmlStatement([GOOD_TRN + '<CORRECTFITID>A0\n<CORRECTACTION>UNDO\n']));
    expect(errors(bad).map((p) => p.message)).toEqual(['"UNDO" is unknown, expected REPLACE or DELETE']);
    const lone = parse(sgmlStatement([GOOD_TRN + '<CORRECTACTION>DELETE\n']));
    expect(errors(lone)[0]?.message).toBe('missing, expected the FITID that CORRECTACTION applies to');
  });
});

describe('OFX importer: reconciliation material', () => {
  it('emits the stated closing balances unchanged although they do not match the entries', () => {
    // Invented data: January closes at 1000.00; February's entries add +50.00, but February's
    // LEDGERBAL says 1100.00. The importer cannot know an opening balance, so it reports
    // what the file states and leaves the mismatch to the ledger's reconciliation.
    const r = parse(fixture('ledger-mismatch-xml-220.ofx'));
    expect(r.problems).toEqual([]);
    const [jan, feb] = r.statements;
    expect(jan?.balances).toMatchObject([{ kind: 'closing', date: '2024-01-31', at: 'end', amount: 100000 }]);
    expect(feb?.balances).toMatchObject([{ kind: 'closing', date: '2024-02-29', at: 'end', amount: 110000 }]);
    const febNet = (feb?.entries ?? []).reduce((sum, e) => sum + e.amount, 0);
    expect(febNet).toBe(5000);
    expect(100000 + febNet).not.toBe(110000);
  });
});

describe('OFX importer: refusals name the element and the line', () => {
  it('reports a missing TRNAMT with the element path and the line of its STMTTRN', () => {
    const text = sgmlStatement([
      GOOD_TRN,
      GOOD_TRN.replace('A1', 'A2'),
      '<TRNTYPE>DEBIT\n<DTPOSTED>20240105\n<FITID>A3\n',
    ]);
    const r = parse(text, 'march.ofx');
    const e = errors(r);
    expect(e).toHaveLength(1);
    expect(e[0]).toEqual({
      file: 'march.ofx',
      line: lineOf(text, '<STMTTRN>', 3),
      element: `${TRN_PATH}[3]/TRNAMT`,
      message: 'missing, expected a signed amount',
      severity: 'error',
    });
    expect(`element ${e[0]?.element}: ${e[0]?.message}`).toBe(
      'element OFX/BANKMSGSRSV1/STMTTRNRS/STMTRS/BANKTRANLIST/STMTTRN[3]/TRNAMT: missing, expected a signed amount',
    );
  });

  it('reports missing DTPOSTED, FITID and CURDEF', () => {
    const noDate = parse(sgmlStatement(['<TRNTYPE>DEBIT\n<TRNAMT>-1.00\n<FITID>A1\n']));
    expect(errors(noDate)).toMatchObject([
      { element: `${TRN_PATH}/DTPOSTED`, message: 'missing, expected a date YYYYMMDD[HHMMSS]' },
    ]);
    const noFitId = parse(sgmlStatement(['<TRNTYPE>DEBIT\n<DTPOSTED>20240105\n<TRNAMT>-1.00\n<FITID>\n']));
    expect(errors(noFitId)).toMatchObject([
      { element: `${TRN_PATH}/FITID`, message: "missing, expected the bank's transaction id" },
    ]);
    const noCurdef = parse(sgmlStatement([GOOD_TRN], { curdef: '' }));
    expect(errors(noCurdef)).toMatchObject([
      {
        element: 'OFX/BANKMSGSRSV1/STMTTRNRS/STMTRS/CURDEF',
        message: 'missing, expected an ISO 4217 currency code such as EUR',
      },
    ]);
    expect(noCurdef.statements).toEqual([]);
  });

  it('refuses an impossible date, naming the element and its line', () => {
    // Source: Gregorian calendar: 31 April does not exist.
    const text = sgmlStatement([GOOD_TRN.replace('20240105', '19960431')]);
    const r = parse(text);
    expect(errors(r)).toEqual([
      {
        file: 'test.ofx',
        line: lineOf(text, '19960431'),
        element: `${TRN_PATH}/DTPOSTED`,
        message: '"19960431" is not a calendar date: 1996-04-31 does not exist',
        severity: 'error',
      },
    ]);
  });

  it('refuses amounts with more decimals than the currency has, and unknown currencies', () => {
    // Source: ISO 4217 list one: EUR has 2 minor-unit digits, JPY 0.
    const text = sgmlStatement([GOOD_TRN.replace('-10.00', '-10.005')]);
    expect(errors(parse(text))).toMatchObject([
      {
        element: `${TRN_PATH}/TRNAMT`,
        line: lineOf(text, '-10.005'),
        message: '"-10.005" has 3 decimals, the currency allows 2',
      },
    ]);
    const yen = sgmlStatement([GOOD_TRN.replace('-10.00', '-10.5')], { curdef: '<CURDEF>JPY\n' });
    expect(errors(parse(yen))[0]?.message).toBe('"-10.5" has 1 decimals, the currency allows 0');
    const unknown = sgmlStatement([GOOD_TRN], { curdef: '<CURDEF>EUX\n' });
    expect(errors(parse(unknown))[0]?.message).toBe(
      '"EUX" is not an ISO 4217 currency code, expected one such as EUR or USD',
    );
  });

  it('refuses a file whose signon STATUS CODE is not 0', () => {
    // Source: OFX Banking Specification 2.3, STATUS aggregate: CODE 0 is success; 15500
    // (from memory) is "signon invalid".
    const text = sgmlStatement([GOOD_TRN]).replace(
      '<STATUS>\n<CODE>0\n<SEVERITY>INFO\n</STATUS>\n<DTSERVER>',
      '<STATUS>\n<CODE>15500\n<SEVERITY>ERROR\n<MESSAGE>Signon invalid\n</STATUS>\n<DTSERVER>',
    );
    const e = errors(parse(text));
    expect(e).toHaveLength(1);
    expect(e[0]).toMatchObject({
      element: 'OFX/SIGNONMSGSRSV1/SONRS/STATUS',
      line: lineOf(text, '<STATUS>', 1),
      message: 'signon refused by the bank: STATUS CODE 15500 (ERROR): Signon invalid, expected CODE 0',
    });
  });

  it('refuses a statement response with an error STATUS, notes a warning one', () => {
    const failed = parse(
      sgmlStatement([GOOD_TRN], {
        status: '<STATUS>\n<CODE>2003\n<SEVERITY>ERROR\n<MESSAGE>Account not found\n</STATUS>\n',
      }),
    );
    expect(errors(failed)[0]?.message).toBe(
      'statement response STATUS CODE 2003 (ERROR): Account not found, expected CODE 0',
    );
    const warned = parse(sgmlStatement([GOOD_TRN], { status: '<STATUS>\n<CODE>2000\n<SEVERITY>WARN\n</STATUS>\n' }));
    expect(hasErrors(warned)).toBe(false);
    expect(warned.problems[0]).toMatchObject({ severity: 'notice', element: 'OFX/BANKMSGSRSV1/STMTTRNRS/STATUS' });
  });

  it('refuses investment-only files, naming what it found', () => {
    const r = parse(fixture('investment-only-xml-220.ofx'));
    expect(errors(r).map((p) => p.message)).toEqual([
      'only INVSTMTMSGSRSV1 (investment statements) found, which Ebbline does not read; expected bank (BANKMSGSRSV1) or card (CREDITCARDMSGSRSV1) statements',
    ]);
  });

  it('refuses truncated files at every cut point inside the body', () => {
    const text = fixture('bank-sgml-102.ofx');
    const bodyStart = text.indexOf('<OFX>');
    const end = text.lastIndexOf('</OFX>');
    for (let cut = bodyStart + 1; cut < end; cut += 7) {
      const r = parse(text.slice(0, cut));
      expect(hasErrors(r), `cut at ${cut}`).toBe(true);
      expect(errors(r).every((p) => p.line !== undefined || p.element !== undefined)).toBe(true);
    }
    const r = parse(text.slice(0, text.indexOf('<STMTTRN>', text.indexOf('<STMTTRN>') + 1) + 30));
    expect(errors(r).some((p) => /truncated/.test(p.message))).toBe(true);
  });

  it('accepts an empty BANKTRANLIST as zero entries', () => {
    const r = parse(sgmlStatement([]));
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.entries).toEqual([]);
    expect(r.statements[0]?.balances).toHaveLength(1);
  });

  it('reports mismatched aggregates', () => {
    const text = sgmlStatement([GOOD_TRN]).replace('</BANKTRANLIST>', '</STMTRS>');
    const e = errors(parse(text));
    expect(e.length).toBeGreaterThan(0);
    expect(e[0]?.message).toMatch(
      /<BANKTRANLIST> opened on line \d+ is not closed, expected <\/BANKTRANLIST> before <\/STMTRS>/,
    );
  });

  it('caps the problem list and says how many more there were', () => {
    const many = Array.from({ length: 150 }, (_, i) => `<TRNTYPE>DEBIT\n<DTPOSTED>20240105\n<FITID>X${i}\n`);
    const r = parse(sgmlStatement(many));
    expect(r.problems).toHaveLength(MAX_OFX_PROBLEMS);
    expect(r.problems[MAX_OFX_PROBLEMS - 1]).toMatchObject({
      message: '51 more problems not listed',
      severity: 'error',
    });
  });
});

describe('OFX importer: headers', () => {
  const body = sgmlStatement([GOOD_TRN]).slice(SGML_HEADER.length);

  it('accepts the OFX 1.0.2 and 1.0.3 header lines', () => {
    // Source: OFX 1.0.2 specification, section 2.2 (from memory): OFXHEADER:100, DATA:OFXSGML, VERSION:102/103.
    expect(parse(SGML_HEADER + body).problems).toEqual([]);
    expect(parse(SGML_HEADER.replace('VERSION:102', 'VERSION:103') + body).problems).toEqual([]);
  });

  it('accepts the OFX 2 processing instruction and an XML body', () => {
    // Source: OFX Banking Specification 2.3, section 2.2 (from memory): <?OFX OFXHEADER="200" VERSION="220" …?>.
    const xml = fixture('spec-11.14.1-statement-response.ofx');
    expect(parse(xml.replace('VERSION="220"', 'VERSION="211"')).problems).toEqual([]);
  });

  it('refuses malformed and unsupported headers with the line', () => {
    const cases: [string, RegExp, number][] = [
      [SGML_HEADER.replace('VERSION:102', 'VERSION:abc'), /VERSION:abc is not an OFX 1.x version/, 3],
      [
        SGML_HEADER.replace('OFXHEADER:100', 'OFXHEADER:200'),
        /OFXHEADER:200 is not supported, expected OFXHEADER:100/,
        1,
      ],
      [SGML_HEADER.replace('DATA:OFXSGML', 'DATA:OFXXML'), /DATA:OFXXML is not supported/, 2],
      [SGML_HEADER.replace('DATA:OFXSGML\n', ''), /header DATA is missing/, 1],
      [SGML_HEADER.replace('COMPRESSION:NONE', 'COMPRESSION:ZIP'), /COMPRESSION:ZIP cannot be read/, 7],
      [SGML_HEADER.replace('SECURITY:NONE', 'SECURITY NONE'), /header line "SECURITY NONE" is not KEY:VALUE/, 4],
    ];
    for (const [header, message, line] of cases) {
      const e = errors(parse(header + body));
      expect(e.length, String(message)).toBeGreaterThan(0);
      expect(e[0]?.message).toMatch(message);
      expect(e[0]?.line).toBe(line);
    }
    const xml = fixture('spec-11.14.1-statement-response.ofx');
    expect(errors(parse(xml.replace('OFXHEADER="200"', 'OFXHEADER="100"')))[0]?.message).toMatch(
      /OFXHEADER="100" is not supported/,
    );
    expect(errors(parse(xml.replace('VERSION="220"', 'VERSION="102"')))[0]?.message).toMatch(
      /VERSION="102" is not an OFX 2.x version/,
    );
  });

  it('refuses a file that is only a header, or not OFX at all', () => {
    expect(errors(parse(SGML_HEADER))[0]?.message).toBe('the file ends after the header, expected the <OFX> body');
    expect(errors(parse('Date,Amount\n2024-01-01,5'))[0]).toMatchObject({
      line: 1,
      message: 'found "Date,Amount", expected an OFX header (OFXHEADER:100 or <?OFX OFXHEADER="200" …?>)',
    });
    expect(errors(parse(''))).toHaveLength(1);
  });

  it('reads a body without a header, and lower-case tags, with a notice', () => {
    const r = parse(body.toLowerCase().replace(/<acctid>4410-778/, '<acctid>4410-778'));
    expect(hasErrors(r)).toBe(false);
    expect(r.problems[0]?.message).toMatch(/no OFX header/);
    expect(r.statements[0]?.entries[0]?.amount).toBe(-1000);
  });

  it('tolerates a byte-order mark and a one-line 1.x header', () => {
    const oneLine = 'OFXHEADER:100 DATA:OFXSGML VERSION:102 SECURITY:NONE ENCODING:USASCII\n\n';
    const r = parse('\uFEFF' + oneLine + body);
    expect(r.problems).toEqual([]);
  });
});

describe('OFX importer: smaller rules', () => {
  it('notes pending transactions, unknown TRNTYPEs, duplicate FITIDs and unknown ACCTTYPE', () => {
    const text = sgmlStatement([GOOD_TRN.replace('DEBIT', 'WIRE'), GOOD_TRN])
      .replace('<ACCTTYPE>CHECKING', '<ACCTTYPE>PIGGYBANK')
      .replace(
        '</BANKTRANLIST>',
        '</BANKTRANLIST>\n<BANKTRANLISTP>\n<STMTTRNP>\n<TRNAMT>1.00\n</STMTTRNP>\n</BANKTRANLISTP>',
      );
    const r = parse(text);
    expect(hasErrors(r)).toBe(false);
    expect(r.problems.map((p) => p.message)).toEqual([
      '"PIGGYBANK" is unknown, expected CHECKING, SAVINGS, MONEYMRKT, CREDITLINE or CD; account kind left open',
      '"WIRE" is not an OFX transaction type; kept as written',
      '1 pending transaction (STMTTRNP) left out: only posted transactions are imported',
      expect.stringMatching(/^FITID "A1" appears again \(first on line \d+\); both kept/),
    ]);
    expect(r.statements[0]?.account.kind).toBeUndefined();
  });

  it('maps every ACCTTYPE to an account kind', () => {
    // Source: OFX Banking Specification 2.3, ACCTTYPE values CHECKING, SAVINGS, MONEYMRKT, CREDITLINE, CD.
    const kinds = ['CHECKING', 'SAVINGS', 'MONEYMRKT', 'CREDITLINE', 'CD'].map(
      (t) =>
        parse(sgmlStatement([GOOD_TRN]).replace('<ACCTTYPE>CHECKING', `<ACCTTYPE>${t}`)).statements[0]?.account.kind,
    );
    expect(kinds).toEqual(['current', 'savings', 'savings', 'current', 'savings']);
  });

  it('never throws, whatever it is given', () => {
    for (const text of [
      '<',
      '<OFX',
      '<?OFX',
      'OFXHEADER:',
      '<OFX></OFX>',
      '<OFX><BANKMSGSRSV1></BANKMSGSRSV1></OFX>',
    ]) {
      const r = parse(text);
      expect(hasErrors(r), text).toBe(true);
    }
  });
});

describe('sniffOfx', () => {
  it('is certain for OFX headers and bodies, zero for other formats', () => {
    expect(sniffOfx(fixture('bank-sgml-102.ofx'))).toBe(1);
    expect(sniffOfx(fixture('card-xml-220.ofx'))).toBe(1);
    expect(sniffOfx('\uFEFF\r\n OFXHEADER:100')).toBe(1);
    expect(sniffOfx('<OFX>\n<SIGNONMSGSRSV1>')).toBe(0.9);
    expect(sniffOfx('Date;Amount;Text\n01.01.2024;-5,00;Rent')).toBe(0);
    expect(sniffOfx('<?xml version="1.0"?><Document xmlns="urn:iso:std:iso:20022:tech:xsd:camt.053.001.02">')).toBe(0);
    expect(sniffOfx(':20:STATEMENT\n:25:DE89370400440532013000\n:28C:1/1')).toBe(0);
    expect(ofxImporter.id).toBe('ofx');
  });
});
