import { describe, expect, it } from 'vitest';
import { detectCsvLayout, validateCsvMapping } from '../../engine/import/csv';
import { csvImporter } from '../../engine/import/csv';
import {
  draftFromDetection,
  mappingFromDraft,
  setColumnRole,
  setDecimalSeparator,
} from '../../renderer/src/lib/import/csvMappingDraft';

const AMBIGUOUS = 'Date;Text;Amount\n01/02/2025;Rent;-1.210,00\n03/04/2025;Market;569,65\n';

describe('CSV mapping draft', () => {
  it('starts from what detection decided', () => {
    const d = detectCsvLayout(AMBIGUOUS, { fileName: 'a.csv', currency: 'EUR' });
    const draft = draftFromDetection(d);
    expect(draft.roles[0]).toBe('date');
    expect(draft.roles[2]).toBe('amount');
    expect(draft.decimalSeparator).toBe(',');
    expect(d.dateFormatAmbiguous).toBe(true);
  });

  it('gives a single-column role to one column only, description to several', () => {
    const d = detectCsvLayout(AMBIGUOUS, { fileName: 'a.csv', currency: 'EUR' });
    let draft = setColumnRole(draftFromDetection(d), 1, 'amount');
    expect(draft.roles).toEqual(['date', 'amount', '']);
    draft = setColumnRole(setColumnRole(draft, 1, 'description'), 2, 'description');
    expect(draft.roles).toEqual(['date', 'description', 'description']);
    expect(mappingFromDraft(draft, d).columns).toEqual({ date: 0, description: [1, 2] });
  });

  it('swaps the thousands separator when the decimal separator takes its character', () => {
    const d = detectCsvLayout('Date,Amount\n2025-01-02,"1,234.50"\n', { fileName: 'b.csv', currency: 'EUR' });
    const draft = draftFromDetection(d);
    expect([draft.decimalSeparator, draft.thousandsSeparator]).toEqual(['.', ',']);
    expect(setDecimalSeparator(draft, ',')).toMatchObject({ decimalSeparator: ',', thousandsSeparator: '.' });
  });

  it('writes a valid mapping that settles an ambiguous date format when read again', () => {
    const d = detectCsvLayout(AMBIGUOUS, { fileName: 'a.csv', currency: 'EUR' });
    const first = csvImporter.parse(AMBIGUOUS, { fileName: 'a.csv', currency: 'EUR' });
    expect(first.problems.some((p) => p.severity === 'error' && /D\/M\/Y or M\/D\/Y/.test(p.message))).toBe(true);
    const mapping = mappingFromDraft(
      { ...draftFromDetection(d), dateFormat: 'DD/MM/YYYY', roles: ['date', 'description', 'amount'] },
      d,
    );
    expect(validateCsvMapping(mapping).problems).toEqual([]);
    expect(mapping).not.toHaveProperty('headerLine'); // left to detection: a longer preamble next month still reads
    const again = csvImporter.parse(AMBIGUOUS, { fileName: 'a.csv', currency: 'EUR', csvMapping: mapping });
    expect(again.problems.filter((p) => p.severity === 'error')).toEqual([]);
    expect(again.statements[0]!.entries.map((e) => [e.bookingDate, e.amount, e.description])).toEqual([
      ['2025-02-01', -121000, 'Rent'],
      ['2025-04-03', 56965, 'Market'],
    ]);
  });
});
