import { describe, expect, it } from 'vitest';
import {
  findHeaderRow,
  matchHeaderCells,
  normaliseHeaderName,
  rolesOfHeaderName,
} from '../../engine/import/csv/header';
import { readPreamble } from '../../engine/import/csv/preamble';
import { findIban, isValidIban, normaliseAccountIdentifier } from '../../engine/import/csv/iban';
import { csvLayoutFingerprint } from '../../engine/import/csv/fingerprint';
import { scanCsv } from '../../engine/import/csv/scan';

describe('normaliseHeaderName', () => {
  it('drops case, accents, punctuation and ß', () => {
    expect(normaliseHeaderName('  Auftraggeber/Empfänger ').key).toBe('auftraggeber empfanger');
    expect(normaliseHeaderName('Date opération').key).toBe('date operation');
    expect(normaliseHeaderName('Währung').key).toBe('wahrung');
    expect(normaliseHeaderName('Straße').key).toBe('strasse');
  });

  it('takes a currency code out of the name', () => {
    expect(normaliseHeaderName('Betrag (EUR)')).toEqual({ key: 'betrag', currency: 'EUR' });
    expect(normaliseHeaderName('Amount USD')).toEqual({ key: 'amount', currency: 'USD' });
    expect(normaliseHeaderName('Betrag in CHF')).toEqual({ key: 'betrag', currency: 'CHF' });
    // A lone word is a name, not a currency, and unknown codes stay.
    expect(normaliseHeaderName('Currency')).toEqual({ key: 'currency' });
    expect(normaliseHeaderName('Amount (XYZ)')).toEqual({ key: 'amount' });
  });
});

describe('rolesOfHeaderName: common column names', () => {
  // Common practice, no source: the words banks print as column names in exports.
  it.each([
    ['Date', 'date'],
    ['Booking date', 'date'],
    ['Buchungstag', 'date'],
    ['Date opération', 'date'],
    ['Boekdatum', 'date'],
    ['Fecha operación', 'date'],
    ['Value date', 'valueDate'],
    ['Wertstellung', 'valueDate'],
    ['Date de valeur', 'valueDate'],
    ['Amount', 'amount'],
    ['Betrag', 'amount'],
    ['Montant', 'amount'],
    ['Bedrag', 'amount'],
    ['Importe', 'amount'],
    ['Debit', 'debit'],
    ['Soll', 'debit'],
    ['Débit', 'debit'],
    ['Credit', 'credit'],
    ['Haben', 'credit'],
    ['Crédit', 'credit'],
    ['D/C', 'indicator'],
    ['DR/CR', 'indicator'],
    ['S/H', 'indicator'],
    ['Debit/Credit', 'indicator'],
    ['Af Bij', 'indicator'],
    ['Description', 'description'],
    ['Memo', 'description'],
    ['Purpose', 'description'],
    ['Verwendungszweck', 'description'],
    ['Libellé', 'description'],
    ['Omschrijving', 'description'],
    ['Concepto', 'description'],
    ['Payee', 'counterparty'],
    ['Counterparty', 'counterparty'],
    ['Auftraggeber / Empfänger', 'counterparty'],
    ['Tegenpartij', 'counterparty'],
    ['Balance', 'balance'],
    ['Saldo', 'balance'],
    ['Kontostand', 'balance'],
    ['Solde', 'balance'],
    ['Currency', 'currency'],
    ['Währung', 'currency'],
    ['Devise', 'currency'],
    ['Reference', 'reference'],
    ['Referenz', 'reference'],
    ['Status', 'status'],
    ['Buchungstext', 'type'],
  ])('%s → %s', (name, role) => {
    expect(rolesOfHeaderName(name)).toEqual([role]);
  });

  it('leaves "Valuta" open (value date in German, currency in Dutch and Italian) and unknown names empty', () => {
    expect(rolesOfHeaderName('Valuta')).toEqual(['valueDate', 'currency']);
    expect(rolesOfHeaderName('Kategorie')).toEqual([]);
  });
});

describe('matchHeaderCells and findHeaderRow', () => {
  it('keeps the first column of a role and every description column', () => {
    const m = matchHeaderCells(['Date', 'Posting date', 'Memo', 'Details', 'Amount (EUR)']);
    expect(m.roles.get('date')).toBe(0);
    expect(m.description).toEqual([2, 3]);
    expect(m.roles.get('amount')).toBe(4);
    expect(m.currency).toBe('EUR');
  });

  it('finds the header below a preamble', () => {
    const t = scanCsv('Konto;DE89 3704 0044 0532 0130 00\n\nBuchungstag;Text;Betrag\n01.02.2025;a;1,00\n', ';');
    expect(findHeaderRow(t)).toBe(2);
  });

  it('needs a date and an amount (or debit and credit)', () => {
    expect(findHeaderRow(scanCsv('Date;Text\n2025-01-01;a', ';'))).toBeUndefined();
    expect(findHeaderRow(scanCsv('Date;Debit;Credit\n2025-01-01;1;', ';'))).toBe(0);
    expect(findHeaderRow(scanCsv('Date;Debit\n2025-01-01;1', ';'))).toBeUndefined();
  });
});

describe('IBAN check digits', () => {
  it('accepts valid IBANs and refuses a wrong check digit', () => {
    // From memory: DE89 3704 0044 0532 0130 00 and GB82 WEST 1234 5698 7654 32 are the example IBANs
    // printed in IBAN documentation; their ISO 7064 MOD 97-10 remainder is 1 (checked by hand with Python).
    expect(isValidIban('DE89370400440532013000')).toBe(true);
    expect(isValidIban('GB82WEST12345698765432')).toBe(true);
    expect(isValidIban('DE88370400440532013000')).toBe(false);
    expect(isValidIban('DE89')).toBe(false);
  });

  it('finds a printed IBAN in text without swallowing the next word', () => {
    expect(findIban('Account: DE89 3704 0044 0532 0130 00 EUR')).toBe('DE89370400440532013000');
    expect(findIban('Order 12345678901234567890')).toBeUndefined();
    expect(normaliseAccountIdentifier(' gb82 west 1234 5698 7654 32 ')).toBe('GB82WEST12345698765432');
    expect(normaliseAccountIdentifier(' 0012 345 ')).toBe('0012 345');
  });
});

describe('readPreamble', () => {
  it('picks up an IBAN, an account name and a currency', () => {
    const t = scanCsv(
      'Kontonummer;DE89 3704 0044 0532 0130 00\nKontobezeichnung;Werkstatt\nWährung;EUR\nBuchungstag;Betrag\n',
      ';',
    );
    expect(readPreamble(t, 3)).toEqual({
      identifier: 'DE89370400440532013000',
      identifierLine: 1,
      name: 'Werkstatt',
      currency: 'EUR',
      currencyLine: 3,
    });
  });

  it('reads "Label: value" cells, non-IBAN account numbers and a code standing alone', () => {
    const t = scanCsv('Account number: 0012-345678\nStatement;March;USD\n', ';');
    expect(readPreamble(t, 2)).toEqual({
      identifier: '0012-345678',
      identifierLine: 1,
      currency: 'USD',
      currencyLine: 2,
    });
  });

  it('reports a second, different currency', () => {
    const t = scanCsv('Currency;EUR\nCurrency;USD\n', ';');
    expect(readPreamble(t, 2).conflictingCurrency).toEqual({ code: 'USD', line: 2 });
  });
});

describe('csvLayoutFingerprint', () => {
  it('ignores case, spacing and trailing empty cells', () => {
    const a = csvLayoutFingerprint(['Buchungstag', 'Betrag (EUR)', 'Text']);
    expect(csvLayoutFingerprint([' buchungstag', 'BETRAG  (EUR)', 'Text ', '', ''])).toBe(a);
    expect(a).toMatch(/^csv1-[0-9a-f]{16}$/);
  });

  it('differs for another column order or name', () => {
    const a = csvLayoutFingerprint(['Date', 'Amount']);
    expect(csvLayoutFingerprint(['Amount', 'Date'])).not.toBe(a);
    expect(csvLayoutFingerprint(['Date', 'Amount', 'Balance'])).not.toBe(a);
  });

  it('is 64-bit FNV-1a of the normalised cells', () => {
    // Source: FNV-1a 64-bit test vectors (IETF draft-eastlake-fnv): "" → cbf29ce484222325, "a" → af63dc4c8601ec8c
    expect(csvLayoutFingerprint([])).toBe('csv1-cbf29ce484222325');
    expect(csvLayoutFingerprint(['a'])).toBe('csv1-af63dc4c8601ec8c');
  });
});
