import { describe, expect, it } from 'vitest';
import { detectDelimiter, rankDelimiters } from '../../engine/import/csv/delimiter';

describe('detectDelimiter', () => {
  it('finds each supported delimiter', () => {
    expect(detectDelimiter('Date,Amount,Text\n2025-01-02,-5.00,a\n2025-01-03,6.00,b\n')).toBe(',');
    expect(detectDelimiter('Date;Amount;Text\n02.01.2025;-5,00;a\n03.01.2025;6,00;b\n')).toBe(';');
    expect(detectDelimiter('Date\tAmount\tText\n2025-01-02\t-5.00\ta\n')).toBe('\t');
    expect(detectDelimiter('Date|Amount|Text\n2025-01-02|-5.00|a\n')).toBe('|');
  });

  it('is not fooled by decimal commas in a semicolon file', () => {
    // Every data row has one comma (the decimal), the header has none.
    const text = 'Buchungstag;Text;Betrag\n01.02.2025;Miete;-900,00\n02.02.2025;Markt;312,40\n';
    expect(detectDelimiter(text)).toBe(';');
  });

  it('ignores delimiters inside quoted fields', () => {
    const text = 'Date,Text,Amount\n2025-01-02,"a;b;c;d",1.00\n2025-01-03,"e;f;g;h",2.00\n';
    expect(detectDelimiter(text)).toBe(',');
  });

  it('sees through a preamble of two-field lines', () => {
    const text = [
      'Account;DE89 3704 0044 0532 0130 00',
      'Currency;EUR',
      'Date;Text;Amount;Balance',
      '01.02.2025;a;-1,00;9,00',
      '02.02.2025;b;-2,00;7,00',
      '03.02.2025;c;-3,00;4,00',
    ].join('\n');
    const best = rankDelimiters(text)[0];
    expect(best?.delimiter).toBe(';');
    expect(best?.fieldCount).toBe(4);
    expect(best?.matching).toBe(4);
  });

  it('falls back to a comma when nothing splits the text', () => {
    expect(detectDelimiter('just one line of prose')).toBe(',');
    expect(rankDelimiters('just prose')[0]?.matching).toBe(0);
  });
});
