// Journeys 5 and 6 on the demo workspace: the Outlook answers "how likely is a shortfall"
// and moves when the threshold does; Patterns shows the correlograms with their bands and
// plain-word statistics. The caution is in view on both.
import type { Locator, Page } from '@playwright/test';
import { expect, goToScreen, openDemo, screenshotScreen, test } from './support';

const CAUTION = /Estimates only, not financial, tax or legal advice/;

/**
 * The shortfall figure as a number of percent: "12.3%" is 12.3; "< 0.1%" (no path went
 * below) counts as 0.
 */
async function shortfallPercent(figure: Locator): Promise<number> {
  const text = ((await figure.locator('.value').textContent()) ?? '').trim();
  const m = /^(<\s*)?(\d+(?:\.\d+)?)\s*%$/.exec(text);
  if (!m) throw new Error(`the shortfall figure "${text}" is not a percentage`);
  return m[1] ? 0 : Number(m[2]);
}

/** The part of a canvas element the pixel check uses (the tests compile without DOM types). */
interface CanvasLike {
  width: number;
  height: number;
  getContext(
    kind: '2d',
  ): { getImageData(x: number, y: number, w: number, h: number): { data: ArrayLike<number> } } | null;
}

/** Whether the canvas inside `scope` has any painted pixel (the chart was drawn, not blank). */
async function canvasPainted(scope: Locator): Promise<boolean> {
  return scope.locator('canvas').evaluate((element) => {
    const canvas = element as unknown as CanvasLike;
    if (canvas.width === 0 || canvas.height === 0) return false;
    const data = canvas.getContext('2d')?.getImageData(0, 0, canvas.width, canvas.height).data;
    if (!data) return false;
    for (let i = 3; i < data.length; i += 4) if (data[i] !== 0) return true;
    return false;
  });
}

async function openOutlook(page: Page): Promise<Locator> {
  await openDemo(page);
  await goToScreen(page, 'Outlook');
  const chart = page.getByTestId('outlook-chart');
  await expect(chart).toHaveAttribute('data-drawn', /.+/);
  return chart;
}

test('the Outlook shows the fan chart, the caution and a shortfall chance that follows the threshold', async ({
  page,
}, testInfo) => {
  const chart = await openOutlook(page);
  await expect(page.getByTestId('outlook-caution')).toHaveText(CAUTION);
  await expect(page.getByTestId('outlook-caution')).toBeVisible();
  expect(await canvasPainted(chart)).toBe(true);
  await expect(chart.getByRole('img')).toHaveAttribute('aria-label', /\S/);

  const figure = page.getByTestId('shortfall-probability');
  await expect(figure).toBeVisible();
  const before = await shortfallPercent(figure);
  const drawnBefore = await chart.getAttribute('data-drawn');
  await expect(page.getByTestId('drivers')).toBeVisible();

  await screenshotScreen(page, testInfo, 'outlook', { ready: () => expect(chart).toHaveAttribute('data-drawn', /.+/) });

  // A cushion far above today's balance: nearly every path goes below it at some point.
  const threshold = page.getByTestId('threshold-input');
  await threshold.fill('100000');
  await threshold.press('Enter');
  await expect(page.getByText(/Going below 100,000(\.00)? EUR within/)).toBeVisible();
  await expect(chart).not.toHaveAttribute('data-drawn', drawnBefore ?? '');
  await expect(chart).toHaveAttribute('data-drawn', /.+/);
  await expect.poll(() => shortfallPercent(figure)).toBeGreaterThan(before);
  const high = await shortfallPercent(figure);
  expect(high).toBeGreaterThan(50);

  // The same numbers as a table, for those who do not read charts.
  await page.getByTestId('outlook-table-toggle').click();
  await expect(page.getByTestId('outlook-table')).toBeVisible();
  await expect(page.getByTestId('outlook-table').getByRole('row').nth(1)).toBeVisible();
  await screenshotScreen(page, testInfo, 'outlook-table', { themes: ['light'] });
  await page.getByTestId('outlook-table-toggle').click();
  await expect(chart).toBeVisible();
});

test('Patterns shows the ACF and PACF with their bands, sentences in plain words and the caution', async ({
  page,
}, testInfo) => {
  await openDemo(page);
  await goToScreen(page, 'Patterns');
  await expect(page.getByTestId('patterns-caution')).toHaveText(CAUTION);
  await expect(page.getByTestId('patterns-caution')).toBeVisible();

  const acf = page.getByTestId('patterns-acf');
  const pacf = page.getByTestId('patterns-pacf');
  await expect(acf).toBeVisible();
  await expect(pacf).toBeVisible();
  // The summary a screen reader hears names the band the bars are measured against.
  const band = /for lags 1 to \d+: .+ outside the white-noise band of ±0\.\d{3}\./;
  await expect(acf.getByRole('img')).toHaveAttribute('aria-label', new RegExp(`^Autocorrelation ${band.source}`));
  await expect(pacf.getByRole('img')).toHaveAttribute(
    'aria-label',
    new RegExp(`^Partial autocorrelation ${band.source}`),
  );
  await expect(acf).toContainText('band');
  await expect.poll(() => canvasPainted(acf)).toBe(true);
  await expect.poll(() => canvasPainted(pacf)).toBe(true);

  const sentences = page.getByTestId('patterns-sentences').getByRole('listitem');
  await expect(sentences.first()).toBeVisible();
  expect(await sentences.count()).toBeGreaterThan(0);
  for (const s of await sentences.all()) await expect(s).toHaveText(/\w{3,}/);

  await screenshotScreen(page, testInfo, 'patterns', { ready: () => expect(acf).toBeVisible() });

  // Money out has its own patterns.
  await page.getByRole('tab', { name: 'Money out' }).click();
  await expect(page.getByRole('tab', { name: 'Money out' })).toHaveAttribute('aria-selected', 'true');
  await expect(page.getByTestId('patterns-acf')).toBeVisible();
  await expect(page.getByTestId('patterns-sentences').getByRole('listitem').first()).toBeVisible();
});
