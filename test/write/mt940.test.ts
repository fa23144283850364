import { describe, expect, it } from 'vitest';
import { mt940Reference, mt940Text, wrapField86, writeMt940 } from '../../engine/write/mt940';
import { mt940Importer } from '../../engine/import/mt940';
import { isSwiftX } from '../../engine/import/mt940/swiftCharset';
import type { ParsedStatement, StatementEntry } from '../../engine/import/types';

const entry = (over: Partial<StatementEntry>): StatementEntry => ({
  bookingDate: '2025-02-03',
  amount: -1250,
  description: 'Glaze order',
  status: 'booked',
  source: {},
  ...over,
});

const statement = (over: Partial<ParsedStatement> = {}): ParsedStatement => ({
  account: { identifier: 'GB82WEST12345698765432' },
  currency: 'EUR',
  statementId: 'REF1',
  entries: [entry({})],
  balances: [
    { kind: 'opening', date: '2025-01-31', at: 'end', amount: 10000, source: {} },
    { kind: 'closing', date: '2025-02-03', at: 'end', amount: 8750, source: {} },
  ],
  ...over,
});

const lines = (text: string): string[] => text.split('\r\n').slice(0, -1);

describe('writeMt940 layout', () => {
  it('writes the mandatory fields in order with CrLf line ends', () => {
    // Source: SWIFT User Handbook, Category 9, MT940 format specifications: 20, 25, 28C, 60a, 61, 86, 62a; Standards MT General Information: lines end with CrLf
    expect(writeMt940([statement()])).toBe(
      [
        ':20:REF1',
        ':25:GB82WEST12345698765432',
        ':28C:1',
        ':60F:C250131EUR100,00',
        ':61:250203D12,50NMSCNONREF',
        ':86:Glaze order',
        ':62F:C250203EUR87,50',
        '-',
        '',
      ].join('\r\n'),
    );
  });

  it('wraps each statement in SWIFT blocks on request', () => {
    // Source: SWIFT User Handbook, Standards MT General Information: {1: basic header}{2: application header}{4: text block ending in CrLf-}
    const out = lines(writeMt940([statement(), statement({ statementId: 'REF2' })], { blockWrappers: true }));
    expect(out.filter((l) => l.startsWith('{1:'))).toEqual([
      '{1:F01XXXXXXXXAXXX0000000000}{2:I940XXXXXXXXXXXXN}{4:',
      '{1:F01XXXXXXXXAXXX0000000000}{2:I940XXXXXXXXXXXXN}{4:',
    ]);
    expect(out.filter((l) => l === '-}')).toHaveLength(2);
    expect(out[out.length - 1]).toBe('-}');
    const bic = lines(
      writeMt940([statement({ account: { identifier: '123456', servicer: 'ABCDGB22' } })], { blockWrappers: true }),
    );
    expect(bic[0]).toBe('{1:F01ABCDGB22AXXX0000000000}{2:I940XXXXXXXXXXXXN}{4:');
    expect(bic[2]).toBe(':25:ABCDGB22/123456');
  });

  it('writes the entry date only when it differs from the value date, and never RC/RD', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 2 (optional entry date) and subfield 3 (C, D; RC/RD only for reversals)
    const out = lines(
      writeMt940([
        statement({
          entries: [
            entry({ bookingDate: '2025-01-02', valueDate: '2024-12-31', amount: 500, reference: 'R1', bankRef: 'B1' }),
            entry({ bookingDate: '2025-02-03', valueDate: '2025-02-03', amount: 0, typeCode: 'NCHK' }),
          ],
          balances: [
            { kind: 'opening', date: '2024-12-31', at: 'end', amount: 0, source: {} },
            { kind: 'closing', date: '2025-02-03', at: 'end', amount: 500, source: {} },
          ],
        }),
      ]),
    );
    const sixtyOne = out.filter((l) => l.startsWith(':61:'));
    expect(sixtyOne).toEqual([':61:2412310102C5,00NMSCR1//B1', ':61:250203C0,00NCHKNONREF']);
    expect(sixtyOne.every((l) => !/^:61:\d{6,10}R[CD]/.test(l))).toBe(true);
  });

  it('writes amounts with a decimal comma and the currency digits, debits as D', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a and field 61 subfield 5 (15d, decimal comma); ISO 4217 exponents JPY 0, KWD 3
    const jpy = lines(
      writeMt940([
        statement({
          currency: 'JPY',
          entries: [entry({ amount: -1500 })],
          balances: [{ kind: 'opening', date: '2025-01-31', at: 'end', amount: -100, source: {} }],
        }),
      ]),
    );
    expect(jpy).toContain(':60F:D250131JPY100,');
    expect(jpy).toContain(':61:250203D1500,NMSCNONREF');
    expect(jpy).toContain(':62F:D250203JPY1600,');
    const kwd = lines(writeMt940([statement({ currency: 'KWD', entries: [entry({ amount: 1 })] })]));
    expect(kwd).toContain(':61:250203C0,001NMSCNONREF');
  });

  it('dates an opening at the start of a day with the previous day, as 60F does', () => {
    // Source: SWIFT User Handbook, Category 9, field 60F usage rule: the opening balance is the previous statement's 62F, dated with that closing day
    const out = lines(
      writeMt940([
        statement({
          balances: [
            { kind: 'opening', date: '2025-02-01', at: 'start', amount: 10000, source: {} },
            { kind: 'closing', date: '2025-02-03', at: 'end', amount: 8750, source: {} },
            { kind: 'available', date: '2025-02-03', at: 'end', amount: 8000, source: {} },
            { kind: 'available', date: '2025-02-05', at: 'end', amount: 7000, source: {} },
            { kind: 'available', date: '2025-02-04', at: 'end', amount: 7500, source: {} },
          ],
        }),
      ]),
    );
    expect(out).toContain(':60F:C250131EUR100,00');
    expect(out.slice(-5)).toEqual([
      ':62F:C250203EUR87,50',
      ':64:C250203EUR80,00',
      ':65:C250204EUR75,00',
      ':65:C250205EUR70,00',
      '-',
    ]);
  });

  it('derives a missing opening or closing balance from the other and the entries', () => {
    // Source: SWIFT User Handbook, Category 9, MT940: 60a and 62a are mandatory; closing = opening + statement lines
    const closingOnly = lines(
      writeMt940([
        statement({ balances: [{ kind: 'closing', date: '2025-02-03', at: 'end', amount: 8750, source: {} }] }),
      ]),
    );
    expect(closingOnly).toContain(':60F:C250202EUR100,00');
    const openingOnly = lines(
      writeMt940([
        statement({ balances: [{ kind: 'opening', date: '2025-01-31', at: 'end', amount: 10000, source: {} }] }),
      ]),
    );
    expect(openingOnly).toContain(':62F:C250203EUR87,50');
  });

  it('puts the counterparty into /NAME/ and keeps text that looks structured as free text', () => {
    // Common practice, no source: /NAME/ and /REMI/ code words in field 86
    const out = lines(
      writeMt940([
        statement({
          entries: [
            entry({ description: 'Rent March', counterparty: 'Studio Landlord' }),
            entry({ description: '/NAME/ not a name' }),
            entry({ description: '123?20 not sub-fields' }),
            entry({ description: '' }),
          ],
        }),
      ]),
    );
    expect(out.filter((l) => l.startsWith(':86:'))).toEqual([
      ':86:/NAME/Studio Landlord/REMI/Rent March',
      ':86:/Name/ not a name',
      ':86:/REMI/123?20 not sub-fields',
    ]);
  });

  it('refuses what MT940 cannot say', () => {
    // Source: SWIFT User Handbook, Category 9, MT940: 25, 60a and 62a mandatory; ISO 4217 currency; field 61 subfield 2 has no year (Ebbline allows 182 days)
    expect(() => writeMt940([statement({ currency: 'EUX' })])).toThrow(
      expect.objectContaining({ code: 'UNKNOWN_CURRENCY' }),
    );
    expect(() => writeMt940([statement({ balances: [] })])).toThrow(
      expect.objectContaining({ code: 'INVALID_ARGUMENT' }),
    );
    expect(() => writeMt940([statement({ account: {} })])).toThrow(
      expect.objectContaining({ code: 'INVALID_ARGUMENT' }),
    );
    expect(() => writeMt940([statement({ entries: [entry({ valueDate: '2024-06-01' })] })])).toThrow(
      /days from value date/,
    );
    expect(() => writeMt940([statement({ entries: [entry({ bookingDate: '2080-01-01' })] })])).toThrow(
      expect.objectContaining({ code: 'INVALID_DATE' }),
    );
    expect(writeMt940([])).toBe('');
  });
});

describe('SWIFT X text', () => {
  it('transliterates descriptions, references and the account', () => {
    // Source: SWIFT User Handbook, Standards MT General Information, X character set
    const text = writeMt940([
      statement({
        account: { identifier: 'Konto Nº 12 – Größe' },
        statementId: 'Mär/2025',
        entries: [
          entry({ description: 'Café “Blau” & Söhne; 20 € @ home_', counterparty: 'Łódź Ørsted', reference: 'ÄB//CD' }),
        ],
      }),
    ]);
    for (const line of lines(text)) expect(isSwiftX(line), line).toBe(true);
    expect(text).toContain(":86:/NAME/Lodz Orsted/REMI/Cafe 'Blau' + Sohne, 20 EUR (at) home-");
    expect(text).toContain(':61:250203D12,50NMSCAB/CD');
    expect(text).toContain(':25:Konto No 12 - Grosse');
    expect(mt940Text('a  /NAME/b/REMI')).toBe('a /Name/b/Remi');
    expect(mt940Text('USTD//x')).toBe('Ustd//x');
    expect(mt940Reference('/abc//def/')).toBe('abc/def');
    expect(mt940Reference(' ')).toBeUndefined();
    expect(mt940Reference('12345678901234567890')).toBe('1234567890123456');
  });
});

describe('field 86 wrapping', () => {
  const join = (ls: string[]) =>
    ls.reduce((acc, l, i) => (i === 0 ? l : acc + ((ls[i - 1] as string).length >= 65 ? '' : ' ') + l), '');

  it('keeps lines at 65 characters and never starts a line with ":" or "-"', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 86 (6*65x); From memory: SWIFT Standards MT General Information, a line must not start with ':' or '-'
    const text = mt940Text(`${'studio '.repeat(9)}x:20:abc -dash ${'y'.repeat(64)}-z :61: end`);
    const wrapped = wrapField86(text);
    expect(wrapped.every((l) => l.length <= 65)).toBe(true);
    expect(wrapped.slice(1).every((l) => !/^[:-]/.test(l))).toBe(true);
    expect(join(wrapped).replace(/ {2,}/g, ' ')).toBe(text);
  });

  it('continues past six lines instead of cutting (documented deviation)', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 86 allows 6*65x; Ebbline writes further lines rather than lose text
    const text = 'kiln '.repeat(100).trim();
    const wrapped = wrapField86(text);
    expect(wrapped.length).toBeGreaterThan(6);
    const parsed = mt940Importer.parse(writeMt940([statement({ entries: [entry({ description: text })] })]), {
      fileName: 'w.sta',
    });
    expect(parsed.statements[0]?.entries[0]?.description).toBe(text);
  });

  it('inserts a space only in a run of over 64 characters that must be cut before ":" or "-"', () => {
    // From memory: SWIFT Standards MT General Information, a line must not start with ':' or '-' (the one case the writer changes text)
    const text = 'x'.repeat(65) + '-y';
    const wrapped = wrapField86(text);
    expect(wrapped).toEqual(['x'.repeat(64), 'x-y']);
    expect(join(wrapped)).toBe('x'.repeat(64) + ' x-y');
  });
});
