/**
 * Single-pass RFC 4180 scanner. RFC 4180 (2005) section 2: records end at a line break
 * (rule 1; LF alone and CR alone are accepted too, as banks write them), fields are
 * separated by the delimiter (rule 4), a field may be enclosed in double quotes (rule 5),
 * a quoted field may hold delimiters and line breaks (rule 6), and a quote inside a
 * quoted field is written twice (rule 7).
 *
 * Leniencies real exports need: a quote inside an unquoted field is an ordinary character;
 * text after a closing quote is appended to the field; blanks before an opening quote are
 * skipped. The output is flat (one array of all fields plus row offsets) so a 100,000-row
 * file makes no per-row objects.
 */

/** The records of a CSV text, flattened. Read cells with `cellAt` / `rowWidth`. */
export interface CsvTable {
  /** Every field of every record, record after record. */
  readonly fields: readonly string[];
  /** `rowStart[r]` is the index in `fields` of record r's first field; one extra entry closes the last record. */
  readonly rowStart: readonly number[];
  /** 1-based line on which record r starts. */
  readonly rowLine: readonly number[];
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

/**
 * Splits `text` into records and fields. O(n) in the text length, one pass, no regular
 * expressions. A leading U+FEFF byte-order mark is skipped. Never throws.
 *
 * @param delimiter one character: `,` `;` tab or `|`.
 * @param maxRecords stop after this many records (for sniffing a sample).
 * @example
 * const t = scanCsv('a;"b ""c"""\r\n1;2', ';');
 * cellAt(t, 0, 1) // 'b "c"'
 * t.rowLine // [1, 2]
 */
export function scanCsv(text: string, delimiter: string, maxRecords = Number.POSITIVE_INFINITY): CsvTable {
  const d = delimiter.charCodeAt(0);
  const n = text.length;
  const fields: string[] = [];
  const rowStart: number[] = [];
  const rowLine: number[] = [];
  let unclosedQuoteLine: number | undefined;
  let i = n > 0 && text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  let rows = 0;

  while (i < n && rows < maxRecords) {
    rowStart.push(fields.length);
    rowLine.push(line);
    rows++;
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
        i++;
        let value = '';
        let segment = i;
        for (;;) {
          if (i >= n) {
            value += text.slice(segment, n);
            unclosedQuoteLine ??= openLine;
            break;
          }
          const q = text.charCodeAt(i);
          if (q === QUOTE) {
            if (i + 1 < n && text.charCodeAt(i + 1) === QUOTE) {
              value += text.slice(segment, i + 1);
              i += 2;
              segment = i;
              continue;
            }
            value += text.slice(segment, i);
            i++;
            break;
          }
          if (q === LF) line++;
          else if (q === CR && !(i + 1 < n && text.charCodeAt(i + 1) === LF)) line++;
          i++;
        }
        if (i < n) {
          const s = i;
          while (i < n) {
            const t = text.charCodeAt(i);
            if (t === d || t === LF || t === CR) break;
            i++;
          }
          if (i > s) value += text.slice(s, i);
        }
        fields.push(value);
      } else {
        const s = i;
        while (i < n) {
          const t = text.charCodeAt(i);
          if (t === d || t === LF || t === CR) break;
          i++;
        }
        fields.push(text.slice(s, i));
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
  rowStart.push(fields.length);
  const table: CsvTable = { fields, rowStart, rowLine, rowCount: rows, truncated: i < n };
  return unclosedQuoteLine === undefined ? table : { ...table, unclosedQuoteLine };
}

/** Number of fields of record `row`. */
export function rowWidth(table: CsvTable, row: number): number {
  return (table.rowStart[row + 1] as number) - (table.rowStart[row] as number);
}

/** Field `col` of record `row`, or '' when the record is shorter. */
export function cellAt(table: CsvTable, row: number, col: number): string {
  if (col >= rowWidth(table, row)) return '';
  return table.fields[(table.rowStart[row] as number) + col] as string;
}

/** The fields of record `row` as a new array (for headers and previews, not hot loops). */
export function rowCells(table: CsvTable, row: number): string[] {
  return table.fields.slice(table.rowStart[row] as number, table.rowStart[row + 1] as number) as string[];
}

/** True when every field of the record is empty or blank (an empty line, or `;;;`). */
export function isBlankRow(table: CsvTable, row: number): boolean {
  const end = table.rowStart[row + 1] as number;
  for (let k = table.rowStart[row] as number; k < end; k++) {
    const f = table.fields[k] as string;
    if (f.length > 0 && f.trim() !== '') return false;
  }
  return true;
}
