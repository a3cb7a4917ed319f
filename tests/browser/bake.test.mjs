// `strata bake` pre-renders the gallery: the charts show with scripting off,
// and once the module loads the element draws the very same bytes.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, serve, launch, cli, settled, GALLERY_IDS, GALLERY_FULL } from './harness.mjs';

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

const IDS = GALLERY_IDS;
/** The page's text without the classes the bake adds to each <svg>. */
const unmarked = (html) => html.replace(/ strata-baked( strata-(from|until)-\d+)*/g, '');

test('bake reports the broken chart by page and id and bakes the rest', () => {
  assert.equal(bake.status, 1, 'a chart failed, so the exit status says so');
  assert.match(bake.stderr, /index\.html: #typo: .*layers\[0\]\.y/);
  assert.match(bake.stderr, new RegExp(`baked ${IDS.length} charts`));
  const html = fs.readFileSync(BAKED, 'utf8');
  // Each chart at its own width and at 360 px.
  assert.equal((html.match(/<svg xmlns/g) || []).length, 2 * IDS.length);
  assert.equal((html.match(/class="strata strata-(auto|dark) strata-baked strata-until-\d+" width="360"/g) || []).length, IDS.length);
});

test('with scripting off the baked charts are in the page', async () => {
  // Block every script the page would load: what shows is the baked HTML alone.
  const page = await browser.context.newPage();
  await page.route('**/*.js', (r) => r.abort());
  await page.goto(`${server.url}/www/index.baked.html`);
  const n = await page.evaluate(() => [...document.querySelectorAll('strata-chart > svg.strata')].filter((s) => getComputedStyle(s).display !== 'none').length);
  assert.equal(n, IDS.length, 'one drawing of each chart shows');
  const box = await page.evaluate(() => document.querySelector('#bars > svg').getBoundingClientRect().height);
  assert.ok(box > 100, 'the SVG has its size without any script');
  // The data tables are there too, and open with no script.
  const tables = await page.evaluate(() => document.querySelectorAll('strata-chart > svg + details.strata-data').length);
  assert.equal(tables, IDS.length);
  await page.click('#bars > details.strata-data > summary');
  const cells = await page.evaluate(() => {
    const d = document.querySelector('#bars > details.strata-data');
    return { open: d.open, visible: d.querySelector('td').getBoundingClientRect().height > 0 };
  });
  assert.deepEqual(cells, { open: true, visible: true });
  await page.close();
});

for (const width of [1280, 360]) {
  test(`at ${width} px the element keeps the baked chart that fits, and draws the same bytes when asked`, async () => {
    const page = await browser.context.newPage();
    const wasm = [];
    page.on('request', (r) => r.url().endsWith('.wasm') && wasm.push(r.url()));
    await page.setViewportSize({ width, height: 800 });
    await page.goto(`${server.url}/www/index.baked.html`);
    await settled(page);
    const kept = await page.evaluate((ids) => ids.map((id) => document.getElementById(id).status), IDS);
    assert.deepEqual(kept, IDS.map(() => 'baked'), 'every chart keeps its baked SVG');
    // #typo could not be baked, so the engine loads for it: once.
    assert.equal(await page.evaluate(() => document.getElementById('typo').status), 'error');
    const html = unmarked(fs.readFileSync(BAKED, 'utf8'));
    for (const id of IDS) {
      const { svgText, tableHtml, count, status } = await page.evaluate(async (id) => {
        const el = document.getElementById(id);
        await el.render();
        return { svgText: el.svgText, tableHtml: el.tableHtml, status: el.status, count: el.querySelectorAll(':scope > svg, :scope > details').length };
      }, id);
      assert.equal(status, 'drawn');
      assert.ok(html.includes(svgText.trimEnd()), `${id}: baked bytes equal the element's at ${width} px`);
      if (width > 360) assert.ok(html.includes(tableHtml), `${id}: the table too`);
      assert.equal(count, 2, `${id}: the baked SVGs and table were replaced, not doubled`);
    }
    // Each engine once: the core, and the full engine for the charts that
    // need it (drawn again here on request).
    const names = wasm.map((u) => u.split('/').pop()).sort();
    assert.deepEqual(names, GALLERY_FULL.length ? ['strata_wasm_bg.wasm', 'strata_wasm_full_bg.wasm'] : ['strata_wasm_bg.wasm'], 'each engine once');
    await page.close();
  });
}
