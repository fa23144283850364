#!/usr/bin/env node
// Bundles the Electron main process and the sandboxed preload into dist/main as CommonJS.
// The preload must be one file: sandboxed preloads cannot load local modules.
import { build } from 'esbuild';
import { mkdirSync, writeFileSync } from 'node:fs';

const outdir = new URL('../dist/main/', import.meta.url).pathname;
mkdirSync(outdir, { recursive: true });
writeFileSync(`${outdir}package.json`, JSON.stringify({ type: 'commonjs' }) + '\n');
for (const entry of ['main', 'preload']) {
  await build({
    entryPoints: [new URL(`../main/${entry}.ts`, import.meta.url).pathname],
    outfile: `${outdir}${entry}.js`,
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    external: ['electron'],
    logLevel: 'warning',
  });
}
console.log('built dist/main/main.js and dist/main/preload.js');
