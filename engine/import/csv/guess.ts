/**
 * Column roles guessed from content alone, for files without a header: a column where
 * every cell is a date, a column where every cell is an amount. Used by `sniff` and to
 * propose a mapping in the preview; an import without a header still needs an explicit
 * mapping, because a guess cannot tell an amount from a balance.
 */
import { looksLikeDate } from './dates';
import { inspectAmount } from './numbers';
import { cellAt, isBlankRow, type CsvTable } from './scan';

/** The guess: column indexes, undefined when no column fits. */
export interface ContentGuess {
  readonly date?: number;
  readonly amount?: number;
  readonly balance?: number;
  readonly description?: number;
}

/** Rows looked at. */
export const GUESS_ROWS = 50;

/**
 * Guesses the date, amount, balance and description columns from rows `from … to-1`.
 * A date column: every non-empty cell is shaped like a date. An amount column: every
 * non-empty cell is a number, and at least one has a sign or a fraction (so an id column of
 * plain integers is not taken). The first such column is the amount, a second the balance.
 * The description is the text column with the longest cells.
 *
 * @example guessColumns(scanCsv('2025-01-02,Rent,-500.00\n2025-01-03,Pay,20.00', ','), 0, 2) // { date: 0, amount: 2, description: 1 }
 */
export function guessColumns(table: CsvTable, from: number, to: number, width: number): ContentGuess {
  const end = Math.min(to, from + GUESS_ROWS);
  let date: number | undefined;
  let amount: number | undefined;
  let balance: number | undefined;
  let description: number | undefined;
  let longest = 0;
  for (let c = 0; c < width; c++) {
    let filled = 0;
    let dates = 0;
    let numbers = 0;
    let signed = 0;
    let length = 0;
    for (let r = from; r < end; r++) {
      if (isBlankRow(table, r)) continue;
      const cell = cellAt(table, r, c).trim();
      if (cell === '') continue;
      filled++;
      length += cell.length;
      if (looksLikeDate(cell)) dates++;
      else {
        const info = inspectAmount(cell);
        if (info.ok) {
          numbers++;
          if (/[-,.()]/.test(cell)) signed++;
        }
      }
    }
    if (filled === 0) continue;
    if (dates === filled) {
      date ??= c;
    } else if (numbers === filled && signed > 0) {
      if (amount === undefined) amount = c;
      else balance ??= c;
    } else if (dates === 0 && numbers < filled && length / filled > longest) {
      longest = length / filled;
      description = c;
    }
  }
  return {
    ...(date !== undefined ? { date } : {}),
    ...(amount !== undefined ? { amount } : {}),
    ...(balance !== undefined ? { balance } : {}),
    ...(description !== undefined ? { description } : {}),
  };
}
