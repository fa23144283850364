/**
 * Finds the incoming payments that look like the settlement of an invoice: a reference with
 * an invoice number (INV-2025-031, RE 2025/114, Rechnung Nr. 4711, factura F-0042 …) or an
 * invoice word (invoice, Rechnung, factura, facture, fattura, factuur, faktura) in the
 * description or counterparty. Statements carry no issued-invoice list, so this is the
 * only trace of invoices a forecast has; what it finds feeds estimatePaymentDelay.
 */
import type { CalendarDate } from '../core/dates';
import type { HistoryEntry } from '../forecast/history';

/** An incoming payment that looks like an invoice being paid. */
export interface InvoicePayment {
  readonly id: string;
  readonly date: CalendarDate;
  /** Minor units, > 0. */
  readonly amount: number;
  readonly counterparty: string | null;
  /** The invoice number as written (upper-cased), or null when only a word matched. */
  readonly reference: string | null;
  readonly matchedBy: 'number' | 'word';
}

// Words that mean "invoice" in the languages statements commonly use.
const WORDS = 'invoice|inv|rechnung|rechnungsnr|rg|re|factura|facture|fact|fac|fattura|fatt|factuur|faktura|fv';
// A prefix word, an optional "no"/"nr"/"#", then a number of at least 3 digits that may be
// split by - / . (INV-2025-031, RE 2025/114, Nr. 4711).
const NUMBER = new RegExp(
  `(?<![\\p{L}\\p{N}])(${WORDS})(?:[\\s.:#_-]*(?:no|nr|n°|num|number|nummer|núm))?[\\s.:#_/-]*(?:\\p{L}{1,3}[-/])?(\\d[\\d./-]*\\d|\\d{3,})(?!\\p{N})`,
  'iu',
);
const WORD = /(?<![\p{L}\p{N}])(invoice|rechnung|factura|facture|fattura|factuur|faktura)/iu;

function digitCount(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) >= 48 && text.charCodeAt(i) <= 57) n++;
  return n;
}

/**
 * The invoice number in a text, e.g. "INV-2025-031", or null.
 * Two-letter prefixes (RE, RG, FV) need a number of 4 digits or more, so "RE: 12" in a
 * reply line does not count.
 * @example invoiceReferenceOf('Payment INV-2025-031 commission') // 'INV-2025-031'
 */
export function invoiceReferenceOf(text: string): string | null {
  const m = NUMBER.exec(text);
  if (!m) return null;
  const word = (m[1] as string).toLowerCase();
  const number = (m[2] as string).replace(/[./-]+$/, '');
  if (digitCount(number) < (word.length <= 2 ? 4 : 3)) return null;
  return m[0].trim().toUpperCase();
}

/**
 * @returns the invoice-like inflows, in the entries' order.
 * @example findInvoicePayments(history.entries).filter((p) => p.counterparty === 'Saltmarrow Cafe')
 * Complexity: O(n · text length).
 */
export function findInvoicePayments(entries: readonly HistoryEntry[]): InvoicePayment[] {
  const out: InvoicePayment[] = [];
  for (const e of entries) {
    if (!(e.amount > 0)) continue;
    const text = `${e.description} ${e.counterparty ?? ''}`;
    const reference = invoiceReferenceOf(text);
    if (reference === null && !WORD.test(text)) continue;
    out.push({
      id: e.id,
      date: e.date,
      amount: e.amount,
      counterparty: e.counterparty ?? null,
      reference,
      matchedBy: reference === null ? 'word' : 'number',
    });
  }
  return out;
}
