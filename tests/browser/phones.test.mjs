// Readers on phones: every gallery chart at 360, 768 and 1280 px, drawn live
// by the element and baked by `strata bake` with scripting disabled. Text is
// never shown smaller than the size the engine gave it, no text overlaps
// another or leaves the chart, and the page never scrolls sideways.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, serve, launch, cli, settled, GALLERY_IDS } from './harness.mjs';

const BAKED = path.join(ROOT, 'www', 'index.phones.html');
const WIDTHS = [360, 768, 1280];
const IDS = GALLERY_IDS;

let server, live, noScript;

before(async () => {
  // Default widths: each chart's own and 360.
  const r = cli(['bake', '--root', ROOT, path.join(ROOT, 'www', 'index.html'), '-o', BAKED]);
  assert.match(r.stderr, new RegExp(`baked ${IDS.length} charts`), r.stderr);
  server = await serve();
  live = await launch();
  noScript = await launch({ javaScriptEnabled: false });
});

after(async () => {
  await live?.close();
  await noScript?.close();
  await server?.close();
  fs.rmSync(BAKED, { force: true });
});

/**
 * Measure every chart the reader sees, in the page. Each text's box is its
 * getBBox() (advance widths across; the font's ascent and descent down,
 * trimmed by 15 % at top and bottom to the ink of a line) carried to the
 * screen by its CTM, so rotated labels are compared as rotated boxes
 * (separating-axis test on the two quadrilaterals).
 */
function measure(ids) {
  const quad = (t) => {
    const b = t.getBBox();
    const m = t.getScreenCTM();
    const inset = b.height * 0.15;
    const pts = [
      [b.x + 0.5, b.y + inset],
      [b.x + b.width - 0.5, b.y + inset],
      [b.x + b.width - 0.5, b.y + b.height - inset],
      [b.x + 0.5, b.y + b.height - inset],
    ];
    return pts.map(([x, y]) => [m.a * x + m.c * y + m.e, m.b * x + m.d * y + m.f]);
  };
  const axes = (q) => [0, 1].map((i) => {
    const [x1, y1] = q[i];
    const [x2, y2] = q[i + 1];
    return [y1 - y2, x2 - x1];
  });
  const project = (q, [ax, ay]) => {
    const v = q.map(([x, y]) => x * ax + y * ay);
    return [Math.min(...v), Math.max(...v)];
  };
  const overlap = (p, q) =>
    [...axes(p), ...axes(q)].every((a) => {
      const [p0, p1] = project(p, a);
      const [q0, q1] = project(q, a);
      return p1 > q0 && q1 > p0;
    });
  const out = {};
  for (const id of ids) {
    const el = document.getElementById(id);
    const svgs = [...el.querySelectorAll(':scope > svg')].filter((s) => getComputedStyle(s).display !== 'none');
    if (svgs.length !== 1) {
      out[id] = { shown: svgs.length };
      continue;
    }
    const svg = svgs[0];
    const box = svg.getBoundingClientRect();
    const small = [];
    const outside = [];
    const overlaps = [];
    const texts = [...svg.querySelectorAll('text')].filter((t) => t.textContent.trim() && t.getBBox().width > 0);
    const quads = texts.map(quad);
    texts.forEach((t, i) => {
      // The engine's size for this text, and the size it has on screen.
      const theme = Number(t.getAttribute('font-size'));
      const m = t.getScreenCTM();
      const onScreen = parseFloat(getComputedStyle(t).fontSize) * Math.hypot(m.a, m.b);
      if (!(onScreen >= 0.95 * theme)) small.push(`${t.textContent} ${onScreen.toFixed(1)} < ${theme}`);
      if (quads[i].some(([x, y]) => x < box.left - 1 || x > box.right + 1 || y < box.top - 1 || y > box.bottom + 1)) outside.push(t.textContent);
      for (let j = i + 1; j < texts.length; j++) {
        if (overlap(quads[i], quads[j])) overlaps.push(`"${t.textContent}" / "${texts[j].textContent}"`);
      }
    });
    out[id] = { shown: 1, width: Number(svg.getAttribute('width')), drawnAt: box.width, texts: texts.length, small, outside, overlaps };
  }
  out.scroll = { page: document.documentElement.scrollWidth, viewport: document.documentElement.clientWidth };
  return out;
}

function check(result, where) {
  assert.ok(result.scroll.page <= result.scroll.viewport, `${where}: the page scrolls sideways (${result.scroll.page} > ${result.scroll.viewport})`);
  for (const id of IDS) {
    const r = result[id];
    assert.equal(r.shown, 1, `${where} #${id}: one chart shows`);
    assert.ok(r.texts > 0, `${where} #${id}: has text`);
    assert.deepEqual(r.small, [], `${where} #${id}: text smaller than its size`);
    assert.deepEqual(r.outside, [], `${where} #${id}: text leaves the chart`);
    assert.deepEqual(r.overlaps, [], `${where} #${id}: texts overlap`);
  }
}

for (const width of WIDTHS) {
  test(`live at ${width} px: every chart fits, text at its size, nothing overlaps`, async () => {
    const page = await live.context.newPage();
    await page.setViewportSize({ width, height: 800 });
    await page.goto(`${server.url}/www/index.html`);
    await settled(page, 30000);
    await page.evaluate(() => document.fonts.ready);
    const result = await page.evaluate(measure, IDS);
    check(result, `live ${width}`);
    for (const id of IDS) {
      // Drawn at the container's width, up to the spec's: never scaled.
      assert.ok(Math.abs(result[id].drawnAt - result[id].width) < 1, `#${id} drawn at ${result[id].width}, shown at ${result[id].drawnAt}`);
    }
    if (width === 360) assert.ok(IDS.every((id) => result[id].width <= 360), 'narrow drawings on a phone');
    await page.close();
  });

  test(`baked, scripts disabled, at ${width} px: the sheet shows the chart that fits`, async () => {
    const page = await noScript.context.newPage();
    await page.setViewportSize({ width, height: 800 });
    await page.goto(`${server.url}/www/index.phones.html`);
    await page.evaluate(() => document.fonts.ready);
    assert.equal(await page.evaluate(() => typeof customElements.get('strata-chart')), 'undefined', 'no script ran');
    const result = await page.evaluate(measure, IDS);
    check(result, `baked ${width}`);
    if (width === 360) assert.ok(IDS.every((id) => result[id].width === 360), 'the 360 px drawings show on a phone');
    else assert.ok(IDS.every((id) => result[id].width > 360), 'the wide drawings show on wider screens');
    await page.close();
  });
}
