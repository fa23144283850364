// bin/ebbline.mjs forecast end to end on the demo statements: run as a child process the
// way `npx ebbline` runs it, twice with the same seed (stdout, then --out), byte for byte.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '../..');

function ebbline(args: string[]) {
  const r = spawnSync(process.execPath, [join(ROOT, 'bin/ebbline.mjs'), ...args], { cwd: ROOT, encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('ebbline forecast (bin)', () => {
  it('gives byte-identical JSON on a second run with the same seed, and --out writes the same bytes', () => {
    // The business account's first six months keep the run short.
    const files = readdirSync(join(ROOT, 'resources/demo/statements'))
      .filter((n) => /^business-(2023|2024-0[1-4])/.test(n))
      .sort()
      .map((n) => join('resources/demo/statements', n));
    const args = ['forecast', ...files, '--horizon', '30', '--paths', '500', '--seed', '42', '--format', 'json'];
    const first = ebbline(args);
    expect(first.stderr).toBe('');
    expect(first.status).toBe(0);
    const doc = JSON.parse(first.stdout);
    expect(doc.schema).toBe('ebbline.forecast/1');
    expect(doc.asOf).toBe('2024-04-30');
    const out = join(mkdtempSync(join(tmpdir(), 'ebbline-forecast-')), 'forecast.json');
    const second = ebbline([...args, '--out', out]);
    expect(second.status).toBe(0);
    expect(second.stdout).toBe(`Wrote the forecast (JSON) to ${out}.\n`);
    expect(readFileSync(out, 'utf8')).toBe(first.stdout);
  });

  it('answers a bad --paths with exit code 2 and the one-line problem, no stack trace', () => {
    const r = ebbline(['forecast', 'resources/demo/statements/reserve-2024.sta', '--paths', '5']);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe('--paths: "5" is outside 100..100000\n');
  });
});
