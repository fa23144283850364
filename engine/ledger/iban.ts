/**
 * IBAN check digits, ISO 13616-1: move the first four characters to the end, replace
 * letters by two digits (A = 10 … Z = 35) and take the number modulo 97; a valid IBAN
 * leaves 1. Check digits for a new IBAN are 98 − (that number with "00" as check digits)
 * mod 97. Only the structure and the check digits are verified, not a country's length.
 */

/** The ISO 7064 MOD 97-10 remainder of an IBAN-shaped string, read piecewise (no big integers). */
function mod97(text: string): number {
  let remainder = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    const value = c >= 65 && c <= 90 ? c - 55 : c - 48;
    remainder = value >= 10 ? (remainder * 100 + value) % 97 : (remainder * 10 + value) % 97;
  }
  return remainder;
}

const IBAN_SHAPE = /^[A-Z]{2}\d{2}[A-Z0-9]{11,30}$/;

/**
 * True when `text` (spaces allowed, any case) is an IBAN with valid check digits.
 * @example isValidIban('GB82 WEST 1234 5698 7654 32') // true
 */
export function isValidIban(text: string): boolean {
  const iban = text.replace(/\s+/g, '').toUpperCase();
  if (!IBAN_SHAPE.test(iban)) return false;
  return mod97(iban.slice(4) + iban.slice(0, 4)) === 1;
}

/**
 * The two check digits for a country code and a BBAN (basic bank account number).
 * @throws Error when the country is not two letters or the BBAN not 11–30 letters/digits.
 * @example ibanCheckDigits('GB', 'WEST12345698765432') // '82'
 */
export function ibanCheckDigits(country: string, bban: string): string {
  if (!/^[A-Z]{2}$/.test(country) || !/^[A-Z0-9]{11,30}$/.test(bban)) {
    throw new Error(`not an IBAN country code and BBAN: "${country}", "${bban}"`);
  }
  return String(98 - mod97(bban + country + '00')).padStart(2, '0');
}
