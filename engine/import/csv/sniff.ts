/**
 * How sure the CSV importer is, from content alone, that a text is a CSV statement. XML,
 * OFX and MT940 get 0 so their own importers win; delimited text with a consistent field
 * count and a date and an amount column gets a high score.
 */
import { rankDelimiters } from './delimiter';
import { guessColumns } from './guess';
import { HEADER_SEARCH_ROWS, findHeaderRow } from './header';
import { isBlankRow, rowWidth, scanCsv } from './scan';

/** Characters of the text looked at. */
export const SNIFF_CHARS = 65_536;

/** True for content another importer owns: XML (camt.053, OFX 2), OFX 1 SGML, SWIFT MT940. */
function belongsElsewhere(head: string): boolean {
  const start = head.replace(/^[\ufeff\s]+/, '');
  if (start.startsWith('<') || start.startsWith('OFXHEADER') || start.startsWith('{1:')) return true;
  if (/^\s*<\?xml/i.test(start) || /^\s*<OFX>/im.test(head)) return true;
  return /^:20:/m.test(head) && /^:(?:25|28C|60[FM]|61):/m.test(head);
}

/**
 * Confidence 0–1 that `text` is a CSV statement: 0 for XML/OFX/MT940 or undelimited text,
 * 0.05 for a single delimited line, 0.2 for a consistent table without a date and an
 * amount, 0.8 for a table whose content has a date and an amount column, 0.95 when its
 * header names them. O(min(n, 64 KiB)).
 *
 * @example sniffCsv('Date;Amount\n01.02.2025;-12,50\n') // 0.95
 * @example sniffCsv('OFXHEADER:100\nDATA:OFXSGML\n') // 0
 */
export function sniffCsv(text: string): number {
  const cut = text.length > SNIFF_CHARS;
  const head = cut ? text.slice(0, SNIFF_CHARS) : text;
  if (head.trim() === '' || belongsElsewhere(head)) return 0;
  const best = rankDelimiters(head)[0];
  if (!best || best.fieldCount < 2 || best.matching === 0) return 0;
  if (best.matching < 2) return 0.05;
  const table = scanCsv(head, best.delimiter, HEADER_SEARCH_ROWS + 50);
  const rows = cut && !table.truncated ? table.rowCount - 1 : table.rowCount;
  const header = findHeaderRow(table);
  if (header !== undefined && header < rows - 1) {
    const width = rowWidth(table, header);
    let consistent = 0;
    let total = 0;
    for (let r = header + 1; r < rows; r++) {
      if (isBlankRow(table, r)) continue;
      total++;
      if (rowWidth(table, r) >= width - 1 && rowWidth(table, r) <= width + 1) consistent++;
    }
    if (total > 0 && consistent / total >= 0.8) return 0.95;
  }
  let start = 0;
  while (start < rows && rowWidth(table, start) !== best.fieldCount) start++;
  const guess = guessColumns(table, start, rows, best.fieldCount);
  if (guess.date !== undefined && guess.amount !== undefined && best.matching / Math.max(1, best.sampled) >= 0.6) {
    return 0.8;
  }
  return best.matching / Math.max(1, best.sampled) >= 0.8 ? 0.2 : 0.1;
}
