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
const io: CliIo = { readFile: (path) => new Uint8Array(readFileSync(new URL(path.replace('statements/', ''), dir))) };

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
});
