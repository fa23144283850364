/**
 * Field delimiter detection. Each candidate splits a sample of the text (quote-aware, so a
 * `;` inside a quoted field does not count); the candidate under which the most records
 * share one field count of two or more wins. Preamble lines and a trailer have other
 * counts, so the table's own count dominates once it has more rows than the preamble.
 */
import { isBlankRow, rowWidth, scanCsv } from './scan';

/** Delimiters Ebbline reads and writes. */
export const CSV_DELIMITERS = [',', ';', '\t', '|'] as const;

/** One of `,` `;` tab `|`. */
export type CsvDelimiter = (typeof CSV_DELIMITERS)[number];

/** How well one delimiter explains the sample. */
export interface DelimiterScore {
  readonly delimiter: CsvDelimiter;
  /** Most frequent field count (≥ 2) under this delimiter, or 1 when nothing splits. */
  readonly fieldCount: number;
  /** Non-blank sampled records with exactly `fieldCount` fields. */
  readonly matching: number;
  /** Non-blank records sampled. */
  readonly sampled: number;
}

/** Characters of text looked at per candidate. */
export const DELIMITER_SAMPLE_CHARS = 65_536;
/** Records sampled per candidate. */
export const DELIMITER_SAMPLE_RECORDS = 80;

/** Tie order: a tab or `;` is rarely part of a value, `,` often is (decimal commas). */
const TIE_ORDER: readonly CsvDelimiter[] = ['\t', ';', '|', ','];

/**
 * Scores every candidate delimiter on the head of `text`, best first.
 * O(min(n, 64 KiB)) per candidate.
 *
 * @example rankDelimiters('Date;Amount\n01.02.2025;-12,50\n')[0].delimiter // ';'
 */
export function rankDelimiters(text: string): DelimiterScore[] {
  const cut = text.length > DELIMITER_SAMPLE_CHARS;
  const sample = cut ? text.slice(0, DELIMITER_SAMPLE_CHARS) : text;
  const scores: DelimiterScore[] = [];
  for (const delimiter of TIE_ORDER) {
    const table = scanCsv(sample, delimiter, DELIMITER_SAMPLE_RECORDS);
    // The last record of a cut sample may be cut in the middle.
    const rows = cut && !table.truncated ? table.rowCount - 1 : table.rowCount;
    const tally = new Map<number, number>();
    let sampled = 0;
    for (let r = 0; r < rows; r++) {
      if (isBlankRow(table, r)) continue;
      sampled++;
      const w = rowWidth(table, r);
      if (w >= 2) tally.set(w, (tally.get(w) ?? 0) + 1);
    }
    let fieldCount = 1;
    let matching = 0;
    for (const [w, count] of tally) {
      if (count > matching || (count === matching && w > fieldCount)) {
        fieldCount = w;
        matching = count;
      }
    }
    scores.push({ delimiter, fieldCount, matching, sampled });
  }
  // Stable sort keeps TIE_ORDER among equals.
  return scores.sort((a, b) => b.matching - a.matching || b.fieldCount - a.fieldCount);
}

/**
 * The most likely delimiter of `text` (`,` when nothing splits the text).
 *
 * @example detectDelimiter('a|b|c\n1|2|3') // '|'
 */
export function detectDelimiter(text: string): CsvDelimiter {
  const best = rankDelimiters(text)[0];
  return best !== undefined && best.matching > 0 ? best.delimiter : ',';
}
