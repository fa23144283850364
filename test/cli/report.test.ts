import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CAUTION } from '../../engine/core/caution';
import { runCli } from '../../engine/cli/runCli';
import type { CliIo } from '../../engine/cli/types';

// The invented demo statements of the business account, last eight months (camt.053).
const dir = new URL('../../resources/demo/statements/', import.meta.url);
const files = readdirSync(dir)
  .filter((f) => /^business-20(26-0[3-9]|26-10)\.xml$/.test(f))
  .map((f) => `statements/${f}`);
/** Plan files by name, beside the statements. */
const plans = new Map<string, string>();
const io: CliIo = {
  readFile: async (path) => {
    const plan = plans.get(path);
    if (plan !== undefined) return new TextEncoder().encode(plan);
    return new Uint8Array(readFileSync(new URL(path.replace('statements/', ''), dir)));
  },
};

const run = (extra: string[]) =>
  runCli(['report', ...files, '--paths', '400', '--horizon', '60', '--date', '2026-12-02', ...extra], io);

describe('ebbline report', () => {
  it('writes a self-contained HTML report with the answer, the caution and no outside resources', async () => {
    const outcome = await run(['--out', 'client.html', '--title', 'Outlook for <Tessellate>']);
    expect(outcome.exitCode).toBe(0);
    expect(outcome.stdout).toContain(CAUTION);
    const [write] = outcome.writes;
    expect(write?.path).toBe('client.html');
    expect(write?.as).toBeUndefined();
    const html = write!.content;
    expect(html).toContain('Estimated chance that the balance of');
    expect(html).toContain(CAUTION.slice(0, 40));
    expect(html).toContain('Outlook for &lt;Tessellate&gt;'); // the title is escaped
    expect(html).not.toMatch(/(src|href)="https?:/);
    expect(html).not.toContain('<script');
    expect(html).not.toContain('(EUR) (EUR)');
  });

  it('gives the same report for the same files, options and seed', async () => {
    const a = await run(['--out', 'a.html', '--seed', '9']);
    const b = await run(['--out', 'a.html', '--seed', '9']);
    expect(a.writes[0]?.content).toBe(b.writes[0]?.content);
  });

  it('asks the host to print a .pdf and refuses other file kinds and bad dates', async () => {
    const pdf = await run(['--out', 'client.pdf']);
    expect(pdf.exitCode).toBe(0);
    expect(pdf.writes[0]?.as).toBe('pdf');
    const txt = await run(['--out', 'client.txt']);
    expect(txt.exitCode).toBe(2);
    expect(txt.stderr).toBe('--out: "client.txt", expected a file name ending in .html or .pdf\n');
    expect(txt.writes).toEqual([]);
    const missing = await runCli(['report', ...files, '--date', '2026-02-30'], io);
    expect(missing.exitCode).toBe(2);
    expect(missing.stderr).toContain('--out: missing');
    expect(missing.stderr).toContain('--date: "2026-02-30" is not a calendar date');
  });

  it('reports a --plan scenario beside the base forecast: a certain one-off lowers the median by its amount', async () => {
    // Common practice, no source: a payment certain to happen on a date moves every path,
    // hence every quantile, by exactly its amount from that date on.
    plans.set(
      'clients/tax bill.plan.json',
      JSON.stringify({
        schema: 'ebbline.plan/1',
        items: [{ label: 'Tax bill', amount: -1234.56, date: '2026-11-03', probability: 1 }],
      }),
    );
    const outcome = await run(['--out', 'tax.html', '--plan', 'clients/tax bill.plan.json']);
    expect(outcome.stderr).toBe('');
    expect(outcome.exitCode).toBe(0);
    const html = outcome.writes[0]!.content;
    // No name in the file: the scenario is named after it.
    expect(html).toContain('Cash outlook: scenario “tax bill”');
    expect(html).toContain('Base forecast (no changes)');
    expect(html).toMatch(/the median balance on that date is 1,234\.56 EUR lower/);
    expect(html).toContain(CAUTION.slice(0, 40));
  });

  it('compares with the plan of --reference, and refuses --reference without --plan', async () => {
    plans.set(
      'clients/usual.json',
      JSON.stringify({
        schema: 'ebbline.plan/1',
        name: 'Usual terms',
        items: [{ label: 'Invoice', amount: 500, date: '2026-11-05', probability: 1 }],
      }),
    );
    plans.set(
      'clients/late.json',
      JSON.stringify({
        schema: 'ebbline.plan/1',
        name: 'Paid late',
        items: [{ label: 'Invoice', amount: 500, date: '2026-12-20', probability: 1 }],
      }),
    );
    const outcome = await run([
      '--out',
      'late.html',
      '--plan',
      'clients/late.json',
      '--reference',
      'clients/usual.json',
    ]);
    expect(outcome.exitCode).toBe(0);
    const html = outcome.writes[0]!.content;
    expect(html).toContain('Cash outlook: scenario “Paid late”');
    expect(html).toContain('Usual terms');
    expect(html).not.toContain('Base forecast (no changes)');

    const alone = await run(['--out', 'x.html', '--reference', 'clients/usual.json']);
    expect(alone.exitCode).toBe(2);
    expect(alone.stderr).toContain('--reference: given without --plan');
    expect(alone.writes).toEqual([]);

    const broken = await run(['--out', 'x.html', '--plan', 'clients/late.json', '--reference', 'clients/none.json']);
    expect(broken.exitCode).toBe(2);
    expect(broken.stderr).toContain('clients/none.json');
    expect(broken.writes).toEqual([]);
  });
});
