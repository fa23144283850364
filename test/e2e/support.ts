/**
 * Shared pieces of the browser journeys: a `test` whose every page is held offline and
 * watched for uncaught errors, screen navigation, theme switching with screenshots, the
 * axe-core scan, and the demo statements the journeys import.
 */
import AxeBuilder from '@axe-core/playwright';
import { test as base, expect, type Locator, type Page, type TestInfo } from '@playwright/test';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The committed demo statements (resources/demo/statements). */
export const DEMO_DIR = fileURLToPath(new URL('../../resources/demo/statements/', import.meta.url));
/** Generated test files (test/e2e/fixtures/generate.ts). */
export const FIXTURES_DIR = fileURLToPath(new URL('./fixtures/', import.meta.url));

/**
 * A representative subset of the demo, every format present, chosen so that each of the
 * three accounts has at least two stated balances to reconcile against:
 * business (camt.053, two consecutive months, then the CSV export that continues them),
 * tax reserve (MT940, one year of monthly statements), household (OFX, two quarters).
 * `npx ebbline import <these> --check` reports 3 accounts, all reconciled, 174 entries.
 */
export const DEMO_SUBSET = {
  'camt.053': ['business-2026-06.xml', 'business-2026-07.xml'],
  csv: ['business-export-2026-08-10.csv'],
  mt940: ['reserve-2026.sta'],
  ofx: ['household-2026-Q1.ofx', 'household-2026-Q2.ofx'],
} as const;
export const DEMO_SUBSET_ACCOUNTS = 3;
export const DEMO_SUBSET_ENTRIES = 174;

/** Every committed demo statement's name, for checking the subset covers every format. */
export function demoFileNames(): string[] {
  return readdirSync(DEMO_DIR).sort();
}

interface Watch {
  /** Requests for anything not served by the app on 127.0.0.1 (they are also aborted). */
  external: string[];
  /** Uncaught exceptions in the page. */
  pageErrors: string[];
}

function leavesLoopback(url: string): boolean {
  const u = new URL(url);
  if (u.protocol === 'data:' || u.protocol === 'about:') return false;
  // blob:http://127.0.0.1:4173/<uuid> belongs to the page's own origin.
  const inner = u.protocol === 'blob:' ? new URL(u.pathname) : u;
  return inner.hostname !== '127.0.0.1';
}

/**
 * `test` with an automatic offline watch on every test's browser context: any request that
 * would leave 127.0.0.1 (page, worker or service worker) is aborted and listed, and the test
 * fails at its end when the list is not empty or the page threw an uncaught error.
 */
export const test = base.extend<{ watch: Watch }>({
  watch: [
    async ({ context }, use) => {
      const watch: Watch = { external: [], pageErrors: [] };
      await context.route(
        (url) => leavesLoopback(url.href),
        (route) => {
          watch.external.push(route.request().url());
          return route.abort('internetdisconnected');
        },
      );
      context.on('request', (r) => {
        if (leavesLoopback(r.url()) && !watch.external.includes(r.url())) watch.external.push(r.url());
      });
      context.on('page', (p) => p.on('pageerror', (e) => watch.pageErrors.push(e.message)));
      await use(watch);
      expect(watch.external, 'requests that left 127.0.0.1').toEqual([]);
      expect(watch.pageErrors, 'uncaught errors in the page').toEqual([]);
    },
    { auto: true },
  ],
});
export { expect };

/** The left-hand screen navigation. */
export function nav(page: Page): Locator {
  return page.getByRole('navigation', { name: 'Screens' });
}

/** Opens a screen from the navigation and waits until it is the current one. */
export async function goToScreen(page: Page, label: string): Promise<void> {
  const button = nav(page).getByRole('button', { name: label, exact: true });
  await button.click();
  await expect(button).toHaveAttribute('aria-current', 'page');
}

/** The app on first launch, storage ready (the welcome card or the workspace list shows). */
export async function openApp(page: Page): Promise<void> {
  await page.goto('/');
  await expect(nav(page)).toBeVisible();
}

/**
 * Creates a workspace from the Workspaces screen, sees the app open it on Accounts &
 * statements, and comes back to the list with it marked as the open one.
 */
export async function createWorkspace(page: Page, name: string): Promise<Locator> {
  await goToScreen(page, 'Workspaces');
  await page.getByLabel('Name', { exact: true }).fill(name);
  await page.getByRole('button', { name: 'Create workspace' }).click();
  await expect(page.getByTestId('current-workspace')).toContainText(name);
  await expect(nav(page).getByRole('button', { name: 'Accounts & statements', exact: true })).toHaveAttribute(
    'aria-current',
    'page',
  );
  await goToScreen(page, 'Workspaces');
  const row = workspaceRow(page, name);
  await expect(row).toHaveAttribute('data-current', 'true');
  return row;
}

/** The row of the workspace called `name` in the workspace list. */
export function workspaceRow(page: Page, name: string): Locator {
  return page.locator(`[data-testid="workspace-row"][data-name="${name.replace(/"/g, '\\"')}"]`);
}

export type ThemeMode = 'light' | 'dark';

/** Switches the theme with the navigation's toggle (a no-op when it is already `mode`). */
export async function setTheme(page: Page, mode: ThemeMode): Promise<void> {
  const html = page.locator('html');
  if ((await html.getAttribute('data-theme')) !== mode) await page.getByTestId('theme-toggle').click();
  await expect(html).toHaveAttribute('data-theme', mode);
}

/**
 * Runs axe-core on the page as it is and lists each serious or critical violation: rule,
 * impact, help and the offending elements. Every violation is attached to the report.
 */
export async function seriousAxeViolations(page: Page, name: string, testInfo: TestInfo): Promise<string[]> {
  const results = await new AxeBuilder({ page }).analyze();
  expect(results.passes.length, 'axe-core ran its checks').toBeGreaterThan(0);
  await testInfo.attach(`axe-${name}.json`, {
    body: JSON.stringify(results.violations, null, 2),
    contentType: 'application/json',
  });
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.id} (${v.impact}): ${v.help} — ` +
        v.nodes
          .map((n) => `${n.target.join(' ')}${n.failureSummary ? ` [${n.failureSummary.replace(/\s+/g, ' ')}]` : ''}`)
          .join('; '),
    );
}

export interface ThemeOptions {
  /** Themes to look at, light and dark unless told. */
  readonly themes?: readonly ThemeMode[];
  /** Waits, after each theme switch, for whatever must show before looking. */
  readonly ready?: () => Promise<void>;
}

/**
 * Runs `look` once in each theme, the current theme first (no switch is needed while a
 * modal dialog holds the focus), and restores the theme it found.
 */
async function inEachTheme(
  page: Page,
  { themes = ['light', 'dark'], ready = async () => {} }: ThemeOptions,
  look: (theme: ThemeMode, ready: () => Promise<void>) => Promise<void>,
): Promise<void> {
  const startTheme = (await page.locator('html').getAttribute('data-theme')) as ThemeMode;
  const order = [...themes].sort((a, b) => Number(b === startTheme) - Number(a === startTheme));
  for (const theme of order) {
    await setTheme(page, theme);
    await ready();
    await look(theme, ready);
  }
  await setTheme(page, startTheme);
}

/**
 * Saves a screenshot of the whole current screen in each theme as
 * test-results/e2e/screens/<screen>-<theme>.png and attaches it to the report.
 */
export async function screenshotScreen(
  page: Page,
  testInfo: TestInfo,
  screen: string,
  options: ThemeOptions = {},
): Promise<void> {
  await inEachTheme(page, options, async (theme, ready) => {
    // The screen scrolls inside <main>, not the page: show it whole by growing the window
    // to its content (within reason), from the top.
    const viewport = page.viewportSize();
    const contentHeight = await page.locator('main').evaluate((el) => {
      el.scrollTop = 0;
      return el.scrollHeight + el.getBoundingClientRect().top;
    });
    if (viewport && contentHeight > viewport.height) {
      await page.setViewportSize({ width: viewport.width, height: Math.min(Math.ceil(contentHeight), 4000) });
      await ready();
    }
    const path = join(testInfo.project.outputDir, 'screens', `${screen}-${theme}.png`);
    await page.screenshot({ path, fullPage: true, animations: 'disabled' });
    await testInfo.attach(`${screen}-${theme}`, { path, contentType: 'image/png' });
    if (viewport) await page.setViewportSize(viewport);
  });
}

/**
 * Scans the current screen with axe-core in each theme; any serious or critical violation
 * fails the test, listed by rule and element. The assertion is soft so that one test can
 * walk several screens and report all of them.
 */
export async function expectAccessible(
  page: Page,
  testInfo: TestInfo,
  screen: string,
  options: ThemeOptions = {},
): Promise<void> {
  await inEachTheme(page, options, async (theme) => {
    const violations = await seriousAxeViolations(page, `${screen}-${theme}`, testInfo);
    expect.soft(violations, `serious or critical axe-core violations on ${screen} (${theme} theme)`).toEqual([]);
  });
}

/** The demo workspace's name (renderer/src/lib/demo/demoFiles.ts). */
export const DEMO_WORKSPACE = 'Tessellate Ceramics (demo)';

/**
 * First launch: opens the invented demo workspace from the welcome card, as a new user
 * would, and waits until its statements are stored and its accounts listed.
 */
export async function openDemo(page: Page): Promise<void> {
  await openApp(page);
  await page.getByRole('button', { name: 'Open the demo workspace' }).click();
  const opened = nav(page).locator('[data-testid="nav-accounts"][aria-current="page"]');
  const failed = page.getByText(/The demo could not be opened/);
  await expect(opened.or(failed)).toBeVisible();
  await expect(failed, 'the demo workspace opened without an error').toHaveCount(0);
  await expect(page.getByTestId('current-workspace')).toContainText(DEMO_WORKSPACE);
  await expect(page.getByTestId('account-row')).toHaveCount(3);
  await expect(page.getByTestId('import-progress')).toBeHidden();
}

/**
 * The demo workspace with its ready-made scenarios (engine/scenario/demoScenarios.ts):
 * opened as on first launch, then "Add the example scenarios" on the Scenarios screen.
 */
export async function openDemoWithExamples(page: Page): Promise<void> {
  await openDemo(page);
  await goToScreen(page, 'Scenarios');
  await page.getByTestId('scenario-add-examples').click();
  await expect(page.getByTestId('scenarios-notice')).toContainText('Added 4 example scenarios');
  await expect(page.getByTestId('scenario-entry')).toHaveCount(4);
}
