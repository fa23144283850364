import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ibanCheckDigits, isValidIban } from '../../engine/ledger/iban';
import { identifierKeys, normaliseIdentifier } from '../../engine/ledger/normaliseIdentifier';
import {
  entryFingerprint,
  fingerprintHash,
  fingerprintWords,
  lastFingerprintHash,
} from '../../engine/ledger/fingerprint';

describe('IBAN check digits', () => {
  it('accepts the standard example and refuses a changed check digit', () => {
    // From memory: the widely published example IBAN "GB82 WEST 1234 5698 7654 32" (ECBS EBS204).
    expect(isValidIban('GB82 WEST 1234 5698 7654 32')).toBe(true);
    expect(isValidIban('gb82west12345698765432')).toBe(true);
    expect(isValidIban('GB83 WEST 1234 5698 7654 32')).toBe(false);
    expect(ibanCheckDigits('GB', 'WEST12345698765432')).toBe('82');
  });
  it('refuses wrong shapes', () => {
    for (const bad of ['', 'GB82', '1234WEST12345698765432', 'GB82-WEST-1234', 'GBXXWEST12345698765432']) {
      expect(isValidIban(bad), bad).toBe(false);
    }
    expect(() => ibanCheckDigits('gb', 'WEST12345698765432')).toThrow();
  });
  it('gives check digits that validate for invented BBANs', () => {
    for (const bban of ['EBBL0123456789', 'HRBL0412345670', 'QFSB0100200300', 'ZZZZ0000000001']) {
      expect(isValidIban(`NL${ibanCheckDigits('NL', bban)}${bban}`), bban).toBe(true);
    }
  });
});

describe('identifiers', () => {
  it('keeps only upper-case letters and digits', () => {
    expect(normaliseIdentifier(' nl94 ebbl-0123.4567/89 ')).toBe('NL94EBBL0123456789');
  });
  it('adds the BBAN as a key for valid IBANs only', () => {
    expect(identifierKeys('NL94 EBBL 0123 4567 89')).toEqual(['NL94EBBL0123456789', 'EBBL0123456789']);
    expect(identifierKeys('NL95 EBBL 0123 4567 89')).toEqual(['NL95EBBL0123456789']);
    expect(identifierKeys('0123-456789')).toEqual(['0123456789']);
    expect(identifierKeys(' - ')).toEqual([]);
  });
});

describe('fingerprints', () => {
  it('uses sorted distinct lower-case words', () => {
    expect(fingerprintWords('Clay  SUPPLY, clay')).toBe('clay supply');
    expect(fingerprintWords('Überweisung Café')).toBe('café überweisung');
    expect(fingerprintWords('')).toBe('');
  });
  it('combines date, amount and the words of description and counterparty', () => {
    expect(entryFingerprint({ bookingDate: '2026-01-02', amount: -1250, description: 'Clay supply' })).toBe(
      '2026-01-02|-1250|clay supply',
    );
    expect(
      entryFingerprint({
        bookingDate: '2026-01-02',
        amount: 500,
        description: 'INV-2026-031',
        counterparty: 'Moss & Fern',
      }),
    ).toBe(entryFingerprint({ bookingDate: '2026-01-02', amount: 500, description: 'moss fern inv 2026 031' }));
  });
  it('gives the same words on the ASCII fast path as the general Unicode split', () => {
    // The definition the fast path must agree with: lower-case, NFC, split on non-letters/digits.
    const reference = (text: string): string =>
      [
        ...new Set(
          text
            .toLowerCase()
            .normalize('NFC')
            .split(/[^\p{L}\p{N}]+/u)
            .filter((w) => w !== ''),
        ),
      ]
        .sort()
        .join(' ');
    const chars = fc.constantFrom(...'aZz09 -.,;/&|_~\t\nABCxyzé€ß'.split(''));
    const text = fc.array(chars, { maxLength: 40 }).map((cs) => cs.join(''));
    fc.assert(
      fc.property(text, text, (description, counterparty) => {
        expect(fingerprintWords(description)).toBe(reference(description));
        const fingerprint = entryFingerprint({ bookingDate: '2026-01-02', amount: 1, description, counterparty });
        expect(fingerprint).toBe(`2026-01-02|1|${reference(`${description} ${counterparty}`)}`);
        expect(lastFingerprintHash()).toBe(fingerprintHash(fingerprint));
      }),
      { numRuns: 500 },
    );
  });
});
