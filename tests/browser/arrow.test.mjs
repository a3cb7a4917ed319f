// Arrow IPC data (pyarrow-written fixtures) in the page: the element loads
// the Arrow add-on only for these charts, and the core engine draws the
// decoded columns to the same bytes as the CLI.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ROOT, serve, launch, cli, settled } from './harness.mjs';

let server, browser, page, requested;

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  requested = [];
  page.on('request', (r) => requested.push(new URL(r.url()).pathname));
  await page.goto(`${server.url}/tests/browser/pages/arrow.html`);
  await settled(page);
});

after(async () => {
  await browser?.close();
  await server?.close();
});

for (const id of ['file', 'stream']) {
  test(`Arrow IPC ${id} format draws the CLI's bytes`, async () => {
    const got = await page.evaluate((id) => {
      const el = document.getElementById(id);
      return {
        svgText: el.svgText,
        error: el.querySelector('.strata-error')?.textContent ?? null,
        spec: el.querySelector('script').textContent,
        src: el.getAttribute('src'),
      };
    }, id);
    assert.equal(got.error, null);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'strata-arrow-'));
    fs.writeFileSync(path.join(dir, 's.json'), got.spec);
    const data = path.resolve(ROOT, 'tests/browser/pages', got.src);
    const r = cli(['render', path.join(dir, 's.json'), '--data', data, '-o', path.join(dir, 's.svg')]);
    assert.equal(r.status, 0, r.stderr);
    assert.equal(got.svgText, fs.readFileSync(path.join(dir, 's.svg'), 'utf8'));
    fs.rmSync(dir, { recursive: true, force: true });
  });
}

test('Arrow pages fetch the Arrow add-on beside the one core engine', () => {
  // The add-on only decodes; the core engine draws (render_columns).
  assert.equal(requested.filter((p) => p.endsWith('/strata_wasm_arrow_bg.wasm')).length, 1);
  assert.equal(requested.filter((p) => p.endsWith('/strata_wasm_bg.wasm')).length, 1);
});
