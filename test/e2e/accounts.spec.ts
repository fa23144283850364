// Journeys 2 and 3: importing statements through the file chooser. Every format of the
// demo goes in at once and every account reconciles; a broken file is refused problem by
// problem, located by file and line, and nothing of it is stored.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from '@playwright/test';
import {
  DEMO_DIR,
  DEMO_SUBSET,
  DEMO_SUBSET_ACCOUNTS,
  DEMO_SUBSET_ENTRIES,
  FIXTURES_DIR,
  createWorkspace,
  demoFileNames,
  expect,
  goToScreen,
  openApp,
  screenshotScreen,
  test,
} from './support';
import { BAD_AMOUNT, IMPOSSIBLE_DATE } from './fixtures/generate';

const FORMAT_LABELS: Record<keyof typeof DEMO_SUBSET, RegExp> = {
  'camt.053': /camt\.053/,
  csv: /CSV/,
  mt940: /MT940/,
  ofx: /OFX/,
};

/** The few browser globals the progress recorder uses (the tests compile without DOM types). */
interface RecorderGlobals {
  progressSeen: number[];
  document: {
    body: unknown;
    querySelectorAll(selector: string): Iterable<{ getAttribute(name: string): string | null }>;
  };
  MutationObserver: new (callback: () => void) => { observe(target: unknown, options: Record<string, boolean>): void };
}

/** Keeps every progressbar value the page shows from now on, however briefly it shows. */
async function recordProgress(page: Page): Promise<void> {
  await page.evaluate(() => {
    const g = globalThis as unknown as RecorderGlobals;
    const seen: number[] = [];
    g.progressSeen = seen;
    const note = () => {
      for (const bar of g.document.querySelectorAll('[role="progressbar"]')) {
        seen.push(Number(bar.getAttribute('aria-valuenow')));
      }
    };
    new g.MutationObserver(note).observe(g.document.body, { subtree: true, childList: true, attributes: true });
  });
}

async function progressSeen(page: Page): Promise<number[]> {
  return page.evaluate(() => (globalThis as unknown as RecorderGlobals).progressSeen);
}

function fileInput(page: Page) {
  return page.getByTestId('statement-file-input');
}

test('every demo format imports through the file chooser and every account reconciles', async ({ page }, testInfo) => {
  // The subset names real demo files and covers every format the demo has.
  const names = Object.values(DEMO_SUBSET).flat();
  for (const name of names) expect(demoFileNames()).toContain(name);
  const extensions = new Set(demoFileNames().map((n) => n.slice(n.lastIndexOf('.'))));
  expect(new Set(names.map((n) => n.slice(n.lastIndexOf('.'))))).toEqual(extensions);

  await openApp(page);
  await createWorkspace(page, 'Studio statements');
  await goToScreen(page, 'Accounts & statements');
  await expect(page.getByTestId('accounts-empty')).toBeVisible();

  await recordProgress(page);
  await fileInput(page).setInputFiles(names.map((n) => join(DEMO_DIR, n)));

  // The preview: one entry per file, each read cleanly in its own format, nothing stored yet.
  const preview = page.getByTestId('import-preview');
  await expect(preview).toBeVisible();
  await expect(preview).toContainText('Nothing is stored yet');
  const files = preview.getByTestId('preview-file');
  await expect(files).toHaveCount(names.length);
  for (const [format, formatNames] of Object.entries(DEMO_SUBSET) as [keyof typeof DEMO_SUBSET, readonly string[]][]) {
    for (const name of formatNames) {
      const file = preview.locator(`[data-testid="preview-file"][data-file="${name}"]`);
      await expect(file).toHaveAttribute('data-status', 'ok');
      await expect(file).toContainText(FORMAT_LABELS[format]);
    }
  }
  // The CSV file shows how its columns are read before anything is stored.
  const mapping = preview.getByTestId('csv-mapping');
  await expect(mapping).toHaveCount(1);
  await expect(mapping.getByTestId('csv-mapping-table')).toContainText('Amount (EUR)');
  await expect(page.getByTestId('account-row')).toHaveCount(0);

  await screenshotScreen(page, testInfo, 'import-preview', { themes: ['light'] });

  await preview.getByRole('button', { name: `Store ${names.length} files` }).click();

  // Progress showed and finished: the preview and the bar are gone, the outcome is told.
  await expect(preview).toBeHidden();
  await expect(page.getByTestId('import-progress')).toBeHidden();
  await expect(page.getByTestId('import-message')).toBeVisible();
  expect((await progressSeen(page)).length, 'a progress bar was shown while reading and storing').toBeGreaterThan(0);

  // Every account reconciles; the entries add up to what the CLI counts for the same files.
  const accounts = page.getByTestId('account-row');
  await expect(accounts).toHaveCount(DEMO_SUBSET_ACCOUNTS);
  for (const row of await accounts.all()) {
    await expect(row).toHaveAttribute('data-reconciled', 'true');
    await expect(row.getByTestId('reconciliation-status')).toContainText('Reconciled');
  }
  const entryCells = await accounts
    .locator('td.num')
    .evaluateAll((cells) =>
      cells.filter((_, i) => i % 2 === 0).map((c) => Number((c.textContent ?? '').replace(/[^\d]/g, ''))),
    );
  expect(entryCells.reduce((a, b) => a + b, 0)).toBe(DEMO_SUBSET_ENTRIES);
  await expect(page.getByTestId('statement-row')).toHaveCount(names.length);

  await screenshotScreen(page, testInfo, 'accounts');
});

test('a broken statement lists each problem by file and line and stores nothing', async ({ page }, testInfo) => {
  const brokenName = 'broken-camt053.xml';
  const brokenLines = readFileSync(join(FIXTURES_DIR, brokenName), 'utf8').split('\n');
  const lineOf = (text: string) => brokenLines.findIndex((l) => l.includes(text)) + 1;
  const dateLine = lineOf(IMPOSSIBLE_DATE);
  const amountLine = lineOf(BAD_AMOUNT);
  expect(dateLine).toBeGreaterThan(0);
  expect(amountLine).toBeGreaterThan(dateLine);

  await openApp(page);
  await createWorkspace(page, 'Reserve only');
  await goToScreen(page, 'Accounts & statements');

  // One good file first, so "nothing stored" is measured against an account that exists.
  await fileInput(page).setInputFiles(join(DEMO_DIR, 'reserve-2026.sta'));
  await page.getByRole('button', { name: 'Store 1 file' }).click();
  const accounts = page.getByTestId('account-row');
  await expect(accounts).toHaveCount(1);
  await expect(page.getByTestId('statement-row')).toHaveCount(1);

  await fileInput(page).setInputFiles(join(FIXTURES_DIR, brokenName));
  const preview = page.getByTestId('import-preview');
  await expect(preview.locator(`[data-testid="preview-file"][data-file="${brokenName}"]`)).toHaveAttribute(
    'data-status',
    'error',
  );
  const problems = page.getByTestId('import-problem');
  await expect(problems).toHaveCount(2);
  await expect(problems.nth(0)).toHaveText(new RegExp(`^${brokenName}:${dateLine}: .*${IMPOSSIBLE_DATE}`));
  await expect(problems.nth(1)).toHaveText(new RegExp(`^${brokenName}:${amountLine}: .*${BAD_AMOUNT}.*not a decimal`));
  await expect(preview.getByTestId('import-confirm')).toBeDisabled();

  await screenshotScreen(page, testInfo, 'import-problems', { themes: ['light'] });

  // Leaving the preview as it is and reloading: the broken file's account never appears.
  await page.reload();
  await goToScreen(page, 'Accounts & statements');
  await expect(page.getByTestId('statement-row')).toHaveCount(1);
  await expect(accounts).toHaveCount(1);
  await expect(page.getByTestId('statement-row')).toHaveAttribute('data-file', 'reserve-2026.sta');
});
