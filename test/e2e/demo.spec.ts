// Journeys 4 and 7 on the invented demo workspace, opened from the welcome card as a new
// user would: confirming a suggested recurring flow, and finding the workspace, its
// accounts and its transactions unchanged after a reload.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import type { Locator, Page } from '@playwright/test';
import {
  DEMO_DIR,
  DEMO_WORKSPACE,
  demoFileNames,
  expect,
  goToScreen,
  nav,
  openDemo,
  screenshotScreen,
  test,
  workspaceRow,
} from './support';

/** Booked entries the CLI keeps from all demo statements (duplicates of the CSV export removed). */
function demoEntriesByCli(): number {
  const cli = spawnSync(
    process.execPath,
    ['bin/ebbline.mjs', 'import', ...demoFileNames().map((n) => join(DEMO_DIR, n)), '--check', '--format', 'json'],
    { encoding: 'utf8' },
  );
  expect(cli.status, cli.stderr).toBe(0);
  const report = JSON.parse(cli.stdout) as { accounts: { entries: number }[] };
  return report.accounts.reduce((sum, a) => sum + a.entries, 0);
}

/** The number in "1,187 transactions" (or "12 of 1,187 transactions": the first). */
async function shownTransactions(count: Locator): Promise<number> {
  const text = (await count.textContent()) ?? '';
  const first = /[\d.,\s]+/.exec(text)?.[0] ?? '';
  return Number(first.replace(/[^\d]/g, ''));
}

function recurringRow(page: Page, key: string): Locator {
  return page.locator(`[data-testid="recurring-row"][data-key=${JSON.stringify(key)}]`);
}

test('a confirmed recurring flow stays confirmed after a reload', async ({ page }, testInfo) => {
  await openDemo(page);
  await goToScreen(page, 'Recurring flows');

  const suggested = page.getByTestId('recurring-suggested').getByTestId('recurring-row');
  await expect(suggested.first()).toBeVisible();
  await expect(page.getByTestId('recurring-confirmed')).toContainText('Nothing confirmed yet');
  await screenshotScreen(page, testInfo, 'recurring');

  const first = suggested.first();
  const key = (await first.getAttribute('data-key')) ?? '';
  const label = (await first.getAttribute('data-label')) ?? '';
  expect(key).not.toBe('');
  await expect(first).toHaveAttribute('data-state', 'suggested');
  const suggestedBefore = await suggested.count();

  await page.getByRole('button', { name: `Confirm ${label}`, exact: true }).click();
  const confirmed = page.getByTestId('recurring-confirmed').locator(`[data-key=${JSON.stringify(key)}]`);
  await expect(confirmed).toHaveAttribute('data-state', 'confirmed');
  await expect(suggested).toHaveCount(suggestedBefore - 1);
  await expect(page.getByTestId('recurring-last-decision')).toContainText(`${label} confirmed`);

  await page.reload();
  await expect(nav(page).getByRole('button', { name: 'Recurring flows', exact: true })).toHaveAttribute(
    'aria-current',
    'page',
  );
  await expect(recurringRow(page, key)).toHaveAttribute('data-state', 'confirmed');
  await expect(page.getByTestId('recurring-confirmed').locator(`[data-key=${JSON.stringify(key)}]`)).toBeVisible();
  await expect(page.getByRole('button', { name: `Confirm ${label}`, exact: true })).toHaveCount(0);
});

test('after a reload the workspace, its accounts and its transactions are all still there', async ({
  page,
}, testInfo) => {
  const expectedEntries = demoEntriesByCli();
  await openDemo(page);

  const accounts = page.getByTestId('account-row');
  const statements = page.getByTestId('statement-row');
  await expect(statements).toHaveCount(demoFileNames().length);
  for (const row of await accounts.all()) await expect(row).toHaveAttribute('data-reconciled', 'true');

  await goToScreen(page, 'Transactions');
  const count = page.getByTestId('transaction-count');
  await expect(page.getByTestId('transaction-row').first()).toBeVisible();
  await expect.poll(() => shownTransactions(count)).toBe(expectedEntries);
  await screenshotScreen(page, testInfo, 'transactions');

  // A search narrows the list and the count; clearing it brings every transaction back.
  await page.getByTestId('transaction-search').fill('Kilnyard');
  await expect(count).toContainText(`of ${expectedEntries.toLocaleString('en-US')}`);
  const narrowed = await shownTransactions(count);
  expect(narrowed).toBeGreaterThan(0);
  expect(narrowed).toBeLessThan(expectedEntries);
  for (const row of await page.getByTestId('transaction-row').all()) await expect(row).toContainText('Kilnyard');
  await page.getByRole('button', { name: 'Clear filters' }).click();
  await expect.poll(() => shownTransactions(count)).toBe(expectedEntries);

  await page.reload();
  // The screen shown before the reload comes back, in the same workspace, with every entry.
  await expect(nav(page).getByRole('button', { name: 'Transactions', exact: true })).toHaveAttribute(
    'aria-current',
    'page',
  );
  await expect(page.getByTestId('current-workspace')).toContainText(DEMO_WORKSPACE);
  await expect(page.getByTestId('transaction-row').first()).toBeVisible();
  await expect.poll(() => shownTransactions(count)).toBe(expectedEntries);

  await goToScreen(page, 'Accounts & statements');
  await expect(accounts).toHaveCount(3);
  await expect(statements).toHaveCount(demoFileNames().length);
  for (const row of await accounts.all()) await expect(row).toHaveAttribute('data-reconciled', 'true');

  await goToScreen(page, 'Workspaces');
  await expect(page.getByTestId('workspace-row')).toHaveCount(1);
  await expect(workspaceRow(page, DEMO_WORKSPACE)).toHaveAttribute('data-current', 'true');
});

test('the start address with ?demo opens the demo workspace on the Outlook (README quick start)', async ({ page }) => {
  await page.goto('/?demo');
  await expect(page.getByTestId('shortfall-probability')).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('outlook-caution')).toBeVisible();
  await expect(page).toHaveURL(/#\/outlook$/);
  await expect(page.getByText(DEMO_WORKSPACE).first()).toBeVisible();
});
