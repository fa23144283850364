import { describe, expect, it } from 'vitest';
import { reconciliationStatus } from '../../renderer/src/lib/accounts/reconciliationStatus';
import type { AccountRecord } from '../../renderer/src/lib/db/records';
import { uniqueFileName } from '../../renderer/src/lib/import/uniqueFileName';
import { contentHash, fnv1a64 } from '../../renderer/src/lib/worker/contentHash';

const account: AccountRecord = {
  id: 'NL21HRBL0412345670',
  name: 'Studio',
  currency: 'EUR',
  identifiers: ['NL21HRBL0412345670'],
  kind: 'current',
  order: 0,
  entries: 10,
  firstDate: '2026-01-01',
  lastDate: '2026-01-31',
  closingBalance: 150000,
  relative: false,
  reconciled: true,
  checkedAnchors: 2,
  firstMismatch: null,
  note: null,
};

describe('reconciliationStatus', () => {
  it('says reconciled, a mismatch with its first day and both balances, or nothing to check', () => {
    expect(reconciliationStatus(account, { locale: 'en' })).toMatchObject({ attribute: 'true', label: 'Reconciled ✓' });
    const mismatch = reconciliationStatus(
      {
        ...account,
        reconciled: false,
        firstMismatch: {
          date: '2026-01-15',
          at: 'end',
          kind: 'closing',
          expected: 100000,
          computed: 99000,
          difference: 1000,
          sourceFile: 'jan.xml',
          lastAgreement: '2026-01-01',
        },
      },
      { locale: 'en' },
    );
    expect(mismatch.attribute).toBe('false');
    expect(mismatch.label).toBe('Mismatch from 2026-01-15');
    expect(mismatch.detail.replace(/\u00a0/g, ' ')).toContain(
      'jan.xml states 1,000.00 EUR, the transactions give 990.00 EUR (difference 10.00 EUR)',
    );
    expect(reconciliationStatus({ ...account, reconciled: null, relative: true }).attribute).toBe('none');
    expect(reconciliationStatus({ ...account, reconciled: null, relative: true }).label).toBe('No stated balance');
  });
});

describe('uniqueFileName', () => {
  it('keeps a free name and numbers a taken one', () => {
    expect(uniqueFileName('export.csv', new Set())).toBe('export.csv');
    expect(uniqueFileName('export.csv', new Set(['export.csv', 'export (2).csv']))).toBe('export (3).csv');
    expect(uniqueFileName('C:\\bank\\README', new Set(['README']))).toBe('README (2)');
  });
});

describe('contentHash', () => {
  it('is SHA-256 in hex', async () => {
    // Source: FIPS 180-2, appendix B.1 ("abc").
    expect(await contentHash(new TextEncoder().encode('abc'))).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });

  it('falls back to 64-bit FNV-1a', () => {
    // Source: draft-eastlake-fnv test vectors, FNV-1a 64 of "" and "a".
    expect(fnv1a64(new Uint8Array())).toBe('fnv1a64-cbf29ce484222325');
    expect(fnv1a64(new TextEncoder().encode('a'))).toBe('fnv1a64-af63dc4c8601ec8c');
    expect(fnv1a64(new TextEncoder().encode('foobar'))).toBe('fnv1a64-85944171f73967e8');
  });
});
