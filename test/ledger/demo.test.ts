// The committed demo workspace (resources/demo/statements, invented data) must import
// without problems, reconcile on every account, and be exactly what the generator makes.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../engine/cli/runCli';
import { isoWeekday, toDayNumber } from '../../engine/core/dates';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { dailySeries } from '../../engine/ledger/dailySeries';
import { generateDemoFiles } from '../../resources/demo/generate';

const DIR = join(import.meta.dirname, '../../resources/demo/statements');
const names = readdirSync(DIR).sort();
const paths = names.map((n) => join(DIR, n));

describe('demo workspace', () => {
  it('has one file format per account and a CSV export, under 5 MB in all', () => {
    const byExtension = new Map<string, number>();
    let bytes = 0;
    for (const p of paths) {
      bytes += readFileSync(p).length;
      const ext = p.slice(p.lastIndexOf('.') + 1);
      byExtension.set(ext, (byExtension.get(ext) ?? 0) + 1);
    }
    expect(Object.fromEntries(byExtension)).toEqual({ xml: 36, sta: 4, ofx: 13, csv: 1 });
    expect(bytes).toBeLessThan(5 * 1024 * 1024);
  });

  it('imports without problems and reconciles every account', () => {
    const files = paths.map((file) => {
      const result = importStatement(new Uint8Array(readFileSync(file)), { fileName: file });
      expect(result.problems, file).toEqual([]);
      return { file, result: result as ImportResult };
    });
    expect(new Set(files.map((f) => f.result.format))).toEqual(new Set(['camt.053', 'mt940', 'ofx', 'csv']));
    const ledger = buildLedger(files);
    expect(ledger.accounts.map((a) => [a.id, a.currency])).toEqual([
      ['NL21HRBL0412345670', 'EUR'],
      ['NL77TLMC0203040506', 'EUR'],
      ['NL35QFSB0100200300', 'EUR'],
    ]);
    for (const r of ledger.reconciliation) {
      expect(r.reconciled, r.accountId).toBe(true);
      expect(r.firstDate, r.accountId).toMatch(/^2023-1[01]-/);
      expect(r.lastDate, r.accountId).toBe('2026-10-31');
    }
    // Statements that state both balances add up; OFX states only the ledger balance at the end.
    expect(ledger.statements.filter((s) => s.consistent === false)).toEqual([]);
    expect(ledger.statements.filter((s) => s.consistent === true)).toHaveLength(36 + 36 + 1);
    // The CSV export repeats the business account's last quarter: every row is a duplicate.
    const csv = ledger.files.find((f) => f.format === 'csv')!;
    expect(csv.accounts[0]).toMatchObject({
      accountId: 'NL21HRBL0412345670',
      entries: 0,
      from: '2026-08-01',
      to: '2026-10-31',
    });
    expect(csv.accounts[0]!.duplicates).toBeGreaterThan(30);
    // Three years of daily series, combined over the three EUR accounts.
    const series = dailySeries(ledger, { currency: 'EUR' }, { from: '2023-11-01', to: '2026-10-31' });
    expect(series.days).toBe(1096);
    expect(series.combined.relative).toBe(false);
  });

  it('passes `ebbline import --check` with exit code 0', async () => {
    const io = { readFile: (p: string) => new Uint8Array(readFileSync(p)) };
    const out = await runCli(['import', ...paths, '--check', '--format', 'json'], io);
    expect(out.stderr).toBe('');
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(doc.accounts.map((a: { reconciled: boolean }) => a.reconciled)).toEqual([true, true, true]);
  });

  it('is exactly what resources/demo/generate.ts produces (regenerate with npm run demo)', () => {
    const generated = generateDemoFiles();
    expect([...generated.keys()].sort()).toEqual(names);
    for (const [name, bytes] of generated) {
      expect(Buffer.from(bytes).equals(readFileSync(join(DIR, name))), name).toBe(true);
    }
  });

  it('shows the patterns it promises: Saturday takings, rent on the first business day, owner draw at month end', () => {
    const files = paths
      .filter((p) => p.endsWith('.xml'))
      .map((file) => ({
        file,
        result: importStatement(new Uint8Array(readFileSync(file)), { fileName: file }) as ImportResult,
      }));
    const tx = buildLedger(files).transactions;
    const takings = tx.filter((t) => t.description.startsWith('Card takings'));
    expect(takings.length).toBeGreaterThan(130);
    expect(takings.filter((t) => isoWeekday(toDayNumber(t.bookingDate)) !== 6)).toEqual([]);
    const rents = tx.filter((t) => t.description.startsWith('Studio rent'));
    expect(rents).toHaveLength(36);
    for (const r of rents) expect(Number(r.bookingDate.slice(8)), r.bookingDate).toBeLessThanOrEqual(3);
    const invoices = tx.filter((t) => /INV-\d{4}-\d{3}/.test(t.description));
    expect(invoices.length).toBeGreaterThan(40);
    const draws = tx.filter((t) => t.description.startsWith("Owner's draw"));
    expect(draws).toHaveLength(36);
    for (const d of draws) expect(Number(d.bookingDate.slice(8)), d.bookingDate).toBeGreaterThanOrEqual(26);
  });
});
