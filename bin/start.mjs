#!/usr/bin/env node
// `npm start`: opens the desktop window when an Electron binary is installed; otherwise
// serves the same renderer in the browser and says why.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';

const root = new URL('..', import.meta.url).pathname;
const require = createRequire(import.meta.url);

function electronBinary() {
  try {
    const path = require('electron');
    return typeof path === 'string' && existsSync(path) ? path : null;
  } catch {
    return null;
  }
}

const run = (cmd, args) => {
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
};

const binary = electronBinary();
if (binary && !process.argv.includes('--browser')) {
  run('npx', ['vite', 'build', '--config', 'renderer/vite.config.ts', '--logLevel', 'warn']);
  run('node', ['bin/build-main.mjs']);
  const child = spawn(binary, ['.', ...process.argv.slice(2).filter((a) => a === '--demo')], {
    cwd: root,
    stdio: 'inherit',
  });
  child.on('exit', (code) => process.exit(code ?? 0));
} else {
  console.log(
    binary
      ? 'Starting in the browser as asked (--browser).'
      : 'No Electron binary is installed here (it was skipped or could not be downloaded), so Ebbline is served for your browser instead: open the address below. Your data stays in that browser profile on this machine.',
  );
  const child = spawn('node', ['bin/web.mjs', ...process.argv.slice(2).filter((a) => a !== '--browser')], {
    cwd: root,
    stdio: 'inherit',
  });
  child.on('exit', (code) => process.exit(code ?? 0));
}
