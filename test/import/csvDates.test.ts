import { describe, expect, it } from 'vitest';
import {
  TWO_DIGIT_YEAR_PIVOT,
  dateFormatLabel,
  dateFormatName,
  describeDateError,
  inferDateFormat,
  parseDateCell,
  parseDateFormatName,
  type CsvDateFormat,
} from '../../engine/import/csv/dates';
import { csvImporter } from '../../engine/import/csv';

const ISO: CsvDateFormat = { order: 'YMD', separator: '-', twoDigitYear: false };
const DMY_DOT: CsvDateFormat = { order: 'DMY', separator: '.', twoDigitYear: false };
const DMY_DOT_YY: CsvDateFormat = { order: 'DMY', separator: '.', twoDigitYear: true };
const DMY_SLASH: CsvDateFormat = { order: 'DMY', separator: '/', twoDigitYear: false };
const MDY_SLASH: CsvDateFormat = { order: 'MDY', separator: '/', twoDigitYear: false };
const COMPACT: CsvDateFormat = { order: 'YMD', separator: '', twoDigitYear: false };

function infer(cells: string[]): ReturnType<typeof inferDateFormat> {
  return inferDateFormat(
    cells,
    cells.map((_, k) => k + 2),
  );
}

describe('parseDateCell', () => {
  it('reads each supported format', () => {
    expect(parseDateCell('2025-03-01', ISO)).toBe('2025-03-01');
    expect(parseDateCell('1.3.2025', DMY_DOT)).toBe('2025-03-01');
    expect(parseDateCell('01/03/2025', DMY_SLASH)).toBe('2025-03-01');
    expect(parseDateCell('03/01/2025', MDY_SLASH)).toBe('2025-03-01');
    expect(parseDateCell('20250301', COMPACT)).toBe('2025-03-01');
    expect(parseDateCell(' 01.03.25 ', DMY_DOT_YY)).toBe('2025-03-01');
  });

  it('ignores a time after the date', () => {
    expect(parseDateCell('01.03.2025 14:02', DMY_DOT)).toBe('2025-03-01');
    expect(parseDateCell('2025-03-01T23:59:59Z', ISO)).toBe('2025-03-01');
  });

  it('reads two-digit years with the documented pivot (00–69 → 20xx, 70–99 → 19xx)', () => {
    // Ebbline rule, documented in engine/import/csv/dates.ts.
    expect(TWO_DIGIT_YEAR_PIVOT).toBe(70);
    expect(parseDateCell('31.12.69', DMY_DOT_YY)).toBe('2069-12-31');
    expect(parseDateCell('01.01.70', DMY_DOT_YY)).toBe('1970-01-01');
    expect(parseDateCell('15.06.00', DMY_DOT_YY)).toBe('2000-06-15');
    expect(parseDateCell('15.06.99', DMY_DOT_YY)).toBe('1999-06-15');
  });

  it('accepts leap days only in leap years', () => {
    // From memory: Gregorian rule (ISO 8601 calendar): leap years are divisible by 4, except centuries not divisible by 400.
    expect(parseDateCell('29.02.2024', DMY_DOT)).toBe('2024-02-29');
    expect(parseDateCell('29.02.2025', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('29.02.2000', DMY_DOT)).toBe('2000-02-29');
    expect(parseDateCell('29.02.1900', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('29.02.00', DMY_DOT_YY)).toBe('2000-02-29');
    expect(parseDateCell('02/29/2028', MDY_SLASH)).toBe('2028-02-29');
  });

  it('refuses impossible days, other shapes and non-dates', () => {
    expect(parseDateCell('31.04.2025', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('00.04.2025', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('01.13.2025', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('2025/03/01', ISO)).toBeUndefined();
    expect(parseDateCell('01.03.25', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('01.03.2025', DMY_DOT_YY)).toBeUndefined();
    expect(parseDateCell('yesterday', DMY_DOT)).toBeUndefined();
    expect(parseDateCell('', ISO)).toBeUndefined();
    expect(parseDateCell('2025-03-01x', ISO)).toBeUndefined();
  });
});

describe('describeDateError', () => {
  it('says what was found and what was expected', () => {
    expect(describeDateError('31.04.2025', DMY_DOT)).toBe('date "31.04.2025" is not a calendar day, expected D.M.Y');
    expect(describeDateError('2025-04-01', DMY_DOT)).toBe(
      'date "2025-04-01" does not match the file\'s date format, expected D.M.Y',
    );
    expect(describeDateError('soon', MDY_SLASH)).toBe('date "soon" is not a date, expected M/D/Y');
    expect(describeDateError(' ', DMY_DOT_YY)).toBe('date is empty, expected a date like 31.01.25 (D.M.YY)');
  });
});

describe('inferDateFormat: decided from all rows', () => {
  it('reads ISO and compact dates as year first', () => {
    expect(infer(['2025-01-02', '2025-01-03']).format).toEqual(ISO);
    expect(infer(['20250102']).format).toEqual(COMPACT);
  });

  it('takes dotted dates as day first', () => {
    // Common practice, no source: dotted dates in bank exports are always day.month.year.
    expect(infer(['01.02.2025', '03.02.2025']).format).toEqual(DMY_DOT);
    expect(infer(['01.02.25']).format).toEqual(DMY_DOT_YY);
  });

  it('settles day-first by a first number above 12 on any row, even the last', () => {
    const cells = Array.from({ length: 999 }, () => '01/02/2025').concat(['13/02/2025']);
    expect(infer(cells)).toEqual({ format: DMY_SLASH, ambiguous: false });
  });

  it('settles month-first by a second number above 12', () => {
    expect(infer(['01/02/2025', '02/28/2025']).format).toEqual(MDY_SLASH);
  });

  it('reports ambiguity with the first line where the readings differ', () => {
    const result = infer(['05/05/2025', '03/04/2025', '04/03/2025']);
    expect(result.ambiguous).toBe(true);
    expect(result.format).toBeUndefined();
    expect(result.problem).toEqual({
      line: 3,
      message:
        'date "03/04/2025" can be read as D/M/Y or M/D/Y and no date in the file has a number above 12 to settle ' +
        'it, expected an explicit csvMapping.dateFormat ("DD/MM/YYYY" or "MM/DD/YYYY")',
    });
  });

  it('is not ambiguous when every date reads the same both ways', () => {
    expect(infer(['01/01/2025', '07/07/2025'])).toEqual({ format: DMY_SLASH, ambiguous: false });
  });

  it('reports a file that mixes day-first and month-first', () => {
    const result = infer(['13/01/2025', '01/13/2025']);
    expect(result.format).toBeUndefined();
    expect(result.problem?.line).toBe(3);
    expect(result.problem?.message).toContain('puts the month first, but line 2 ("13/01/2025") puts the day first');
  });

  it('finds nothing in cells that are no dates', () => {
    expect(infer(['', 'n/a'])).toEqual({ ambiguous: false });
  });
});

describe('date format names', () => {
  it('parses canonical and short names', () => {
    expect(parseDateFormatName('DD.MM.YYYY')).toEqual(DMY_DOT);
    expect(parseDateFormatName('D.M.Y')).toEqual(DMY_DOT);
    expect(parseDateFormatName('mm/dd/yyyy')).toEqual(MDY_SLASH);
    expect(parseDateFormatName('DD.MM.YY')).toEqual(DMY_DOT_YY);
    expect(parseDateFormatName('ISO')).toEqual(ISO);
    expect(parseDateFormatName('YYYYMMDD')).toEqual(COMPACT);
  });

  it('refuses unsupported names', () => {
    for (const bad of ['YYYY-DD-MM', 'DD.MM', 'MM.YYYY.DD', 'YY-MM-DD', 'DD.MM/YYYY', 'tomorrow']) {
      expect(parseDateFormatName(bad), bad).toBeUndefined();
    }
  });

  it('labels and names round-trip', () => {
    for (const f of [ISO, DMY_DOT, DMY_DOT_YY, DMY_SLASH, MDY_SLASH, COMPACT]) {
      expect(parseDateFormatName(dateFormatName(f))).toEqual(f);
      expect(parseDateFormatName(dateFormatLabel(f))).toEqual(f);
    }
  });
});

describe('dates in an import', () => {
  it('refuses an impossible date naming its line', () => {
    const text = 'Datum;Text;Betrag\n30.04.2025;a;1,00\n31.04.2025;b;2,00\n';
    const r = csvImporter.parse(text, { fileName: 'april.csv', currency: 'EUR' });
    expect(r.statements).toEqual([]);
    expect(r.problems).toEqual([
      {
        file: 'april.csv',
        line: 3,
        message: 'date "31.04.2025" is not a calendar day, expected D.M.Y',
        severity: 'error',
      },
    ]);
  });

  it('refuses ambiguous dates, and reads them with an explicit dateFormat', () => {
    const text = 'Date,Text,Amount\n03/04/2025,a,1.00\n04/05/2025,b,2.00\n';
    const refused = csvImporter.parse(text, { fileName: 'q.csv', currency: 'USD' });
    expect(refused.problems[0]?.line).toBe(2);
    expect(refused.problems[0]?.message).toContain('expected an explicit csvMapping.dateFormat');
    const us = csvImporter.parse(text, {
      fileName: 'q.csv',
      currency: 'USD',
      csvMapping: { dateFormat: 'MM/DD/YYYY' },
    });
    expect(us.statements[0]?.entries.map((e) => e.bookingDate)).toEqual(['2025-03-04', '2025-04-05']);
    const eu = csvImporter.parse(text, {
      fileName: 'q.csv',
      currency: 'USD',
      csvMapping: { dateFormat: 'DD/MM/YYYY' },
    });
    expect(eu.statements[0]?.entries.map((e) => e.bookingDate)).toEqual(['2025-04-03', '2025-05-04']);
  });

  it('uses value dates to settle the order of booking dates', () => {
    const text = 'Date,Value date,Text,Amount\n03/04/2025,03/14/2025,a,1.00\n';
    const r = csvImporter.parse(text, { fileName: 'v.csv', currency: 'USD' });
    expect(r.statements[0]?.entries[0]).toMatchObject({ bookingDate: '2025-03-04', valueDate: '2025-03-14' });
  });

  it('refuses a date written in another shape than the rest', () => {
    const text = 'Date;Text;Amount\n2025-01-02;a;1.00\n02.01.2025;b;2.00\n';
    const r = csvImporter.parse(text, { fileName: 'm.csv', currency: 'EUR' });
    expect(r.problems).toEqual([
      {
        file: 'm.csv',
        line: 3,
        message: 'date "02.01.2025" does not match the file\'s date format, expected Y-M-D',
        severity: 'error',
      },
    ]);
  });
});
