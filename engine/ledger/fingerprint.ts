/**
 * The content fingerprint that recognises one entry printed by two statement files (say a
 * camt.053 file and a CSV export of the same account): booking date, signed amount and the
 * words of description and counterparty. The words are lower-cased, split on anything
 * that is not a letter or digit, deduplicated and sorted, so the formats' different
 * layouts (OFX NAME + MEMO vs camt counterparty + remittance text, line breaks in MT940
 * :86:) give the same fingerprint. References and bank ids are left out: one format has
 * them, another does not.
 */
import type { StatementEntry } from '../import/types';

/**
 * Sorted distinct lower-case words of a text (letters and digits of any script).
 * @example fingerprintWords('Clay  SUPPLY, clay') // 'clay supply'
 */
export function fingerprintWords(text: string): string {
  const words = text
    .toLowerCase()
    .normalize('NFC')
    .split(/[^\p{L}\p{N}]+/u);
  const distinct = [...new Set(words.filter((w) => w !== ''))];
  distinct.sort();
  return distinct.join(' ');
}

/**
 * Fingerprint of an entry: `bookingDate|amount|words`.
 * @example entryFingerprint({ bookingDate: '2026-01-02', amount: -1250, description: 'Clay supply', … })
 * // '2026-01-02|-1250|clay supply'
 */
export function entryFingerprint(
  entry: Pick<StatementEntry, 'bookingDate' | 'amount' | 'description' | 'counterparty'>,
): string {
  const words = fingerprintWords(`${entry.description} ${entry.counterparty ?? ''}`);
  return `${entry.bookingDate}|${entry.amount}|${words}`;
}
