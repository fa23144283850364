// The offline watch that every journey runs under (support.ts) must itself see a request
// that tries to leave 127.0.0.1; otherwise "no request left" would prove nothing. The app's
// own policy blocks such requests before they are made, so the check runs on a blank page.
import { expect, test } from './support';

test('the offline watch catches and stops a request to another host', async ({ page, watch }) => {
  const outside = 'http://192.0.2.7/ebbline-offline-check'; // TEST-NET-1 (RFC 5737): never routed
  await page.goto('about:blank');
  const failed = await page.evaluate(async (url) => {
    try {
      await fetch(url, { mode: 'no-cors' });
      return false;
    } catch {
      return true;
    }
  }, outside);
  expect(failed, 'the request was aborted').toBe(true);
  expect(watch.external).toContain(outside);
  watch.external.length = 0; // seen and stopped: the watch's own end-of-test check passes
});
