#!/usr/bin/env node
// Runs every suite the project has (static checks, Vitest, Playwright when present) and
// ends with one plain line `N passed, N failed` that sums them all. Exit code 1 when any
// suite fails. Each static check counts as one test.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';

const root = new URL('..', import.meta.url).pathname;
const out = join(root, 'test-results');
rmSync(out, { recursive: true, force: true });
mkdirSync(out, { recursive: true });

let passed = 0;
let failed = 0;
const lines = [];

function run(label, command, args, env = {}) {
  const started = Date.now();
  const r = spawnSync(command, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  return { ok: r.status === 0, seconds };
}

function check(label, command, args) {
  const { ok, seconds } = run(label, command, args);
  if (ok) passed++;
  else failed++;
  lines.push(`${ok ? 'ok  ' : 'FAIL'} ${label} (${seconds} s)`);
}

const npx = 'npx';
check('lint: eslint', npx, ['eslint', '.']);
check('lint: prettier', npx, ['prettier', '--check', '.']);
check('types: engine and tests', npx, ['tsc', '-p', 'tsconfig.json']);
check('types: engine is pure (no DOM, no Node)', npx, ['tsc', '-p', 'engine/tsconfig.json']);
if (existsSync(join(root, 'main/tsconfig.json')))
  check('types: electron main and preload', npx, ['tsc', '-p', 'main/tsconfig.json']);
if (existsSync(join(root, 'renderer/tsconfig.json')))
  check('types: renderer (svelte-check)', npx, [
    'svelte-check',
    '--tsconfig',
    'renderer/tsconfig.json',
    '--fail-on-warnings',
  ]);

// Vitest: unit, oracle, property and fuzz tests.
{
  const file = join(out, 'vitest.json');
  const { ok, seconds } = run('vitest', npx, [
    'vitest',
    'run',
    '--reporter=default',
    '--reporter=json',
    `--outputFile=${file}`,
  ]);
  let p = 0;
  let f = 0;
  if (existsSync(file)) {
    const report = JSON.parse(readFileSync(file, 'utf8'));
    p = report.numPassedTests ?? 0;
    f = (report.numFailedTests ?? 0) + (report.numFailedTestSuites ?? 0);
  }
  if (!ok && f === 0) f = 1;
  passed += p;
  failed += f;
  lines.push(`${ok ? 'ok  ' : 'FAIL'} vitest: ${p} passed, ${f} failed (${seconds} s)`);
}

// Playwright: browser journeys on the built renderer.
if (existsSync(join(root, 'playwright.config.ts')) && process.env.EBBLINE_SKIP_E2E !== '1') {
  const file = join(out, 'playwright.json');
  const { ok, seconds } = run('playwright', npx, ['playwright', 'test'], { PLAYWRIGHT_JSON_OUTPUT_NAME: file });
  let p = 0;
  let f = 0;
  if (existsSync(file)) {
    const report = JSON.parse(readFileSync(file, 'utf8'));
    p = report.stats?.expected ?? 0;
    f = (report.stats?.unexpected ?? 0) + (report.stats?.flaky ?? 0);
  }
  if (!ok && f === 0) f = 1;
  passed += p;
  failed += f;
  lines.push(`${ok ? 'ok  ' : 'FAIL'} playwright: ${p} passed, ${f} failed (${seconds} s)`);
}

console.log('\n' + lines.join('\n'));
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
