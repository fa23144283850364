import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { importStatement } from '../../engine/import/registry';

const sniff = (text: string): number => csvImporter.sniff(text);

describe('csvImporter.sniff', () => {
  it('is sure of a delimited table whose header names a date and an amount', () => {
    expect(csvImporter.id).toBe('csv');
    expect(sniff('Date,Description,Amount\n2025-01-02,Rent,-500.00\n2025-01-03,Sale,20.00\n')).toBe(0.95);
    expect(sniff('Konto;DE89\n\nBuchungstag;Text;Betrag\n01.02.2025;a;-1,00\n')).toBe(0.95);
  });

  it('is fairly sure of a headerless table with a date and an amount column', () => {
    expect(sniff('2025-07-01;Kiln power;-61,20\n2025-07-05;Market;418,00\n')).toBe(0.8);
  });

  it('is unsure of other delimited text and of a single line', () => {
    expect(sniff('name,colour\nfig,purple\nlime,green\n')).toBeLessThanOrEqual(0.2);
    expect(sniff('name,colour\nfig,purple\nlime,green\n')).toBeGreaterThan(0);
    expect(sniff('a,b\n')).toBe(0.05);
    expect(sniff('Just a sentence without any delimiter at all.')).toBe(0);
    expect(sniff('')).toBe(0);
  });

  it('gives 0 for XML, OFX and MT940 so their importers win', () => {
    // Source: OFX Banking Specification: 1.x files begin with the header line OFXHEADER:100; 2.x are XML with <OFX>.
    expect(sniff('OFXHEADER:100\nDATA:OFXSGML\nVERSION:102\n\n<OFX>\n<SIGNONMSGSRSV1>\n')).toBe(0);
    expect(sniff('<?xml version="1.0"?>\n<?OFX OFXHEADER="200" VERSION="220"?>\n<OFX></OFX>')).toBe(0);
    expect(sniff('\ufeff<?xml version="1.0" encoding="UTF-8"?><Document><BkToCstmrStmt/></Document>')).toBe(0);
    // Source: SWIFT User Handbook, MT940: fields :20: (reference), :25: (account), :61: (statement line).
    expect(
      sniff(
        ':20:STMT1\r\n:25:DE89370400440532013000\r\n:28C:1/1\r\n:60F:C250101EUR1000,00\r\n:61:2501020102D12,50NTRFNONREF\r\n',
      ),
    ).toBe(0);
    expect(sniff('{1:F01BANKDEFFAXXX0000000000}{4:\r\n:20:X\r\n:61:250102D1,00NTRF\r\n-}')).toBe(0);
  });

  it('does not take a CSV for MT940 because a description mentions a tag', () => {
    expect(sniff('Date;Text;Amount\n2025-01-02;":20: ref";1,00\n')).toBe(0.95);
  });

  it('never throws on odd input', () => {
    for (const odd of ['"', '""""', '\r\r\r', ',,,,', '\u0000\u0001', '"a\nb', ';'.repeat(10_000)]) {
      expect(sniff(odd)).toBeGreaterThanOrEqual(0);
    }
  });
});

describe('the registry picks the CSV importer by content', () => {
  it('routes every CSV fixture to csv', () => {
    const dir = new URL('../fixtures/csv/', import.meta.url);
    for (const name of readdirSync(dir)) {
      const result = importStatement(new Uint8Array(readFileSync(new URL(name, dir))), { fileName: name });
      expect(result.format, name).toBe('csv');
    }
  });
});
