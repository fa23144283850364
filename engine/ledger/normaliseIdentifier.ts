/**
 * Account identifiers as the ledger compares them. Files print the same account in
 * different ways ("DE89 3704 0044 0532 0130 00", "de89370400440532013000", MT940
 * "37040044/0532013000"); the normal form keeps only letters and digits, upper case.
 */
import { isValidIban } from './iban';

/**
 * Upper-case letters and digits of an identifier; spaces, dashes, dots and slashes go.
 * @example normaliseIdentifier('de89 3704-0044/0532.0130 00') // 'DE89370400440532013000'
 */
export function normaliseIdentifier(identifier: string): string {
  return identifier.toUpperCase().replace(/[^A-Z0-9]/g, '');
}

/**
 * The keys under which an account is matched: its normal form and, for a valid IBAN, also
 * its BBAN (the IBAN without country and check digits), so a statement that prints the
 * national bank code and account number (e.g. MT940 :25: "37040044/0532013000") joins the
 * IBAN's account.
 *
 * @example identifierKeys('DE89 3704 0044 0532 0130 00') // ['DE89370400440532013000', '370400440532013000']
 */
export function identifierKeys(identifier: string): string[] {
  const normal = normaliseIdentifier(identifier);
  if (normal === '') return [];
  return isValidIban(normal) ? [normal, normal.slice(4)] : [normal];
}
