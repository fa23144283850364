/**
 * What the UI bench serves:
 * - `startApp()`: the app itself, built with renderer/vite.config.ts into test-results (so
 *   it never races `npm run web` over dist/) and served on a free 127.0.0.1 port;
 * - `startHarness()`: a page that mounts the Outlook or Patterns screen on its own with a
 *   ForecastHistory handed over by the bench (`window.__harness`), for histories the app
 *   cannot be given quickly through its import screens (100,000 invented transactions).
 *   It is generated into test-results/ui-harness (never committed) and built with the
 *   renderer's own Vite settings.
 */
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { fileURLToPath } from 'node:url';
import { build, preview } from 'vite';
import { svelte, vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult } from '../../engine/import/types';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { historyFromLedger, type ForecastHistory } from '../../engine/forecast/history';

const root = fileURLToPath(new URL('../..', import.meta.url));
const harnessDir = `${root}test-results/ui-harness`;
const appDir = `${root}test-results/ui-app`;

/** The demo workspace's EUR history (all three accounts combined), as the CLI builds it. */
export function demoHistory(): ForecastHistory {
  const dir = `${root}resources/demo/statements/`;
  const files = readdirSync(dir)
    .sort()
    .map((file) => ({
      file,
      result: importStatement(new Uint8Array(readFileSync(dir + file)), { fileName: file }) as ImportResult,
    }));
  return historyFromLedger(buildLedger(files), { currency: 'EUR' });
}

/**
 * A synthetic history with `count` entries over three years (seeded, invented): many small
 * receipts and payments a day, for the memory figure. No real data.
 */
export function syntheticHistory(count: number): ForecastHistory {
  let state = 0x2545f491;
  const random = () => {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    return (state >>> 0) / 0x100000000;
  };
  const days = 3 * 365;
  const startDay = Date.UTC(2023, 10, 1) / 86_400_000;
  const date = (d: number) => new Date((startDay + d) * 86_400_000).toISOString().slice(0, 10);
  const labels = ['Card sale', 'Market stall', 'Clay supplier', 'Glaze order', 'Courier', 'Online order', 'Refund'];
  const entries: ForecastHistory['entries'][number][] = [];
  for (let i = 0; i < count; i++) {
    const d = Math.floor((i / count) * days);
    const inflow = random() < 0.55;
    const amount = Math.round((inflow ? 1 : -1) * (200 + random() * 9000));
    const label = labels[Math.floor(random() * labels.length)] as string;
    entries.push({ id: `s${i}`, date: date(d), amount, description: `${label} ${i % 97}`, counterparty: label });
  }
  const endBalance = 2_500_000 + entries.reduce((s, e) => s + e.amount, 0);
  return { currency: 'EUR', start: date(0), asOf: date(days - 1), endBalance, relative: false, entries };
}

const INDEX_HTML = (csp: string) => `<!doctype html>
<html lang="en">
  <head>
    <meta charset="utf-8" />
    <meta http-equiv="Content-Security-Policy" content="${csp}" />
    <meta name="viewport" content="width=device-width, initial-scale=1" />
    <title>Ebbline screens</title>
    <style>main { padding: 1.5rem 2rem; } body { overflow: auto; }</style>
  </head>
  <body>
    <main id="app"></main>
    <script type="module" src="./main.ts"></script>
  </body>
</html>
`;

const MAIN_TS = `import { mount, unmount } from 'svelte';
import OutlookScreen from '../../renderer/src/screens/OutlookScreen.svelte';
import PatternsScreen from '../../renderer/src/screens/PatternsScreen.svelte';
import '../../renderer/src/styles/theme.css';

let current: Record<string, unknown> | null = null;
const target = document.getElementById('app')!;

function show(component: typeof OutlookScreen | typeof PatternsScreen, history: unknown, version: number) {
  if (current) unmount(current);
  performance.clearMarks();
  performance.mark('ebbline:mount');
  current = mount(component, { target, props: { history, decisions: [], version } as never });
}

(window as unknown as { __harness: unknown }).__harness = {
  outlook: (history: unknown, version = 1) => show(OutlookScreen, history, version),
  patterns: (history: unknown, version = 1) => show(PatternsScreen, history, version),
  clear: () => { if (current) unmount(current); current = null; },
  theme: (mode: 'light' | 'dark') => { document.documentElement.dataset.theme = mode; },
};
document.documentElement.dataset.theme = new URLSearchParams(location.search).get('theme') ?? 'light';
`;

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

export interface Harness {
  readonly url: string;
  close(): Promise<void>;
}

/** Builds the app with renderer/vite.config.ts into test-results and serves it on a free port. */
export async function startApp(): Promise<Harness> {
  const configFile = `${root}renderer/vite.config.ts`;
  const outDir = { build: { outDir: appDir, emptyOutDir: true } };
  await build({ configFile, logLevel: 'warn', ...outDir });
  const port = await freePort();
  const server = await preview({
    configFile,
    logLevel: 'warn',
    ...outDir,
    preview: { host: '127.0.0.1', port, strictPort: true },
  });
  return {
    url: `http://127.0.0.1:${port}/`,
    close: () => new Promise<void>((resolve) => server.httpServer.close(() => resolve())),
  };
}

/** Builds the harness page with the renderer's Vite settings and serves it on a free port. */
export async function startHarness(): Promise<Harness> {
  mkdirSync(harnessDir, { recursive: true });
  const csp = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(
    readFileSync(`${root}renderer/index.html`, 'utf8'),
  )?.[1];
  if (!csp) throw new Error('renderer/index.html has no Content-Security-Policy');
  writeFileSync(`${harnessDir}/index.html`, INDEX_HTML(csp));
  writeFileSync(`${harnessDir}/main.ts`, MAIN_TS);
  const shared = {
    root: harnessDir,
    base: './',
    configFile: false as const,
    logLevel: 'warn' as const,
    plugins: [svelte({ configFile: false, preprocess: vitePreprocess() })],
    worker: { format: 'es' as const },
    resolve: { alias: { '@engine': `${root}engine` } },
    // UI_BENCH_NO_MINIFY=1 keeps names readable in CPU profiles of the harness page.
    build: {
      outDir: `${harnessDir}/dist`,
      emptyOutDir: true,
      target: 'es2022',
      minify: !process.env.UI_BENCH_NO_MINIFY,
    },
  };
  await build(shared);
  const port = await freePort();
  const server = await preview({ ...shared, preview: { host: '127.0.0.1', port, strictPort: true } });
  return {
    url: `http://127.0.0.1:${port}/`,
    close: () => new Promise<void>((resolve) => server.httpServer.close(() => resolve())),
  };
}
