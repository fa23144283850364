// The worker's methods run the CLI's engine on plain data: the forecast history and the
// recurring flows the app shows are exactly what the CLI computes from the same files.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { historyFromLedger } from '../../engine/forecast/history';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger, type LedgerInputFile } from '../../engine/ledger/buildLedger';
import { detectRecurringFlows } from '../../engine/recurring/detectRecurringFlows';
import { STORED_FILES_NEEDED, engineMethods } from '../../renderer/src/lib/worker/methods';

const DEMO = new URL('../../resources/demo/statements/', import.meta.url);
const NAMES = [
  'business-2026-07.xml',
  'business-2026-08.xml',
  'business-2026-09.xml',
  'business-2026-10.xml',
  'reserve-2026.sta',
];
const context = { progress: () => {} };

function files(): LedgerInputFile[] {
  return NAMES.map((name) => ({
    file: name,
    result: importStatement(readFileSync(new URL(name, DEMO)), { fileName: name }) as ImportResult,
  }));
}

describe('engine methods', () => {
  it('parseStatements reads any format, hashes the bytes and adds the CSV layout', async () => {
    const csv = 'business-export-2026-08-10.csv';
    const parsed = await engineMethods.parseStatements(
      {
        files: [
          { name: csv, bytes: new Uint8Array(readFileSync(new URL(csv, DEMO))) },
          { name: 'reserve-2026.sta', bytes: new Uint8Array(readFileSync(new URL('reserve-2026.sta', DEMO))) },
          { name: 'empty.csv', bytes: new Uint8Array() },
        ],
      },
      context,
    );
    expect(parsed.map((p) => p.result.format)).toEqual(['csv', 'mt940', undefined]);
    expect(parsed[0]!.csv?.fingerprint).toMatch(/^csv1-[0-9a-f]{16}$/);
    expect(parsed[0]!.csv?.dateFormat).toBe('DD.MM.YYYY');
    expect(parsed[1]!.csv).toBeUndefined();
    expect(parsed[0]!.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(parsed[2]!.result.problems[0]!.message).toMatch(/empty/);
  });

  it('forecastHistory is historyFromLedger of buildLedger, as in the CLI', async () => {
    const stored = { revision: 'w1:a,b,c,d,e', files: files() };
    const history = await engineMethods.forecastHistory({ stored, scope: { currency: 'EUR' } }, context);
    expect(history).toEqual(historyFromLedger(buildLedger(files()), { currency: 'EUR' }));
    expect(history.asOf).toBe('2026-10-31');
  });

  it('recurringFlows detects on the scope history with its as-of date', async () => {
    const r = await engineMethods.recurringFlows(
      { stored: { revision: 'w1:recurring', files: files() }, scope: { currency: 'EUR' } },
      context,
    );
    const h = historyFromLedger(buildLedger(files()), { currency: 'EUR' });
    expect(r.asOf).toBe(h.asOf);
    expect(r.flows).toEqual(
      detectRecurringFlows(
        h.entries.map((e) => ({
          id: e.id,
          date: e.date,
          amount: e.amount,
          description: e.description,
          counterparty: e.counterparty,
        })),
        { asOf: h.asOf },
      ),
    );
  });

  it('keeps the stored files by revision and asks for them when it does not have them', async () => {
    await engineMethods.buildLedger({ stored: { revision: 'w2:x', files: files() } }, context);
    const seen: string[] = [];
    const again = await engineMethods.forecastHistory(
      { stored: { revision: 'w2:x' }, scope: { currency: 'EUR' } },
      { progress: (_, label) => seen.push(label) },
    );
    expect(again.asOf).toBe('2026-10-31');
    expect(seen).not.toContain('Building the ledger'); // the kept ledger was used
    await expect(
      engineMethods.forecastHistory({ stored: { revision: 'w2:other' }, scope: { currency: 'EUR' } }, context),
    ).rejects.toMatchObject({ code: STORED_FILES_NEEDED });
    // Stored files plus an import's new files, in that order.
    const csv = 'business-export-2026-08-10.csv';
    const extra = [
      { file: csv, result: importStatement(readFileSync(new URL(csv, DEMO)), { fileName: csv }) as ImportResult },
    ];
    const ledger = await engineMethods.buildLedger({ stored: { revision: 'w2:x' }, extra }, context);
    expect(ledger).toEqual(buildLedger([...files(), ...extra]));
  });

  it('buildLedger reports its progress and refuses a file with errors', async () => {
    const seen: number[] = [];
    const ledger = await engineMethods.buildLedger({ files: files() }, { progress: (share) => seen.push(share) });
    expect(ledger.accounts).toHaveLength(2);
    expect(seen.at(-1)).toBe(1);
    const bad = {
      file: 'bad.csv',
      result: {
        file: 'bad.csv',
        format: 'csv' as const,
        statements: [],
        problems: [{ file: 'bad.csv', message: 'x', severity: 'error' as const }],
      },
    };
    await expect(engineMethods.buildLedger({ files: [bad] }, context)).rejects.toMatchObject({
      code: 'INVALID_ARGUMENT',
    });
  });
});
