// `strata bake` pre-renders the gallery: the charts show with scripting off,
// and once the module loads the element draws the very same bytes.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, serve, launch, cli, settled } from './harness.mjs';

const BAKED = path.join(ROOT, 'www', 'index.baked.html');
let server, browser, bake;

before(async () => {
  // The gallery page reads ../examples, so the site root is the repository.
  bake = cli(['bake', '--root', ROOT, path.join(ROOT, 'www', 'index.html'), '-o', BAKED]);
  server = await serve();
  browser = await launch();
});

after(async () => {
  await browser?.close();
  await server?.close();
  fs.rmSync(BAKED, { force: true });
});

test('bake reports the broken chart by page and id and bakes the rest', () => {
  assert.equal(bake.status, 1, 'a chart failed, so the exit status says so');
  assert.match(bake.stderr, /index\.html: #typo: .*layers\[0\]\.y/);
  assert.match(bake.stderr, /baked 11 charts/);
  const html = fs.readFileSync(BAKED, 'utf8');
  assert.equal((html.match(/<svg xmlns/g) || []).length, 11);
});

test('with scripting off the baked charts are in the page', async () => {
  // Block every script the page would load: what shows is the baked HTML alone.
  const page = await browser.context.newPage();
  await page.route('**/*.js', (r) => r.abort());
  await page.goto(`${server.url}/www/index.baked.html`);
  const n = await page.evaluate(() => document.querySelectorAll('strata-chart > svg.strata').length);
  assert.equal(n, 11);
  const box = await page.evaluate(() => document.querySelector('#bars > svg').getBoundingClientRect().height);
  assert.ok(box > 100, 'the SVG has its size without any script');
  // The data tables are there too, and open with no script.
  const tables = await page.evaluate(() => document.querySelectorAll('strata-chart > svg + details.strata-data').length);
  assert.equal(tables, 11);
  await page.click('#bars > details.strata-data > summary');
  const cells = await page.evaluate(() => {
    const d = document.querySelector('#bars > details.strata-data');
    return { open: d.open, visible: d.querySelector('td').getBoundingClientRect().height > 0 };
  });
  assert.deepEqual(cells, { open: true, visible: true });
  await page.close();
});

test('the element redraws a baked chart byte for byte', async () => {
  const page = await browser.context.newPage();
  await page.goto(`${server.url}/www/index.baked.html`);
  await settled(page);
  const html = fs.readFileSync(BAKED, 'utf8');
  for (const id of ['points', 'lines', 'bars', 'histogram', 'boxes', 'trend', 'weather', 'windrose', 'dark', 'panels', 'seasons']) {
    const { svgText, tableHtml } = await page.evaluate((id) => {
      const el = document.getElementById(id);
      return { svgText: el.svgText, tableHtml: el.tableHtml };
    }, id);
    assert.ok(html.includes(svgText.trimEnd() + tableHtml), `${id}: baked bytes equal the element's`);
    const count = await page.evaluate((id) => document.querySelectorAll(`#${id} > svg, #${id} > details`).length, id);
    assert.equal(count, 2, `${id}: the baked SVG and table were replaced, not doubled`);
  }
  await page.close();
});
