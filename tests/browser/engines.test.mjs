// The page's two engines: charts that need nothing more draw with the light
// core engine alone; a chart that needs the full engine (maps, expressions,
// fitted statistics...) loads it, whether the element's word list spots it
// or the core turns it away (spec.needs_full_engine): then it draws with the
// full engine with no error shown on the way, to the CLI's bytes.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ROOT, serve, launch, cli, settled, FULL_WORDS } from './harness.mjs';

let server, browser, page, wasm;

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  wasm = [];
  page.on('request', (r) => r.url().endsWith('.wasm') && wasm.push(new URL(r.url()).pathname.split('/').pop()));
  // The core engine's glue, wrapped to count the charts it turns away.
  await page.route(/\/www\/pkg\/strata_wasm\.js$/, (route) =>
    route.fulfill({
      contentType: 'text/javascript',
      body: `import * as real from './strata_wasm.js?real';
        export * from './strata_wasm.js?real';
        export default real.default;
        export function render(...args) {
          const answer = real.render(...args);
          if (answer.includes('"code":"spec.needs_full_engine"')) globalThis.refusedByCore = (globalThis.refusedByCore || 0) + 1;
          return answer;
        }`,
    })
  );
  await page.goto(`${server.url}/tests/browser/pages/engines.html`);
  await settled(page);
});

after(async () => {
  await browser?.close();
  await server?.close();
});

/** Add a chart of `spec` text over the harvest data; resolves to what it showed. */
function addChart(id, spec, src = '../../../examples/data/orchard_harvest.csv') {
  return page.evaluate(
    ([id, spec, src]) =>
      new Promise((resolve) => {
        const el = document.createElement('strata-chart');
        el.id = id;
        el.setAttribute('src', src);
        const s = document.createElement('script');
        s.type = 'application/json';
        s.textContent = spec;
        el.append(s);
        // Any error box, even one replaced at once, is seen.
        let flashed = false;
        new MutationObserver(() => (flashed ||= !!el.querySelector(':scope > .strata-error'))).observe(el, { childList: true });
        el.addEventListener('strata-error', (e) => resolve({ error: JSON.stringify(e.detail.errors) }));
        el.addEventListener('strata-render', () => resolve({ svgText: el.svgText, status: el.status, flashed }));
        document.body.append(el);
      }),
    [id, spec, src]
  );
}

const refused = () => page.evaluate(() => globalThis.refusedByCore || 0);

function cliSvg(spec, data = path.join(ROOT, 'examples', 'data', 'orchard_harvest.csv')) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'strata-engines-'));
  const specFile = path.join(dir, 'spec.json');
  fs.writeFileSync(specFile, spec);
  const out = path.join(dir, 'out.svg');
  const r = cli(['render', specFile, '--data', data, '-o', out]);
  assert.equal(r.status, 0, r.stderr);
  const svg = fs.readFileSync(out, 'utf8');
  fs.rmSync(dir, { recursive: true, force: true });
  return svg;
}

test('a page of charts the core draws loads the core engine alone', async () => {
  const status = await page.evaluate(() => [...document.querySelectorAll('strata-chart')].map((el) => el.status));
  assert.deepEqual(status, ['drawn', 'drawn']);
  assert.deepEqual(wasm, ['strata_wasm_bg.wasm']);
  assert.equal(await refused(), 0);
});

test('a chart whose words ask for the full engine draws with it', async () => {
  const spec = '{"title": "Harvest trend", "source": "Invented demo data", "layers": [{"draw": "point", "x": "season", "y": "harvest_kg"}, {"draw": "line", "x": "season", "y": "harvest_kg", "stat": {"fit": "linear"}}], "size": {"width": 640, "height": 320}}';
  assert.ok(FULL_WORDS.test(spec));
  const got = await addChart('trend', spec);
  assert.equal(got.error, undefined, got.error);
  assert.equal(got.flashed, false);
  assert.equal(got.svgText, cliSvg(spec), 'the page draws the CLI bytes');
  assert.deepEqual(wasm, ['strata_wasm_bg.wasm', 'strata_wasm_full_bg.wasm']);
  assert.equal(await refused(), 0, 'the word list sent it to the full engine at once');
});

test('a chart the word list misses is turned away by the core and drawn by the full engine, no error shown', async () => {
  // `derive` spelt with a JSON escape: the element's word list does not see it.
  const spec = String.raw`{"title": "Harvest in tonnes", "source": "Invented demo data", "d\u0065rive": {"tonnes": "harvest_kg / 1000"}, "layers": [{"draw": "bar", "x": "variety", "y": "tonnes"}], "size": {"width": 640, "height": 320}}`;
  assert.ok(!FULL_WORDS.test(spec));
  const got = await addChart('missed', spec);
  assert.equal(got.error, undefined, got.error);
  assert.equal(got.status, 'drawn');
  assert.equal(got.flashed, false, 'no error box on the way');
  assert.equal(await refused(), 1, 'the core turned it away once');
  assert.equal(got.svgText, cliSvg(spec), 'the page draws the CLI bytes');
  // Each engine still downloaded once.
  assert.deepEqual(wasm, ['strata_wasm_bg.wasm', 'strata_wasm_full_bg.wasm']);
});

test('Arrow data loads the add-on beside the full engine', async () => {
  const spec = '{"size": {"width": 480}, "where": "f64 > 0", "layers": [{"draw": "point", "x": "u8", "y": "f64"}]}';
  const got = await addChart('arrow', spec, '../../reference/fixtures/arrow/types.arrow');
  assert.equal(got.error, undefined, got.error);
  assert.equal(got.svgText, cliSvg(spec, path.join(ROOT, 'tests', 'reference', 'fixtures', 'arrow', 'types.arrow')), 'the page draws the CLI bytes');
  assert.deepEqual(wasm, ['strata_wasm_bg.wasm', 'strata_wasm_full_bg.wasm', 'strata_wasm_arrow_bg.wasm']);
});
