import { describe, expect, it } from 'vitest';
import { formatOfxDate, parseOfxDate, type OfxDateTime } from '../../engine/import/ofx/parseOfxDate';

function ok(text: string): OfxDateTime {
  const r = parseOfxDate(text);
  if (typeof r === 'string') throw new Error(`expected "${text}" to parse, got: ${r}`);
  return r;
}

describe('parseOfxDate', () => {
  it('reads the specification example as the calendar date written, with its time and offset', () => {
    // Source: OFX Banking Specification 2.3, section 3.2.8.1 "Dates, Times, and Time Zones":
    // 19961005132200.124[-5:EST] is 5 October 1996, 1:22:00.124 pm Eastern Standard Time.
    const r = ok('19961005132200.124[-5:EST]');
    expect(r.date).toBe('1996-10-05');
    expect(r.secondOfDay).toBe(13 * 3600 + 22 * 60);
    expect(r.offsetMinutes).toBe(-300);
    expect(r.zoneName).toBe('EST');
    // Source: same section: the example is 18:22:00.124 UTC — local time minus the offset.
    expect(((r.secondOfDay as number) - (r.offsetMinutes as number) * 60) / 3600).toBeCloseTo(18 + 22 / 60, 10);
  });

  it('keeps a late-evening posting on its local day instead of moving it to the UTC date', () => {
    // Design choice (see parseOfxDate's JSDoc): 23:00 EST is 04:00 UTC the next day, but the
    // bank booked it on 31 January.
    expect(ok('20240131230000[-5:EST]').date).toBe('2024-01-31');
    expect(ok('20231231233000.000[-8:PST]').date).toBe('2023-12-31');
  });

  it('accepts every shorter form the specification allows', () => {
    // Source: OFX Banking Specification 2.3, section 3.2.8.1: the time, the fraction and the
    // time-zone part are each optional.
    expect(ok('19961005')).toEqual({ date: '1996-10-05' });
    expect(ok('19961005132200')).toEqual({ date: '1996-10-05', secondOfDay: 48120 });
    expect(ok('19961005132200.124')).toEqual({ date: '1996-10-05', secondOfDay: 48120 });
    expect(ok('19961005132200.124[-5]')).toEqual({ date: '1996-10-05', secondOfDay: 48120, offsetMinutes: -300 });
    expect(ok('20051029112000.000[+0:UTC]').offsetMinutes).toBe(0);
    expect(ok('20240101[0:GMT]')).toEqual({ date: '2024-01-01', offsetMinutes: 0, zoneName: 'GMT' });
  });

  it('tolerates forms seen in real files', () => {
    // Common practice, no source: some servers drop the seconds, write half-hour zones as
    // .30 or .5, or leave white space around the value.
    expect(ok('202401151230').secondOfDay).toBe(12 * 3600 + 30 * 60);
    expect(ok('20240115120000[+5.30:IST]').offsetMinutes).toBe(330);
    expect(ok('20240115120000[+5.5:IST]').offsetMinutes).toBe(330);
    expect(ok('20240115120000[-3.30:NST]').offsetMinutes).toBe(-210);
    expect(ok('  20240115\r\n').date).toBe('2024-01-15');
  });

  it('refuses impossible calendar dates', () => {
    // Source: Gregorian calendar: April has 30 days; 1996 is a leap year, 1997 and 1900 are not.
    expect(parseOfxDate('19960431')).toBe('is not a calendar date: 1996-04-31 does not exist');
    expect(parseOfxDate('19970229')).toMatch(/1997-02-29 does not exist/);
    expect(parseOfxDate('19000229')).toMatch(/does not exist/);
    expect(ok('19960229').date).toBe('1996-02-29');
    expect(ok('20000229').date).toBe('2000-02-29');
    expect(parseOfxDate('20241301')).toMatch(/does not exist/);
    expect(parseOfxDate('20240100')).toMatch(/does not exist/);
  });

  it('still validates the time and the offset syntax although the date ignores them', () => {
    expect(parseOfxDate('19961005240000')).toMatch(/impossible time 24:00:00/);
    expect(parseOfxDate('19961005136000')).toMatch(/impossible time/);
    expect(parseOfxDate('19961005132200.124[-5:EST')).toMatch(/not an OFX date/);
    expect(parseOfxDate('19961005132200.124[EST]')).toMatch(/malformed time-zone part/);
    expect(parseOfxDate('19961005132200.124[-5:]')).toEqual({
      date: '1996-10-05',
      secondOfDay: 48120,
      offsetMinutes: -300,
    });
    expect(parseOfxDate('19961005132200[+15:XYZ]')).toMatch(/outside −12…\+14 hours/);
    expect(parseOfxDate('19961005132200[+5.75]')).toMatch(/minutes must be below 60/);
    expect(parseOfxDate('19961005132200.')).toMatch(/not an OFX date/);
    expect(parseOfxDate('1996-10-05')).toMatch(/not an OFX date/);
    expect(parseOfxDate('199610')).toMatch(/not an OFX date/);
    expect(parseOfxDate('')).toMatch(/not an OFX date/);
    expect(parseOfxDate('19961005 132200')).toMatch(/not an OFX date/);
  });
});

describe('formatOfxDate', () => {
  it('writes the YYYYMMDD form, which reads back to the same day', () => {
    expect(formatOfxDate('2024-02-29')).toBe('20240229');
    expect(ok(formatOfxDate('0001-01-01')).date).toBe('0001-01-01');
  });
});
