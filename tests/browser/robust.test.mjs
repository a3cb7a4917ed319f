// Bad input never breaks the page: located messages in the chart's place,
// pre-rendered content kept, nothing from data run as script, redraw on resize.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { serve, launch, settled } from './harness.mjs';

let server, browser, page, pageErrors, events;

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  pageErrors = [];
  page.on('pageerror', (e) => pageErrors.push(String(e)));
  await page.addInitScript(() => {
    window.__events = [];
    for (const type of ['strata-render', 'strata-error']) {
      document.addEventListener(type, (e) => window.__events.push({ type, id: e.target.id, detail: e.detail }));
    }
  });
  await page.goto(`${server.url}/tests/browser/pages/robust.html`);
  await settled(page);
  events = await page.evaluate(() => window.__events);
});

after(async () => {
  await browser?.close();
  await server?.close();
});

const errorText = (id) => page.evaluate((id) => document.querySelector(`#${id} > .strata-error`)?.textContent ?? null, id);

test('unreachable data names the URL and the HTTP status', async () => {
  const text = await errorText('missing');
  assert.match(text, /data\.url/);
  assert.match(text, /no-such-file\.csv/);
  assert.match(text, /404/);
  assert.ok(events.some((e) => e.type === 'strata-error' && e.id === 'missing' && e.detail.errors[0].code === 'data.fetch'));
});

test('a JSON syntax error names the line of the spec', async () => {
  const text = await errorText('badjson');
  assert.match(text, /not valid JSON/);
  assert.match(text, /spec line 1/);
});

test('a bad spec keeps the author\'s pre-rendered SVG and adds the message', async () => {
  const text = await errorText('prerendered');
  assert.match(text, /layers\[0\]\.colour/);
  const kept = await page.evaluate(() => !!document.querySelector('#prerendered > svg#authors-svg'));
  assert.ok(kept, 'pre-rendered SVG still in place');
});

test('markup in data is drawn as text and never runs', async () => {
  assert.equal(await errorText('hostile'), null);
  const r = await page.evaluate(() => ({
    pwned: window.__pwned,
    imgs: document.querySelectorAll('#hostile img, #hostile script:not([type="application/json"])').length,
    labels: [...document.querySelectorAll('#hostile svg text')].map((t) => t.textContent),
    cells: [...document.querySelectorAll('#hostile details.strata-data td')].map((t) => t.textContent),
    tableElements: [...document.querySelectorAll('#hostile details.strata-data *')].map((e) => e.localName),
  }));
  assert.equal(r.pwned, undefined);
  assert.equal(r.imgs, 0);
  assert.ok(r.labels.includes('<script>window.__pwned=2</script>'));
  assert.ok(r.labels.includes('Tom & "Jerry"'));
  // The data table holds the same words as text, and only table elements.
  assert.ok(r.cells.includes('<script>window.__pwned=2</script>'), r.cells.join('|'));
  assert.ok(r.cells.includes('Tom & "Jerry"'));
  const allowed = new Set(['summary', 'table', 'caption', 'thead', 'tbody', 'tr', 'th', 'td']);
  assert.deepEqual(r.tableElements.filter((n) => !allowed.has(n)), []);
});

test('a chart without a width fills its container and redraws on resize', async () => {
  const w1 = await page.evaluate(() => document.querySelector('#fluid > svg').getAttribute('width'));
  assert.equal(w1, '360');
  await page.evaluate(() => { document.getElementById('box').style.width = '520px'; });
  await page.waitForFunction(() => document.querySelector('#fluid > svg').getAttribute('width') === '520');
});

test('setting spec and rows from JavaScript draws', async () => {
  const width = await page.evaluate(async () => {
    const el = document.createElement('strata-chart');
    document.body.append(el);
    const done = new Promise((r) => el.addEventListener('strata-render', (e) => r(e.detail.width), { once: true }));
    el.rows = [{ k: 'a', v: 1 }, { k: 'b', v: 2 }];
    el.spec = { size: { width: 300 }, layers: [{ draw: 'bar', x: 'k', y: 'v' }] };
    return done;
  });
  assert.equal(width, 300);
});

test('no uncaught errors reached the page', () => {
  assert.deepEqual(pageErrors, []);
});
