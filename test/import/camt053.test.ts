import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { camt053Importer } from '../../engine/import/camt053';
import { hasErrors, type ImportResult, type ParsedStatement } from '../../engine/import/types';
import { childElement, elementText, parseXml, type XmlElement } from '../../engine/import/xml';

const FIXTURES = new URL('../fixtures/camt053/', import.meta.url);

function fixture(name: string): string {
  return readFileSync(new URL(name, FIXTURES), 'utf8');
}

function parse(text: string, fileName = 'test.xml'): ImportResult {
  return camt053Importer.parse(text, { fileName });
}

function ok(text: string): readonly ParsedStatement[] {
  const r = parse(text);
  const errors = r.problems.filter((p) => p.severity === 'error');
  expect(errors, JSON.stringify(errors)).toEqual([]);
  return r.statements;
}

function errors(text: string): { element?: string; line?: number; message: string; file: string }[] {
  const r = parse(text);
  expect(hasErrors(r)).toBe(true);
  return r.problems.filter((p) => p.severity === 'error');
}

const ns = (nn: string): string => `urn:iso:std:iso:20022:tech:xsd:camt.053.001.${nn}`;

function doc(nn: string, statements: string[]): string {
  return (
    `<?xml version="1.0" encoding="UTF-8"?>\n<Document xmlns="${ns(nn)}">\n<BkToCstmrStmt>\n` +
    `<GrpHdr><MsgId>M1</MsgId><CreDtTm>2024-01-31T10:00:00</CreDtTm></GrpHdr>\n` +
    statements.join('\n') +
    `\n</BkToCstmrStmt>\n</Document>\n`
  );
}

interface StmtParts {
  id?: string;
  acct?: string;
  period?: string;
  bals?: string[];
  entries?: string[];
}

function stmt(p: StmtParts = {}): string {
  return [
    '<Stmt>',
    p.id ?? '<Id>S1</Id>',
    '<CreDtTm>2024-01-31T10:00:00</CreDtTm>',
    p.period ?? '',
    p.acct ?? '<Acct><Id><IBAN>DE00999900001234567890</IBAN></Id><Ccy>EUR</Ccy></Acct>',
    ...(p.bals ?? [bal('OPBD', '100.00', 'CRDT', '2024-01-02')]),
    ...(p.entries ?? []),
    '</Stmt>',
  ].join('\n');
}

function bal(code: string, amt: string, cd: string, date: string, ccy = 'EUR'): string {
  return `<Bal><Tp><CdOrPrtry><Cd>${code}</Cd></CdOrPrtry></Tp><Amt Ccy="${ccy}">${amt}</Amt><CdtDbtInd>${cd}</CdtDbtInd><Dt><Dt>${date}</Dt></Dt></Bal>`;
}

interface EntryParts {
  amt?: string;
  ccy?: string;
  cd?: string;
  sts?: string;
  bookg?: string;
  extra?: string;
  dtls?: string;
}

function ntry(p: EntryParts = {}): string {
  return [
    '<Ntry>',
    p.amt === undefined ? `<Amt Ccy="${p.ccy ?? 'EUR'}">10.00</Amt>` : p.amt,
    p.cd ?? '<CdtDbtInd>DBIT</CdtDbtInd>',
    p.sts ?? '<Sts>BOOK</Sts>',
    p.bookg ?? '<BookgDt><Dt>2024-01-02</Dt></BookgDt>',
    p.extra ?? '',
    '<BkTxCd><Prtry><Cd>NTRF</Cd></Prtry></BkTxCd>',
    p.dtls ? `<NtryDtls>${p.dtls}</NtryDtls>` : '',
    '</Ntry>',
  ].join('\n');
}

function only(statements: readonly ParsedStatement[]): ParsedStatement {
  expect(statements).toHaveLength(1);
  return statements[0] as ParsedStatement;
}

/** Σ booked entries, for the balance check. */
function bookedNet(s: ParsedStatement): number {
  return s.entries.filter((e) => e.status === 'booked').reduce((sum, e) => sum + e.amount, 0);
}

function balance(s: ParsedStatement, kind: string): number {
  const b = s.balances.find((x) => x.kind === kind);
  if (!b) throw new Error(`no ${kind} balance`);
  return b.amount;
}

describe('camt.053 fixture laid out as in the Swiss Payment Standards guide (001.04)', () => {
  const s = only(ok(fixture('sps-layout-v04.xml')));

  it('reconciles: OPBD + Σ credits − Σ debits = CLBD', () => {
    // Source: ISO 20022 rule as in REFERENCES.md (camt.053: OPBD + Σ credits − Σ debits = CLBD).
    expect(balance(s, 'opening') + bookedNet(s)).toBe(balance(s, 'closing'));
    expect(balance(s, 'closing')).toBe(1068785);
  });

  it('agrees with the file’s own TxsSummry (count, Σ of amounts, net)', () => {
    // Source: ISO 20022 camt.053.001.04, Stmt/TxsSummry/TtlNtries/NbOfNtries, Sum and TtlNetNtry.
    const r = parseXml(fixture('sps-layout-v04.xml'));
    if (!r.ok) throw new Error(r.error.message);
    const path = (el: XmlElement, ...names: string[]): string =>
      elementText(names.reduce<XmlElement>((at, n) => childElement(at, n) as XmlElement, el));
    const stmtEl = childElement(childElement(r.root, 'BkToCstmrStmt') as XmlElement, 'Stmt') as XmlElement;
    const booked = s.entries.filter((e) => e.status === 'booked');
    expect(booked).toHaveLength(Number(path(stmtEl, 'TxsSummry', 'TtlNtries', 'NbOfNtries')));
    expect(booked.reduce((t, e) => t + Math.abs(e.amount), 0)).toBe(
      Math.round(Number(path(stmtEl, 'TxsSummry', 'TtlNtries', 'Sum')) * 100),
    );
    expect(bookedNet(s)).toBe(-Math.round(Number(path(stmtEl, 'TxsSummry', 'TtlNtries', 'TtlNetNtry', 'Amt')) * 100));
  });

  it('reads the account: IBAN without spaces, Ccy, owner name as fallback, BICFI', () => {
    // Source: ISO 20022 camt.053.001.04, Stmt/Acct/Id/IBAN, Acct/Ccy, Acct/Ownr/Nm, Acct/Svcr/FinInstnId/BICFI.
    expect(s.account).toEqual({
      identifier: 'CH4431999123000889012',
      name: 'Tessellate Ceramics',
      servicer: 'EXMPCHZZ80A',
    });
    expect(s.currency).toBe('CHF');
    expect(s.statementId).toBe('EXMP-STMT-2025-03');
    expect([s.from, s.to]).toEqual(['2025-03-01', '2025-03-31']);
  });

  it('reads balances: OPBD on the first day is the start of that day, CLBD and CLAV the end', () => {
    // Source: ISO 20022 camt.053.001.04, Stmt/Bal/Tp/CdOrPrtry/Cd (OPBD, CLBD, CLAV), Bal/Dt/Dt.
    expect(s.balances.map((b) => [b.kind, b.date, b.at, b.amount])).toEqual([
      ['opening', '2025-03-01', 'start', 1250000],
      ['closing', '2025-03-31', 'end', 1068785],
      ['available', '2025-03-31', 'end', 1068785],
    ]);
    const firstBalLine =
      fixture('sps-layout-v04.xml')
        .split('\n')
        .findIndex((l) => l.trim() === '<Bal>') + 1;
    expect(s.balances[0]?.source).toEqual({ line: firstBalLine, element: 'Document/BkToCstmrStmt/Stmt[1]/Bal[1]' });
  });

  it('reads a structured creditor reference, the debtor of a credit and AcctSvcrRef', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/AcctSvcrRef, TxDtls/Refs/EndToEndId, RmtInf/Strd/CdtrRefInf/Ref, RltdPties/Dbtr/Nm.
    expect(s.entries[0]).toMatchObject({
      bookingDate: '2025-03-03',
      valueDate: '2025-03-03',
      amount: 185000,
      description: '210000000003139471430009017',
      counterparty: 'Invented Gallery AG',
      reference: 'INV-2025-041',
      bankRef: 'EXMP25062A0001',
      typeCode: 'PMNT/RCDT/VCOM',
      status: 'booked',
    });
  });

  it('takes the creditor as the counterparty of a debit', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/NtryDtls/TxDtls/RltdPties/Cdtr/Nm.
    expect(s.entries[1]).toMatchObject({
      amount: -240000,
      counterparty: 'Invented Property Ltd',
      description: 'Studio rent March 2025',
    });
  });

  it('keeps a batch as one entry with the booked amount', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/NtryDtls/Btch/NbOfTxs and Ntry/Amt (the booked amount).
    expect(s.entries[2]).toMatchObject({
      amount: -127535,
      description: 'Collective payment (batch of 3 transactions)',
      reference: 'PAY-2025-03-10',
    });
    expect(s.entries[2]?.counterparty).toBeUndefined();
  });

  it('gives a reversal the sign of its CdtDbtInd and ignores the NOTPROVIDED placeholder', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/RvslInd (a reversed debit is reported with CdtDbtInd CRDT).
    // Common practice, no source: EndToEndId "NOTPROVIDED" stands for no reference.
    expect(s.entries[3]).toMatchObject({
      amount: 8990,
      description: 'Return of direct debit kiln electricity February',
    });
    expect(s.entries[3]?.reference).toBeUndefined();
    expect(s.entries[3]?.valueDate).toBe('2025-03-12');
  });

  it('takes a DtTm booking date as written, not converted to UTC', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/BookgDt/DtTm (ISODateTime); 00:30+01:00 is 23:30 UTC the day before.
    expect(s.entries[4]).toMatchObject({ bookingDate: '2025-03-20', description: 'Card payment, thermocouple' });
  });

  it('falls back to AddtlNtryInf for the description', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/AddtlNtryInf.
    expect(s.entries[5]).toMatchObject({
      amount: -1250,
      description: 'Account fees March 2025',
      typeCode: 'ACMT/MDOP/CHRG',
    });
  });

  it('keeps a pending entry as pending and reports it as a notice', () => {
    // Source: ISO 20022 camt.053.001.04, Ntry/Sts (EntryStatus2Code PDNG).
    expect(s.entries[6]).toMatchObject({ status: 'pending', amount: 30000 });
    const notices = parse(fixture('sps-layout-v04.xml')).problems;
    expect(notices).toEqual([
      expect.objectContaining({
        severity: 'notice',
        element: 'Document/BkToCstmrStmt/Stmt[1]/Ntry[7]',
        file: 'test.xml',
      }),
    ]);
  });
});

describe('camt.053.001.02: two statements, plain names, previous-day opening', () => {
  const statements = ok(fixture('two-statements-v02.xml'));

  it('gives one ParsedStatement per Stmt', () => {
    // Source: ISO 20022 camt.053.001.02, BkToCstmrStmt/Stmt [1..*].
    expect(statements.map((s) => [s.statementId, s.account.identifier, s.entries.length])).toEqual([
      ['0402-CUR', 'DE00999900001234567890', 2],
      ['0402-SAV', '7700112233', 1],
    ]);
  });

  it('reads an OPBD dated before the first day as the end of that day, and PRCD likewise', () => {
    // Source: ISO 20022 camt.053.001.02, Bal/Tp/CdOrPrtry/Cd OPBD and PRCD, Stmt/FrToDt/FrDtTm.
    const [cur, sav] = statements as [ParsedStatement, ParsedStatement];
    expect(cur.balances[0]).toMatchObject({ kind: 'opening', date: '2024-03-31', at: 'end', amount: -25000 });
    expect(sav.balances[0]).toMatchObject({ kind: 'opening', date: '2024-03-31', at: 'end', amount: 400000 });
    for (const s of statements) expect(balance(s, 'opening') + bookedNet(s)).toBe(balance(s, 'closing'));
  });

  it('reads Dbtr/Nm and Cdtr/Nm directly below the party before 001.08', () => {
    // Source: ISO 20022 camt.053.001.02, TxDtls/RltdPties/Dbtr/Nm (PartyIdentification32).
    const cur = statements[0] as ParsedStatement;
    expect(cur.entries.map((e) => e.counterparty)).toEqual(['Invented Hotel Group', 'Invented Energy Co']);
    expect(cur.entries.map((e) => e.typeCode)).toEqual(['NTRF+166', 'NDDT+105']);
    expect(cur.account).toMatchObject({ name: 'Studio current account', servicer: 'EXMPDEZZXXX' });
  });

  it('uses NtryRef when there is no AcctSvcrRef, and derives the period from the entries', () => {
    // Source: ISO 20022 camt.053.001.02, Ntry/NtryRef and Ntry/AcctSvcrRef.
    const sav = statements[1] as ParsedStatement;
    expect(sav.entries[0]).toMatchObject({
      bankRef: 'SAV-0401-1',
      description: 'Transfer to tax reserve',
      amount: 50000,
    });
    expect([sav.from, sav.to]).toEqual(['2024-04-01', '2024-04-01']);
  });
});

describe('camt.053.001.08 (JPY) and 001.13 (KWD, prefixed namespace)', () => {
  it('reads Sts/Cd, Pty/Nm, an ITBD dated with DtTm and amounts without minor unit', () => {
    // Source: ISO 20022 camt.053.001.08, Ntry/Sts/Cd, TxDtls/RltdPties/Cdtr/Pty/Nm, Bal/Dt/DtTm; ISO 4217 JPY exponent 0.
    const r = parse(fixture('jpy-v08.xml'));
    expect(hasErrors(r)).toBe(false);
    const s = only(r.statements);
    expect(s.entries.map((e) => [e.amount, e.status, e.counterparty])).toEqual([
      [-180000, 'booked', 'Invented Landlord KK'],
      [550000, 'booked', 'Invented Retail Chain'],
      [-9800, 'pending', undefined],
    ]);
    expect(s.balances.map((b) => [b.kind, b.date, b.amount])).toEqual([
      ['opening', '2025-04-01', 1500000],
      ['interim', '2025-04-15', 1320000],
      ['closing', '2025-04-30', 1870000],
    ]);
    expect(balance(s, 'opening') + bookedNet(s)).toBe(balance(s, 'closing'));
    expect(r.problems.filter((p) => p.severity === 'notice')).toHaveLength(1);
  });

  it('reads a prefixed camt.053.001.13 document with three-decimal KWD amounts', () => {
    // Source: ISO 20022 camt.053.001.13 namespace; ISO 4217 KWD exponent 3.
    const s = only(ok(fixture('kwd-v13.xml')));
    expect(s.entries[0]).toMatchObject({
      amount: -125345,
      counterparty: 'Invented Freight Co',
      typeCode: 'PMNT/ICDT/XBCT',
    });
    expect(s.balances[0]).toMatchObject({ kind: 'opening', at: 'start', amount: 1000000 });
    expect(balance(s, 'opening') + bookedNet(s)).toBe(balance(s, 'closing'));
    expect([s.from, s.to]).toEqual(['2025-05-04', '2025-05-29']);
  });
});

describe('camt.053 namespaces and sniff', () => {
  it('accepts every version 02 … 13', () => {
    // Source: ISO 20022 camt.053 namespaces urn:iso:std:iso:20022:tech:xsd:camt.053.001.NN (REFERENCES.md).
    for (let n = 2; n <= 13; n++) {
      const nn = String(n).padStart(2, '0');
      const text = doc(nn, [stmt({ entries: [ntry()] })]);
      expect(camt053Importer.sniff(text)).toBe(1);
      expect(only(ok(text)).entries).toHaveLength(1);
    }
  });

  it('refuses camt.052 and camt.054 with a precise message, sniffing them lower', () => {
    // Source: ISO 20022 camt.052 (BankToCustomerAccountReport) and camt.054 (BankToCustomerDebitCreditNotification).
    for (const [other, word] of [
      ['camt.052.001.08', 'account report'],
      ['camt.054.001.08', 'notification'],
    ] as const) {
      const text = doc('08', [stmt()]).replace('camt.053.001.08', other);
      expect(camt053Importer.sniff(text)).toBe(0.3);
      const [e] = errors(text);
      expect(e?.element).toBe('Document');
      expect(e?.message).toContain(`namespace "urn:iso:std:iso:20022:tech:xsd:${other}"`);
      expect(e?.message).toContain('expected urn:iso:std:iso:20022:tech:xsd:camt.053.001.NN');
      expect(e?.message).toContain(word);
    }
  });

  it('refuses unknown camt.053 versions, foreign namespaces and other roots', () => {
    expect(errors(doc('01', [stmt()]))[0]?.message).toContain('camt.053.001.01');
    expect(errors(doc('14', [stmt()]))[0]?.message).toContain('expected');
    const foreign = '<Document xmlns="urn:example:other"><BkToCstmrStmt/></Document>';
    expect(camt053Importer.sniff(foreign)).toBe(0.1);
    expect(errors(foreign)[0]?.message).toContain('namespace "urn:example:other"');
    expect(errors('<Document/>')[0]?.message).toContain('no namespace');
    expect(camt053Importer.sniff('<OFX><BANKMSGSRSV1/></OFX>')).toBe(0);
    expect(errors('<OFX/>')[0]).toMatchObject({ element: 'OFX', line: 1 });
  });

  it('sniffs 0 for non-XML text', () => {
    expect(camt053Importer.sniff('Date;Amount\n2024-01-02;10,00\n')).toBe(0);
    expect(camt053Importer.sniff(':20:STARTUMSE\n:25:12345678/0000000001\n')).toBe(0);
    expect(camt053Importer.sniff('')).toBe(0);
  });
});

describe('camt.053 element rules and their errors', () => {
  it('names file, line and path for a missing BookgDt (Stmt[2]/Ntry[14])', () => {
    // Source: ISO 20022 camt.053.001.08, Ntry/BookgDt (DateAndDateTime2Choice: Dt or DtTm).
    const entries = Array.from({ length: 14 }, (_, i) => (i === 13 ? ntry({ bookg: '' }) : ntry()));
    const text = doc('08', [stmt(), stmt({ id: '<Id>S2</Id>', entries })]);
    const [e, ...rest] = errors(text);
    expect(rest).toEqual([]);
    const line =
      text
        .split('\n')
        .findIndex((l, i, all) => l === '<Ntry>' && all.slice(0, i).filter((x) => x === '<Ntry>').length === 13) + 1;
    expect(e).toEqual({
      file: 'test.xml',
      line,
      element: 'Document/BkToCstmrStmt/Stmt[2]/Ntry[14]/BookgDt',
      message: 'missing, expected Dt or DtTm',
      severity: 'error',
    });
  });

  it('refuses a missing Amt and a missing CdtDbtInd', () => {
    // Source: ISO 20022 camt.053.001.02, Ntry/Amt [1..1] and Ntry/CdtDbtInd [1..1].
    const e = errors(doc('02', [stmt({ entries: [ntry({ amt: '', cd: '' })] })]));
    expect(e.map((x) => [x.element, x.message])).toEqual([
      ['Document/BkToCstmrStmt/Stmt[1]/Ntry[1]/Amt', 'missing, expected the entry amount <Amt Ccy="…">'],
      ['Document/BkToCstmrStmt/Stmt[1]/Ntry[1]/CdtDbtInd', 'missing, expected CRDT or DBIT'],
    ]);
  });

  it('refuses impossible dates in Dt and DtTm', () => {
    // Source: ISO 20022 ISODate / ISODateTime (XML Schema xs:date, xs:dateTime); April has 30 days.
    const e = errors(
      doc('04', [
        stmt({
          entries: [
            ntry({ bookg: '<BookgDt><Dt>2025-04-31</Dt></BookgDt>' }),
            ntry({ bookg: '<BookgDt><DtTm>2025-02-29T10:00:00</DtTm></BookgDt>' }),
          ],
        }),
      ]),
    );
    expect(e.map((x) => [x.element, x.message])).toEqual([
      ['Document/BkToCstmrStmt/Stmt[1]/Ntry[1]/BookgDt/Dt', 'impossible date "2025-04-31"'],
      ['Document/BkToCstmrStmt/Stmt[1]/Ntry[2]/BookgDt/DtTm', 'impossible date "2025-02-29"'],
    ]);
    expect(
      errors(doc('04', [stmt({ entries: [ntry({ bookg: '<BookgDt><Dt>31.01.2024</Dt></BookgDt>' })] })]))[0]?.message,
    ).toContain('expected YYYY-MM-DD');
  });

  it('refuses an unknown currency and mixed currencies', () => {
    // Source: ISO 4217 (active codes) and ISO 20022 camt.053 Acct/Ccy; one statement has one currency.
    const unknown = errors(
      doc('08', [stmt({ acct: '<Acct><Id><IBAN>DE00999900001234567890</IBAN></Id><Ccy>EUX</Ccy></Acct>', bals: [] })]),
    );
    expect(unknown[0]).toMatchObject({ element: 'Document/BkToCstmrStmt/Stmt[1]/Acct/Ccy' });
    expect(unknown[0]?.message).toContain('unknown currency "EUX"');
    const mixed = errors(doc('08', [stmt({ entries: [ntry(), ntry({ ccy: 'USD' })] })]));
    expect(mixed).toHaveLength(1);
    expect(mixed[0]?.element).toBe('Document/BkToCstmrStmt/Stmt[1]/Ntry[2]/Amt');
    expect(mixed[0]?.message).toContain('mixed currencies');
    const balanceMixed = errors(doc('08', [stmt({ bals: [bal('CLBD', '1.00', 'CRDT', '2024-01-02', 'CHF')] })]));
    expect(balanceMixed[0]?.element).toBe('Document/BkToCstmrStmt/Stmt[1]/Bal[1]/Amt');
  });

  it('takes the currency from the amounts when Acct/Ccy is absent', () => {
    // Source: ISO 20022 camt.053.001.08, Stmt/Acct/Ccy [0..1] and Amt@Ccy [1..1].
    const s = only(
      ok(
        doc('08', [
          stmt({
            acct: '<Acct><Id><IBAN>DE00999900001234567890</IBAN></Id></Acct>',
            entries: [ntry({ ccy: 'GBP' })],
            bals: [bal('OPBD', '1.00', 'CRDT', '2024-01-02', 'GBP')],
          }),
        ]),
      ),
    );
    expect(s.currency).toBe('GBP');
  });

  it('refuses more decimals than the currency has and negative amounts', () => {
    // Source: ISO 4217 minor units (EUR 2, JPY 0); ISO 20022 ActiveOrHistoricCurrencyAndAmount minInclusive 0.
    const e = errors(
      doc('08', [
        stmt({
          entries: [
            ntry({ amt: '<Amt Ccy="EUR">10.005</Amt>' }),
            ntry({ amt: '<Amt Ccy="EUR">-10.00</Amt>' }),
            ntry({ amt: '<Amt Ccy="EUR">1,50</Amt>' }),
          ],
        }),
      ]),
    );
    expect(e.map((x) => x.element)).toEqual([1, 2, 3].map((i) => `Document/BkToCstmrStmt/Stmt[1]/Ntry[${i}]/Amt`));
    expect(e[0]?.message).toContain('3 decimals, the currency allows 2');
    expect(e[1]?.message).toContain('negative amount');
    expect(e[2]?.message).toContain('not a decimal amount');
    const jpy = '<Acct><Id><Othr><Id>1</Id></Othr></Id><Ccy>JPY</Ccy></Acct>';
    expect(
      errors(
        doc('08', [stmt({ acct: jpy, bals: [], entries: [ntry({ ccy: 'JPY', amt: '<Amt Ccy="JPY">100.5</Amt>' })] })]),
      )[0]?.message,
    ).toContain('allows 0');
    // Zeros beyond the exponent change nothing and are accepted.
    expect(
      only(ok(doc('08', [stmt({ entries: [ntry({ amt: '<Amt Ccy="EUR">10.500</Amt>' })] })]))).entries[0]?.amount,
    ).toBe(-1050);
  });

  it('refuses CdtDbtInd and Sts values outside the code lists', () => {
    // Source: ISO 20022 CreditDebitCode (CRDT, DBIT) and EntryStatus2Code / ExternalEntryStatus1Code.
    const e = errors(
      doc('08', [
        stmt({ entries: [ntry({ cd: '<CdtDbtInd>CR</CdtDbtInd>' }), ntry({ sts: '<Sts><Cd>DONE</Cd></Sts>' })] }),
      ]),
    );
    expect(e.map((x) => x.message)).toEqual([
      '"CR", expected CRDT or DBIT',
      'status "DONE", expected BOOK, PDNG, INFO or FUTR',
    ]);
  });

  it('accepts Sts as plain text and as Sts/Cd in any version', () => {
    // Source: ISO 20022 camt.053.001.02 Ntry/Sts (EntryStatus2Code) and camt.053.001.08 Ntry/Sts/Cd (EntryStatus1Choice).
    expect(
      only(ok(doc('02', [stmt({ entries: [ntry({ sts: '<Sts><Cd>BOOK</Cd></Sts>' })] })]))).entries[0]?.status,
    ).toBe('booked');
    expect(
      only(
        ok(
          doc('10', [
            stmt({
              entries: [ntry({ sts: '<Sts>PDNG</Sts>', bookg: '', extra: '<ValDt><Dt>2024-01-03</Dt></ValDt>' })],
            }),
          ]),
        ),
      ).entries[0],
    ).toMatchObject({ status: 'pending', bookingDate: '2024-01-03' });
  });

  it('joins Ustrd pieces: a full 140-character piece continues without a space', () => {
    // Source: ISO 20022 camt.053, RmtInf/Ustrd (Max140Text, [0..*]).
    const full = 'a'.repeat(139) + 'b';
    const dtls = `<TxDtls><RmtInf><Ustrd>${full}</Ustrd><Ustrd>cd</Ustrd><Ustrd>ef</Ustrd><Strd><CdtrRefInf><Ref>RF18539007547034</Ref></CdtrRefInf></Strd></RmtInf></TxDtls>`;
    expect(only(ok(doc('08', [stmt({ entries: [ntry({ dtls })] })]))).entries[0]?.description).toBe(
      `${full}cd ef RF18539007547034`,
    );
  });

  it('takes the ultimate creditor when the creditor has no name, and Agt names from 001.08', () => {
    // Source: ISO 20022 camt.053.001.08, TxDtls/RltdPties/UltmtCdtr and Party40Choice (Pty | Agt).
    const dtls =
      '<TxDtls><RltdPties><Cdtr><Pty><PstlAdr><Ctry>DE</Ctry></PstlAdr></Pty></Cdtr><UltmtCdtr><Pty><Nm>Final Payee</Nm></Pty></UltmtCdtr></RltdPties></TxDtls>';
    expect(only(ok(doc('08', [stmt({ entries: [ntry({ dtls })] })]))).entries[0]?.counterparty).toBe('Final Payee');
    const agt =
      '<TxDtls><RltdPties><Cdtr><Agt><FinInstnId><Nm>Some Agent Bank</Nm></FinInstnId></Agt></Cdtr></RltdPties></TxDtls>';
    expect(only(ok(doc('08', [stmt({ entries: [ntry({ dtls: agt })] })]))).entries[0]?.counterparty).toBe(
      'Some Agent Bank',
    );
  });

  it('describes a batch without AddtlNtryInf by its size and keeps a shared counterparty', () => {
    // Source: ISO 20022 camt.053.001.02, NtryDtls/Btch/NbOfTxs and NtryDtls/TxDtls [0..*].
    const tx = '<TxDtls><RltdPties><Cdtr><Nm>Same Payee</Nm></Cdtr></RltdPties></TxDtls>';
    const e = only(ok(doc('02', [stmt({ entries: [ntry({ dtls: tx + tx })] })]))).entries[0];
    expect(e).toMatchObject({ description: 'Batch of 2 transactions', counterparty: 'Same Payee', amount: -1000 });
    const declared = only(ok(doc('02', [stmt({ entries: [ntry({ dtls: '<Btch><NbOfTxs>25</NbOfTxs></Btch>' })] })])))
      .entries[0];
    expect(declared?.description).toBe('Batch of 25 transactions');
  });

  it('refuses a statement without Id or Acct, and a document without Stmt or GrpHdr', () => {
    // Source: ISO 20022 camt.053.001.02, Stmt/Id [1..1], Stmt/Acct [1..1], GrpHdr [1..1], Stmt [1..*].
    const e = errors(doc('02', [stmt({ id: '', acct: '' })]));
    expect(e.map((x) => x.element)).toEqual([
      'Document/BkToCstmrStmt/Stmt[1]/Id',
      'Document/BkToCstmrStmt/Stmt[1]/Acct',
    ]);
    expect(errors(doc('02', []))[0]?.element).toBe('Document/BkToCstmrStmt/Stmt');
    const noHeader = doc('02', [stmt()]).replace(/<GrpHdr>.*<\/GrpHdr>/, '');
    expect(errors(noHeader)[0]?.element).toBe('Document/BkToCstmrStmt/GrpHdr');
    const noId = errors(doc('02', [stmt({ acct: '<Acct><Ccy>EUR</Ccy></Acct>' })]));
    expect(noId[0]).toMatchObject({
      element: 'Document/BkToCstmrStmt/Stmt[1]/Acct/Id',
      message: 'missing, expected IBAN or Othr/Id',
    });
  });

  it('leaves proprietary and expected balances out with a notice', () => {
    // Source: ISO 20022 camt.053, BalanceType12Code XPCD and Bal/Tp/CdOrPrtry/Prtry.
    const prtry =
      '<Bal><Tp><CdOrPrtry><Prtry>BANKX</Prtry></CdOrPrtry></Tp><Amt Ccy="EUR">1.00</Amt><CdtDbtInd>CRDT</CdtDbtInd><Dt><Dt>2024-01-02</Dt></Dt></Bal>';
    const r = parse(doc('08', [stmt({ bals: [prtry, bal('XPCD', '1.00', 'CRDT', '2024-01-05')] })]));
    expect(hasErrors(r)).toBe(false);
    expect(r.statements[0]?.balances).toEqual([]);
    expect(r.problems.map((p) => p.severity)).toEqual(['notice', 'notice']);
  });

  it('reports truncated XML with the unclosed element and line, never throwing', () => {
    const text = fixture('sps-layout-v04.xml');
    const cut = text.slice(0, text.indexOf('<Sts>BOOK</Sts>') + 8);
    const [e] = errors(cut);
    expect(e?.message).toContain('XML is not well-formed: unexpected end of file');
    expect(e?.element).toBe('Document/BkToCstmrStmt/Stmt[1]/Ntry[1]/Sts');
    expect(e?.line).toBe(cut.split('\n').length);
  });

  it('reports a well-formedness error once, wherever it is', () => {
    const good = doc('08', [stmt({ entries: [ntry()] })]);
    for (const broken of [
      good.replace('</BkToCstmrStmt>', '</BkToCstmrStmt>&bad;'),
      good.replace('<Stmt>', '<Stmt><Id>x</Id'),
      good.replace('</Document>', '</Document><Document/>'),
      good.replace('<GrpHdr>', '<GrpHdr><MsgId>a</Msgid>'),
    ]) {
      const e = errors(broken);
      expect(e, broken).toHaveLength(1);
      expect(e[0]?.message).toMatch(/^XML is not well-formed: /);
      expect(e[0]?.line).toBeGreaterThan(1);
    }
  });

  it('refuses a DOCTYPE before the root', () => {
    const [e] = errors(
      '<?xml version="1.0"?>\n<!DOCTYPE Document [<!ENTITY x "y">]>\n' +
        doc('08', [stmt()]).split('\n').slice(1).join('\n'),
    );
    expect(e).toMatchObject({ line: 2 });
    expect(e?.message).toContain('DOCTYPE is refused');
  });

  it('caps the listed problems and counts the rest', () => {
    const entries = Array.from({ length: 300 }, () => ntry({ bookg: '' }));
    const r = parse(doc('08', [stmt({ entries })]));
    expect(r.problems).toHaveLength(201);
    expect(r.problems[200]?.message).toBe(
      '100 more errors and 0 more notices not listed (300 errors and 0 notices in all)',
    );
  });
});
