// Run the browser CSV bench page in Debian's Chromium and print its figures.
//   node bench/browser/run-csv.mjs     (after scripts/build-wasm.sh and npm ci in tests/browser)
import { serve, launch } from '../../tests/browser/harness.mjs';

const server = await serve();
const browser = await launch();
try {
  const page = await browser.context.newPage();
  page.on('pageerror', (e) => console.error('page error:', String(e)));
  await page.goto(`${server.url}/bench/browser/csv.html`);
  await page.waitForFunction(() => window.__bench, null, { timeout: 300000 });
  console.log(await page.evaluate(() => document.getElementById('out').textContent));
} finally {
  await browser.close();
  await server.close();
}
