// bin/ebbline.mjs end to end: the Node wrapper around runCli (file reading, exit codes,
// stdout/stderr), run as a child process the way `npx ebbline` runs it.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '../..');
const DEMO = join(ROOT, 'resources/demo/statements');

function ebbline(args: string[]) {
  const r = spawnSync(process.execPath, [join(ROOT, 'bin/ebbline.mjs'), ...args], { cwd: ROOT, encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('bin/ebbline.mjs', () => {
  it('checks the demo statements with exit code 0 and byte-identical JSON on a second run', () => {
    const files = readdirSync(DEMO)
      .sort()
      .map((n) => join('resources/demo/statements', n));
    const first = ebbline(['import', ...files, '--check', '--format', 'json']);
    expect(first.stderr).toBe('');
    expect(first.status).toBe(0);
    expect(JSON.parse(first.stdout).schema).toBe('ebbline.import/1');
    const second = ebbline(['import', ...files, '--check', '--format', 'json']);
    expect(second.stdout).toBe(first.stdout);
  });

  it('refuses bad input with exit code 2, one line per problem, no stack trace and nothing on stdout', () => {
    const dir = mkdtempSync(join(tmpdir(), 'ebbline-bin-'));
    const bad = join(dir, 'bad.csv');
    writeFileSync(
      bad,
      'Date;Description;Amount;Currency\r\n02.01.2026;Clay;-12,50;EUR\r\n03.01.2026;Glaze;1-2-3;EUR\r\n',
    );
    const missing = join(dir, 'missing.xml');
    const r = ebbline(['import', join(DEMO, 'reserve-2024.sta'), bad, missing, '--check']);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    const lines = r.stderr.trimEnd().split('\n');
    expect(lines.length).toBeGreaterThanOrEqual(2);
    expect(lines[0]).toMatch(new RegExp(`^${bad.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:3: `));
    expect(lines[lines.length - 1]).toBe(`${missing}: file not found, expected a readable statement file`);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('answers a usage mistake with exit code 2 and the usage line', () => {
    const r = ebbline(['import', '--check']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('usage: ebbline import <statement files...> --check');
  });
});
