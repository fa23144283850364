/**
 * `npm run bench:ui`: how the Outlook feels, measured in Chromium on the built screens.
 * Prints figures only; nothing is asserted (DEVELOPERS.md: performance is measured by
 * benches, never asserted in tests).
 *
 * - first drawn forecast: the app opens the demo workspace (its "Open the demo workspace"
 *   button: statements imported, ledger built), then the Outlook is opened and timed to the
 *   fan chart's first render (cold workers: history prepared, recurring flows found,
 *   residual models chosen by backtest, 5,000 paths × 90 days simulated);
 * - re-forecast: from committing a new threshold or horizon (Enter) to the fan chart's
 *   render of the new result, 5,000 paths × 90 days, median of several changes;
 * - longest main-thread task (PerformanceObserver 'longtask', which reports tasks of
 *   50 ms or more) while 10,000-path forecasts run;
 * - JS heap with a 100,000-transaction history loaded and forecast (window and worker
 *   heaps, after a garbage collection, through the Chrome DevTools Protocol). Importing
 *   100,000 transactions through the app's screens would measure the import, so this one
 *   mounts the Outlook on the harness page (./uiHarness.ts) with an invented history.
 */
import { existsSync } from 'node:fs';
import { chromium, type CDPSession, type Page } from '@playwright/test';
import { startApp, startHarness, syntheticHistory } from './uiHarness';

const executablePath = process.env.CHROMIUM_PATH ?? (existsSync('/usr/bin/chromium') ? '/usr/bin/chromium' : undefined);
const args = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--enable-precise-memory-info',
];

/**
 * The page globals the bench touches. This file compiles without DOM types (like the
 * browser tests), so the page's globals are described here, as far as they are used.
 */
interface PageGlobals {
  __longTasks: { start: number; duration: number }[];
  __history: unknown;
  __harness: Record<'outlook' | 'patterns', (history: unknown) => void>;
  document: {
    addEventListener(type: string, listener: (event: { key?: string }) => void, capture: boolean): void;
    querySelectorAll(selector: string): { length: number };
  };
}

const OBSERVE_LONG_TASKS = () => {
  const w = globalThis as unknown as PageGlobals;
  w.__longTasks = [];
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) w.__longTasks.push({ start: e.startTime, duration: e.duration });
  }).observe({ type: 'longtask' as 'mark', buffered: true });
  // Marks the moment a setting is committed, before the screen's own handlers run.
  w.document.addEventListener(
    'keydown',
    (e) => {
      if (e.key === 'Enter') performance.mark('ebbline:commit');
    },
    true,
  );
  w.document.addEventListener('change', () => performance.mark('ebbline:commit'), true);
};

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
};
const ms = (x: number) => `${Math.round(x)} ms`;
const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

async function drawnCount(page: Page): Promise<number> {
  return page.evaluate(() => performance.getEntriesByName('ebbline:outlook-drawn').length);
}

async function waitForDraw(page: Page, before: number, timeout = 120_000): Promise<void> {
  await page.waitForFunction((n) => performance.getEntriesByName('ebbline:outlook-drawn').length > n, before, {
    timeout,
    polling: 10,
  });
}

async function longestTaskSince(page: Page, since: number): Promise<number> {
  return page.evaluate(
    (t) =>
      (globalThis as unknown as PageGlobals).__longTasks
        .filter((e) => e.start + e.duration >= t)
        .reduce((m, e) => Math.max(m, e.duration), 0),
    since,
  );
}

/** Where a re-forecast's time went: commit → request, request → result (workers), result → drawn (window). */
interface Split {
  total: number;
  engine: number;
  window: number;
}

async function lastSplit(page: Page): Promise<Split> {
  // No named helpers inside evaluate: the bundler would wrap them in a helper the page lacks.
  return page.evaluate(() => {
    const [commit, request, result, drawn] = [
      'ebbline:commit',
      'ebbline:forecast-request',
      'ebbline:forecast-result',
      'ebbline:outlook-drawn',
    ].map((name) => performance.getEntriesByName(name).at(-1)?.startTime ?? NaN) as [number, number, number, number];
    return { total: drawn - commit, engine: result - request, window: drawn - result };
  });
}

async function commit(page: Page, testid: string, value: string): Promise<Split> {
  const before = await drawnCount(page);
  await page.fill(`[data-testid="${testid}"]`, value);
  await page.press(`[data-testid="${testid}"]`, 'Enter');
  await waitForDraw(page, before);
  return lastSplit(page);
}

function printSplits(label: string, splits: Split[]): void {
  print(`${label} (median of ${splits.length})`, ms(median(splits.map((s) => s.total))));
  print(
    '  of which engine workers / window (medians)',
    `${ms(median(splits.map((s) => s.engine)))} / ${ms(median(splits.map((s) => s.window)))}`,
  );
  print(
    '  fastest / slowest',
    `${ms(Math.min(...splits.map((s) => s.total)))} / ${ms(Math.max(...splits.map((s) => s.total)))}`,
  );
}

async function mountToFirstDraw(page: Page): Promise<number> {
  return page.evaluate(() => {
    const [mount, drawn] = ['ebbline:mount', 'ebbline:outlook-drawn'].map(
      (name) => performance.getEntriesByName(name)[0]?.startTime ?? NaN,
    ) as [number, number];
    return drawn - mount;
  });
}

/** Hands a history to the page and mounts a screen with it; returns the page time just before the mount. */
async function mountWith(page: Page, screen: 'outlook' | 'patterns', history: unknown): Promise<number> {
  // The hand-over is the bench's own work (Playwright serialises the object): done first, outside the timings.
  await page.evaluate((h) => ((globalThis as unknown as PageGlobals).__history = h), history);
  return page.evaluate((s) => {
    const w = globalThis as unknown as PageGlobals;
    const t = performance.now();
    w.__harness[s](w.__history);
    return t;
  }, screen);
}

async function heapUsed(cdp: CDPSession): Promise<number> {
  await cdp.send('HeapProfiler.collectGarbage');
  const usage = (await cdp.send('Runtime.getHeapUsage')) as { usedSize: number };
  return usage.usedSize;
}

interface CdpEvents {
  on(event: 'Target.attachedToTarget', f: (e: { sessionId: string; targetInfo: { type: string } }) => void): void;
  on(event: 'Target.receivedMessageFromTarget', f: (e: { sessionId: string; message: string }) => void): void;
}

/**
 * Used JS heap of each dedicated worker of the page after a garbage collection, through the
 * page's CDP session (workers attached as child targets, messages relayed).
 */
async function workerHeaps(cdp: CDPSession): Promise<number[]> {
  const events = cdp as unknown as CdpEvents;
  const sessions: string[] = [];
  const sizes = new Map<string, number>();
  events.on('Target.attachedToTarget', (e) => {
    if (e.targetInfo.type === 'worker') sessions.push(e.sessionId);
  });
  events.on('Target.receivedMessageFromTarget', (e) => {
    const reply = JSON.parse(e.message) as { id: number; result?: { usedSize?: number } };
    if (reply.id === 2 && reply.result?.usedSize !== undefined) sizes.set(e.sessionId, reply.result.usedSize);
  });
  await cdp.send('Target.setAutoAttach', { autoAttach: true, waitForDebuggerOnStart: false, flatten: false });
  await new Promise((r) => setTimeout(r, 500));
  for (const sessionId of sessions) {
    for (const [id, method] of [
      [1, 'HeapProfiler.collectGarbage'],
      [2, 'Runtime.getHeapUsage'],
    ] as const) {
      await cdp.send('Target.sendMessageToTarget', { sessionId, message: JSON.stringify({ id, method }) });
    }
  }
  await new Promise((r) => setTimeout(r, 1000));
  return sessions.map((id) => sizes.get(id) ?? -1);
}

const nav = (page: Page, name: string) =>
  page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name, exact: true });

/** Opens the demo workspace the way a person does; returns the page time of the click. */
async function openDemo(page: Page): Promise<number> {
  await page.getByRole('button', { name: 'Open the demo workspace' }).waitFor();
  const t = await page.evaluate(() => performance.now());
  await page.getByRole('button', { name: 'Open the demo workspace' }).click();
  await page.locator('[data-testid="nav-accounts"][aria-current="page"]').waitFor({ timeout: 120_000 });
  await page.getByTestId('account-row').nth(2).waitFor({ timeout: 120_000 });
  await page.getByTestId('import-progress').waitFor({ state: 'hidden', timeout: 120_000 });
  return t;
}

const print = (label: string, value: string) => console.log(`${label.padEnd(64)} ${value}`);

const app = await startApp();
const harness = await startHarness();
const browser = await chromium.launch({ ...(executablePath ? { executablePath } : {}), args });
try {
  // 1. The demo workspace, opened as a person opens it, then the Outlook (cold workers).
  const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
  await page.addInitScript(OBSERVE_LONG_TASKS);
  await page.goto(app.url);
  const opened = await openDemo(page);
  const outlookClick = await page.evaluate(() => performance.now());
  print('demo workspace opened (statements imported, ledger built)', ms(outlookClick - opened));
  await nav(page, 'Outlook').click();
  await waitForDraw(page, 0);
  const firstDraw = await page.evaluate(
    () => performance.getEntriesByName('ebbline:outlook-drawn')[0]?.startTime ?? Number.NaN,
  );
  print('Outlook opened to first drawn forecast (5,000 paths x 90 days)', ms(firstDraw - outlookClick));
  print('  from clicking "Open the demo workspace"', ms(firstDraw - opened));
  print('  longest main-thread task in the Outlook until then', ms(await longestTaskSince(page, outlookClick)));

  // 2. Re-forecasts after a threshold or horizon change (5,000 paths x 90 days).
  const thresholdSplits: Split[] = [];
  for (const value of ['25000', '26000', '24000', '27000', '25500', '26500', '24500']) {
    thresholdSplits.push(await commit(page, 'threshold-input', value));
  }
  printSplits('re-forecast after a threshold change', thresholdSplits);
  const horizonSplits: Split[] = [];
  for (const from of ['60', '120', '75', '150', '45']) {
    await commit(page, 'horizon-input', from);
    horizonSplits.push(await commit(page, 'horizon-input', '90'));
  }
  printSplits('re-forecast after a horizon change to 90 days', horizonSplits);

  // 3. Longest main-thread task while 10,000-path forecasts run.
  let since = await page.evaluate(() => performance.now());
  const before = await drawnCount(page);
  await page.selectOption('[data-testid="paths-select"]', '10000');
  await waitForDraw(page, before);
  print('10,000 paths x 90 days: commit to drawn', ms((await lastSplit(page)).total));
  print('  longest main-thread task', ms(await longestTaskSince(page, since)));
  since = await page.evaluate(() => performance.now());
  const t365 = await commit(page, 'horizon-input', '365');
  print('10,000 paths x 365 days: commit to drawn', ms(t365.total));
  print('  longest main-thread task', ms(await longestTaskSince(page, since)));

  // Patterns, for reference.
  const patternsClick = await page.evaluate(() => performance.now());
  await nav(page, 'Patterns').click();
  await page.waitForFunction(
    () =>
      (globalThis as unknown as PageGlobals).document.querySelectorAll('[data-testid="patterns-pacf"] canvas[height]')
        .length > 0,
    null,
    { timeout: 120_000 },
  );
  print('Patterns opened to drawn (cold worker)', ms((await page.evaluate(() => performance.now())) - patternsClick));
  print('  longest main-thread task', ms(await longestTaskSince(page, patternsClick)));
  await page.close();

  // A cold 10,000-path forecast: a fresh browser context (empty storage), demo, Outlook, 10,000 paths.
  const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const cold = await context.newPage();
  await cold.addInitScript(OBSERVE_LONG_TASKS);
  await cold.goto(app.url);
  await openDemo(cold);
  since = await cold.evaluate(() => performance.now());
  await nav(cold, 'Outlook').click();
  await cold.getByTestId('paths-select').waitFor();
  await cold.selectOption('[data-testid="paths-select"]', '10000'); // runs right after the first forecast
  await cold.waitForFunction(() => performance.getEntriesByName('ebbline:outlook-drawn').length >= 2, null, {
    timeout: 120_000,
  });
  print('longest main-thread task, Outlook + cold 10,000-path forecast', ms(await longestTaskSince(cold, since)));
  await context.close();

  // 4. Memory with 100,000 transactions (invented), mounted by the harness page.
  const big = syntheticHistory(100_000);
  const mem = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
  await mem.addInitScript(OBSERVE_LONG_TASKS);
  await mem.goto(harness.url);
  const cdp = await mem.context().newCDPSession(mem);
  const baseline = await heapUsed(cdp);
  since = await mountWith(mem, 'outlook', big);
  await waitForDraw(mem, 0, 300_000);
  print('100,000 transactions: first drawn forecast', ms(await mountToFirstDraw(mem)));
  print('  longest main-thread task', ms(await longestTaskSince(mem, since)));
  since = await mem.evaluate(() => performance.now());
  print('  re-forecast after a threshold change', ms((await commit(mem, 'threshold-input', '20000')).total));
  print('  longest main-thread task during it', ms(await longestTaskSince(mem, since)));
  const loaded = await heapUsed(cdp);
  print('  window JS heap, empty page / history and Outlook loaded', `${mb(baseline)} / ${mb(loaded)}`);
  const workers = await workerHeaps(cdp);
  print(
    '  engine workers JS heap',
    workers.length ? workers.map((b) => (b < 0 ? 'not reported' : mb(b))).join(', ') : 'no worker',
  );
  await mem.close();
} finally {
  await browser.close();
  await harness.close();
  await app.close();
}
