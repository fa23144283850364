/**
 * Account information lines before the header ("Account;DE89 3704 0044 0532 0130 00",
 * "Währung: EUR"). Labels are recognised in the same languages as column names; an IBAN is
 * only taken when its check digits are right, so a random number is not mistaken for one.
 */
import { isKnownCurrency } from '../../core/currency';
import { findIban, normaliseAccountIdentifier } from './iban';
import { normaliseHeaderName } from './header';
import { cellAt, rowWidth, type CsvTable } from './scan';

/** What a preamble states. */
export interface PreambleInfo {
  readonly identifier?: string;
  readonly identifierLine?: number;
  readonly name?: string;
  /** Upper-cased code as written (may be unknown to ISO 4217: the caller refuses it). */
  readonly currency?: string;
  readonly currencyLine?: number;
  /** A second, different currency stated by the preamble (a refusing conflict). */
  readonly conflictingCurrency?: { readonly code: string; readonly line: number };
}

const ACCOUNT_LABELS = new Set([
  'account',
  'account number',
  'account no',
  'iban',
  'account iban',
  'konto',
  'kontonummer',
  'konto iban',
  'rekening',
  'rekeningnummer',
  'compte',
  'numero de compte',
  'cuenta',
  'numero de cuenta',
  'conto',
]);
const NAME_LABELS = new Set(['account name', 'kontobezeichnung', 'kontoname', 'naam rekening', 'nom du compte']);
const CURRENCY_LABELS = new Set(['currency', 'waehrung', 'wahrung', 'devise', 'munt', 'moneda', 'divisa', 'valuta']);

/** Splits "Label: value" written in one cell. */
function labelled(cell: string): [string, string] | undefined {
  const colon = cell.indexOf(':');
  if (colon <= 0) return undefined;
  return [cell.slice(0, colon), cell.slice(colon + 1)];
}

/**
 * Reads records `0 … end-1` of `table` as a preamble.
 *
 * @example readPreamble(scanCsv('Account;DE89 3704 0044 0532 0130 00\nCurrency;EUR\nDate;Amount', ';'), 2)
 *   // { identifier: 'DE89370400440532013000', identifierLine: 1, currency: 'EUR', currencyLine: 2 }
 */
export function readPreamble(table: CsvTable, end: number): PreambleInfo {
  let identifier: string | undefined;
  let identifierLine: number | undefined;
  let name: string | undefined;
  let currency: string | undefined;
  let currencyLine: number | undefined;
  let conflictingCurrency: { code: string; line: number } | undefined;

  const noteCurrency = (raw: string, line: number): void => {
    const code = raw.trim().toUpperCase();
    if (!/^[A-Z]{3}$/.test(code)) return;
    if (currency === undefined) {
      currency = code;
      currencyLine = line;
    } else if (code !== currency) conflictingCurrency ??= { code, line };
  };

  for (let r = 0; r < end && r < table.rowCount; r++) {
    const line = table.rowLine[r] as number;
    const cells: string[] = [];
    for (let c = 0; c < rowWidth(table, r); c++) {
      const cell = cellAt(table, r, c).trim();
      if (cell !== '') cells.push(cell);
    }
    // Pairs: a label cell followed by its value, or "Label: value" in one cell.
    const pairs: [string, string][] = [];
    for (let k = 0; k < cells.length; k++) {
      const cell = cells[k] as string;
      const inline = labelled(cell);
      if (inline && inline[1].trim() !== '') pairs.push([inline[0], inline[1]]);
      else if (k + 1 < cells.length) pairs.push([inline ? inline[0] : cell, cells[k + 1] as string]);
    }
    for (const [label, value] of pairs) {
      const key = normaliseHeaderName(label).key;
      if (ACCOUNT_LABELS.has(key) && identifier === undefined && /\d/.test(value)) {
        identifier = findIban(value) ?? normaliseAccountIdentifier(value);
        identifierLine = line;
      } else if (NAME_LABELS.has(key) && name === undefined) {
        name = value.trim();
      } else if (CURRENCY_LABELS.has(key)) {
        noteCurrency(value, line);
      }
    }
    if (identifier === undefined) {
      const iban = findIban(cells.join(' '));
      if (iban !== undefined) {
        identifier = iban;
        identifierLine = line;
      }
    }
    // A known code standing alone in a cell ("…;EUR").
    for (const cell of cells) if (/^[A-Z]{3}$/.test(cell) && isKnownCurrency(cell)) noteCurrency(cell, line);
  }
  return {
    ...(identifier !== undefined ? { identifier, identifierLine } : {}),
    ...(name !== undefined && name !== '' ? { name } : {}),
    ...(currency !== undefined ? { currency, currencyLine } : {}),
    ...(conflictingCurrency !== undefined ? { conflictingCurrency } : {}),
  };
}
