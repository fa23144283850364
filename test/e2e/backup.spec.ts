// A bookkeeper backs up the demo workspace, with its example scenarios, from the Workspaces
// screen and restores the file as a new workspace: the copy must show what the original
// shows — the same accounts, entries, statement files, transactions and scenarios, and the
// same Outlook figures for the same seed. Files that are damaged, edited or made by a newer
// version are refused with the reason, and nothing changes. Every expected value is read
// off the original workspace; none is written into the test.
import { readFileSync } from 'node:fs';
import type { Page } from '@playwright/test';
import {
  DEMO_WORKSPACE,
  expect,
  goToScreen,
  openDemoWithExamples,
  screenshotScreen,
  test,
  workspaceRow,
} from './support';

/** What a workspace shows on its screens, to compare a restored copy with the original. */
interface Shown {
  /** Each account's row on Accounts & statements, cell by cell. */
  readonly accounts: readonly string[][];
  readonly statementFiles: readonly string[];
  readonly transactions: string;
  readonly scenarios: readonly string[];
  readonly outlook: {
    readonly scope: string;
    /** "How this outlook was made": paths, seed, models, recurring flows. */
    readonly model: string;
    readonly seed: string;
    /** The figures at a threshold of 0 and at a cushion some paths go below. */
    readonly byThreshold: readonly OutlookFigures[];
  };
}

/** The Outlook's answer at one threshold. */
interface OutlookFigures {
  readonly threshold: string;
  readonly shortfall: string;
  readonly firstCrossing: string | null;
  /** The week-by-week table: every row's date, quantiles and chances. */
  readonly table: readonly string[];
}

const clean = (t: string) => t.replace(/\s+/g, ' ').trim();

/** Sets the Outlook's threshold (whole currency units) and reads its figures once drawn for it. */
async function outlookAt(page: Page, major: number): Promise<OutlookFigures> {
  const input = page.getByTestId('threshold-input');
  await input.fill(String(major));
  await input.press('Enter');
  // The chart's stamp ends with the threshold, in minor units, of the result it drew.
  const chart = page.getByTestId('outlook-chart');
  await expect(chart).toHaveAttribute('data-drawn', new RegExp(`:${major * 100}$`));
  await expect(page.getByTestId('outlook-progress')).toHaveCount(0);
  await expect(page.locator('.outlook .layout')).not.toHaveClass(/stale/);
  const summary = page.getByTestId('shortfall-probability').locator('..');
  const crossing = page.getByTestId('first-crossing');
  const figures = {
    threshold: clean(await summary.locator('.sub').innerText()),
    shortfall: clean(await page.getByTestId('shortfall-probability').innerText()),
    firstCrossing: (await crossing.count()) > 0 ? clean(await crossing.innerText()) : null,
    table: [] as string[],
  };
  await page.getByTestId('outlook-table-toggle').click();
  const table = page.getByTestId('outlook-table');
  await expect(table.locator('tbody tr').first()).toBeVisible();
  for (const row of await table.locator('tbody tr').all()) figures.table.push(clean(await row.innerText()));
  await page.getByTestId('outlook-table-toggle').click();
  await expect(chart).toBeVisible();
  return figures;
}

/** The backup file as the test reads it. */
interface BackupFile {
  readonly schema: string;
  readonly schemaVersion: number;
  readonly createdOn: string;
  readonly workspace: string;
  readonly checksum: { readonly algorithm: string; readonly value: string };
  readonly tables: Readonly<Record<string, readonly Record<string, unknown>[]>>;
}

/** Reads the open workspace's accounts, statements, transactions, scenarios and Outlook. */
async function readWorkspace(page: Page): Promise<Shown> {
  await goToScreen(page, 'Accounts & statements');
  const accountRows = page.getByTestId('account-row');
  await expect(accountRows.first()).toBeVisible();
  await expect(page.getByTestId('import-progress')).toBeHidden();
  const accounts: string[][] = [];
  for (const row of await accountRows.all()) accounts.push((await row.locator('td').allInnerTexts()).map(clean));
  const statementFiles = (
    await page
      .getByTestId('statement-row')
      .evaluateAll((rows) => rows.map((r) => (r as unknown as { dataset: { file: string } }).dataset.file))
  ).sort();

  await goToScreen(page, 'Transactions');
  await expect(page.getByTestId('transaction-row').first()).toBeVisible();
  const transactions = clean(await page.getByTestId('transaction-count').innerText());

  await goToScreen(page, 'Scenarios');
  const scenarios = (await page
    .getByTestId('scenario-entry')
    .evaluateAll((entries) =>
      entries.map((e) => (e as unknown as { dataset: { name: string } }).dataset.name),
    )) as string[];

  await goToScreen(page, 'Outlook');
  await expect(page.getByTestId('outlook-chart')).toHaveAttribute('data-drawn', /.+/);
  const scope = clean(await page.locator('.outlook header .scope').innerText());
  const atZero = await outlookAt(page, 0);
  // A cushion a fair share of the paths go below: the lowest weekly P10 at a threshold of 0.
  const lows = atZero.table.map((row) =>
    Number(/^\w{3} \d{1,2} \w{3} \d{4} (-?[\d,]+(?:\.\d+)?) /.exec(row)?.[1]?.replace(/,/g, '')),
  );
  expect(lows.every(Number.isFinite), `a P10 in every row of ${JSON.stringify(atZero.table)}`).toBe(true);
  const byThreshold = [atZero, await outlookAt(page, Math.round(Math.min(...lows)))];
  const model = clean(await page.getByTestId('outlook-model').locator('p').first().innerText());
  const seed = /\(seed (\d+)\)/.exec(model)?.[1];
  expect(seed, `the seed is named in "${model}"`).toBeTruthy();
  const outlook = { scope, model, seed: String(seed), byThreshold };

  return { accounts, statementFiles, transactions, scenarios, outlook };
}

/** The names in the workspace list, in its order. */
async function workspaceNames(page: Page): Promise<string[]> {
  await goToScreen(page, 'Workspaces');
  return page
    .getByTestId('workspace-row')
    .evaluateAll((rows) => rows.map((r) => (r as unknown as { dataset: { name: string } }).dataset.name));
}

/** The page's IndexedDB database names (a refused restore must not leave one behind). */
async function databaseNames(page: Page): Promise<string[]> {
  return page.evaluate(async () => {
    const idb = (globalThis as unknown as { indexedDB: { databases(): Promise<{ name?: string }[]> } }).indexedDB;
    return (await idb.databases()).map((d) => d.name ?? '').sort();
  });
}

/** Chooses `file` with "Restore from backup…", through the browser's file chooser. */
async function chooseBackup(page: Page, file: { name: string; buffer: Buffer }): Promise<void> {
  const choosing = page.waitForEvent('filechooser');
  await page.getByTestId('backup-restore').click();
  const chooser = await choosing;
  await chooser.setFiles({ name: file.name, mimeType: 'application/json', buffer: file.buffer });
}

test('a backup restored as a new workspace shows the same accounts, transactions, scenarios and outlook; damaged and newer files are refused', async ({
  page,
}, testInfo) => {
  // The workspace is read three times, with two forecasts each, after the demo import.
  test.setTimeout(120_000);
  await openDemoWithExamples(page);

  const original = await readWorkspace(page);
  expect(original.accounts.length).toBeGreaterThan(0);
  expect(original.scenarios.length).toBeGreaterThan(0);
  for (const at of original.outlook.byThreshold) expect(at.table.length).toBeGreaterThan(1);
  // Not a vacuous match: some paths go below the second cushion, on dates the screen names.
  expect(original.outlook.byThreshold[1]?.firstCrossing).toBeTruthy();
  await testInfo.attach('original.json', { body: JSON.stringify(original, null, 2), contentType: 'application/json' });

  // Export from the Workspaces screen.
  const namesBefore = await workspaceNames(page);
  expect(namesBefore).toContain(DEMO_WORKSPACE);
  const panel = page.getByTestId('backup-panel');
  await expect(panel).toBeVisible();
  const downloading = page.waitForEvent('download');
  await page.getByTestId('backup-export').click();
  const download = await downloading;
  const fileName = download.suggestedFilename();
  expect(fileName).toMatch(/-backup-\d{4}-\d{2}-\d{2}\.json$/);
  const backupPath = testInfo.outputPath(fileName);
  await download.saveAs(backupPath);
  await expect(page.getByTestId('backup-message')).toContainText(fileName);
  await screenshotScreen(page, testInfo, 'backup', { ready: () => expect(panel).toBeVisible() });

  // The file is the versioned backup format and holds what the screens show.
  const bytes = readFileSync(backupPath);
  const file = JSON.parse(bytes.toString('utf8')) as BackupFile;
  expect(file.schema).toBe('ebbline.backup/1');
  expect(Number.isSafeInteger(file.schemaVersion) && file.schemaVersion >= 1).toBe(true);
  expect(file.createdOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  expect(file.workspace).toBe(DEMO_WORKSPACE);
  expect(file.checksum.algorithm).toBe('SHA-256');
  expect(file.checksum.value).toMatch(/^[0-9a-f]{64}$/);
  expect(file.tables.accounts).toHaveLength(original.accounts.length);
  expect(file.tables.statements).toHaveLength(original.statementFiles.length);
  expect(file.tables.scenarios?.map((s) => s.name).sort()).toEqual([...original.scenarios].sort());
  const transactionTotal = Number(/[\d,]+/.exec(original.transactions)?.[0].replace(/,/g, ''));
  expect(file.tables.transactions).toHaveLength(transactionTotal);

  // Damaged, edited and newer files are refused with the reason; nothing is created.
  const databasesBefore = await databaseNames(page);
  const text = bytes.toString('utf8');
  const cut = text.lastIndexOf('}');
  const firstAmount = /"amount":(-?\d)/.exec(text);
  expect(firstAmount, 'an amount in the file to edit').not.toBeNull();
  const at = (firstAmount?.index ?? 0) + (firstAmount?.[0].length ?? 0) - 1;
  const digit = text[at] === '9' ? '8' : String(Number(text[at]) + 1);
  const refusals = [
    {
      name: 'cut-short.json',
      content: text.slice(0, cut) + text.slice(cut + 1),
      reason: /is damaged/,
      where: /not valid JSON/,
    },
    {
      name: 'edited.json',
      content: text.slice(0, at) + digit + text.slice(at + 1),
      reason: /is damaged or was changed after it was made/,
      where: /\$\.checksum\.value does not match the content/,
    },
    {
      name: 'from-a-newer-version.json',
      content: text.replace(/"schemaVersion": \d+/, `"schemaVersion": ${file.schemaVersion + 1}`),
      reason: /was made by a newer version of Ebbline/,
      where: new RegExp(`\\$\\.schemaVersion is ${file.schemaVersion + 1}`),
    },
  ];
  for (const refused of refusals) {
    expect(refused.content, `${refused.name} differs from the backup`).not.toBe(text);
    await chooseBackup(page, { name: refused.name, buffer: Buffer.from(refused.content, 'utf8') });
    const error = page.getByTestId('backup-error');
    await expect(error).toContainText(refused.name);
    await expect(error).toContainText(refused.reason);
    await expect(error).toContainText('nothing was changed');
    // The list of problems may still be open from the previous file.
    const details = error.locator('details');
    if ((await details.getAttribute('open')) === null) await details.locator('summary').click();
    await expect(details).toHaveAttribute('open', '');
    await expect(error.getByRole('listitem').filter({ hasText: refused.where })).toHaveCount(1);
    await expect(page.getByTestId('backup-confirm-dialog')).toBeHidden();
    if (refused.name === 'edited.json') {
      await screenshotScreen(page, testInfo, 'backup-refused', { themes: ['light'] });
    }
  }
  expect(await workspaceNames(page)).toEqual(namesBefore);
  expect(await databaseNames(page)).toEqual(databasesBefore);
  await expect(page.getByTestId('current-workspace')).toContainText(DEMO_WORKSPACE);
  expect(await readWorkspace(page), 'the open workspace after the refusals').toEqual(original);

  // The backup itself: the dialog says what will be created, then a new workspace opens.
  await goToScreen(page, 'Workspaces');
  await chooseBackup(page, { name: fileName, buffer: bytes });
  const dialog = page.getByTestId('backup-confirm-dialog');
  await expect(dialog).toBeVisible();
  const restoredName = `${DEMO_WORKSPACE} (restored ${file.createdOn})`;
  await expect(dialog).toContainText(restoredName);
  const contents = dialog.getByTestId('backup-contents');
  const plural = (n: number, word: string) => `${n.toLocaleString('en')} ${word}`;
  await expect(contents).toContainText(plural(original.accounts.length, 'account'));
  await expect(contents).toContainText(plural(original.statementFiles.length, 'imported statement file'));
  await expect(contents).toContainText(plural(transactionTotal, 'transaction'));
  await expect(contents).toContainText(plural(original.scenarios.length, 'scenario'));
  await screenshotScreen(page, testInfo, 'backup-confirm', { themes: ['light'] });
  await dialog.getByTestId('confirm-accept').click();
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId('backup-message')).toContainText(`as the new workspace “${restoredName}”, now open`);
  await expect(page.getByTestId('current-workspace')).toContainText(restoredName);
  expect(await workspaceNames(page)).toEqual(expect.arrayContaining([...namesBefore, restoredName]));
  expect(await workspaceNames(page)).toHaveLength(namesBefore.length + 1);
  await expect(workspaceRow(page, restoredName)).toHaveAttribute('data-current', 'true');

  const restored = await readWorkspace(page);
  await testInfo.attach('restored.json', { body: JSON.stringify(restored, null, 2), contentType: 'application/json' });
  expect(restored.accounts.map((a) => a[0])).toEqual(original.accounts.map((a) => a[0]));
  expect(restored.statementFiles).toEqual(original.statementFiles);
  expect(restored.transactions).toBe(original.transactions);
  expect(restored.scenarios).toEqual(original.scenarios);
  expect(restored.outlook.seed).toBe(original.outlook.seed);
  expect(restored).toEqual(original);
});
