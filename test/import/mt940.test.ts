import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { mt940Importer } from '../../engine/import/mt940';
import { hasErrors, type ImportResult } from '../../engine/import/types';

const FIXTURES = join(__dirname, '..', 'fixtures', 'mt940');
const fixture = (name: string): string => readFileSync(join(FIXTURES, name), 'utf8');
const parse = (text: string, fileName = 'test.sta'): ImportResult => mt940Importer.parse(text, { fileName });
const errors = (r: ImportResult) => r.problems.filter((p) => p.severity === 'error');

/** A minimal valid statement; `replace` swaps one line for others (or removes it). */
function statement(replace: Record<string, string | null> = {}): string {
  const lines: [string, string][] = [
    ['20', ':20:REF1'],
    ['25', ':25:0123456789'],
    ['28C', ':28C:1/1'],
    ['60F', ':60F:C250131EUR100,00'],
    ['61', ':61:250203D12,5NTRFNONREF'],
    ['86', ':86:Glaze order'],
    ['62F', ':62F:C250203EUR87,50'],
  ];
  return lines
    .map(([tag, line]) => (tag in replace ? replace[tag] : line))
    .filter((l) => l !== null)
    .join('\n');
}

describe('mt940Importer.sniff', () => {
  it('is sure of MT940 with or without wrappers and 0 for other formats', () => {
    // Source: SWIFT User Handbook, Category 9, MT940 field tags :20: :25: :28C: :60F: :61: :62F:
    expect(mt940Importer.sniff(fixture('two-messages-wrapped.sta'))).toBe(1);
    expect(mt940Importer.sniff(fixture('separators-lf.sta'))).toBe(1);
    expect(mt940Importer.sniff('{1:F01XXXXXXXXAXXX0000000000}{4::20:X\r\n:61:250102C1,NTRFNONREF\r\n-}')).toBe(1);
    expect(mt940Importer.sniff('Date;Amount;Text\n2025-01-02;12,50;:20: in a cell')).toBe(0);
    expect(mt940Importer.sniff('OFXHEADER:100\nDATA:OFXSGML\n<OFX><BANKMSGSRSV1>')).toBe(0);
    expect(
      mt940Importer.sniff('<?xml version="1.0"?><Document xmlns="urn:iso:std:iso:20022:tech:xsd:camt.053.001.02"/>'),
    ).toBe(0);
    expect(mt940Importer.sniff(':20:REF only')).toBe(0);
    expect(mt940Importer.sniff('')).toBe(0);
  });
});

describe('two wrapped messages (CRLF)', () => {
  const result = parse(fixture('two-messages-wrapped.sta'), 'two-messages-wrapped.sta');

  it('reads both statements without problems', () => {
    // Source: SWIFT User Handbook, Standards MT General Information: blocks {1:} {2:} {4: … -} {5:}
    expect(result.problems).toEqual([]);
    expect(result.format).toBe('mt940');
    expect(result.statements.map((s) => s.statementId)).toEqual(['TESS2412', 'TESS2501']);
  });

  it('removes the spaces of the IBAN in field 25', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 25 (Account Identification, 35x); IBAN without spaces per ISO 13616 electronic format
    expect(result.statements[0]?.account).toEqual({ identifier: 'GB82WEST12345698765432' });
  });

  it('dates an entry booked in the next year (value 31 Dec, entry 0102)', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfields 1 (value date YYMMDD) and 2 (entry date MMDD)
    const rent = result.statements[0]?.entries[1];
    expect(rent).toMatchObject({ bookingDate: '2025-01-02', valueDate: '2024-12-31', amount: -100000 });
    expect(rent).toMatchObject({
      reference: 'RENT-2025-01',
      bankRef: 'RNT0002',
      typeCode: 'NTRF',
      source: { line: 9 },
    });
  });

  it('dates an entry booked in the previous year (value 3 Jan, entry 1231)', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 2 (entry date MMDD)
    const kiln = result.statements[0]?.entries[2];
    expect(kiln).toMatchObject({
      bookingDate: '2024-12-31',
      valueDate: '2025-01-03',
      amount: -4590,
      reference: '000123',
    });
  });

  it('reads a ?NN field 86 cut at 65 characters', () => {
    // Source: DFÜ-Abkommen Anlage 3, 8.2.4 "Strukturierte Belegung des Feldes 86": ?20–?29 purpose, ?32 name
    expect(result.statements[0]?.entries[0]).toEqual({
      bookingDate: '2024-12-30',
      valueDate: '2024-12-30',
      amount: 12050,
      description: 'Saturday market sales',
      counterparty: 'Market Stall Cooperative',
      bankRef: 'MKT0001',
      status: 'booked',
      typeCode: 'NMSC',
      source: { line: 6 },
    });
  });

  it('emits the opening balance at the end of its day when it is dated before the first entry', () => {
    // Source: SWIFT User Handbook, Category 9, field 60F usage rule: it must be the same as field 62F of the previous statement (so it is dated with that closing day)
    const [s1, s2] = result.statements;
    expect(s1?.balances[0]).toEqual({
      kind: 'opening',
      date: '2024-12-29',
      at: 'end',
      amount: 250000,
      source: { line: 5 },
    });
    expect(s2?.balances[0]).toEqual({
      kind: 'opening',
      date: '2025-01-02',
      at: 'end',
      amount: 157460,
      source: { line: 21 },
    });
    expect([s1?.from, s1?.to, s2?.from, s2?.to]).toEqual(['2024-12-30', '2025-01-02', '2025-01-03', '2025-01-03']);
  });

  it('emits the opening balance at the start of its day when a bank dates it with the first entry day', () => {
    // Common practice, no source: some banks date 60F with the first day of the statement rather than the previous closing day
    const r = parse(statement({ '60F': ':60F:C250203EUR100,00' }));
    expect(r.statements[0]?.balances[0]).toMatchObject({ kind: 'opening', date: '2025-02-03', at: 'start' });
    expect(r.statements[0]?.from).toBe('2025-02-03');
    const empty = parse(statement({ '60F': ':60F:C250203EUR87,50', '61': null, '86': null }));
    expect(empty.statements[0]?.balances[0]).toMatchObject({ date: '2025-02-03', at: 'start' });
  });

  it('reads 62F as closing and 64/65 as available', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, fields 62a (closing balance), 64 (closing available balance), 65 (forward available balance)
    expect(result.statements[0]?.balances.slice(1)).toEqual([
      { kind: 'closing', date: '2025-01-02', at: 'end', amount: 157460, source: { line: 13 } },
      { kind: 'available', date: '2025-01-02', at: 'end', amount: 157460, source: { line: 14 } },
      { kind: 'available', date: '2025-01-03', at: 'end', amount: 157460, source: { line: 15 } },
    ]);
  });

  it('reads the same statements from LF text and without the wrappers', () => {
    // Source: SWIFT User Handbook, Standards MT General Information (CrLf line ends); Common practice, no source: bank exports also use LF and drop the block wrappers
    const text = fixture('two-messages-wrapped.sta');
    const lf = parse(text.replace(/\r\n/g, '\n'));
    expect(lf.statements).toEqual(result.statements);
    // Wrapper lines become blank lines so that line numbers stay the same.
    const unwrapped = text.replace(/^\{1:.*\{4:$/gm, '').replace(/^-\}.*$/gm, '-');
    expect(unwrapped).not.toMatch(/[{}]/);
    const bare = parse(unwrapped);
    expect(bare.problems).toEqual([]);
    expect(bare.statements).toEqual(result.statements);
    const oneLine = parse(text.replace(/\{4:\r\n:20:/g, '{4::20:'));
    expect(oneLine.statements.map((s) => s.entries.length)).toEqual([3, 2]);
  });
});

describe('separated messages without wrappers (LF)', () => {
  const result = parse(fixture('separators-lf.sta'));

  it('skips the header line with a notice only', () => {
    // Common practice, no source: bank exports may start with header lines before the first field
    expect(result.problems).toEqual([
      { file: 'test.sta', line: 1, message: 'line 1 is outside any MT940 field and ignored', severity: 'notice' },
    ]);
  });

  it('splits BIC/IBAN in field 25', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 25 (35x)
    expect(result.statements[0]?.account).toEqual({ identifier: 'DE89370400440532013000', servicer: 'ABCDDEFFXXX' });
  });

  it('reads the funds code, slash code words cut inside a word, and keeps the owner reference', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61 subfields 3–8; field 86 6*65x
    // Common practice, no source: /EREF/ /ORDP//NAME/ /REMI/USTD// code words in field 86
    expect(result.statements[0]?.entries[0]).toMatchObject({
      amount: 200000,
      description: 'Owner draw March',
      counterparty: 'Tessellate Ceramics',
      reference: 'SALARY-03',
      bankRef: 'ST0301',
    });
  });

  it('appends supplementary details to a multi-line field 86', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61 subfield 9 (34x, supplementary details) and field 86 (6*65x)
    expect(result.statements[0]?.entries[1]).toMatchObject({
      bookingDate: '2025-03-04',
      amount: -6430,
      description: 'Household electricity March instalment Direct debit 2025-03',
      reference: 'GRID-ELEC-03',
      typeCode: 'NDDT',
    });
  });

  it('signs RD as a credit and RC as a debit and drops NONREF', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 3: RD reversal of debit (credit entry), RC reversal of credit (debit entry)
    const [, , rd, rc] = result.statements[0]?.entries ?? [];
    expect(rd).toMatchObject({ amount: 1200, description: 'Returned direct debit' });
    expect(rd).not.toHaveProperty('reference');
    expect(rc).toMatchObject({ amount: -250 });
  });

  it('keeps a statement split into 62M/60M as interim and opening balances', () => {
    // Source: SWIFT User Handbook, Category 9, field 60a usage rule: the first message of a statement carries 60F, further messages 60M; 62M is the intermediate closing balance
    const [first, second] = result.statements;
    expect(first?.balances.map((b) => [b.kind, b.date, b.at, b.amount])).toEqual([
      ['opening', '2025-02-28', 'end', -15025],
      ['interim', '2025-03-06', 'end', 179495],
    ]);
    expect(second?.balances.map((b) => [b.kind, b.date, b.at, b.amount])).toEqual([
      ['opening', '2025-03-06', 'end', 179495],
      ['closing', '2025-03-10', 'end', 170000],
      ['available', '2025-03-10', 'end', 170000],
    ]);
  });
});

describe('currencies', () => {
  it('reads a currency without minor units', () => {
    // Source: ISO 4217 (JPY has 0 minor units); SWIFT User Handbook, Category 9, field 60a rule C03
    const r = parse(fixture('jpy.sta'));
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.currency).toBe('JPY');
    expect(r.statements[0]?.entries[0]?.amount).toBe(-1500);
    expect(r.statements[0]?.balances.map((b) => b.amount)).toEqual([100000, 98500]);
    const decimals = parse(fixture('jpy.sta').replace('D1500,', 'D1500,5'));
    expect(errors(decimals)[0]).toMatchObject({
      line: 5,
      message: 'field 61: amount "1500,5" has 1 decimals, JPY allows 0 (ISO 4217)',
    });
  });

  it('refuses mixed and unknown currencies', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a/62a network validated rules: ISO 4217 currency (T52); one statement has one currency (C27)
    const mixed = parse(statement({ '62F': ':62F:C250203USD87,50' }));
    expect(errors(mixed)).toEqual([
      expect.objectContaining({ line: 7, message: expect.stringMatching(/field 62F: currency USD differs from EUR/) }),
    ]);
    const unknown = parse(statement({ '60F': ':60F:C250131EUX100,00' }));
    expect(errors(unknown)[0]).toMatchObject({
      line: 4,
      message: 'field 60F: currency "EUX" is not an ISO 4217 code (3!a)',
    });
  });
});

describe('problems', () => {
  it('names file, line and field for a malformed amount', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 5 (Amount, 15d with decimal comma)
    const r = parse(statement({ '61': ':61:250203D12.5NTRFNONREF' }), 'march.sta');
    expect(errors(r)).toEqual([
      {
        file: 'march.sta',
        line: 5,
        message: 'field 61: amount "12.5" uses a point, expected a decimal comma (15d)',
        severity: 'error',
      },
    ]);
    expect(hasErrors(r)).toBe(true);
  });

  it('reports each missing mandatory field', () => {
    // Source: SWIFT User Handbook, Category 9, MT940 format specifications: 20, 25, 28C, 60a and 62a are mandatory
    for (const [tag, pattern] of [
      ['25', /field 25 \(account identification\) is missing/],
      ['28C', /field 28C \(statement number\) is missing/],
      ['60F', /field 60F or 60M \(opening balance\) is missing/],
      ['62F', /field 62F or 62M \(closing balance\) is missing; the file may be truncated/],
    ] as const) {
      const r = parse(statement({ [tag]: null }));
      expect(errors(r), tag).toContainEqual(
        expect.objectContaining({ line: 1, message: expect.stringMatching(pattern) }),
      );
    }
    const no20 = parse(statement({ '20': null }));
    expect(errors(no20)[0]).toMatchObject({
      line: 1,
      message: expect.stringMatching(/field 25: comes before any field 20/),
    });
  });

  it('refuses an impossible date in a balance', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a: Date must be a valid date YYMMDD (T50)
    const r = parse(statement({ '60F': ':60F:C250431EUR100,00' }));
    expect(errors(r)[0]).toMatchObject({
      line: 4,
      message: 'field 60F: date "250431" is not a calendar date (YYMMDD) (6!n)',
    });
  });

  it('refuses a truncated file', () => {
    // Source: SWIFT User Handbook, Category 9, MT940: 62a mandatory; Standards MT General Information: block 4 ends with -}
    const r = parse(fixture('truncated.sta'), 'truncated.sta');
    expect(errors(r).map((p) => [p.line, p.message])).toEqual([
      [17, "block 4 opened on line 17 is not closed with '-}'; the file may be truncated"],
      [
        18,
        'statement "TESS2501" (field 20, line 18): field 62F or 62M (closing balance) is missing; the file may be truncated',
      ],
      [23, 'field 61: amount "74" has no decimal comma, expected e.g. "74," (15d: the comma is mandatory)'],
    ]);
  });

  it('refuses text that is not MT940', () => {
    // Source: SWIFT User Handbook, Category 9, MT940: a statement is a sequence of :TAG: fields
    for (const text of ['', 'hello world', 'Date,Amount\n2025-01-01,1.00']) {
      const r = parse(text);
      expect(errors(r)).toEqual([
        expect.objectContaining({
          file: 'test.sta',
          line: 1,
          message: expect.stringMatching(/^no MT940 fields found/),
        }),
      ]);
      expect(r.statements).toEqual([]);
    }
  });

  it('refuses fields out of order and repeated', () => {
    // Source: SWIFT User Handbook, Category 9, MT940 format specifications: order 20, 21, 25, 28C, 60a, (61, 86)*, 62a, 64, 65, 86
    const after = parse(statement({ '62F': ':62F:C250203EUR87,50\n:61:250203C1,NTRFNONREF' }));
    expect(errors(after)[0]?.message).toMatch(/statement line after the closing balance/);
    const twice = parse(statement({ '25': ':25:0123456789\n:25:999' }));
    expect(errors(twice)[0]?.message).toMatch(/field 25: appears again/);
    const extraLine = parse(statement({ '28C': ':28C:1/1\nstray text' }));
    expect(errors(extraLine)[0]).toMatchObject({
      line: 4,
      message: 'field 28C: unexpected second line "stray text"; the field has one line',
    });
  });

  it('notes a closing balance that does not follow from the entries, without refusing', () => {
    // Source: SWIFT User Handbook, Category 9, MT940: 62a is the opening balance plus the statement lines; Ebbline reconciles in the ledger and only notes it here
    const r = parse(statement({ '62F': ':62F:C250203EUR87,00' }));
    expect(hasErrors(r)).toBe(false);
    expect(r.problems).toEqual([
      expect.objectContaining({
        line: 7,
        severity: 'notice',
        message: expect.stringMatching(
          /100.00 EUR plus the entries \(-12.50 EUR\) is 87.50 EUR, but the closing balance is 87.00 EUR/,
        ),
      }),
    ]);
  });

  it('skips MT942 fields with a notice', () => {
    // Source: SWIFT User Handbook, Category 9, MT942 fields 34F, 13D, 90D, 90C are not part of MT940
    const r = parse(statement({ '28C': ':28C:1/1\n:13D:2502031200+0100' }));
    expect(hasErrors(r)).toBe(false);
    expect(r.problems[0]).toMatchObject({
      line: 4,
      severity: 'notice',
      message: 'field 13D: not part of MT940; ignored',
    });
  });
});
