// Theme "auto" follows the reader's colour-scheme preference through
// www/strata-theme.css, with no redraw and the same SVG bytes.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { serve, launch, settled } from './harness.mjs';

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
