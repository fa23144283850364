/**
 * Debit/credit indicator cells and booking status cells. Common practice, no single
 * source: the words are those banks print in English, German (S/H for Soll/Haben),
 * French, Dutch (Af/Bij), Spanish and Italian exports.
 */

function key(text: string): string {
  return text
    .trim()
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/\.$/, '');
}

const DEBIT_WORDS = new Set([
  'd',
  'dr',
  'db',
  'dbit',
  'debit',
  'debet',
  'debito',
  '-',
  's',
  'soll',
  'lastschrift',
  'af',
  'out',
  'withdrawal',
  'cargo',
  'addebito',
]);
const CREDIT_WORDS = new Set([
  'c',
  'cr',
  'crdt',
  'credit',
  'credito',
  '+',
  'h',
  'haben',
  'gutschrift',
  'bij',
  'in',
  'deposit',
  'abono',
  'accredito',
]);

/**
 * The sign a debit/credit indicator cell gives: -1 debit, +1 credit, 0 unknown.
 *
 * @example indicatorSign('DR') // -1
 * @example indicatorSign('Haben') // 1
 * @example indicatorSign('?') // 0
 */
export function indicatorSign(text: string): -1 | 0 | 1 {
  const k = key(text);
  if (DEBIT_WORDS.has(k)) return -1;
  if (CREDIT_WORDS.has(k)) return 1;
  return 0;
}

const PENDING_WORDS = new Set([
  'pending',
  'vorgemerkt',
  'vorgemerkte',
  'nicht gebucht',
  'in bearbeitung',
  'reserviert',
  'en attente',
  'a venir',
  'in behandeling',
  'in afwachting',
  'pendiente',
  'in sospeso',
  'authorised',
  'authorized',
  'authorisation',
  'authorization',
  'on hold',
  'hold',
  'unposted',
  'not booked',
  'provisional',
]);
const BOOKED_WORDS = new Set([
  '',
  'booked',
  'gebucht',
  'posted',
  'cleared',
  'completed',
  'complete',
  'settled',
  'final',
  'comptabilise',
  'execute',
  'geboekt',
  'verwerkt',
  'contabilizado',
  'contabilizzato',
]);

/**
 * Reads a status cell: 'pending', 'booked', or undefined when the word is unknown.
 *
 * @example bookingStatus('Vorgemerkt') // 'pending'
 * @example bookingStatus('') // 'booked'
 */
export function bookingStatus(text: string): 'booked' | 'pending' | undefined {
  const k = key(text);
  if (BOOKED_WORDS.has(k)) return 'booked';
  if (PENDING_WORDS.has(k)) return 'pending';
  return undefined;
}
