#!/usr/bin/env node
// The `ebbline` command: Node file I/O around the pure command logic in engine/cli.
// TypeScript is loaded through tsx, so `npx ebbline …` works from a checkout without a build.
import { readFileSync, writeFileSync } from 'node:fs';
import { register } from 'tsx/esm/api';

register();

function fail(message) {
  process.stderr.write(`ebbline: internal error: ${message}\n`);
  process.exitCode = 1;
}

try {
  const { runCli } = await import(new URL('../engine/cli/runCli.ts', import.meta.url).href);
  const io = { readFile: (path) => new Uint8Array(readFileSync(path)) };
  const outcome = await runCli(process.argv.slice(2), io);
  let exitCode = outcome.exitCode;
  let stderr = outcome.stderr;
  for (const { path, content } of outcome.writes) {
    try {
      writeFileSync(path, content);
    } catch (error) {
      stderr += `${path}: cannot be written (${error.code ?? error.message}), expected a writable file path\n`;
      exitCode = 2;
    }
  }
  if (outcome.stdout) process.stdout.write(outcome.stdout);
  if (stderr) process.stderr.write(stderr);
  process.exitCode = exitCode;
} catch (error) {
  // Never a stack trace for the person at the terminal; EBBLINE_DEBUG=1 shows it.
  if (process.env.EBBLINE_DEBUG === '1') console.error(error);
  fail(error instanceof Error ? error.message.split('\n')[0] : String(error));
}
