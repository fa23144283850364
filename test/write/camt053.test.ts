import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fromDayNumber, toDayNumber } from '../../engine/core/dates';
import { camt053Importer } from '../../engine/import/camt053';
import { hasErrors, type ParsedStatement, type StatementBalance, type StatementEntry } from '../../engine/import/types';
import { childElement, childElements, elementText, parseXml, type XmlElement } from '../../engine/import/xml';
import { writeCamt053 } from '../../engine/write/camt053';

const base: ParsedStatement = {
  account: { identifier: 'DE00999900001234567890', name: 'Studio', servicer: 'EXMPDEZZXXX' },
  currency: 'EUR',
  statementId: 'S-1',
  from: '2024-03-01',
  to: '2024-03-31',
  entries: [
    {
      bookingDate: '2024-03-04',
      valueDate: '2024-03-05',
      amount: -123456,
      description: 'Rent & <utilities> "March"',
      counterparty: 'Invented Property Ltd',
      reference: 'RENT-03',
      bankRef: 'B-0001',
      status: 'booked',
      typeCode: 'PMNT/ICDT/ESCT',
      source: {},
    },
    {
      bookingDate: '2024-03-08',
      amount: 5000,
      description: 'Market sales',
      counterparty: 'Invented Buyer',
      status: 'pending',
      typeCode: 'NTRF+166',
      source: {},
    },
  ],
  balances: [
    { kind: 'opening', date: '2024-03-01', at: 'start', amount: 200000, source: {} },
    { kind: 'closing', date: '2024-03-31', at: 'end', amount: 76544, source: {} },
  ],
};

function tree(xml: string): XmlElement {
  const r = parseXml(xml);
  if (!r.ok) throw new Error(r.error.message);
  return r.root;
}

function at(el: XmlElement, ...names: string[]): XmlElement {
  return names.reduce<XmlElement>((e, n) => {
    const c = childElement(e, n);
    if (!c) throw new Error(`no ${n} below ${e.name}`);
    return c;
  }, el);
}

function firstEntry(xml: string): XmlElement {
  return at(tree(xml), 'BkToCstmrStmt', 'Stmt', 'Ntry');
}

describe('writeCamt053: version-specific layout', () => {
  it('writes the version’s namespace and a well-formed document', () => {
    // Source: ISO 20022 camt.053 namespaces urn:iso:std:iso:20022:tech:xsd:camt.053.001.NN (REFERENCES.md).
    for (const v of ['001.02', '001.04', '001.06', '001.08', '001.10', '001.13']) {
      const root = tree(writeCamt053([base], { version: v }));
      expect(root.namespace).toBe(`urn:iso:std:iso:20022:tech:xsd:camt.053.${v}`);
      expect(root.localName).toBe('Document');
    }
  });

  it('writes Sts as text before 001.08 and as Sts/Cd from 001.08', () => {
    // Source: ISO 20022 camt.053.001.02 Ntry/Sts (EntryStatus2Code); camt.053.001.08 Ntry/Sts/Cd (EntryStatus1Choice).
    expect(elementText(at(firstEntry(writeCamt053([base], { version: '001.06' })), 'Sts'))).toBe('BOOK');
    expect(elementText(at(firstEntry(writeCamt053([base], { version: '001.08' })), 'Sts', 'Cd'))).toBe('BOOK');
  });

  it('writes the counterparty as Cdtr of a debit, with Pty from 001.08', () => {
    // Source: ISO 20022 camt.053.001.02 TxDtls/RltdPties/Cdtr/Nm; camt.053.001.08 RltdPties/Cdtr/Pty/Nm (Party40Choice).
    const old = at(firstEntry(writeCamt053([base], { version: '001.04' })), 'NtryDtls', 'TxDtls', 'RltdPties', 'Cdtr');
    expect(elementText(at(old, 'Nm'))).toBe('Invented Property Ltd');
    const later = at(
      firstEntry(writeCamt053([base], { version: '001.10' })),
      'NtryDtls',
      'TxDtls',
      'RltdPties',
      'Cdtr',
    );
    expect(elementText(at(later, 'Pty', 'Nm'))).toBe('Invented Property Ltd');
  });

  it('writes TxDtls/Amt and BICFI from 001.04 only', () => {
    // Source: ISO 20022 camt.053.001.02 EntryTransaction2 (no Amt) and FinancialInstitutionIdentification7/BIC;
    // camt.053.001.04 EntryTransaction4/Amt and FinancialInstitutionIdentification8/BICFI.
    const v2 = tree(writeCamt053([base], { version: '001.02' }));
    const v4 = tree(writeCamt053([base], { version: '001.04' }));
    expect(childElement(at(v2, 'BkToCstmrStmt', 'Stmt', 'Ntry', 'NtryDtls', 'TxDtls'), 'Amt')).toBeUndefined();
    expect(elementText(at(v4, 'BkToCstmrStmt', 'Stmt', 'Ntry', 'NtryDtls', 'TxDtls', 'Amt'))).toBe('1234.56');
    expect(elementText(at(v2, 'BkToCstmrStmt', 'Stmt', 'Acct', 'Svcr', 'FinInstnId', 'BIC'))).toBe('EXMPDEZZXXX');
    expect(elementText(at(v4, 'BkToCstmrStmt', 'Stmt', 'Acct', 'Svcr', 'FinInstnId', 'BICFI'))).toBe('EXMPDEZZXXX');
  });

  it('writes Ntry children in the schema’s sequence', () => {
    // Source: ISO 20022 camt.053.001.02 ReportEntry2 sequence: NtryRef, Amt, CdtDbtInd, RvslInd, Sts, BookgDt,
    // ValDt, AcctSvcrRef, Avlbty, BkTxCd, …, NtryDtls, AddtlNtryInf.
    const names = childElements(firstEntry(writeCamt053([base], { version: '001.02' }))).map((e) => e.localName);
    expect(names).toEqual(['Amt', 'CdtDbtInd', 'Sts', 'BookgDt', 'ValDt', 'AcctSvcrRef', 'BkTxCd', 'NtryDtls']);
  });

  it('writes OPBD and CLBD with unsigned amounts and CdtDbtInd', () => {
    // Source: ISO 20022 camt.053.001.02 Bal/Tp/CdOrPrtry/Cd, Bal/Amt (minInclusive 0), Bal/CdtDbtInd.
    const negative: ParsedStatement = {
      ...base,
      balances: [{ kind: 'closing', date: '2024-03-31', at: 'end', amount: -4200, source: {} }],
    };
    const stmt = at(tree(writeCamt053([base, negative], { version: '001.08' })), 'BkToCstmrStmt');
    const [first, second] = childElements(stmt, 'Stmt') as [XmlElement, XmlElement];
    expect(childElements(first, 'Bal').map((b) => elementText(at(b, 'Tp', 'CdOrPrtry', 'Cd')))).toEqual([
      'OPBD',
      'CLBD',
    ]);
    const bal = at(second, 'Bal');
    expect([elementText(at(bal, 'Amt')), elementText(at(bal, 'CdtDbtInd'))]).toEqual(['42.00', 'DBIT']);
  });

  it('writes an end-of-day opening as PRCD, or as OPBD when dated before the first day', () => {
    // Source: ISO 20022 camt.053 BalanceType12Code PRCD (previously closed booked) and OPBD.
    const endOfDay = (from: string | undefined): ParsedStatement => ({
      ...base,
      from,
      balances: [{ kind: 'opening', date: '2024-02-29', at: 'end', amount: 1, source: {} }],
    });
    const code = (s: ParsedStatement): string =>
      elementText(
        at(tree(writeCamt053([s], { version: '001.08' })), 'BkToCstmrStmt', 'Stmt', 'Bal', 'Tp', 'CdOrPrtry', 'Cd'),
      );
    expect(code(endOfDay('2024-03-01'))).toBe('OPBD');
    // Without a stated first day the period is derived (the day after), so OPBD still reads back as end of day.
    expect(code({ ...endOfDay(undefined), entries: [] })).toBe('OPBD');
    // Dated inside the period, OPBD would read back as the start of the day: PRCD keeps "end of day".
    expect(code(endOfDay('2024-02-01'))).toBe('PRCD');
    const back = camt053Importer.parse(writeCamt053([endOfDay('2024-02-01')], { version: '001.08' }), {
      fileName: 'p.xml',
    });
    expect(back.statements[0]?.balances[0]).toMatchObject({ kind: 'opening', at: 'end', date: '2024-02-29' });
  });

  it('splits the description into Ustrd pieces of 140 characters and escapes XML', () => {
    // Source: ISO 20022 camt.053 RmtInf/Ustrd (Max140Text).
    const long = 'é'.repeat(150) + ' < & >';
    const xml = writeCamt053([{ ...base, entries: [{ ...(base.entries[0] as StatementEntry), description: long }] }], {
      version: '001.08',
    });
    const pieces = childElements(at(firstEntry(xml), 'NtryDtls', 'TxDtls', 'RmtInf'), 'Ustrd').map(elementText);
    expect(pieces.map((p) => Array.from(p).length)).toEqual([140, 16]);
    expect(pieces.join('')).toBe(long);
    expect(xml).toContain('&lt; &amp; &gt;');
  });

  it('writes AcctSvcrRef, EndToEndId and the bank transaction code', () => {
    // Source: ISO 20022 camt.053 Ntry/AcctSvcrRef, TxDtls/Refs/EndToEndId, Ntry/BkTxCd/Domn and BkTxCd/Prtry/Cd.
    const xml = writeCamt053([base], { version: '001.08' });
    const ntry = firstEntry(xml);
    expect(elementText(at(ntry, 'AcctSvcrRef'))).toBe('B-0001');
    expect(elementText(at(ntry, 'NtryDtls', 'TxDtls', 'Refs', 'EndToEndId'))).toBe('RENT-03');
    expect(elementText(at(ntry, 'BkTxCd', 'Domn', 'Fmly', 'SubFmlyCd'))).toBe('ESCT');
    const second = childElements(at(tree(xml), 'BkToCstmrStmt', 'Stmt'), 'Ntry')[1] as XmlElement;
    expect(elementText(at(second, 'BkTxCd', 'Prtry', 'Cd'))).toBe('NTRF+166');
    expect(elementText(at(second, 'Sts', 'Cd'))).toBe('PDNG');
  });

  it('uses Othr/Id for identifiers that are not IBANs and replaces characters XML cannot carry', () => {
    // Source: ISO 20022 camt.053 Acct/Id (AccountIdentification4Choice: IBAN | Othr); W3C XML 1.0 §2.2 Char.
    const s: ParsedStatement = {
      ...base,
      account: { identifier: '0012-3456789' },
      entries: [{ ...(base.entries[0] as StatementEntry), description: 'bell\u0007 here' }],
    };
    const xml = writeCamt053([s], { version: '001.08' });
    expect(elementText(at(tree(xml), 'BkToCstmrStmt', 'Stmt', 'Acct', 'Id', 'Othr', 'Id'))).toBe('0012-3456789');
    const back = camt053Importer.parse(xml, { fileName: 'w.xml' });
    expect(back.statements[0]?.entries[0]?.description).toBe('bell\uFFFD here');
  });

  it('refuses unknown versions, currencies and an empty statement list', () => {
    expect(() => writeCamt053([base], { version: '001.01' })).toThrow(/version/);
    expect(() => writeCamt053([base], { version: '1.8' })).toThrow(/version/);
    expect(() => writeCamt053([{ ...base, currency: 'EUX' }], { version: '001.08' })).toThrow(/EUX/);
    expect(() => writeCamt053([], { version: '001.08' })).toThrow(/at least one/);
    expect(() => writeCamt053([base], { version: '001.08', createdAt: 'yesterday' })).toThrow(/createdAt/);
  });
});

// ---- round trip ------------------------------------------------------------------------

const FIRST_DAY = toDayNumber('2019-01-01');
const LAST_DAY = toDayNumber('2030-12-31');

/** Text the writer keeps as is: XML characters, no CR, trimmed as the importer trims. */
function textArb(maxLength: number, minLength = 0): fc.Arbitrary<string> {
  return fc
    .string({ unit: 'grapheme', minLength, maxLength: maxLength + 10 })
    .map((s) =>
      Array.from(s.replace(/[^\t\n\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, ''))
        .slice(0, maxLength)
        .join('')
        .trim(),
    )
    .filter((s) => Array.from(s).length >= minLength);
}

const idArb = (max: number): fc.Arbitrary<string> =>
  fc
    .stringMatching(new RegExp(`^[A-Za-z0-9][A-Za-z0-9/\\-?:().,'+]{0,${max - 1}}$`))
    .filter((s) => s !== 'NOTPROVIDED');

const typeCodeArb = fc.oneof(
  fc.tuple(...[0, 1, 2].map(() => fc.stringMatching(/^[A-Z]{4}$/))).map((parts) => parts.join('/')),
  fc.stringMatching(/^[A-Z0-9+]{1,35}$/),
);

function entryArb(from: number, to: number): fc.Arbitrary<StatementEntry> {
  return fc
    .record(
      {
        booking: fc.integer({ min: from, max: to }),
        value: fc.option(fc.integer({ min: from - 3, max: to + 3 }), { nil: undefined }),
        amount: fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }),
        description: fc.oneof(textArb(20), textArb(420, 141)),
        counterparty: fc.option(textArb(140, 1), { nil: undefined }),
        reference: fc.option(idArb(35), { nil: undefined }),
        bankRef: fc.option(idArb(35), { nil: undefined }),
        status: fc.constantFrom('booked' as const, 'booked' as const, 'pending' as const),
        typeCode: typeCodeArb,
      },
      { requiredKeys: ['booking', 'amount', 'description', 'status', 'typeCode'] },
    )
    .map((r) => {
      const e: { -readonly [K in keyof StatementEntry]: StatementEntry[K] } = {
        bookingDate: fromDayNumber(r.booking),
        amount: r.amount,
        description: r.description,
        status: r.status,
        typeCode: r.typeCode,
        source: {},
      };
      if (r.value !== undefined) e.valueDate = fromDayNumber(r.value);
      if (r.counterparty !== undefined) e.counterparty = r.counterparty;
      if (r.reference !== undefined) e.reference = r.reference;
      if (r.bankRef !== undefined) e.bankRef = r.bankRef;
      return e;
    });
}

const statementArb: fc.Arbitrary<ParsedStatement> = fc
  .record({
    start: fc.integer({ min: FIRST_DAY, max: LAST_DAY - 60 }),
    length: fc.integer({ min: 0, max: 45 }),
    currency: fc.constantFrom('EUR', 'JPY', 'KWD', 'CHF', 'GBP'),
    iban: fc.boolean(),
    number: fc.stringMatching(/^[0-9]{8,20}$/),
    name: fc.option(textArb(70, 1), { nil: undefined }),
    servicer: fc.option(fc.stringMatching(/^[A-Z]{6}[A-Z2-9][A-NP-Z0-9]([A-Z0-9]{3})?$/), { nil: undefined }),
    statementId: idArb(35),
    openingAtEnd: fc.boolean(),
    opening: fc.integer({ min: -1e9, max: 1e9 }),
    interim: fc.boolean(),
    available: fc.boolean(),
  })
  .chain((h) =>
    fc.array(entryArb(h.start, h.start + h.length), { maxLength: 6 }).map((entries): ParsedStatement => {
      const from = fromDayNumber(h.start);
      const to = fromDayNumber(h.start + h.length);
      const closing = h.opening + entries.filter((e) => e.status === 'booked').reduce((t, e) => t + e.amount, 0);
      const balances: StatementBalance[] = [
        h.openingAtEnd
          ? { kind: 'opening', date: fromDayNumber(h.start - 1), at: 'end', amount: h.opening, source: {} }
          : { kind: 'opening', date: from, at: 'start', amount: h.opening, source: {} },
      ];
      if (h.interim) balances.push({ kind: 'interim', date: from, at: 'end', amount: h.opening, source: {} });
      balances.push({ kind: 'closing', date: to, at: 'end', amount: closing, source: {} });
      if (h.available) balances.push({ kind: 'available', date: to, at: 'end', amount: closing, source: {} });
      const account: { identifier: string; name?: string; servicer?: string } = {
        identifier: h.iban ? `DE${h.number.slice(0, 2).padStart(2, '0')}${h.number.padEnd(18, '0')}` : h.number,
      };
      if (h.name !== undefined) account.name = h.name;
      if (h.servicer !== undefined) account.servicer = h.servicer;
      return { account, currency: h.currency, statementId: h.statementId, from, to, entries, balances };
    }),
  );

function withoutSource(s: ParsedStatement): unknown {
  return {
    ...s,
    entries: s.entries.map(({ source: _source, ...rest }) => rest),
    balances: s.balances.map(({ source: _source, ...rest }) => rest),
  };
}

describe('writeCamt053 → camt053Importer round trip', () => {
  it('gives back the same statements, entries and balances in every version', () => {
    fc.assert(
      fc.property(fc.array(statementArb, { minLength: 1, maxLength: 3 }), (statements) => {
        for (const version of ['001.02', '001.04', '001.08', '001.13']) {
          const xml = writeCamt053(statements, { version });
          expect(camt053Importer.sniff(xml)).toBe(1);
          const back = camt053Importer.parse(xml, { fileName: `rt-${version}.xml` });
          expect(hasErrors(back), JSON.stringify(back.problems)).toBe(false);
          expect(back.statements.map(withoutSource)).toEqual(statements.map(withoutSource));
          const pending = statements.reduce((n, s) => n + s.entries.filter((e) => e.status === 'pending').length, 0);
          expect(back.problems.filter((p) => p.severity === 'notice')).toHaveLength(pending);
        }
      }),
      { seed: 53, numRuns: 150 },
    );
  });
});
