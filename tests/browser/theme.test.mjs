// Theme "auto" follows the reader's colour-scheme preference through
// www/strata-theme.css, with no redraw and the same SVG bytes.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { serve, launch, settled, cli, ROOT } from './harness.mjs';

let server, browser;

before(async () => {
  server = await serve();
  browser = await launch();
});

after(async () => {
  await browser?.close();
  await server?.close();
});

async function look(scheme) {
  const page = await browser.context.newPage();
  await page.emulateMedia({ colorScheme: scheme });
  await page.goto(`${server.url}/www/index.html`);
  await settled(page);
  const r = await page.evaluate(async () => {
    await document.fonts.ready;
    const el = document.getElementById('points');
    const bg = el.querySelector('svg .strata-background');
    const title = el.querySelector('svg .strata-title');
    return {
      svgText: el.svgText,
      background: getComputedStyle(bg).fill,
      title: getComputedStyle(title).fill,
      font: [...document.fonts].some((f) => f.family.replace(/"/g, '') === 'Atkinson Hyperlegible Next' && f.status === 'loaded'),
    };
  });
  await page.close();
  return r;
}

test('auto theme: light and dark readers see their colours, from the same bytes', async () => {
  const light = await look('light');
  const dark = await look('dark');
  assert.equal(light.svgText, dark.svgText);
  assert.equal(light.background, 'rgb(255, 255, 255)');
  assert.notEqual(dark.background, light.background);
  assert.notEqual(dark.title, light.title);
  // Dark background, light text: luminance order flips.
  const lum = (c) => c.match(/\d+/g).slice(0, 3).reduce((a, b) => a + Number(b), 0);
  assert.ok(lum(dark.background) < lum(dark.title));
  assert.ok(lum(light.background) > lum(light.title));
});

test('the bundled font loads from the theme sheet', async () => {
  const light = await look('light');
  assert.ok(light.font, 'Atkinson Hyperlegible Next loaded');
});

// Issue 12 item 13: in "auto" dark mode the panel names kept the light
// theme's dark text on the dark background. The CLI's SVG of a chart with
// panels (theme auto) under the theme sheet, in each colour scheme: every
// themed text, panel names included, reads in the scheme's text colour.
async function panelLook(scheme, svg) {
  const page = await browser.context.newPage();
  await page.emulateMedia({ colorScheme: scheme });
  // On the server's origin, so the sheet loads like the gallery's.
  await page.goto(`${server.url}/www/strata-theme.css`);
  await page.setContent(`<!doctype html><link rel="stylesheet" href="${server.url}/www/strata-theme.css"><body>${svg}</body>`, { waitUntil: 'load' });
  const r = await page.evaluate(() => {
    const fill = (sel) => [...document.querySelectorAll(sel)].map((n) => getComputedStyle(n).fill);
    return {
      background: fill('svg .strata-background')[0],
      title: fill('svg .strata-title')[0],
      panels: fill('svg .strata-panel-title'),
    };
  });
  await page.close();
  return r;
}

test('auto theme: panel names follow the dark scheme like every other text', async () => {
  const out = cli(['render', `${ROOT}/examples/panels.json`]);
  assert.equal(out.status, 0, out.stderr);
  assert.match(out.stdout, /class="strata strata-auto"/);
  const light = await panelLook('light', out.stdout);
  const dark = await panelLook('dark', out.stdout);
  assert.equal(light.panels.length, 4);
  assert.equal(dark.panels.length, 4);
  const lum = (c) => c.match(/\d+/g).slice(0, 3).reduce((a, b) => a + Number(b), 0);
  for (const p of dark.panels) {
    assert.equal(p, dark.title, 'a panel name in the dark scheme takes the text colour');
    assert.ok(lum(p) > lum(dark.background), `panel name ${p} on ${dark.background}`);
  }
  for (const p of light.panels) assert.equal(p, light.title);
});
