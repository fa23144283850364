/**
 * Reduces a transaction's counterparty/description to the words that stay the same from
 * one occurrence of a recurring payment to the next: references, invoice numbers, dates,
 * amounts and card-terminal noise change every time and are removed.
 */

const NOISE_WORDS = new Set([
  'sepa',
  'direct',
  'debit',
  'credit',
  'transfer',
  'payment',
  'card',
  'pos',
  'ref',
  'reference',
  'dd',
  'so',
  'standing',
  'order',
  'lastschrift',
  'gutschrift',
  'ueberweisung',
  'the',
  'to',
  'from',
  'for',
  'of',
  'and',
  'invoice',
  'inv',
  'nr',
  'no',
  'id',
  'end',
  'mandate',
]);

/**
 * Normalised grouping label: lower case, accents removed, tokens containing digits dropped,
 * trade noise words dropped, the first four remaining words kept.
 *
 * @example normaliseLabel('SEPA DD Kilnworks Power Co. ref 2025-03 / 4471') // 'kilnworks power co'
 */
export function normaliseLabel(text: string): string {
  const plain = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
  if (plain === '') return '';
  const words: string[] = [];
  for (const token of plain.split(' ')) {
    if (/\d/.test(token) || token.length < 2 || NOISE_WORDS.has(token)) continue;
    words.push(token);
    if (words.length === 4) break;
  }
  return words.join(' ');
}
