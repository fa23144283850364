/**
 * The import bench's reference: a minimal RFC 4180 (2005) CSV parser, written the way fast
 * plain CSV libraries are. Records end at CRLF or LF; fields are split at the delimiter; a
 * field in double quotes may hold delimiters and line breaks, and `""` inside it is one
 * quote. Every field becomes a string, every record an array of them. Delimiters, line
 * ends and quotes are found with native `indexOf` (no per-character JavaScript loop). No
 * type conversion, no checks, no error reporting: this is what "just parsing the CSV"
 * costs, the floor an importer is measured against.
 */

const QUOTE = 0x22;
const CR = 0x0d;

/**
 * Parses `text` into records of string fields.
 * @example parsePlainCsv('a;"b ""c"""\r\n1;2', ';') // [['a', 'b "c"'], ['1', '2']]
 */
export function parsePlainCsv(text: string, delimiter: string): string[][] {
  const n = text.length;
  const records: string[][] = [];
  let record: string[] = [];
  let nextDelimiter = -1;
  let nextLf = -1;
  let i = 0;
  while (i < n) {
    if (nextDelimiter < i) {
      nextDelimiter = text.indexOf(delimiter, i);
      if (nextDelimiter < 0) nextDelimiter = n;
    }
    if (nextLf < i) {
      nextLf = text.indexOf('\n', i);
      if (nextLf < 0) nextLf = n;
    }
    let end: number;
    if (text.charCodeAt(i) === QUOTE) {
      // Quoted field: up to the closing quote, `""` standing for one quote.
      let value = '';
      let from = i + 1;
      let q = text.indexOf('"', from);
      while (q >= 0 && text.charCodeAt(q + 1) === QUOTE) {
        value += text.slice(from, q + 1);
        from = q + 2;
        q = text.indexOf('"', from);
      }
      if (q < 0) q = n;
      record.push(value + text.slice(from, q));
      end = q + 1;
      if (nextDelimiter < end) {
        nextDelimiter = text.indexOf(delimiter, end);
        if (nextDelimiter < 0) nextDelimiter = n;
      }
      if (nextLf < end) {
        nextLf = text.indexOf('\n', end);
        if (nextLf < 0) nextLf = n;
      }
      end = Math.min(nextDelimiter, nextLf);
    } else {
      end = nextDelimiter < nextLf ? nextDelimiter : nextLf;
      // The CR of a CRLF is not part of the last field.
      const valueEnd = end === nextLf && end > i && text.charCodeAt(end - 1) === CR ? end - 1 : end;
      record.push(text.slice(i, valueEnd));
    }
    if (end >= n) break;
    if (end === nextDelimiter) {
      i = end + 1;
      if (i >= n) record.push('');
      continue;
    }
    i = end + 1;
    records.push(record);
    record = [];
  }
  if (record.length > 0) records.push(record);
  return records;
}
