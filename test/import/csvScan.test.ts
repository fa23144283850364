import { describe, expect, it } from 'vitest';
import { cellAt, isBlankRow, rowCells, rowWidth, scanCsv, type CsvTable } from '../../engine/import/csv/scan';

function rows(table: CsvTable): string[][] {
  return Array.from({ length: table.rowCount }, (_, r) => rowCells(table, r));
}

describe('scanCsv: RFC 4180 section 2', () => {
  it('splits records at CRLF', () => {
    // Source: RFC 4180 section 2, rule 1 (example "aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF")
    expect(rows(scanCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n', ','))).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });

  it('accepts a last record without a line break', () => {
    // Source: RFC 4180 section 2, rule 2 ("The last record in the file may or may not have an ending line break")
    expect(rows(scanCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx', ','))).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });

  it('keeps spaces as part of a field', () => {
    // Source: RFC 4180 section 2, rule 4 ("Spaces are considered part of a field and should not be ignored")
    expect(rows(scanCsv(' aaa , bbb', ','))).toEqual([[' aaa ', ' bbb']]);
  });

  it('reads fields enclosed in double quotes', () => {
    // Source: RFC 4180 section 2, rule 5 (example "aaa","bbb","ccc" CRLF zzz,yyy,xxx)
    expect(rows(scanCsv('"aaa","bbb","ccc"\r\nzzz,yyy,xxx', ','))).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });

  it('keeps line breaks and delimiters inside quoted fields and counts the lines', () => {
    // Source: RFC 4180 section 2, rule 6 (example "aaa","b CRLF bb","ccc" CRLF zzz,yyy,xxx)
    const t = scanCsv('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx', ',');
    expect(rows(t)).toEqual([
      ['aaa', 'b\r\nbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
    expect([...t.rowLine]).toEqual([1, 3]);
    expect(cellAt(scanCsv('"a,b;c",d', ','), 0, 0)).toBe('a,b;c');
  });

  it('reads a doubled quote inside a quoted field as one quote', () => {
    // Source: RFC 4180 section 2, rule 7 (example "aaa","b""bb","ccc")
    expect(rows(scanCsv('"aaa","b""bb","ccc"', ','))).toEqual([['aaa', 'b"bb', 'ccc']]);
    expect(cellAt(scanCsv('""""', ','), 0, 0)).toBe('"');
    expect(cellAt(scanCsv('"",x', ','), 0, 0)).toBe('');
  });
});

describe('scanCsv: what bank exports add', () => {
  it('accepts LF and lone CR line endings and numbers lines for each', () => {
    const lf = scanCsv('a;b\n1;2\n3;4\n', ';');
    expect([...lf.rowLine]).toEqual([1, 2, 3]);
    const cr = scanCsv('a;b\r1;2\r', ';');
    expect(rows(cr)).toEqual([
      ['a', 'b'],
      ['1', '2'],
    ]);
    expect([...cr.rowLine]).toEqual([1, 2]);
    // A lone CR inside a quoted field is a line of its own too.
    expect([...scanCsv('"x\ry";1\nz;2', ';').rowLine]).toEqual([1, 3]);
  });

  it('skips a leading byte-order mark', () => {
    expect(cellAt(scanCsv('\ufeffDate;Amount', ';'), 0, 0)).toBe('Date');
  });

  it('reports the line where an unclosed quote opened and keeps the rest as the field', () => {
    const t = scanCsv('a;b\n1;"open\n2;3\n', ';');
    expect(t.unclosedQuoteLine).toBe(2);
    expect(cellAt(t, 1, 1)).toBe('open\n2;3\n');
    expect(scanCsv('a;"b"', ';').unclosedQuoteLine).toBeUndefined();
  });

  it('treats a quote inside an unquoted field as an ordinary character', () => {
    expect(rows(scanCsv('5" tile;2', ';'))).toEqual([['5" tile', '2']]);
  });

  it('appends text after a closing quote and skips blanks before an opening quote', () => {
    expect(rows(scanCsv('"ab"c;d', ';'))).toEqual([['abc', 'd']]);
    expect(rows(scanCsv('x; "a;b"', ';'))).toEqual([['x', 'a;b']]);
    // With a tab delimiter a leading tab is a field boundary, not padding.
    expect(rows(scanCsv('x\t"a"', '\t'))).toEqual([['x', 'a']]);
  });

  it('keeps empty fields, including a trailing one', () => {
    const t = scanCsv('a;;c;\n', ';');
    expect(rowWidth(t, 0)).toBe(4);
    expect(rowCells(t, 0)).toEqual(['a', '', 'c', '']);
  });

  it('recognises blank rows (empty lines and rows of empty fields)', () => {
    const t = scanCsv('a;b\n\n;;\n1;2', ';');
    expect([0, 1, 2, 3].map((r) => isBlankRow(t, r))).toEqual([false, true, true, false]);
  });

  it('stops after maxRecords and says so', () => {
    const t = scanCsv('1\n2\n3\n', ',', 2);
    expect(t.rowCount).toBe(2);
    expect(t.truncated).toBe(true);
    expect(scanCsv('1\n2\n', ',', 2).truncated).toBe(false);
  });

  it('returns no records for empty text and empty cells beyond a short row', () => {
    expect(scanCsv('', ',').rowCount).toBe(0);
    expect(cellAt(scanCsv('a', ','), 0, 5)).toBe('');
  });
});
