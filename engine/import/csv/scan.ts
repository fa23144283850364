/**
 * Single-pass RFC 4180 scanner. RFC 4180 (2005) section 2: records end at a line break
 * (rule 1; LF alone and CR alone are accepted too, as banks write them), fields are
 * separated by the delimiter (rule 4), a field may be enclosed in double quotes (rule 5),
 * a quoted field may hold delimiters and line breaks (rule 6), and a quote inside a
 * quoted field is written twice (rule 7).
 *
 * Leniencies real exports need: a quote inside an unquoted field is an ordinary character;
 * text after a closing quote is appended to the field; blanks before an opening quote are
 * skipped.
 *
 * The table holds no strings: each field is a span of the text (typed arrays of offsets),
 * so hot loops read numbers and dates straight from the text and only the cells that are
 * kept (descriptions, names) become strings. A 100,000-row file makes no per-field objects.
 */

/** The records of a CSV text as spans. Read cells with `cellAt`, or spans with `cellSpan`. */
export interface CsvTable {
  readonly text: string;
  /** Start offset of field f's value in `text` (after an opening quote). */
  readonly fieldStart: Int32Array;
  /** End offset (exclusive) of field f's value (before a closing quote). */
  readonly fieldEnd: Int32Array;
  /**
   * 1 when the value is not the plain span: a quoted field with doubled quotes, text after
   * the closing quote, or no closing quote. Its span then runs from the opening quote to the
   * field's end and `cellAt` unescapes it.
   */
  readonly fieldEscaped: Uint8Array;
  /** `rowStart[r]` is the index of record r's first field; one extra entry closes the last record. */
  readonly rowStart: Int32Array;
  /** 1-based line on which record r starts. */
  readonly rowLine: Int32Array;
  readonly rowCount: number;
  /** Line where a quoted field opened that never closed (it then runs to the end of the text). */
  readonly unclosedQuoteLine?: number;
  /** True when scanning stopped at `maxRecords` before the end of the text. */
  readonly truncated: boolean;
}

const QUOTE = 0x22;
const LF = 0x0a;
const CR = 0x0d;
const SPACE = 0x20;
const TAB = 0x09;

/** A copy of `data` with twice the room. */
function grown<T extends Int32Array | Uint8Array>(data: T): T {
  const bigger = new (data.constructor as { new (length: number): T })(data.length * 2);
  bigger.set(data);
  return bigger;
}

/**
 * Splits `text` into records and fields. O(n) in the text length, one pass, no regular
 * expressions; runs of ordinary characters are skipped with native `indexOf`. A leading
 * U+FEFF byte-order mark is skipped. Never throws.
 *
 * @param delimiter one character: `,` `;` tab or `|`.
 * @param maxRecords stop after this many records (for sniffing a sample).
 * @example
 * const t = scanCsv('a;"b ""c"""\r\n1;2', ';');
 * cellAt(t, 0, 1) // 'b "c"'
 * t.rowLine // Int32Array [1, 2]
 */
export function scanCsv(text: string, delimiter: string, maxRecords = Number.POSITIVE_INFINITY): CsvTable {
  const d = delimiter.charCodeAt(0);
  const n = text.length;
  // Initial capacity: about one field per 8 characters, less when only a few records are wanted.
  const wanted = Number.isFinite(maxRecords) ? maxRecords * 32 : Number.POSITIVE_INFINITY;
  const guess = Math.max(16, Math.min(1 << 22, n >> 3, wanted));
  // Field spans and record starts, in typed arrays held in locals (grown by doubling).
  let starts = new Int32Array(guess);
  let ends = new Int32Array(guess);
  let escaped = new Uint8Array(guess);
  let fields = 0;
  let rowStart = new Int32Array(Math.max(16, guess >> 2));
  let rowLine = new Int32Array(Math.max(16, guess >> 2));
  let rows = 0;
  const addField = (start: number, end: number, isEscaped: number): void => {
    if (fields === starts.length) {
      starts = grown(starts);
      ends = grown(ends);
      escaped = grown(escaped);
    }
    starts[fields] = start;
    ends[fields] = end;
    escaped[fields] = isEscaped;
    fields++;
  };
  const addRow = (first: number, at: number): void => {
    if (rows === rowStart.length) {
      rowStart = grown(rowStart);
      rowLine = grown(rowLine);
    }
    rowStart[rows] = first;
    rowLine[rows] = at;
    rows++;
  };
  let unclosedQuoteLine: number | undefined;
  let i = n > 0 && text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  // Next position of each special character at or after `i` (n when none), refreshed lazily with
  // the engine's native indexOf: the scan stays one pass without a JavaScript loop per character.
  let nextDelimiter = -1;
  let nextLf = -1;
  let nextCr = -1;
  let nextQuote = -1;
  const find = (ch: string, from: number): number => {
    const k = text.indexOf(ch, from);
    return k < 0 ? n : k;
  };
  const fieldEnd = (from: number): number => {
    if (nextDelimiter < from) nextDelimiter = find(delimiter, from);
    if (nextLf < from) nextLf = find('\n', from);
    if (nextCr < from) nextCr = find('\r', from);
    const a = nextDelimiter < nextLf ? nextDelimiter : nextLf;
    return a < nextCr ? a : nextCr;
  };

  while (i < n && rows < maxRecords) {
    addRow(fields, line);
    for (;;) {
      let c = i < n ? text.charCodeAt(i) : -1;
      // Blanks before an opening quote: `; "text"` is read as a quoted field.
      if ((c === SPACE || c === TAB) && d !== TAB) {
        let k = i;
        while (k < n && (text.charCodeAt(k) === SPACE || text.charCodeAt(k) === TAB)) k++;
        if (k < n && text.charCodeAt(k) === QUOTE) {
          i = k;
          c = QUOTE;
        }
      }
      if (c === QUOTE) {
        const openLine = line;
        const open = i;
        i++;
        let plain = true;
        let valueEnd = i;
        for (;;) {
          if (nextQuote < i) nextQuote = find('"', i);
          const q = nextQuote;
          if (nextLf < i) nextLf = find('\n', i);
          if (nextCr < i) nextCr = find('\r', i);
          if (nextLf < q || nextCr < q) line += countLineBreaks(text, i, q);
          if (q >= n) {
            unclosedQuoteLine ??= openLine;
            plain = false;
            i = n;
            break;
          }
          if (q + 1 < n && text.charCodeAt(q + 1) === QUOTE) {
            plain = false;
            i = q + 2;
            continue;
          }
          valueEnd = q;
          i = q + 1;
          break;
        }
        if (i < n) {
          const end = fieldEnd(i);
          if (end > i) plain = false;
          i = end;
        }
        if (plain) addField(open + 1, valueEnd, 0);
        else addField(open, i, 1);
      } else {
        const end = i < n ? fieldEnd(i) : n;
        addField(i, end, 0);
        i = end;
      }
      if (i >= n) break;
      const e = text.charCodeAt(i);
      if (e === d) {
        i++;
        continue;
      }
      // A line break ends the record.
      i++;
      if (e === CR && i < n && text.charCodeAt(i) === LF) i++;
      line++;
      break;
    }
  }
  // One extra entry closes the last record.
  const recordCount = rows;
  addRow(fields, line);
  const table: CsvTable = {
    text,
    fieldStart: starts.subarray(0, fields),
    fieldEnd: ends.subarray(0, fields),
    fieldEscaped: escaped.subarray(0, fields),
    rowStart: rowStart.subarray(0, recordCount + 1),
    rowLine: rowLine.subarray(0, recordCount),
    rowCount: recordCount,
    truncated: i < n,
  };
  return unclosedQuoteLine === undefined ? table : { ...table, unclosedQuoteLine };
}

/** Line breaks (CRLF, LF or a lone CR) in text[from, to). */
function countLineBreaks(text: string, from: number, to: number): number {
  let count = 0;
  const end = Math.min(to, text.length);
  for (let k = from; k < end; k++) {
    const c = text.charCodeAt(k);
    if (c === LF) count++;
    else if (c === CR && !(k + 1 < text.length && text.charCodeAt(k + 1) === LF)) count++;
  }
  return count;
}

/** The value of an escaped field: its quoted part with doubled quotes undone, then any text after it. */
function unescapeField(text: string, open: number, end: number): string {
  let value = '';
  let i = open + 1;
  let segment = i;
  while (i < end) {
    if (text.charCodeAt(i) === QUOTE) {
      if (i + 1 < end && text.charCodeAt(i + 1) === QUOTE) {
        value += text.slice(segment, i + 1);
        i += 2;
        segment = i;
        continue;
      }
      return value + text.slice(segment, i) + text.slice(i + 1, end);
    }
    i++;
  }
  return value + text.slice(segment, end);
}

/** Number of fields of record `row`. */
export function rowWidth(table: CsvTable, row: number): number {
  return (table.rowStart[row + 1] as number) - (table.rowStart[row] as number);
}

/** Index of field `col` of record `row` in the span arrays, or -1 when the record is shorter. */
export function fieldIndex(table: CsvTable, row: number, col: number): number {
  return col < rowWidth(table, row) ? (table.rowStart[row] as number) + col : -1;
}

/** Field `col` of record `row`, or '' when the record is shorter. */
export function cellAt(table: CsvTable, row: number, col: number): string {
  const f = fieldIndex(table, row, col);
  if (f < 0) return '';
  const start = table.fieldStart[f] as number;
  const end = table.fieldEnd[f] as number;
  return table.fieldEscaped[f] === 1 ? unescapeField(table.text, start, end) : table.text.slice(start, end);
}

/** The fields of record `row` as a new array (for headers and previews, not hot loops). */
export function rowCells(table: CsvTable, row: number): string[] {
  const cells: string[] = [];
  for (let c = 0; c < rowWidth(table, row); c++) cells.push(cellAt(table, row, c));
  return cells;
}

function isBlankChar(c: number): boolean {
  return c === SPACE || c === TAB || c === 0xa0 || c === 0x202f || c === 0x2009 || c === 0xfeff;
}

/**
 * A cell's span without surrounding blanks, written to `span` (reused, no allocation):
 * `start`/`end` into `table.text`, or `text` set for an escaped field.
 */
export interface CellSpan {
  text: string;
  start: number;
  end: number;
}

/**
 * Points `span` at field `col` of record `row`, trimmed of blanks (space, tab, no-break
 * spaces). An escaped field is unescaped into `span.text`; others leave `span.text` as the
 * table text. A missing field is the empty span.
 *
 * @example const s = { text: '', start: 0, end: 0 }; cellSpan(scanCsv('a; 12 ', ';'), 0, 1, s); s.text.slice(s.start, s.end) // '12'
 */
export function cellSpan(table: CsvTable, row: number, col: number, span: CellSpan): CellSpan {
  const f = fieldIndex(table, row, col);
  let text = table.text;
  let start = 0;
  let end = 0;
  if (f >= 0) {
    if (table.fieldEscaped[f] === 1) {
      text = unescapeField(table.text, table.fieldStart[f] as number, table.fieldEnd[f] as number);
      end = text.length;
    } else {
      start = table.fieldStart[f] as number;
      end = table.fieldEnd[f] as number;
    }
  }
  while (start < end && isBlankChar(text.charCodeAt(start))) start++;
  while (end > start && isBlankChar(text.charCodeAt(end - 1))) end--;
  span.text = text;
  span.start = start;
  span.end = end;
  return span;
}

/** True when every field of the record is empty or blank (an empty line, or `;;;`). */
export function isBlankRow(table: CsvTable, row: number): boolean {
  const end = table.rowStart[row + 1] as number;
  const text = table.text;
  for (let f = table.rowStart[row] as number; f < end; f++) {
    if (table.fieldEscaped[f] === 1) {
      if (cellAt(table, row, f - (table.rowStart[row] as number)).trim() !== '') return false;
      continue;
    }
    const stop = table.fieldEnd[f] as number;
    for (let k = table.fieldStart[f] as number; k < stop; k++) {
      const c = text.charCodeAt(k);
      if (!isBlankChar(c) && c !== LF && c !== CR) return false;
    }
  }
  return true;
}
