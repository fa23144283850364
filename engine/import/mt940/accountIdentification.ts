/**
 * Field 25, Account Identification (35x), and its option 25P (account, then the BIC of the
 * account owner on a second line). Banks write an IBAN (sometimes with spaces), a plain
 * account number, `BIC/ACCOUNT`, or `BANKCODE/ACCOUNT`. IBANs lose their spaces; a leading
 * BIC or numeric bank code before the first slash becomes the servicer.
 */
import type { StatementAccount } from '../types';

const BIC = /^[A-Z]{6}[A-Z0-9]{2}([A-Z0-9]{3})?$/;
const IBAN_SHAPE = /^[A-Z]{2}\d{2}[A-Z0-9]{11,30}$/;

/**
 * True when `text` (spaces removed, upper case) has the ISO 13616 IBAN shape and its check
 * digits pass the mod-97 test.
 * @example isValidIban('GB82WEST12345698765432') // true
 */
export function isValidIban(text: string): boolean {
  if (!IBAN_SHAPE.test(text)) return false;
  const rearranged = text.slice(4) + text.slice(0, 4);
  let remainder = 0;
  for (const ch of rearranged) {
    const digits = /\d/.test(ch) ? ch : String(ch.charCodeAt(0) - 55);
    for (const d of digits) remainder = (remainder * 10 + Number(d)) % 97;
  }
  return remainder === 1;
}

/** Account identification as read, with notices about its shape. */
export interface AccountIdentification {
  readonly account: StatementAccount;
  readonly notices: readonly string[];
}

function normaliseIdentifier(text: string, notices: string[]): string {
  const compact = text.replace(/\s+/g, '');
  if (IBAN_SHAPE.test(compact.toUpperCase())) {
    const iban = compact.toUpperCase();
    if (!isValidIban(iban)) notices.push(`"${text}" looks like an IBAN but its check digits fail (ISO 13616 mod 97)`);
    return iban;
  }
  return text.trim();
}

/**
 * Reads field 25 / 25P (lines with the tag removed).
 * @example parseAccountIdentification(['DE89 3704 0044 0532 0130 00']).account // { identifier: 'DE89370400440532013000' }
 * @example parseAccountIdentification(['ABCDDEFFXXX/DE89370400440532013000']).account // { identifier: 'DE89370400440532013000', servicer: 'ABCDDEFFXXX' }
 */
export function parseAccountIdentification(lines: readonly string[]): AccountIdentification {
  const notices: string[] = [];
  const first = (lines[0] ?? '').trim().replace(/^\//, '');
  const second = lines[1]?.trim();
  let servicer: string | undefined = second !== undefined && BIC.test(second) ? second : undefined;
  let identifierText = first;
  const slash = first.indexOf('/');
  if (slash > 0 && slash < first.length - 1) {
    const head = first.slice(0, slash).trim();
    if (BIC.test(head) || /^\d{3,11}$/.test(head)) {
      servicer = servicer ?? head;
      identifierText = first.slice(slash + 1);
    }
  }
  const identifier = normaliseIdentifier(identifierText, notices);
  return {
    account: { ...(identifier !== '' ? { identifier } : {}), ...(servicer !== undefined ? { servicer } : {}) },
    notices,
  };
}
