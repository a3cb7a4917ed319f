// One bad chart never breaks the page (issue 16): a long operator chain and a
// huge log base are refused in place; an engine that traps is replaced, so a
// good chart beside it, and one added afterwards, still draw. Also: render()
// resolves when the current spec is drawn, and a fetch that never finishes
// ends in a message after the element's timeout.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { serve, launch } from './harness.mjs';

let server, browser, page, pageErrors;

const ROWS = [{ a: 1, b: 2 }, { a: 2, b: 3 }, { a: 3, b: 5 }];
const good = (title) => ({ title, data: { rows: ROWS }, size: { width: 300 }, layers: [{ draw: 'point', x: 'a', y: 'b' }] });

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  pageErrors = [];
  page.on('pageerror', (e) => pageErrors.push(String(e)));
  // The first engine instance is wrapped so that a spec titled TRAP_ME traps
  // the way a panic does (a WebAssembly RuntimeError), and the instance stays
  // broken afterwards; fresh instances (`?instance=N`) are the real module.
  await page.route(/\/www\/pkg\/strata_wasm\.js$/, (route) =>
    route.fulfill({
      contentType: 'text/javascript',
      body: `import * as real from './strata_wasm.js?real';
        let broken = false;
        export default real.default;
        export function render(text, ...rest) {
          if (broken || text.includes('TRAP_ME')) { broken = true; throw new WebAssembly.RuntimeError('unreachable'); }
          return real.render(text, ...rest);
        }`,
    })
  );
  // A data response that never arrives.
  await page.route(/never\.csv$/, () => {});
  await page.goto(`${server.url}/tests/browser/pages/hostile.html`);
  await page.waitForFunction(() => customElements.get('strata-chart'));
});

after(async () => {
  await browser?.close();
  await server?.close();
});

/** Add charts with these specs at once and wait for every one to finish. */
async function addCharts(specs, attrs = {}) {
  return page.evaluate(
    async ({ specs, attrs }) => {
      const els = specs.map((spec, i) => {
        const el = document.createElement('strata-chart');
        el.id = `c${document.querySelectorAll('strata-chart').length}`;
        for (const [k, v] of Object.entries(attrs)) el.setAttribute(k, v);
        el.spec = spec;
        document.body.append(el);
        return el;
      });
      await Promise.all(els.map((el) => el.render()));
      return els.map((el) => ({
        svg: el.svgText.length,
        title: el.querySelector(':scope > svg title')?.textContent ?? null,
        error: el.querySelector(':scope > .strata-error')?.textContent ?? null,
      }));
    },
    { specs, attrs }
  );
}

test('hostile charts are refused in place and the good one beside them draws', async () => {
  const chain = Array(3000).fill('a').join(' + ');
  const r = await addCharts([
    { data: { rows: ROWS }, derive: { c: chain }, layers: [{ draw: 'point', x: 'a', y: 'c' }] },
    { data: { rows: ROWS }, scales: { x: { kind: 'log', base: 1e50 } }, layers: [{ draw: 'point', x: 'a', y: 'b' }] },
    { ...good('TRAP_ME'), title: 'TRAP_ME' },
    good('first good chart'),
  ]);
  assert.match(r[0].error, /derive\.c/);
  assert.match(r[0].error, /operations deep \(character \d+\)/);
  assert.ok(r[0].error.length < 2000, 'the message stays short');
  assert.match(r[1].error, /scales\.x\.base/);
  assert.match(r[2].error, /engine stopped/);
  assert.equal(r[3].error, null, r[3].error);
  assert.ok(r[3].svg > 0);
  // The deepest chain the bound allows (128 levels) evaluates inside the
  // WebAssembly engine's stack.
  const deepest = Array(128).fill('a').join(' + ');
  const [deep] = await addCharts([{ ...good('deepest chain'), derive: { c: deepest }, layers: [{ draw: 'point', x: 'a', y: 'c' }] }]);
  assert.equal(deep.error, null, deep.error);
  // A chart added afterwards draws with a fresh engine.
  const [later] = await addCharts([good('added later')]);
  assert.equal(later.error, null, later.error);
  assert.ok(later.svg > 0);
  assert.deepEqual(pageErrors, []);
});

test('render() resolves when the current spec is drawn', async () => {
  const widths = await page.evaluate(async (rows) => {
    const el = document.createElement('strata-chart');
    el.spec = { data: { rows }, size: { width: 200 }, layers: [{ draw: 'point', x: 'a', y: 'b' }] };
    document.body.append(el);
    const first = el.render();
    // A newer spec while the first drawing is under way.
    el.spec = { data: { rows }, size: { width: 333 }, layers: [{ draw: 'point', x: 'a', y: 'b' }] };
    await first;
    return el.svgText.match(/width="(\d+)"/)[1];
  }, ROWS);
  assert.equal(widths, '333');
});

test('a response that never finishes ends in a message after the timeout', async () => {
  const t0 = Date.now();
  const [r] = await addCharts([{ data: { url: 'never.csv' }, layers: [{ draw: 'point', x: 'a', y: 'b' }] }], { timeout: '1' });
  assert.match(r.error, /did not arrive within 1 s/);
  assert.ok(Date.now() - t0 < 10000);
});
