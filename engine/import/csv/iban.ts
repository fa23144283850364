/**
 * IBAN recognition for account identifiers found in CSV preambles and account columns.
 * Check digits per ISO 13616-1 (ISO 7064 MOD 97-10): move the first four characters to
 * the end, replace letters by 10–35, and the number must leave remainder 1 modulo 97.
 */

const IBAN_SHAPE = /^[A-Z]{2}\d{2}[A-Z0-9]{11,30}$/;

/**
 * True when `compact` (no spaces, upper case) is shaped like an IBAN and its check digits
 * are right.
 *
 * @example isValidIban('DE89370400440532013000') // true
 * @example isValidIban('DE88370400440532013000') // false
 */
export function isValidIban(compact: string): boolean {
  if (!IBAN_SHAPE.test(compact)) return false;
  const rearranged = compact.slice(4) + compact.slice(0, 4);
  let remainder = 0;
  for (let i = 0; i < rearranged.length; i++) {
    const c = rearranged.charCodeAt(i);
    const value = c >= 0x41 ? c - 0x41 + 10 : c - 0x30;
    remainder = value >= 10 ? (remainder * 100 + value) % 97 : (remainder * 10 + value) % 97;
  }
  return remainder === 1;
}

/**
 * The IBAN in `text` (spaces allowed between groups, as printed), compacted, or undefined.
 * Among several readings the longest one with valid check digits wins, so a following
 * word ("DE89 3704 0044 0532 0130 00 EUR") is not swallowed.
 *
 * @example findIban('Account: DE89 3704 0044 0532 0130 00') // 'DE89370400440532013000'
 */
export function findIban(text: string): string | undefined {
  const upper = text.toUpperCase();
  const start = /(?:^|[^A-Z0-9])([A-Z]{2}\d{2})(?=[ A-Z0-9])/g;
  let m: RegExpExecArray | null;
  while ((m = start.exec(upper)) !== null) {
    const from = m.index + m[0].length - 4;
    let compact = '';
    let best: string | undefined;
    for (let i = from; i < upper.length && compact.length < 34; i++) {
      const c = upper[i] as string;
      if (c === ' ') continue;
      if (!/[A-Z0-9]/.test(c)) break;
      compact += c;
      if (isValidIban(compact)) best = compact;
    }
    if (best !== undefined) return best;
  }
  return undefined;
}

/**
 * An account identifier as the file prints it, normalised: a valid IBAN compacted, any
 * other identifier trimmed.
 *
 * @example normaliseAccountIdentifier(' de89 3704 0044 0532 0130 00 ') // 'DE89370400440532013000'
 */
export function normaliseAccountIdentifier(text: string): string {
  const trimmed = text.trim();
  const compact = trimmed.replace(/\s+/g, '').toUpperCase();
  return isValidIban(compact) ? compact : trimmed;
}
