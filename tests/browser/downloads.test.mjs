// The `downloads` attribute: SVG, PNG and CSV of what is drawn, from
// keyboard-reachable buttons, under a strict CSP (no inline script or style).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import Papa from 'papaparse';
import { serve, launch, settled } from './harness.mjs';

let server, browser, page, problems;

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  problems = [];
  page.on('pageerror', (e) => problems.push(String(e)));
  page.on('console', (m) => m.type() === 'error' && problems.push(m.text()));
  await page.addInitScript(() => {
    window.__csp = [];
    document.addEventListener('securitypolicyviolation', (e) => window.__csp.push(`${e.violatedDirective} ${e.blockedURI}`));
  });
  await page.goto(`${server.url}/tests/browser/pages/downloads.html`);
  await settled(page);
});

after(async () => {
  await browser?.close();
  await server?.close();
});

/** Press a download button from the keyboard and read the file the browser saved. */
async function download(selector) {
  await page.focus(selector);
  assert.ok(await page.evaluate((s) => document.activeElement === document.querySelector(s), selector), `${selector} takes focus`);
  const [file] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
  return { name: file.suggestedFilename(), bytes: fs.readFileSync(await file.path()) };
}

test('only charts with the attribute get the buttons, which are buttons in tab order', async () => {
  const bars = await page.evaluate(() =>
    Object.fromEntries([...document.querySelectorAll('strata-chart')].map((el) => [el.id, [...el.querySelectorAll(':scope > .strata-downloads > button')].map((b) => [b.textContent, b.type, b.tabIndex])]))
  );
  assert.deepEqual(bars.harvest, [['Download SVG', 'button', 0], ['Download PNG', 'button', 0], ['Download CSV', 'button', 0]]);
  assert.deepEqual(bars.trees.map((b) => b[0]), ['Download SVG', 'Download PNG', 'Download CSV (layer 1)', 'Download CSV (layer 2)']);
  assert.deepEqual(bars.plain, []);
  // Tab from the page's start reaches the first button.
  await page.evaluate(() => document.activeElement?.blur());
  const reached = [];
  for (let i = 0; i < 12; i++) {
    await page.keyboard.press('Tab');
    reached.push(await page.evaluate(() => document.activeElement?.textContent || document.activeElement?.tagName));
  }
  assert.ok(reached.includes('Download SVG') && reached.includes('Download CSV'), reached.join(' | '));
  // The attribute removed: the buttons go.
  await page.evaluate(() => document.getElementById('trees').removeAttribute('downloads'));
  assert.equal(await page.evaluate(() => document.querySelectorAll('#trees .strata-downloads').length), 0);
  await page.evaluate(() => document.getElementById('trees').setAttribute('downloads', ''));
  assert.equal(await page.evaluate(() => document.querySelectorAll('#trees .strata-downloads button').length), 4);
});

test('the SVG download is the chart in the page', async () => {
  const { name, bytes } = await download('#harvest [data-strata-download="svg"]');
  assert.equal(name, 'harvest.svg');
  const text = bytes.toString('utf8');
  const same = await page.evaluate((text) => {
    const ser = new XMLSerializer();
    const file = new DOMParser().parseFromString(text, 'image/svg+xml').documentElement;
    return ser.serializeToString(file) === ser.serializeToString(document.querySelector('#harvest > svg'));
  }, text);
  assert.ok(text.startsWith('<?xml'));
  assert.ok(same, 'the file parses to the SVG shown');
});

test('the PNG download is drawn from the SVG, at twice its size', async () => {
  const { name, bytes } = await download('#harvest [data-strata-download="png"]');
  assert.equal(name, 'harvest.png');
  // PNG signature and IHDR (ISO/IEC 15948: width and height, big-endian, at bytes 16 and 20).
  assert.deepEqual([...bytes.subarray(0, 8)], [137, 80, 78, 71, 13, 10, 26, 10]);
  assert.equal(bytes.readUInt32BE(16), 1280);
  assert.equal(bytes.readUInt32BE(20), 640);
  // Not blank: the browser decodes it and finds dark pixels (bars, text) on the white background.
  const dark = await page.evaluate(async (b64) => {
    const img = new Image();
    img.src = `data:image/png;base64,${b64}`;
    await img.decode();
    const c = document.createElement('canvas');
    c.width = img.width;
    c.height = img.height;
    const ctx = c.getContext('2d');
    ctx.drawImage(img, 0, 0);
    const d = ctx.getImageData(0, 0, c.width, c.height).data;
    let n = 0;
    for (let i = 0; i < d.length; i += 4) if (d[i] + d[i + 1] + d[i + 2] < 300) n++;
    return n;
  }, bytes.toString('base64'));
  assert.ok(dark > 1000, `${dark} dark pixels`);
});

test('the CSV download matches the data table, cell for cell', async () => {
  for (const [selector, id, layer] of [
    ['#harvest [data-strata-download="csv-0"]', 'harvest', 0],
    ['#trees [data-strata-download="csv-0"]', 'trees', 0],
    ['#trees [data-strata-download="csv-1"]', 'trees', 1],
  ]) {
    const { name, bytes } = await download(selector);
    assert.equal(name, id === 'trees' ? `trees-layer-${layer + 1}.csv` : 'harvest.csv');
    // Read by an independent RFC 4180 reader (PapaParse).
    const parsed = Papa.parse(bytes.toString('utf8'), { skipEmptyLines: true });
    assert.deepEqual(parsed.errors, []);
    const table = await page.evaluate(
      ([id, layer]) => {
        const t = document.querySelectorAll(`#${id} > details.strata-data > table`)[layer];
        return [[...t.querySelectorAll('thead th')].map((c) => c.textContent), ...[...t.querySelectorAll('tbody tr')].map((tr) => [...tr.children].map((c) => c.textContent))];
      },
      [id, layer]
    );
    assert.ok(table.length > 2);
    assert.deepEqual(parsed.data, table);
  }
});

test('a field with a comma, a quote or a line break is quoted (RFC 4180, section 2)', async () => {
  const csv = await page.evaluate(async () => {
    const { tableCsv } = await import('/www/strata-downloads.js');
    const t = document.createElement('table');
    t.innerHTML = '<thead><tr><th>a, b</th><th>say "hi"</th></tr></thead><tbody><tr><td>line\none</td><td>plain</td></tr></tbody>';
    return tableCsv(t);
  });
  assert.equal(csv, '"a, b","say ""hi"""\r\n"line\none",plain\r\n');
});

test('the file makers load on the first download only', async () => {
  const fresh = await browser.context.newPage();
  const loaded = [];
  fresh.on('request', (r) => loaded.push(new URL(r.url()).pathname));
  await fresh.goto(`${server.url}/tests/browser/pages/downloads.html`);
  await settled(fresh);
  assert.ok(!loaded.some((p) => p.endsWith('strata-downloads.js')));
  await fresh.focus('#harvest [data-strata-download="svg"]');
  await Promise.all([fresh.waitForEvent('download'), fresh.keyboard.press('Enter')]);
  assert.ok(loaded.some((p) => p.endsWith('/www/strata-downloads.js')));
  await fresh.close();
});

test('downloads run under the strict CSP', async () => {
  assert.deepEqual(await page.evaluate(() => window.__csp), []);
  assert.deepEqual(problems, []);
});
