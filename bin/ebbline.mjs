#!/usr/bin/env node
// The `ebbline` command: Node file I/O around the pure command logic in engine/cli.
// TypeScript is loaded through tsx, so `npx ebbline …` works from a checkout without a build.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { register } from 'tsx/esm/api';

register();

const BROWSERS = [
  process.env.CHROMIUM_PATH,
  '/usr/bin/chromium',
  '/usr/bin/chromium-browser',
  '/usr/bin/google-chrome',
];

/** Prints an HTML document to PDF with a headless Chromium; returns an error text or null. */
function printPdf(html, path) {
  const browser = BROWSERS.find((b) => b && existsSync(b));
  if (!browser) return 'a PDF needs Chromium (set CHROMIUM_PATH), none was found; write a .html file instead';
  const dir = mkdtempSync(join(tmpdir(), 'ebbline-report-'));
  try {
    const page = join(dir, 'report.html');
    writeFileSync(page, html);
    const r = spawnSync(
      browser,
      [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
        `--user-data-dir=${join(dir, 'profile')}`,
        '--no-pdf-header-footer',
        `--print-to-pdf=${resolve(path)}`,
        pathToFileURL(page).href,
      ],
      { stdio: 'ignore', timeout: 120_000 },
    );
    return r.status === 0 && existsSync(resolve(path)) ? null : `Chromium could not print the PDF (exit ${r.status})`;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

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
  for (const { path, content, as } of outcome.writes) {
    try {
      if (as === 'pdf') {
        const problem = printPdf(content, path);
        if (problem) {
          stderr += `${path}: ${problem}\n`;
          exitCode = 2;
        }
        continue;
      }
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
