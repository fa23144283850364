import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseIsoDate } from '../../engine/core/dates';
import { parsePlainDecimal } from '../../engine/core/money';
import {
  camt053VersionNumber,
  camt053VersionOf,
  isoDateOf,
  isoDateTimeDateOf,
  unsignedAmountOf,
} from '../../engine/import/camt053/values';

describe('camt.053 value types', () => {
  it('maps namespaces to versions 001.02 … 001.13 only', () => {
    // Source: ISO 20022 camt.053 namespaces urn:iso:std:iso:20022:tech:xsd:camt.053.001.NN (REFERENCES.md).
    expect(camt053VersionOf('urn:iso:std:iso:20022:tech:xsd:camt.053.001.02')).toBe('001.02');
    expect(camt053VersionOf('urn:iso:std:iso:20022:tech:xsd:camt.053.001.13')).toBe('001.13');
    expect(camt053VersionOf('urn:iso:std:iso:20022:tech:xsd:camt.053.001.14')).toBeUndefined();
    expect(camt053VersionOf('urn:iso:std:iso:20022:tech:xsd:camt.052.001.08')).toBeUndefined();
    expect(camt053VersionNumber('001.08')).toBe(8);
    expect(camt053VersionNumber('8')).toBeNaN();
  });

  it('reads ISODate with an optional zone and refuses impossible days', () => {
    // Source: ISO 20022 ISODate = XML Schema xs:date (W3C XML Schema Part 2 §3.2.9), optional timezone.
    expect(isoDateOf('2024-02-29')).toEqual({ date: '2024-02-29' });
    expect(isoDateOf('2024-02-29+01:00')).toEqual({ date: '2024-02-29' });
    expect(isoDateOf('2023-02-29')).toEqual({ message: 'impossible date "2023-02-29"' });
    expect(isoDateOf('2024-2-9')).toHaveProperty('message');
  });

  it('reads ISODateTime as the calendar date written, with or without zone or fraction', () => {
    // Source: ISO 20022 ISODateTime = XML Schema xs:dateTime (W3C XML Schema Part 2 §3.2.7).
    expect(isoDateTimeDateOf('2024-03-31T23:30:00-05:00')).toEqual({ date: '2024-03-31' });
    expect(isoDateTimeDateOf('2024-03-31T23:30:00.123Z')).toEqual({ date: '2024-03-31' });
    expect(isoDateTimeDateOf('2024-03-31T24:00:00')).toEqual({ date: '2024-03-31' });
    expect(isoDateTimeDateOf('2024-03-31T25:00:00')).toHaveProperty('message');
    expect(isoDateTimeDateOf('2024-03-31')).toHaveProperty('message');
  });

  it('agrees with the strict calendar-date parser on any 10-character text', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc
            .tuple(fc.integer({ min: 0, max: 9999 }), fc.integer({ min: 0, max: 13 }), fc.integer({ min: 0, max: 32 }))
            .map(
              ([y, m, d]) =>
                `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`,
            ),
          fc.string({ minLength: 10, maxLength: 10 }),
        ),
        (text) => {
          const r = isoDateOf(text);
          const strict = parseIsoDate(text);
          expect('date' in r).toBe(strict !== undefined);
        },
      ),
      { seed: 4217, numRuns: 3000 },
    );
  });

  it('reads unsigned amounts exactly as the decimal parser does', () => {
    // Source: ISO 20022 ActiveOrHistoricCurrencyAndAmount (xs:decimal, minInclusive 0); ISO 4217 exponents 0, 2, 3.
    fc.assert(
      fc.property(fc.stringMatching(/^[0-9]{1,16}(\.[0-9]{0,5})?$/), fc.constantFrom(0, 2, 3), (text, exponent) => {
        const r = unsignedAmountOf(text, exponent);
        const reference = parsePlainDecimal(text, exponent);
        if (typeof reference === 'number') expect(r).toBe(reference);
        else expect(r).toHaveProperty('message');
      }),
      { seed: 978, numRuns: 3000 },
    );
    expect(unsignedAmountOf('+.5', 2)).toBe(50);
    expect(unsignedAmountOf('-0.01', 2)).toHaveProperty('message');
    expect(unsignedAmountOf('1234567890123456789', 0)).toHaveProperty('message');
  });
});
