import { describe, expect, it } from 'vitest';
import {
  expandSwiftYear,
  formatSwiftDate,
  parseSwiftDate,
  resolveEntryDate,
} from '../../engine/import/mt940/swiftDate';
import { formatSwiftAmount, parseSwiftAmount } from '../../engine/import/mt940/swiftAmount';
import { parseStatementLine, signedAmount } from '../../engine/import/mt940/statementLine';
import { parseBalanceField } from '../../engine/import/mt940/balanceField';
import { isValidIban, parseAccountIdentification } from '../../engine/import/mt940/accountIdentification';
import { interpretOwnerInformation, joinWrappedLines } from '../../engine/import/mt940/ownerInformation';
import { isSwiftX, toSwiftX } from '../../engine/import/mt940/swiftCharset';
import { tokenizeMt940 } from '../../engine/import/mt940/tokenizeMt940';

/** A field 61 as the tokenizer gives it, starting on line 10. */
function line61(...lines: string[]) {
  return { tag: '61', line: 10, lines: lines.map((text, i) => ({ text, line: 10 + i })) };
}

describe('YYMMDD dates', () => {
  it('reads valid dates and refuses impossible ones', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61 network validated rules: subfield 1 must be a valid date YYMMDD (T50)
    expect(parseSwiftDate('250131')).toEqual({ date: '2025-01-31' });
    expect(parseSwiftDate('250431')).toEqual({ error: '"250431" is not a calendar date (YYMMDD)' });
    expect(parseSwiftDate('250229')).toHaveProperty('error');
    expect(parseSwiftDate('240229')).toEqual({ date: '2024-02-29' });
    expect(parseSwiftDate('2501')).toHaveProperty('error');
  });

  it('expands two-digit years with the documented pivot 80', () => {
    // Common practice, no source: SWIFT dates carry no century; Ebbline's pivot (swiftDate.ts) reads 80–99 as 19xx, 00–79 as 20xx
    expect(expandSwiftYear(80)).toBe(1980);
    expect(expandSwiftYear(99)).toBe(1999);
    expect(expandSwiftYear(0)).toBe(2000);
    expect(expandSwiftYear(79)).toBe(2079);
    expect(parseSwiftDate('991231')).toEqual({ date: '1999-12-31' });
    expect(formatSwiftDate('1980-01-01')).toBe('800101');
    expect(() => formatSwiftDate('2080-01-01')).toThrow(/1980–2079/);
    expect(() => formatSwiftDate('1979-12-31')).toThrow(/1980–2079/);
  });

  it('gives the MMDD entry date the year nearest the value date', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 2 (Entry Date, 4!n MMDD): the entry date may fall in the next or previous year
    expect(resolveEntryDate('2024-12-31', '0102')).toEqual({ date: '2025-01-02' });
    expect(resolveEntryDate('2025-01-02', '1231')).toEqual({ date: '2024-12-31' });
    expect(resolveEntryDate('2025-06-15', '0616')).toEqual({ date: '2025-06-16' });
    expect(resolveEntryDate('2025-03-01', '0229')).toHaveProperty('error');
    expect(resolveEntryDate('2024-03-01', '0229')).toEqual({ date: '2024-02-29' });
    expect(resolveEntryDate('2025-01-02', '1332')).toHaveProperty('error');
  });
});

describe('15d amounts', () => {
  it('reads a decimal comma and refuses a point', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a/62a network validated rules: the decimal comma is mandatory, the integer part has at least one digit (T40, T43)
    expect(parseSwiftAmount('1234,5', 'EUR')).toEqual({ minor: 123450 });
    expect(parseSwiftAmount('0,', 'EUR')).toEqual({ minor: 0 });
    expect(parseSwiftAmount('12,00', 'EUR')).toEqual({ minor: 1200 });
    expect(parseSwiftAmount('12.5', 'EUR')).toEqual({
      error: 'amount "12.5" uses a point, expected a decimal comma (15d)',
    });
    expect(parseSwiftAmount('1.234,56', 'EUR')).toHaveProperty('error');
    expect(parseSwiftAmount('1250', 'EUR')).toHaveProperty('error');
    expect(parseSwiftAmount(',50', 'EUR')).toHaveProperty('error');
    expect(parseSwiftAmount('1,2,3', 'EUR')).toHaveProperty('error');
    expect(parseSwiftAmount('1234567890123,45', 'EUR')).toHaveProperty('error'); // 16 characters
    expect(parseSwiftAmount('123456789012,45', 'EUR')).toEqual({ minor: 12345678901245 }); // 15 characters
  });

  it('refuses more decimals than the currency has', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a network validated rules: digits after the comma must not exceed the currency's maximum (C03); exponents per ISO 4217 (EUR 2, JPY 0, KWD 3)
    expect(parseSwiftAmount('12,345', 'EUR')).toEqual({
      error: 'amount "12,345" has 3 decimals, EUR allows 2 (ISO 4217)',
    });
    expect(parseSwiftAmount('12,345', 'KWD')).toEqual({ minor: 12345 });
    expect(parseSwiftAmount('1500,', 'JPY')).toEqual({ minor: 1500 });
    expect(parseSwiftAmount('1500,0', 'JPY')).toHaveProperty('error');
  });

  it('writes amounts with a decimal comma and the currency digits', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a: 15d amount with mandatory decimal comma
    expect(formatSwiftAmount(123450, 'EUR')).toBe('1234,50');
    expect(formatSwiftAmount(0, 'EUR')).toBe('0,00');
    expect(formatSwiftAmount(5, 'JPY')).toBe('5,');
    expect(formatSwiftAmount(1, 'KWD')).toBe('0,001');
    expect(() => formatSwiftAmount(-1, 'EUR')).toThrow();
    expect(() => formatSwiftAmount(1, 'XYZ')).toThrow();
  });
});

describe('field 61 statement line', () => {
  it('reads a published example line', () => {
    // Source: CDCP (Czech central securities depository) developer documentation cdcp_dev_210531, MT940 tag 61 example "0901230122C3500,25FCHK304955//4958843"
    const r = parseStatementLine(line61('0901230122C3500,25FCHK304955//4958843'), 'CZK');
    expect(r.problems).toEqual([]);
    expect(r.statementLine).toEqual({
      valueDate: '2009-01-23',
      entryDate: '2009-01-22',
      mark: 'C',
      amount: 350025,
      typeCode: 'FCHK',
      ownerReference: '304955',
      servicerReference: '4958843',
    });
  });

  it('signs reversals: RD is a credit, RC a debit', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 3 (Debit/Credit Mark): RC reversal of credit (debit entry), RD reversal of debit (credit entry)
    expect(parseStatementLine(line61('250102RD10,NTRFNONREF'), 'EUR').statementLine?.amount).toBe(1000);
    expect(parseStatementLine(line61('250102RC10,NTRFNONREF'), 'EUR').statementLine?.amount).toBe(-1000);
    expect(parseStatementLine(line61('250102D10,NTRFNONREF'), 'EUR').statementLine?.amount).toBe(-1000);
    expect(parseStatementLine(line61('250102C10,NTRFNONREF'), 'EUR').statementLine?.amount).toBe(1000);
    expect(signedAmount('D', 0)).toBe(0);
  });

  it('tells the funds code from the mark', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfield 4 (Funds Code): third character of the currency code, if needed
    const credit = parseStatementLine(line61('250102CR10,NTRFNONREF'), 'EUR');
    expect(credit.statementLine).toMatchObject({ mark: 'C', fundsCode: 'R', amount: 1000 });
    expect(credit.problems).toEqual([]);
    const reversal = parseStatementLine(line61('2501020102RCR10,NTRFNONREF'), 'EUR');
    expect(reversal.statementLine).toMatchObject({ mark: 'RC', fundsCode: 'R', amount: -1000 });
    const debitUsd = parseStatementLine(line61('250102DD7,5NCHK12345'), 'USD');
    expect(debitUsd.statementLine).toMatchObject({ mark: 'D', fundsCode: 'D', amount: -750, typeCode: 'NCHK' });
    const wrong = parseStatementLine(line61('250102CX10,NTRFNONREF'), 'EUR');
    expect(wrong.statementLine?.amount).toBe(1000);
    expect(wrong.problems[0]).toMatchObject({ severity: 'notice' });
    expect(wrong.problems[0]?.message).toMatch(/funds code "X"/);
  });

  it('reads references, servicer reference and supplementary details', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61, subfields 7 (16x), 8 ([//16x]) and 9 ([34x], second line)
    const r = parseStatementLine(line61('250102D12,5NTRFINV-2025-17//BANK0001', 'Card 1234 market'), 'EUR');
    expect(r.statementLine).toMatchObject({
      ownerReference: 'INV-2025-17',
      servicerReference: 'BANK0001',
      supplementary: 'Card 1234 market',
    });
    expect(parseStatementLine(line61('250102D12,5S103NONREF'), 'EUR').statementLine?.typeCode).toBe('S103');
  });

  it('names the subfield and what was expected when a line is malformed', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 61 format 6!n[4!n]2a[1!a]15d1!a3!c16x[//16x][34x]
    const msg = (text: string, currency = 'EUR') => parseStatementLine(line61(text), currency).problems[0]?.message;
    expect(msg('250102D12.5NTRFNONREF')).toBe('field 61: amount "12.5" uses a point, expected a decimal comma (15d)');
    expect(msg('250431D12,5NTRFNONREF')).toMatch(/value date "250431" is not a calendar date \(subfield 1/);
    expect(msg('2501D12,5NTRFNONREF')).toMatch(/value date "2501D1" is not 6 digits \(subfield 1/);
    expect(msg('25010201D12,5NTRFNONREF')).toMatch(/entry date "01D1" is not 4 digits \(subfield 2/);
    expect(msg('2501021399D12,5NTRFNONREF')).toMatch(/entry date "1399" is not a month and day.*subfield 2/);
    expect(msg('250102X12,5NTRFNONREF')).toMatch(/debit\/credit mark "X1" is not C, D, RC or RD \(subfield 3/);
    expect(msg('250102EC12,5NTRFNONREF')).toMatch(/MT942.*subfield 3/);
    expect(msg('250102DNTRFNONREF')).toMatch(/funds code|amount/);
    expect(msg('250102D12,5XTRFNONREF')).toMatch(/transaction type "XTRF" is not S, N or F.*subfield 6/);
    expect(msg('250102D12,5NTRF')).toMatch(/reference for the account owner is missing.*subfield 7/);
    expect(msg('250102D12,555NTRFNONREF')).toMatch(/3 decimals, EUR allows 2/);
    expect(msg('250102D')).toMatch(/amount expected at nothing/);
    expect(parseStatementLine(line61('250102D1,NTRFNONREF', 'a', 'b'), 'EUR').problems[0]?.message).toMatch(
      /third line/,
    );
  });
});

describe('balance fields 60a, 62a, 64, 65', () => {
  it('reads mark, date, currency and amount', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a: 1!a6!n3!a15d (D/C Mark)(Date)(Currency)(Amount)
    expect(parseBalanceField('C250131EUR1234,56')).toEqual({ date: '2025-01-31', currency: 'EUR', amount: 123456 });
    expect(parseBalanceField('D250131EUR12,')).toEqual({ date: '2025-01-31', currency: 'EUR', amount: -1200 });
    expect(parseBalanceField('D250131EUR0,')).toEqual({ date: '2025-01-31', currency: 'EUR', amount: 0 });
  });

  it('refuses unknown currencies, bad marks and impossible dates', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 60a network validated rules: D/C mark C or D (T51), valid YYMMDD (T50), ISO 4217 currency (T52)
    expect(parseBalanceField('X250131EUR1,')).toEqual({ error: 'D/C mark "X" is not C or D (1!a)' });
    expect(parseBalanceField('C250431EUR1,')).toHaveProperty(
      'error',
      'date "250431" is not a calendar date (YYMMDD) (6!n)',
    );
    expect(parseBalanceField('C250131EUX1,')).toHaveProperty('error', 'currency "EUX" is not an ISO 4217 code (3!a)');
    expect(parseBalanceField('C250131JPY1,5')).toHaveProperty('error');
    expect(parseBalanceField('')).toHaveProperty('error');
  });
});

describe('field 25 account identification', () => {
  it('removes the spaces of an IBAN and checks it', () => {
    // From memory: DE89 3704 0044 0532 0130 00 is the example IBAN printed in many IBAN guides; check digits per ISO 13616 (ISO 7064 MOD 97-10)
    expect(parseAccountIdentification(['DE89 3704 0044 0532 0130 00'])).toEqual({
      account: { identifier: 'DE89370400440532013000' },
      notices: [],
    });
    // From memory: GB82 WEST 1234 5698 7654 32 is the example IBAN of ISO 13616
    expect(isValidIban('GB82WEST12345698765432')).toBe(true);
    expect(isValidIban('GB83WEST12345698765432')).toBe(false);
    expect(parseAccountIdentification(['GB83WEST12345698765432']).notices[0]).toMatch(/check digits/);
  });

  it('splits BIC/ACCOUNT and bank code/account; keeps plain account numbers', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 25 (35x) and option 25P (account, then identifier code of the account owner)
    expect(parseAccountIdentification(['ABCDDEFFXXX/DE89370400440532013000']).account).toEqual({
      identifier: 'DE89370400440532013000',
      servicer: 'ABCDDEFFXXX',
    });
    expect(parseAccountIdentification(['10020030/1234567']).account).toEqual({
      identifier: '1234567',
      servicer: '10020030',
    });
    expect(parseAccountIdentification(['123-304958', 'ABCDGB22']).account).toEqual({
      identifier: '123-304958',
      servicer: 'ABCDGB22',
    });
    expect(parseAccountIdentification(['/0123456789']).account).toEqual({ identifier: '0123456789' });
    expect(parseAccountIdentification(['ACCOUNT/NO/1']).account).toEqual({ identifier: 'ACCOUNT/NO/1' });
  });
});

describe('field 86 information to account owner', () => {
  it('joins free text lines: no space after a full 65-character line', () => {
    // Source: SWIFT User Handbook, Category 9, MT940, field 86 format 6*65x (six lines of 65 characters)
    const full = 'x'.repeat(64) + 'y';
    expect(joinWrappedLines([full, 'z'], 65)).toBe(full + 'z');
    expect(interpretOwnerInformation(['Rent for', 'studio  March'])).toEqual({ description: 'Rent for studio March' });
  });

  it('reads the ?NN sub-field layout', () => {
    // Source: DFÜ-Abkommen Anlage 3 (Spezifikation der Datenformate), 8.2.4 "Strukturierte Belegung des Feldes 86": ?00 booking text, ?20–?29 purpose, ?32–?33 name; identifiers start a new sub-field and run on without repetition
    const info = interpretOwnerInformation([
      '166?00GUTSCHRIFT?109310?20EREF+E2E-77?21SVWZ+Invoice 2025-017 glaze?22 order for the studio?30ABCDDEFF',
      '?31DE89370400440532013000?32Kiln Supply Partners?33 Ltd',
    ]);
    expect(info).toEqual({
      description: 'Invoice 2025-017 glaze order for the studio',
      counterparty: 'Kiln Supply Partners Ltd',
      reference: 'E2E-77',
    });
    // A 27-character sub-field was cut inside a word and continues without a space.
    expect(interpretOwnerInformation(['020?20ABCDEFGHIJKLMNOPQRSTUVWXYZA?21BC']).description).toBe(
      'ABCDEFGHIJKLMNOPQRSTUVWXYZABC',
    );
    expect(interpretOwnerInformation(['005?00LASTSCHRIFT?20EREF+NOTPROVIDED'])).toEqual({ description: 'LASTSCHRIFT' });
  });

  it('reads slash code words', () => {
    // Common practice, no source: /CODE/value code words (/EREF/, /ORDP//NAME/, /REMI/USTD//) in field 86 as several countries' structured MT940 profiles use them
    expect(
      interpretOwnerInformation([
        '/EREF/INV17/ORDP//NAME/Market Stall Cooperative/ADDR/Somewhere/REMI/USTD//Saturday ',
        'market/',
      ]),
    ).toEqual({ description: 'Saturday market', counterparty: 'Market Stall Cooperative', reference: 'INV17' });
    expect(interpretOwnerInformation(['/NAME/A/B Partners/REMI/Invoice 2025/17'])).toEqual({
      description: 'Invoice 2025/17',
      counterparty: 'A/B Partners',
    });
    expect(interpretOwnerInformation(['/ABC/not a code word'])).toEqual({ description: '/ABC/not a code word' });
  });
});

describe('SWIFT X character set', () => {
  it('transliterates text outside the set', () => {
    // Source: SWIFT User Handbook, Standards MT General Information, X character set: a-z A-Z 0-9 / - ? : ( ) . , ' + space
    expect(toSwiftX('Müller & Söhne – Café')).toBe('Muller + Sohne - Cafe');
    expect(toSwiftX('Straße 5; 20 €')).toBe('Strasse 5, 20 EUR');
    expect(toSwiftX('a\tb\nc')).toBe('a b c');
    expect(toSwiftX('50% *off* #1')).toBe('50. .off. .1');
    expect(isSwiftX("a-z A-Z 0-9 / - ? : ( ) . , ' +")).toBe(true);
    expect(isSwiftX('a_b')).toBe(false);
    expect(isSwiftX(toSwiftX('ŁÓDŹ ĳ ﬁ ø æ þ — “x” [y] {z} <w> \\ | @ ~ ! ='))).toBe(true);
  });
});

describe('tokenizer', () => {
  it('unwraps SWIFT blocks and keeps line numbers', () => {
    // Source: SWIFT User Handbook, Standards MT General Information: block 4 (text) opens with {4: and ends with CrLf-}
    const t = tokenizeMt940(
      '{1:F01ABCDDEFFAXXX0000000000}{2:I940XXXXXXXXXXXXN}{4:\r\n:20:A\r\n:86:x\r\ny\r\n-}{5:{CHK:1}}\r\n',
    );
    expect(t.fields).toEqual([
      { tag: '20', line: 2, lines: [{ text: 'A', line: 2 }] },
      {
        tag: '86',
        line: 3,
        lines: [
          { text: 'x', line: 3 },
          { text: 'y', line: 4 },
        ],
      },
    ]);
    expect(t.problems).toEqual([]);
  });

  it('reports a block 4 that is never closed', () => {
    // Source: SWIFT User Handbook, Standards MT General Information: the text block ends with CrLf-}
    const t = tokenizeMt940('{1:F01ABCDDEFFAXXX0000000000}{4:\n:20:A\n:25:B');
    expect(t.problems).toEqual([
      { line: 1, severity: 'error', message: expect.stringMatching(/not closed with '-}'/) },
    ]);
  });

  it('skips separator lines, blank lines and file headers', () => {
    // Common practice, no source: files without wrappers separate messages with a line holding "-" and some start with a header of a few lines
    const t = tokenizeMt940('HEADER\n940\n:20:A\n\n-\n:20:B\n-');
    expect(t.fields.map((f) => [f.tag, f.line])).toEqual([
      ['20', 3],
      ['20', 6],
    ]);
    expect(t.problems).toEqual([
      { line: 1, severity: 'notice', message: 'lines 1–2 are outside any MT940 field and ignored' },
    ]);
  });
});
