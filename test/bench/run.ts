/**
 * `npm run bench`: runs every bench script in test/bench (each `.ts` file there except this
 * one and helpers whose name starts with `_`; `*.bench.ts` by convention), one after the
 * other in name order, each in its own Node process so that memory figures do not mix.
 * Benches print figures only; nothing is asserted. Exit code 1 when a bench script fails.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv.slice(2);
const scripts = readdirSync(here)
  .filter((name) => name.endsWith('.ts') && name !== 'run.ts' && !name.startsWith('_'))
  .filter((name) => only.length === 0 || only.some((o) => name.includes(o)))
  .sort();

let failed = 0;
for (const name of scripts) {
  console.log(`\n== ${name}`);
  const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', join(here, name)], { stdio: 'inherit' });
  if (r.status !== 0) {
    failed++;
    console.log(`(${name} exited with ${r.status ?? r.signal})`);
  }
}
process.exitCode = failed > 0 ? 1 : 0;
