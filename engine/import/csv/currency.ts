/**
 * The one currency of a CSV file, from whatever states it: a currency column, a preamble
 * line, a column name ("Betrag (EUR)"), codes beside the amounts, and last the caller's
 * option. Every statement must agree; a second currency refuses the file.
 */
import { isKnownCurrency } from '../../core/currency';

/** Where a currency was stated. */
export type CurrencySource = 'currency column' | 'preamble' | 'column name' | 'amount cell';

/** The first currency stated, with where. */
export interface StatedCurrency {
  readonly code: string;
  readonly line: number;
  readonly source: CurrencySource;
}

/** Collects currency statements one by one. */
export interface CurrencyCollector {
  /** The first valid code stated, if any. */
  readonly stated: StatedCurrency | undefined;
  /** True once a code was refused as not ISO 4217 (then "no currency" is not reported too). */
  readonly rejected: boolean;
  /**
   * Notes a code stated on `line`; returns a problem message when the code is not ISO 4217
   * or differs from the one stated first, otherwise undefined.
   */
  note(raw: string, line: number, source: CurrencySource): string | undefined;
}

/**
 * Creates an empty collector.
 *
 * @example
 * const c = createCurrencyCollector();
 * c.note('eur', 2, 'preamble'); // undefined
 * c.note('USD', 9, 'currency column'); // 'currency "USD" differs from EUR stated on line 2 (preamble), expected one currency per file'
 */
export function createCurrencyCollector(): CurrencyCollector {
  let stated: StatedCurrency | undefined;
  let lastChecked = '';
  let rejected = false;
  return {
    get stated() {
      return stated;
    },
    get rejected() {
      return rejected;
    },
    note(raw, line, source) {
      // Most rows repeat the code already accepted: one comparison, no allocation.
      if (raw === lastChecked && stated !== undefined) return undefined;
      const code = raw.trim().toUpperCase();
      if (!isKnownCurrency(code)) {
        rejected = true;
        return `currency "${raw.trim()}" is not an ISO 4217 code, expected a code like EUR`;
      }
      if (stated === undefined) {
        stated = { code, line, source };
      } else if (code !== stated.code) {
        return `currency "${code}" differs from ${stated.code} stated on line ${stated.line} (${stated.source}), expected one currency per file`;
      }
      lastChecked = raw;
      return undefined;
    },
  };
}
