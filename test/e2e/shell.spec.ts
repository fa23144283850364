import { expect, test } from '@playwright/test';
import { readFileSync } from 'node:fs';

// The source page's policy; test/main/security.test.ts checks it equals main/security.ts.
const CONTENT_SECURITY_POLICY = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(
  readFileSync(new URL('../../renderer/index.html', import.meta.url), 'utf8'),
)?.[1];

test('the built app loads offline with its strict policy and the caution', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  const external: string[] = [];
  page.on('request', (r) => {
    const url = new URL(r.url());
    if (url.hostname !== '127.0.0.1') external.push(r.url());
  });
  await page.goto('/');
  await expect(page).toHaveTitle('Ebbline');
  // Source: Electron security checklist, item 7 — the built page carries the same CSP as the shell.
  const csp = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
  expect(csp).toBe(CONTENT_SECURITY_POLICY);
  await expect(page.getByRole('navigation', { name: 'Screens' })).toBeVisible();
  expect(errors).toEqual([]);
  expect(external).toEqual([]);
});
