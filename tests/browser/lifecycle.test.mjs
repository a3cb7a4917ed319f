// Loading only when needed, and the element's lifecycle: a baked page that
// fits loads no engine; one engine for every chart otherwise; removing an
// element mid-load stops everything it started; properties set before the
// element is defined apply; a scrollbar coming and going cannot loop.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, serve, launch, cli, settled } from './harness.mjs';

const MANY = path.join(ROOT, 'tests', 'browser', 'pages', 'many.html');
const BAKED = path.join(ROOT, 'tests', 'browser', 'pages', 'many.baked.html');
let server, browser;

before(async () => {
  const r = cli(['bake', '--root', ROOT, '--widths', '360,640', MANY, '-o', BAKED]);
  assert.equal(r.status, 0, r.stderr);
  server = await serve();
  browser = await launch();
});

after(async () => {
  await browser?.close();
  await server?.close();
  fs.rmSync(BAKED, { force: true });
});

/** A page that records engine requests and counts live observers (observing targets, not disconnected). */
async function open(width, url) {
  const page = await browser.context.newPage();
  const engine = [];
  page.on('request', (r) => {
    if (/strata_wasm[^/]*\.(wasm|js)(\?|$)/.test(r.url())) engine.push(new URL(r.url()).pathname);
  });
  await page.addInitScript(() => {
    window.__observers = { ResizeObserver: 0, IntersectionObserver: 0 };
    window.__events = [];
    for (const type of ['strata-render', 'strata-error']) document.addEventListener(type, (e) => window.__events.push({ type, id: e.target.id }));
    for (const name of ['ResizeObserver', 'IntersectionObserver']) {
      const Base = window[name];
      window[name] = class extends Base {
        #targets = new Set();
        observe(t, o) {
          if (!this.#targets.size) window.__observers[name] += 1;
          this.#targets.add(t);
          return super.observe(t, o);
        }
        unobserve(t) {
          if (this.#targets.delete(t) && !this.#targets.size) window.__observers[name] -= 1;
          return super.unobserve(t);
        }
        disconnect() {
          if (this.#targets.size) window.__observers[name] -= 1;
          this.#targets.clear();
          return super.disconnect();
        }
      };
    }
  });
  await page.setViewportSize({ width, height: 800 });
  await page.goto(`${server.url}${url}`);
  return { page, engine };
}

const statuses = (page) => page.evaluate(() => [...document.querySelectorAll('strata-chart')].map((el) => el.status));
const wasmCount = (engine) => engine.filter((p) => p.endsWith('.wasm')).length;

for (const width of [360, 1280]) {
  test(`a baked 20-chart page at ${width} px (a baked width fits) requests no engine`, async () => {
    const { page, engine } = await open(width, '/tests/browser/pages/many.baked.html');
    await page.waitForFunction(() => customElements.get('strata-chart') && document.querySelectorAll('strata-chart').length === 20);
    // Read it to the end: charts far below come near and still need nothing.
    for (let y = 0; y < 20; y++) {
      await page.mouse.wheel(0, 800);
      await page.waitForTimeout(30);
    }
    await page.waitForTimeout(400);
    assert.deepEqual(await statuses(page), Array(20).fill('baked'));
    assert.deepEqual(engine, [], 'no engine module or .wasm requested');
    await page.close();
  });
}

test('the same page at another width (330 px) requests the engine once and draws at the container width', async () => {
  const { page, engine } = await open(330, '/tests/browser/pages/many.baked.html');
  await settled(page, 30000);
  assert.deepEqual(await statuses(page), Array(20).fill('drawn'));
  assert.equal(wasmCount(engine), 1);
  const widths = await page.evaluate(() => [...document.querySelectorAll('strata-chart > svg')].map((s) => s.getAttribute('width')));
  assert.deepEqual(widths, Array(20).fill('330'));
  await page.close();
});

test('far below the fold, charts wait until they come near', async () => {
  const { page, engine } = await open(330, '/tests/browser/pages/many.html');
  await page.waitForFunction(() => document.getElementById('c1').status === 'drawn', null, { timeout: 20000 });
  const before = await statuses(page);
  assert.equal(before[19], 'waiting', 'the last chart waits');
  assert.ok(before.filter((s) => s === 'drawn').length >= 2, `${before}`);
  await page.evaluate(() => document.getElementById('c20').scrollIntoView());
  await page.waitForFunction(() => document.getElementById('c20').status === 'drawn', null, { timeout: 20000 });
  assert.equal(wasmCount(engine), 1, 'one engine for every chart');
  await page.close();
});

test('a resize past the baked widths, and a theme change, load the engine once', async () => {
  const { page, engine } = await open(1280, '/tests/browser/pages/many.baked.html');
  await page.waitForFunction(() => document.getElementById('c1')?.status === 'baked');
  await page.setViewportSize({ width: 300, height: 800 });
  await page.waitForFunction(() => document.getElementById('c1').status === 'drawn', null, { timeout: 20000 });
  assert.equal(await page.evaluate(() => document.querySelector('#c1 > svg').getAttribute('width')), '300');
  await page.setViewportSize({ width: 1280, height: 800 });
  // Wider again: drawn live from now on, at the spec's 640 px.
  await page.waitForFunction(() => document.querySelector('#c1 > svg').getAttribute('width') === '640', null, { timeout: 20000 });
  // Charts far below never drew: their baked SVG fits again, with no engine.
  await page.waitForFunction(() => document.getElementById('c20').status === 'baked', null, { timeout: 5000 });
  // A theme change on a chart still baked draws it.
  const id = 'c20';
  await page.evaluate(() => document.getElementById('c20').scrollIntoView());
  await page.evaluate((id) => document.getElementById(id).setAttribute('theme', 'dark'), id);
  await page.waitForFunction((id) => document.getElementById(id).status === 'drawn', id, { timeout: 20000 });
  assert.ok(await page.evaluate((id) => document.querySelector(`#${id} > svg`).classList.contains('strata-dark'), id));
  assert.equal(wasmCount(engine), 1);
  await page.close();
});

const SPEC = { title: 'Lifecycle', layers: [{ draw: 'bar', x: 'variety', y: 'harvest_kg' }], size: { width: 500, height: 300 } };

test('removing an element mid-load aborts its fetch, leaves no observer and fires no event', async () => {
  const { page } = await open(1024, '/tests/browser/pages/lifecycle.html');
  await page.evaluate(() => import('/www/strata-chart.js'));
  let release;
  const held = new Promise((r) => (release = r));
  await page.route('**/slow.csv', async (route) => {
    await held;
    await route.fulfill({ status: 200, contentType: 'text/csv', body: 'variety,harvest_kg\nBramley,12\nRusset,7\n' }).catch(() => {});
  });
  const failed = [];
  page.on('requestfailed', (r) => r.url().endsWith('slow.csv') && failed.push(r.failure()?.errorText));
  await page.evaluate((spec) => {
    const el = document.createElement('strata-chart');
    el.id = 'gone';
    el.setAttribute('src', 'slow.csv');
    el.spec = spec;
    document.getElementById('box').append(el);
  }, SPEC);
  await page.waitForFunction(() => document.getElementById('gone').status === 'drawing');
  assert.deepEqual(await page.evaluate(() => window.__observers), { ResizeObserver: 1, IntersectionObserver: 0 });
  await page.evaluate(() => {
    window.__gone = document.getElementById('gone');
    window.__gone.remove();
  });
  release();
  await page.waitForTimeout(800);
  assert.deepEqual(await page.evaluate(() => window.__observers), { ResizeObserver: 0, IntersectionObserver: 0 });
  assert.deepEqual(await page.evaluate(() => window.__events), [], 'no event');
  assert.deepEqual(failed, ['net::ERR_ABORTED'], 'the data request was aborted');
  assert.equal(await page.evaluate(() => window.__gone.querySelector('svg')), null, 'nothing drawn');
  await page.close();
});

test('the last chart leaving the page stops the engine download; the next chart starts it again', async () => {
  const { page } = await open(1024, '/tests/browser/pages/lifecycle.html');
  await page.evaluate(() => import('/www/strata-chart.js'));
  let release;
  const held = new Promise((r) => (release = r));
  await page.route('**/strata_wasm_bg.wasm', async (route) => {
    await held;
    await route.continue().catch(() => {});
  });
  const failed = [];
  const finished = [];
  page.on('requestfailed', (r) => r.url().endsWith('.wasm') && failed.push(r.failure()?.errorText));
  page.on('requestfinished', (r) => r.url().endsWith('.wasm') && finished.push(r.url()));
  const add = (id) =>
    page.evaluate((id) => {
      const el = document.createElement('strata-chart');
      el.id = id;
      el.rows = [{ k: 'a', v: 1 }, { k: 'b', v: 2 }];
      el.spec = { layers: [{ draw: 'bar', x: 'k', y: 'v' }], size: { width: 300 } };
      document.getElementById('box').append(el);
    }, id);
  await add('first');
  await page.waitForFunction(() => document.getElementById('first').status === 'drawing');
  await page.waitForTimeout(200);
  // Moved within the page: nothing stops.
  await page.evaluate(() => document.body.append(document.getElementById('first')));
  await page.waitForTimeout(100);
  assert.deepEqual(failed, []);
  await page.evaluate(() => document.getElementById('first').remove());
  await page.waitForTimeout(300);
  assert.deepEqual(failed, ['net::ERR_ABORTED']);
  release();
  await page.unroute('**/strata_wasm_bg.wasm');
  await add('second');
  await page.waitForFunction(() => document.getElementById('second').status === 'drawn', null, { timeout: 20000 });
  assert.equal(finished.length, 1, 'downloaded again, in full');
  await page.close();
});

test('properties set before the element is defined apply when it upgrades; an outdated drawing leaves the observers alone', async () => {
  const { page } = await open(1024, '/tests/browser/pages/lifecycle.html');
  await page.evaluate((spec) => {
    const el = document.createElement('strata-chart');
    el.id = 'early';
    el.spec = spec;
    el.rows = [{ variety: 'Bramley', harvest_kg: 12 }, { variety: 'Russet', harvest_kg: 7 }, { variety: 'Egremont', harvest_kg: 9 }];
    document.getElementById('box').append(el);
  }, SPEC);
  await page.evaluate(() => import('/www/strata-chart.js'));
  await page.waitForFunction(() => document.getElementById('early').status === 'drawn', null, { timeout: 20000 });
  const table = await page.evaluate(() => [...document.querySelectorAll('#early details.strata-data tbody tr')].map((tr) => tr.firstElementChild.textContent));
  assert.deepEqual(table.sort(), ['Bramley', 'Egremont', 'Russet'], 'the rows set before upgrade were drawn');
  // Three specs in a row over slow data: the first two drawings are outdated before they finish.
  await page.route('**/slow.csv', async (route) => {
    await new Promise((r) => setTimeout(r, 300));
    await route.fulfill({ status: 200, contentType: 'text/csv', body: 'variety,harvest_kg\nBramley,12\nRusset,7\n' }).catch(() => {});
  });
  const aborted = [];
  page.on('requestfailed', (r) => r.url().endsWith('slow.csv') && aborted.push(r.failure()?.errorText));
  const seen = await page.evaluate(() => window.__events.length);
  await page.evaluate(async (spec) => {
    const el = document.getElementById('early');
    el.rows = null;
    el.setAttribute('src', 'slow.csv');
    for (const title of ['one', 'two', 'three']) {
      el.spec = { ...spec, title };
      await new Promise((r) => setTimeout(r, 60));
    }
  }, SPEC);
  await page.waitForFunction(() => document.querySelector('#early svg .strata-title')?.textContent === 'three' && document.getElementById('early').status === 'drawn', null, { timeout: 20000 });
  await page.waitForTimeout(500);
  assert.deepEqual(await page.evaluate((n) => window.__events.slice(n), seen), [{ type: 'strata-render', id: 'early' }], 'only the current drawing fires');
  assert.ok(aborted.length >= 2 && aborted.every((e) => e === 'net::ERR_ABORTED'), `outdated fetches aborted: ${aborted}`);
  assert.deepEqual(await page.evaluate(() => window.__observers), { ResizeObserver: 1, IntersectionObserver: 0 });
  await page.close();
});

test('a width change under 8 px draws nothing; a larger one draws once, after the width settles', async () => {
  const { page } = await open(1024, '/tests/browser/pages/lifecycle.html');
  await page.evaluate(() => import('/www/strata-chart.js'));
  const r = await page.evaluate(async () => {
    const box = document.getElementById('box');
    box.style.width = '500px';
    const el = document.createElement('strata-chart');
    el.rows = [{ k: 'a', v: 1 }, { k: 'b', v: 2 }];
    el.spec = { layers: [{ draw: 'bar', x: 'k', y: 'v' }], size: { width: 640 } };
    const widths = [];
    el.addEventListener('strata-render', (e) => widths.push(e.detail.width));
    box.append(el);
    const wait = (ms) => new Promise((r) => setTimeout(r, ms));
    while (!widths.length) await wait(20);
    box.style.width = '495px'; // under 8 px
    await wait(400);
    const small = widths.length;
    // A drag through several widths: one drawing, at the last.
    for (const w of [480, 460, 440, 420]) {
      box.style.width = `${w}px`;
      await wait(40);
    }
    await wait(600);
    // Wider than size.width: drawn at 640, and no wider.
    box.style.width = '900px';
    await wait(600);
    box.style.width = '1000px';
    await wait(600);
    return { small, widths };
  });
  assert.equal(r.small, 1, 'a 5 px change did not redraw');
  assert.deepEqual(r.widths, [500, 420, 640]);
  await page.close();
});

test('in a flex row a drawn chart takes its own width (only an element holding baked SVGs is a size container)', async () => {
  const { page } = await open(1024, '/tests/browser/pages/lifecycle.html');
  await page.evaluate(() => import('/www/strata-chart.js'));
  const shown = await page.evaluate(async () => {
    const box = document.getElementById('box');
    box.style.display = 'flex';
    const el = document.createElement('strata-chart');
    el.rows = [{ k: 'a', v: 1 }, { k: 'b', v: 2 }];
    el.spec = { layers: [{ draw: 'bar', x: 'k', y: 'v' }], size: { width: 300, height: 200 } };
    box.append(el);
    await el.render();
    return Math.round(el.querySelector('svg').getBoundingClientRect().width);
  });
  assert.equal(shown, 300);
  await page.close();
});

test('a scrollbar that comes and goes with the chart\'s height cannot make it redraw in a loop', async () => {
  const { page } = await open(1024, '/tests/browser/pages/lifecycle.html');
  await page.evaluate(() => import('/www/strata-chart.js'));
  const draws = await page.evaluate(async () => {
    // The box is 600 px wide, or 585 px (a 15 px scrollbar) while the chart
    // is taller than 370 px: a fluid chart 600 px wide is 375 px tall
    // (aspect 1.6), at 585 px it is 366 px.
    const box = document.getElementById('box');
    box.style.width = '600px';
    const el = document.createElement('strata-chart');
    el.rows = [{ k: 'a', v: 1 }, { k: 'b', v: 2 }];
    el.spec = { layers: [{ draw: 'bar', x: 'k', y: 'v' }] };
    let draws = 0;
    el.addEventListener('strata-render', () => (draws += 1));
    new ResizeObserver(() => {
      box.style.width = el.getBoundingClientRect().height > 370 ? '585px' : '600px';
    }).observe(el);
    box.append(el);
    await new Promise((r) => setTimeout(r, 3000));
    return { draws, width: el.querySelector('svg').getAttribute('width') };
  });
  assert.ok(draws.draws >= 2 && draws.draws <= 3, `drawn ${draws.draws} times`);
  assert.equal(draws.width, '585', 'it settles on the narrower drawing, which fits both');
  await page.close();
});
