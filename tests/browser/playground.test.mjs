// The playground (www/playground.html): open a CSV through the file input,
// type a spec with a mistake, see the located error, jump to it, fix it,
// see the chart, and check that the copied embed snippet draws the same
// bytes in a fresh page (under the gallery's strict CSP, with the element).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { serve, launch, settled, ROOT } from './harness.mjs';

const CSV = fs.readFileSync(path.join(ROOT, 'examples', 'data', 'orchard_trees.csv'));
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; img-src 'self' data:";

let server, browser, page, pageErrors;

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  pageErrors = [];
  page.on('pageerror', (e) => pageErrors.push(String(e)));
  await page.addInitScript(() => {
    window.__csp = [];
    document.addEventListener('securitypolicyviolation', (e) => window.__csp.push(`${e.violatedDirective} ${e.blockedURI}`));
  });
  await page.goto(`${server.url}/www/playground.html`);
});

after(async () => {
  await browser?.close();
  await server?.close();
});

const status = () => page.textContent('#status');

// The spec as an author might type it, with a misspelt column on line 5.
const WRONG = `{
  "title": "Yield <kg> by age",
  "layers": [
    { "draw": "point", "x": "age_years",
      "y": "yeild_kg", "color": "variety" }
  ],
  "size": { "width": 480, "height": 320 }
}`;

test('a CSV opened from disk gives columns and a starter chart', async () => {
  await page.setInputFiles('#file', { name: 'orchard_trees.csv', mimeType: 'text/csv', buffer: CSV });
  await page.waitForFunction(() => / \d+ rows, /.test(document.getElementById('data-status').textContent));
  assert.match(await page.textContent('#data-status'), /orchard_trees\.csv: \d+ rows, 5 columns/);
  const columns = await page.$$eval('#columns li', (lis) => lis.map((li) => li.textContent));
  // Types as the engine's CSV reader infers them.
  assert.deepEqual(columns, ['tree text', 'variety text', 'age_years number', 'yield_kg number', 'planted date']);
  // The starter: two measures draw points (two text columns: no colour, the first may be an identifier).
  const starter = JSON.parse(await page.inputValue('#spec'));
  assert.deepEqual(starter.layers, [{ draw: 'point', x: 'age_years', y: 'yield_kg' }]);
  await page.waitForFunction(() => document.querySelector('#preview-light svg'));
});

test('the starter spec follows the column types', async () => {
  const starter = (columns) => page.evaluate(async (columns) => (await import('./playground.js')).starterSpec(columns, 'd.csv'), columns);
  const layer = async (columns) => JSON.parse(await starter(columns)).layers[0];
  const c = (name, type) => ({ name, type });
  assert.deepEqual(await layer([c('month', 'date'), c('visitors', 'number'), c('gate', 'text')]), { draw: 'line', x: 'month', y: 'visitors', color: 'gate' });
  assert.deepEqual(await layer([c('town', 'text'), c('rain', 'number')]), { draw: 'bar', x: 'town', y: 'rain' });
  assert.deepEqual(await layer([c('rain', 'number')]), { draw: 'bar', x: 'rain', stat: { bin: { rule: 'fd' } } });
  assert.deepEqual(await layer([c('town', 'text')]), { draw: 'bar', x: 'town', stat: 'count' });
});

test('the JSON path locator agrees with the CLI locator (crates/strata-cli/src/locate.rs, same cases)', async () => {
  const SPEC = '{\n  "data": {"url": "d.csv"},\n  "layers": [\n    {"draw": "bar", "x": "k"},\n    {"draw": "point",\n     "stat": {"bin": {"rule": "nope"}}}\n  ],\n  "derive": {"a b": "x + 1", "c\\"d": "1"}\n}';
  const cases = {
    'layers[1].stat.bin.rule': '"rule": "nope"',
    'layers[0].x': '"x": "k"',
    'layers[1]': '{"draw": "point"',
    'data.url': '"url"',
    'derive."a b"': '"a b"',
    'derive."c\\"d"': '"c\\"d"',
    'layers[0].y': '{"draw": "bar"',
    'layers[7]': '[\n    {',
    '': '{\n  "data"',
  };
  const got = await page.evaluate(
    async ([text, paths]) => {
      const { locate } = await import('./playground.js');
      // Broken text never throws.
      for (let cut = 0; cut < text.length; cut++) locate(text.slice(0, cut), 'layers[1].stat.bin.rule');
      return paths.map((p) => text.slice(locate(text, p)));
    },
    [SPEC, Object.keys(cases)]
  );
  Object.values(cases).forEach((start, i) => assert.ok(got[i].startsWith(start), `${Object.keys(cases)[i]}: ${got[i]}`));
});

test('a mistake is listed with its path, and clicking it moves the cursor there', async () => {
  await page.fill('#spec', WRONG);
  const button = page.locator('#problems button', { hasText: 'layers[0].y' });
  await button.waitFor();
  assert.match(await button.textContent(), /no column `yeild_kg`/);
  assert.match(await status(), /Not drawn: 1 error/);
  await button.click();
  const where = await page.evaluate(() => {
    const t = document.getElementById('spec');
    return { focused: document.activeElement === t, start: t.selectionStart, end: t.selectionEnd };
  });
  assert.equal(where.focused, true);
  // The cursor sits on the key of layers[0].y.
  assert.equal(where.start, WRONG.indexOf('"y": "yeild_kg"'));
  assert.equal(where.end, where.start);
  // And from the keyboard: Enter on the focused problem does the same.
  await page.evaluate(() => document.getElementById('spec').setSelectionRange(0, 0));
  await button.focus();
  await page.keyboard.press('Enter');
  assert.equal(await page.evaluate(() => document.getElementById('spec').selectionStart), WRONG.indexOf('"y": "yeild_kg"'));
});

test('a syntax error is located by line and column', async () => {
  const broken = '{\n  "layers": [\n    { "draw": "point" "x": "age_years" }\n  ]\n}';
  await page.fill('#spec', broken);
  const button = page.locator('#problems button', { hasText: 'not valid JSON' });
  await button.waitFor();
  await button.click();
  // serde_json stops at the `"x"` that lacks a comma before it: line 3, column 23.
  assert.equal(await page.evaluate(() => document.getElementById('spec').selectionStart), broken.indexOf('"x"'));
});

let svgDownloaded;

test('fixed, the chart draws in light, dark and narrow previews', async () => {
  await page.fill('#spec', WRONG.replace('yeild_kg', 'yield_kg'));
  await page.waitForFunction(() => document.getElementById('status').textContent.startsWith('Drawn'));
  assert.match(await status(), /Drawn, 480 × 320 px/);
  const previews = await page.evaluate(() =>
    ['light', 'dark', 'narrow'].map((k) => {
      const svg = document.querySelector(`#preview-${k} svg`);
      return svg && { width: svg.getAttribute('width'), cls: svg.getAttribute('class') };
    })
  );
  assert.equal(previews[0].width, '480');
  assert.match(previews[0].cls, /strata-light/);
  assert.match(previews[1].cls, /strata-dark/);
  assert.equal(previews[2].width, '360');
  assert.equal(await page.locator('#problems li', { hasText: 'No problems' }).count(), 1);
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#download-svg')]);
  assert.equal(download.suggestedFilename(), 'orchard_trees.svg');
  svgDownloaded = fs.readFileSync(await download.path(), 'utf8');
  assert.match(svgDownloaded, /^<svg /);
});

test('the PNG is the chart at twice its size; the HTML page holds the chart baked', async () => {
  const [png] = await Promise.all([page.waitForEvent('download'), page.click('#download-png')]);
  const bytes = fs.readFileSync(await png.path());
  // PNG signature and IHDR (ISO/IEC 15948).
  assert.deepEqual([...bytes.subarray(0, 8)], [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  assert.deepEqual([bytes.readUInt32BE(16), bytes.readUInt32BE(20)], [960, 640]);
  const [html] = await Promise.all([page.waitForEvent('download'), page.click('#download-html')]);
  const text = fs.readFileSync(await html.path(), 'utf8');
  assert.ok(text.includes(`</script>${svgDownloaded.trimEnd()}<details class="strata-data">`));
  assert.ok(text.includes('"title": "Yield \\u003ckg> by age"'));
});

test('the embed snippet draws the same bytes in a fresh page', async () => {
  await browser.context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: server.url });
  await page.click('#copy-embed');
  const snippet = await page.inputValue('#embed');
  assert.match(snippet, /^<strata-chart src="orchard_trees\.csv">\n<script type="application\/json">\n/);
  // No `<` inside the inline JSON: written as \u003c.
  const json = snippet.slice(snippet.indexOf('json">') + 6, snippet.lastIndexOf('</script>'));
  assert.ok(!json.includes('<'), json);
  assert.equal(JSON.parse(json).title, 'Yield <kg> by age');
  const clip = await page.evaluate(() => navigator.clipboard.readText());
  assert.equal(clip, snippet);

  const fresh = await browser.context.newPage();
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${CSP}">
<link rel="stylesheet" href="/www/strata-theme.css"></head><body>
${snippet}
<script type="module" src="/www/strata-chart.js"></script></body></html>`;
  await fresh.route(`${server.url}/scratch/**`, (route) => {
    const url = new URL(route.request().url());
    if (url.pathname === '/scratch/page.html') return route.fulfill({ contentType: 'text/html', body: html });
    if (url.pathname === '/scratch/orchard_trees.csv') return route.fulfill({ contentType: 'text/csv', body: CSV });
    return route.fulfill({ status: 404, body: 'not found' });
  });
  await fresh.goto(`${server.url}/scratch/page.html`);
  await settled(fresh);
  const drawn = await fresh.evaluate(() => document.querySelector('strata-chart').svgText);
  assert.equal(drawn, svgDownloaded, 'the element draws the bytes the playground drew');
  await fresh.close();
});

test('data.sha256 is checked against SubtleCrypto\'s digest of the opened file', async () => {
  // The right digest from node's own SHA-256 (OpenSSL), not from Strata.
  const right = crypto.createHash('sha256').update(CSV).digest('hex');
  const spec = (sha256) => JSON.stringify({ data: { sha256 }, layers: [{ draw: 'point', x: 'age_years', y: 'yield_kg' }] });
  await page.fill('#spec', spec('0'.repeat(64)));
  await page.locator('#problems li', { hasText: 'data.sha256' }).first().waitFor();
  assert.match(await page.textContent('#problems'), new RegExp(`digest is ${right}, but`));
  await page.fill('#spec', spec(right));
  await page.waitForFunction(() => document.getElementById('status').textContent.startsWith('Drawn'));
  assert.equal(await page.locator('#problems li', { hasText: 'No problems' }).count(), 1);
});

test('a TSV dropped on the page is read too', async () => {
  // Invented demo data, tab separated.
  await page.evaluate(() => {
    const dt = new DataTransfer();
    dt.items.add(new File(['town\train_mm\nAsh\t12.5\nBirch\t30\n'], 'rain.tsv', { type: 'text/tab-separated-values' }));
    document.getElementById('drop').dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
  });
  await page.waitForFunction(() => document.getElementById('data-status').textContent.startsWith('rain.tsv: 2 rows, 2 columns'));
  assert.deepEqual(await page.$$eval('#columns li', (lis) => lis.map((li) => li.textContent)), ['town text', 'rain_mm number']);
  await page.click('#starter');
  assert.deepEqual(JSON.parse(await page.inputValue('#spec')).layers, [{ draw: 'bar', x: 'town', y: 'rain_mm' }]);
  await page.waitForFunction(() => document.getElementById('status').textContent.startsWith('Drawn'));
});

test('an Arrow IPC file gives the column types the pyarrow fixture lists', async () => {
  // tests/reference/fixtures/arrow/types.arrow, written by pyarrow; types.json lists each column as read.
  const fixtures = path.join(ROOT, 'tests', 'reference', 'fixtures', 'arrow');
  const expected = JSON.parse(fs.readFileSync(path.join(fixtures, 'types.json'), 'utf8'));
  const word = { int64: 'number', float64: 'number', bool: 'bool', utf8: 'text', date32: 'date', timestamp_ms_utc: 'date' };
  const want = Object.entries(expected.columns)
    .filter(([, c]) => c.type !== 'dropped')
    .map(([name, c]) => `${name} ${word[c.type]}`);
  await page.setInputFiles('#file', { name: 'types.arrow', mimeType: 'application/octet-stream', buffer: fs.readFileSync(path.join(fixtures, 'types.arrow')) });
  await page.waitForFunction(() => document.getElementById('data-status').textContent.startsWith('types.arrow:'));
  assert.match(await page.textContent('#data-status'), new RegExp(`types\\.arrow: ${expected.rows} rows, ${want.length} columns`));
  assert.deepEqual(await page.$$eval('#columns li', (lis) => lis.map((li) => li.textContent)), want);
  await page.fill('#spec', JSON.stringify({ layers: [{ draw: 'point', x: 'day', y: 'price' }], size: { width: 400, height: 260 } }));
  await page.waitForFunction(() => document.getElementById('status').textContent.startsWith('Drawn, 400'));
});

test('every control is reached with the Tab key, in reading order', async () => {
  await page.evaluate(() => document.activeElement && document.activeElement.blur());
  await page.focus('#file');
  const seen = [];
  for (let i = 0; i < 14; i++) {
    seen.push(await page.evaluate(() => document.activeElement.id || document.activeElement.textContent.trim().slice(0, 20)));
    await page.keyboard.press('Tab');
  }
  const order = ['file', 'starter', 'spec', 'copy-embed', 'download-svg', 'download-png', 'download-html', 'embed'];
  const at = order.map((id) => seen.indexOf(id));
  assert.ok(at.every((i) => i >= 0), seen.join(' | '));
  assert.deepEqual([...at].sort((a, b) => a - b), at, seen.join(' | '));
});

test('no CSP violation and no page error', async () => {
  assert.deepEqual(await page.evaluate(() => window.__csp), []);
  assert.deepEqual(pageErrors, []);
});
