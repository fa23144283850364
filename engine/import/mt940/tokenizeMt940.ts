/**
 * Splits MT940 text into fields (`:TAG:` lines plus their continuation lines), with or
 * without SWIFT block wrappers `{1:…}{2:…}{4:` … `-}`, and with or without `-` lines
 * between messages. CRLF, LF and lone CR all end a line. O(n) in the text length.
 *
 * Rules (SWIFT User Handbook, Standards MT General Information; field layout per
 * Category 9, MT940):
 * - a field starts at the beginning of a line with `:` two digits, an optional letter
 *   (the option) and `:`; every following line that does not start a field belongs to it;
 * - block 4 (the text block) opens with `{4:` and closes with a line starting `-}`; blocks
 *   1, 2, 3 and 5 are headers and trailers and are skipped;
 * - a line holding only `-` separates messages in files without wrappers;
 * - blank lines carry nothing and are skipped; trailing spaces are trimmed, leading ones kept;
 * - lines outside any field (a bank's file header, text between messages) are skipped
 *   with one notice per run.
 */
import { lineError, lineNotice, type LineProblem } from './lineProblem';

/** One physical line of a field: its text (tag removed on the first line) and 1-based line number. */
export interface Mt940FieldLine {
  readonly text: string;
  readonly line: number;
}

/** One field: tag with option letter (`61`, `60F`, `25P`), the line it starts on, and its lines. */
export interface Mt940Field {
  readonly tag: string;
  readonly line: number;
  readonly lines: readonly Mt940FieldLine[];
}

/** Result of {@link tokenizeMt940}. */
export interface Mt940Tokens {
  readonly fields: readonly Mt940Field[];
  readonly problems: readonly LineProblem[];
  /** Number of physical lines in the text. */
  readonly lineCount: number;
}

const TAG = /^:(\d{2}[A-Z]?):/;
const HEADER_BLOCK = /^\{[1-5]:/;

/**
 * Tokenizes MT940 text into fields. Never throws.
 * @example tokenizeMt940(':20:REF\n:86:two\nlines').fields[1] // { tag: '86', line: 2, lines: [{ text: 'two', line: 2 }, { text: 'lines', line: 3 }] }
 */
export function tokenizeMt940(text: string): Mt940Tokens {
  const fields: { tag: string; line: number; lines: Mt940FieldLine[] }[] = [];
  const problems: LineProblem[] = [];
  let current: (typeof fields)[number] | undefined;
  let inBlock = false;
  let blockLine = 0;
  let strayFirst = 0;
  let strayLast = 0;

  const flushStray = (): void => {
    if (strayFirst === 0) return;
    const where = strayFirst === strayLast ? `line ${strayFirst} is` : `lines ${strayFirst}–${strayLast} are`;
    problems.push(lineNotice(strayFirst, `${where} outside any MT940 field and ignored`));
    strayFirst = 0;
  };

  const content = (lineText: string, lineNo: number): void => {
    if (lineText.trim() === '') return;
    if (lineText === '-') {
      current = undefined;
      return;
    }
    const tag = TAG.exec(lineText);
    if (tag) {
      flushStray();
      current = { tag: tag[1] as string, line: lineNo, lines: [{ text: lineText.slice(tag[0].length), line: lineNo }] };
      fields.push(current);
    } else if (current) {
      current.lines.push({ text: lineText, line: lineNo });
    } else {
      if (strayFirst === 0) strayFirst = lineNo;
      strayLast = lineNo;
    }
  };

  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const physical = source.split(/\r\n|\r|\n/);
  for (let i = 0; i < physical.length; i++) {
    const lineNo = i + 1;
    let rest: string | undefined = (physical[i] as string).trimEnd();
    // A line may close one message and open the next (`-}{5:…}{1:…}{2:…}{4:`).
    for (let guard = 0; rest !== undefined && guard < 1000; guard++) {
      let lineText: string = rest;
      rest = undefined;
      if (lineText.startsWith('-}')) {
        if (!inBlock) problems.push(lineNotice(lineNo, "'-}' closes a block 4 that was never opened with '{4:'"));
        inBlock = false;
        current = undefined;
        const after = lineText.slice(2);
        if (after.includes('{4:')) rest = after;
        continue;
      }
      if (inBlock && HEADER_BLOCK.test(lineText)) {
        problems.push(
          lineError(blockLine, `block 4 opened on line ${blockLine} is not closed with '-}' before line ${lineNo}`),
        );
        inBlock = false;
        current = undefined;
      }
      if (!inBlock) {
        const open = lineText.indexOf('{4:');
        if (open >= 0 && (open === 0 || HEADER_BLOCK.test(lineText) || lineText[open - 1] === '}')) {
          flushStray();
          inBlock = true;
          blockLine = lineNo;
          current = undefined;
          lineText = lineText.slice(open + 3);
          if (lineText === '') continue;
        } else if (HEADER_BLOCK.test(lineText)) {
          continue;
        }
      }
      content(lineText, lineNo);
    }
  }
  flushStray();
  if (inBlock) {
    problems.push(
      lineError(blockLine, `block 4 opened on line ${blockLine} is not closed with '-}'; the file may be truncated`),
    );
  }
  return { fields, problems, lineCount: physical.length };
}
