// RFC 4180 (2005): comma-separated fields, CRLF record ends, a header, quoted fields with
// doubled quotes. The file is read back with the CSV importer's own scanner.
import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../engine/core/caution';
import type { ForecastResult } from '../../engine/forecast/runForecast';
import { scanCsv, rowCells } from '../../engine/import/csv/scan';
import { CSV_COLUMNS, csvField, reportCsv } from '../../engine/report/reportCsv';
import { prepareForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario } from '../../engine/scenario/forecastScenario';
import { syntheticHistory } from '../scenario/syntheticHistory';

let result: ForecastResult;
beforeAll(() => {
  result = forecastScenario(prepareForecastBasis(syntheticHistory(), { horizon: 45 }), { paths: 300, seed: 1 }).result;
});

describe('reportCsv', () => {
  it('parses back to the daily figures in major units', () => {
    const text = reportCsv(result);
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/); // only CRLF line ends (the caution has none)
    const table = scanCsv(text, ',');
    const rows = Array.from({ length: table.rowCount }, (_, r) => rowCells(table, r));
    expect(rows[0]).toEqual([...CSV_COLUMNS]);
    expect(rows).toHaveLength(1 + result.horizonDays + 1);
    for (const row of rows) expect(row).toHaveLength(CSV_COLUMNS.length);
    result.daily.forEach((d, i) => {
      const row = rows[i + 1]!;
      expect(row[0]).toBe(d.date);
      expect(Math.round(Number(row[1]) * 100)).toBe(Math.round(d.mean));
      d.quantiles.forEach((q, k) => expect(Math.round(Number(row[2 + k]) * 100)).toBe(Math.round(q)));
      expect(Number(row[9])).toBeCloseTo(d.pBelow, 6);
      expect(Number(row[10])).toBeCloseTo(d.pCrossed, 6);
      for (const cell of row.slice(1, 9)) expect(cell).toMatch(/^-?\d+\.\d{2}$/);
    });
    expect(rows[rows.length - 1]![0]).toBe(CAUTION);
  });

  it('leaves the caution row out on request and quotes fields by the RFC', () => {
    expect(reportCsv(result, { caution: false }).trimEnd().split('\r\n')).toHaveLength(1 + result.horizonDays);
    expect(csvField('a "b", c')).toBe('"a ""b"", c"');
    expect(csvField('line\nbreak')).toBe('"line\nbreak"');
    expect(csvField('plain')).toBe('plain');
  });
});
