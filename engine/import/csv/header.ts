/**
 * Header recognition: which column holds the booking date, the amount, the payee… Column
 * names are compared after normalisation (case, accents, punctuation and a currency code
 * such as "Betrag (EUR)" removed). The dictionary covers common English, German, French,
 * Dutch, Spanish and Italian bank export names. Common practice, no single source: banks
 * publish their export layouts one by one; these are the plain trade words they use.
 */
import { isKnownCurrency } from '../../core/currency';
import { cellAt, rowCells, rowWidth, type CsvTable } from './scan';

/** What a column means to the importer. */
export type CsvColumnRole =
  | 'date'
  | 'valueDate'
  | 'amount'
  | 'debit'
  | 'credit'
  | 'indicator'
  | 'description'
  | 'counterparty'
  | 'balance'
  | 'currency'
  | 'reference'
  | 'status'
  | 'account'
  | 'type'
  | 'bankRef';

/** Every role, in the order previews list them. */
export const CSV_COLUMN_ROLES: readonly CsvColumnRole[] = [
  'date',
  'valueDate',
  'amount',
  'debit',
  'credit',
  'indicator',
  'description',
  'counterparty',
  'balance',
  'currency',
  'reference',
  'status',
  'account',
  'type',
  'bankRef',
];

const NAMES: Readonly<Record<CsvColumnRole, readonly string[]>> = {
  date: [
    'date',
    'booking date',
    'bookingdate',
    'transaction date',
    'trans date',
    'txn date',
    'posting date',
    'posted date',
    'post date',
    'entry date',
    'buchungstag',
    'buchungsdatum',
    'datum',
    'date operation',
    'date d operation',
    'date de l operation',
    'date comptable',
    'date de comptabilisation',
    'boekdatum',
    'boekingsdatum',
    'transactiedatum',
    'fecha',
    'fecha operacion',
    'fecha de operacion',
    'fecha contable',
    'data',
    'data operazione',
    'data contabile',
  ],
  valueDate: [
    'value date',
    'valuedate',
    'valutadatum',
    'valuta datum',
    'wertstellung',
    'wertstellungsdatum',
    'date de valeur',
    'date valeur',
    'rentedatum',
    'fecha valor',
    'fecha de valor',
    'data valuta',
    'effective date',
  ],
  amount: [
    'amount',
    'transaction amount',
    'betrag',
    'umsatz',
    'montant',
    'montant de l operation',
    'bedrag',
    'importe',
    'importo',
  ],
  debit: [
    'debit',
    'debits',
    'debit amount',
    'withdrawal',
    'withdrawals',
    'withdrawal amount',
    'paid out',
    'money out',
    'soll',
    'ausgang',
    'ausgaben',
    'belastung',
    'montant debit',
    'debit montant',
    'debet',
    'cargo',
    'cargos',
    'debe',
    'importe cargo',
    'uscite',
    'addebiti',
  ],
  credit: [
    'credit',
    'credits',
    'credit amount',
    'deposit',
    'deposits',
    'deposit amount',
    'paid in',
    'money in',
    'haben',
    'eingang',
    'einnahmen',
    'gutschrift',
    'montant credit',
    'credit montant',
    'abono',
    'abonos',
    'haber',
    'importe abono',
    'entrate',
    'accrediti',
  ],
  indicator: [
    'd c',
    'c d',
    'dc',
    'cd',
    'dr cr',
    'cr dr',
    'debit credit',
    'credit debit',
    'debit or credit',
    'credit or debit',
    'debit credit indicator',
    'credit debit indicator',
    'cdt dbt ind',
    's h',
    'soll haben',
    'af bij',
    'bij af',
    'indicator',
    'sign',
    'sens',
  ],
  description: [
    'description',
    'memo',
    'purpose',
    'details',
    'narrative',
    'text',
    'transaction details',
    'transaction description',
    'payment details',
    'remittance information',
    'particulars',
    'notes',
    'note',
    'verwendungszweck',
    'beschreibung',
    'buchungsdetails',
    'libelle',
    'libelle operation',
    'libelle de l operation',
    'detail',
    'details de l operation',
    'omschrijving',
    'mededelingen',
    'concepto',
    'descripcion',
    'causale',
    'descrizione',
  ],
  counterparty: [
    'payee',
    'payer',
    'payee payer',
    'payer payee',
    'counterparty',
    'counter party',
    'beneficiary',
    'name',
    'merchant',
    'recipient',
    'auftraggeber empfanger',
    'auftraggeber',
    'empfanger',
    'zahlungsempfanger',
    'begunstigter zahlungspflichtiger',
    'beguenstigter zahlungspflichtiger',
    'name zahlungsbeteiligter',
    'auftraggeber begunstigter',
    'tiers',
    'beneficiaire',
    'contrepartie',
    'naam',
    'naam omschrijving',
    'tegenpartij',
    'naam tegenpartij',
    'beneficiario',
    'ordenante',
    'contraparte',
    'controparte',
  ],
  balance: [
    'balance',
    'running balance',
    'account balance',
    'balance after',
    'new balance',
    'saldo',
    'kontostand',
    'saldo nach buchung',
    'solde',
    'saldo na mutatie',
    'saldo na boeking',
  ],
  currency: [
    'currency',
    'ccy',
    'cur',
    'curr',
    'currency code',
    'wahrung',
    'waehrung',
    'devise',
    'monnaie',
    'munt',
    'moneda',
    'divisa',
  ],
  reference: [
    'reference',
    'ref',
    'customer reference',
    'end to end reference',
    'end to end id',
    'referenz',
    'kundenreferenz',
    'reference de l operation',
    'referentie',
    'kenmerk',
    'betalingskenmerk',
    'referencia',
    'riferimento',
    'check number',
    'cheque number',
    'check no',
    'cheque no',
  ],
  status: ['status', 'state', 'transaction status', 'buchungsstatus', 'statut', 'estado', 'stato'],
  account: [
    'account',
    'account number',
    'account no',
    'own account',
    'auftragskonto',
    'kontonummer',
    'konto',
    'rekening',
    'rekeningnummer',
    'compte',
    'numero de compte',
    'cuenta',
    'numero de cuenta',
    'conto',
  ],
  type: [
    'type',
    'transaction type',
    'buchungstext',
    'umsatzart',
    'vorgang',
    'code',
    'mutatiesoort',
    'type operation',
    'type d operation',
    'tipo',
    'tipo de operacion',
  ],
  bankRef: ['transaction id', 'bank reference', 'bank ref'],
};

/**
 * Names that mean different things in different languages ("Valuta" is the value date in
 * German and the currency in Dutch and Italian); the column's content decides.
 */
const AMBIGUOUS: ReadonlyMap<string, readonly CsvColumnRole[]> = new Map([['valuta', ['valueDate', 'currency']]]);

const ROLE_OF: ReadonlyMap<string, CsvColumnRole> = (() => {
  const map = new Map<string, CsvColumnRole>();
  for (const role of CSV_COLUMN_ROLES) for (const name of NAMES[role]) if (!map.has(name)) map.set(name, role);
  return map;
})();

/** A header cell reduced to its comparable form. */
export interface NormalisedHeaderName {
  /** Lowercase ASCII words separated by single spaces ('' for a blank cell). */
  readonly key: string;
  /** ISO 4217 code the name carries, e.g. EUR from "Betrag (EUR)". */
  readonly currency?: string;
}

/**
 * Normalises a column name: accents and case dropped, ß → ss, punctuation to spaces, a
 * currency code in brackets or as the last word taken out.
 *
 * @example normaliseHeaderName('Auftraggeber/Empfänger') // { key: 'auftraggeber empfanger' }
 * @example normaliseHeaderName('Betrag (EUR)') // { key: 'betrag', currency: 'EUR' }
 */
export function normaliseHeaderName(raw: string): NormalisedHeaderName {
  let text = raw
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/ß/g, 'ss');
  let currency: string | undefined;
  text = text.replace(/[([{]([^)\]}]*)[)\]}]/g, (_m, inner: string) => {
    const code = inner.trim().toUpperCase();
    if (currency === undefined && /^[A-Z]{3}$/.test(code) && isKnownCurrency(code)) currency = code;
    return ' ';
  });
  const words = text
    .replace(/[^a-z0-9]+/g, ' ')
    .trim()
    .split(' ')
    .filter((w) => w !== '');
  if (words.length >= 2) {
    const last = (words[words.length - 1] as string).toUpperCase();
    if (currency === undefined && last.length === 3 && isKnownCurrency(last)) {
      currency = last;
      words.pop();
      if (words.length >= 2 && words[words.length - 1] === 'in') words.pop();
    }
  }
  const key = words.join(' ');
  return currency === undefined ? { key } : { key, currency };
}

/**
 * The roles a column name can have: one role, two for an ambiguous name, none when unknown.
 *
 * @example rolesOfHeaderName('Buchungstag') // ['date']
 * @example rolesOfHeaderName('Valuta') // ['valueDate', 'currency']
 */
export function rolesOfHeaderName(raw: string): readonly CsvColumnRole[] {
  const { key } = normaliseHeaderName(raw);
  const ambiguous = AMBIGUOUS.get(key);
  if (ambiguous) return ambiguous;
  const role = ROLE_OF.get(key);
  return role === undefined ? [] : [role];
}

/** Columns found in a header row, by role. `description` may span several columns. */
export interface HeaderColumns {
  readonly roles: ReadonlyMap<CsvColumnRole, number>;
  readonly description: readonly number[];
  /** Column index → ambiguous candidate roles still to be decided from the content. */
  readonly ambiguous: ReadonlyMap<number, readonly CsvColumnRole[]>;
  /** Currency carried by an amount or balance column name ("Amount (EUR)"). */
  readonly currency?: string;
}

/**
 * Assigns roles to the cells of a header row; the first column of a role wins, every
 * description column is kept (they are joined).
 *
 * @example matchHeaderCells(['Date', 'Memo', 'Amount']).roles.get('amount') // 2
 */
export function matchHeaderCells(cells: readonly string[]): HeaderColumns {
  const roles = new Map<CsvColumnRole, number>();
  const description: number[] = [];
  const ambiguous = new Map<number, readonly CsvColumnRole[]>();
  let currency: string | undefined;
  cells.forEach((cell, index) => {
    const found = rolesOfHeaderName(cell);
    if (found.length > 1) {
      ambiguous.set(index, found);
      return;
    }
    const role = found[0];
    if (role === undefined) return;
    if (role === 'description') description.push(index);
    else if (!roles.has(role)) roles.set(role, index);
    if (role === 'amount' || role === 'debit' || role === 'credit' || role === 'balance') {
      currency ??= normaliseHeaderName(cell).currency;
    }
  });
  return currency === undefined ? { roles, description, ambiguous } : { roles, description, ambiguous, currency };
}

/** True when the columns name a booking date and an amount (one signed, or debit and credit). */
export function hasDateAndAmount(columns: HeaderColumns): boolean {
  const r = columns.roles;
  return r.has('date') && (r.has('amount') || (r.has('debit') && r.has('credit')));
}

/** Records looked at for a header. */
export const HEADER_SEARCH_ROWS = 60;

/**
 * Index of the first record (among the first 60) whose cells name a booking date and an
 * amount, or undefined.
 *
 * @example findHeaderRow(scanCsv('Account;X\nDate;Amount\n2025-01-02;5', ';')) // 1
 */
export function findHeaderRow(table: CsvTable): number | undefined {
  const last = Math.min(table.rowCount, HEADER_SEARCH_ROWS);
  for (let r = 0; r < last; r++) {
    if (rowWidth(table, r) < 2) continue;
    // Cheap pre-check: at least one cell must be a known name before building the match.
    let known = false;
    for (let c = 0; c < rowWidth(table, r) && !known; c++) known = rolesOfHeaderName(cellAt(table, r, c)).length > 0;
    if (known && hasDateAndAmount(matchHeaderCells(rowCells(table, r)))) return r;
  }
  return undefined;
}
