// Markdown charts: pages converted from Markdown by markdown-it (a general
// purpose converter from npm, which writes a ```strata fence as
// <pre><code class="language-strata">) are baked by `strata bake FOLDER`;
// the result shows the chart with scripts disabled, the chart is the CLI's
// bytes for the same spec, the element redraws the same bytes when scripts
// run, baking twice gives the same bytes, and a failing block is named by
// its page, its line and the JSON path.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import markdownit from 'markdown-it';
import { spawnSync } from 'node:child_process';
import { serve, launch, cli, CLI, ROOT } from './harness.mjs';

const SRC = path.join(ROOT, 'tests', 'browser', 'pages', 'markdown');
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; img-src 'self' data:";

let out, site, server;

/** A page as a static site generator would write it: a template around the converted Markdown. */
function page(markdown) {
  const body = markdownit().render(fs.readFileSync(path.join(SRC, markdown), 'utf8'));
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${CSP}">
<link rel="icon" href="data:,">
<link rel="stylesheet" href="/www/strata-theme.css">
<title>Post</title>
</head>
<body>
${body}<script type="module" src="/www/strata-chart.js"></script>
</body>
</html>
`;
}

before(async () => {
  fs.mkdirSync(path.join(ROOT, 'target'), { recursive: true });
  // Under the repository, so the test server can serve the scratch site.
  out = fs.mkdtempSync(path.join(ROOT, 'target', 'markdown-test-'));
  site = path.join(out, 'public');
  fs.mkdirSync(path.join(site, 'posts', 'deep'), { recursive: true });
  fs.mkdirSync(path.join(site, 'data'));
  fs.copyFileSync(path.join(SRC, 'rain.csv'), path.join(site, 'data', 'rain.csv'));
  fs.writeFileSync(path.join(site, 'posts', 'rain.html'), page('post.md'));
  server = await serve();
});

after(async () => {
  await server?.close();
  if (out) fs.rmSync(out, { recursive: true, force: true });
});

let baked;

test('markdown-it writes the fence as the block bake looks for', () => {
  const html = fs.readFileSync(path.join(site, 'posts', 'rain.html'), 'utf8');
  assert.match(html, /<pre><code class="language-strata">\{\n {2}&quot;title&quot;: &quot;Rain &lt;mm&gt; in three towns&quot;/);
});

test('strata bake FOLDER bakes the Markdown chart; baking twice gives the same bytes', () => {
  // The CLI with its standard error kept on success too.
  const r = spawnSync(CLI, ['bake', site], { encoding: 'utf8' });
  assert.equal(r.status, 0, r.stderr);
  // Not a terminal: one summary line, no progress bar.
  assert.equal(r.stderr, 'strata: baked 1 chart in 1 page\n');
  baked = fs.readFileSync(path.join(site, 'posts', 'rain.html'), 'utf8');
  assert.ok(!baked.includes('language-strata'), 'the block is gone');
  assert.ok(baked.includes('<pre><code class="language-js">'), 'other code stays');
  // The spec inline, `<` written as \u003c (no text can end the script), `&` as itself.
  assert.ok(baked.includes('"title": "Rain \\u003cmm> in three towns"'), baked);
  assert.ok(baked.includes('"subtitle": "A wet week & a dry one"'), baked);
  // The chart is the CLI's bytes for the same spec, data read relative to the page.
  const spec = path.join(out, 'spec.json');
  fs.writeFileSync(spec, JSON.stringify({ ...JSON.parse(fs.readFileSync(path.join(SRC, 'post.md'), 'utf8').split('```strata\n')[1].split('```')[0]), data: undefined }));
  const svg = cli(['render', spec, '--data', path.join(site, 'data', 'rain.csv')]);
  assert.equal(svg.status, 0, svg.stderr);
  // At its own width (420 px) first, then at 360 px for phones, then the table.
  const unmarked = baked.replace(/ strata-baked( strata-(from|until)-\d+)*/g, '');
  assert.ok(unmarked.includes(`</script>${svg.stdout.trimEnd()}<svg `), 'baked SVG equals the CLI render');
  assert.equal((baked.match(/<svg xmlns/g) || []).length, 2);
  assert.match(baked, /<\/svg><details class="strata-data">/);
  const again = cli(['bake', site]);
  assert.equal(again.status, 0, again.stderr);
  assert.equal(fs.readFileSync(path.join(site, 'posts', 'rain.html'), 'utf8'), baked);
});

test('the baked page shows the chart with scripts disabled', async () => {
  const browser = await launch({ javaScriptEnabled: false });
  try {
    const p = await browser.context.newPage();
    await p.goto(`${server.url}/${path.relative(ROOT, site)}/posts/rain.html`);
    const shown = await p.evaluate(() => {
      const svg = document.querySelector('strata-chart > svg');
      const box = svg && svg.getBoundingClientRect();
      return {
        defined: !!customElements.get('strata-chart'),
        width: box && Math.round(box.width),
        height: box && Math.round(box.height),
        bars: svg ? svg.querySelectorAll('[data-row], rect').length : 0,
        title: svg ? svg.textContent.includes('Rain <mm> in three towns') : false,
      };
    });
    assert.equal(shown.defined, false, 'no script ran');
    assert.deepEqual([shown.width, shown.height], [420, 260]);
    assert.ok(shown.bars >= 4, `background and three bars, got ${shown.bars}`);
    assert.equal(shown.title, true);
  } finally {
    await browser.close();
  }
});

test('with scripts, the element redraws the same bytes', async () => {
  const browser = await launch();
  try {
    const p = await browser.context.newPage();
    const errors = [];
    p.on('pageerror', (e) => errors.push(String(e)));
    const wasm = [];
    p.on('request', (r) => r.url().endsWith('.wasm') && wasm.push(r.url()));
    await p.goto(`${server.url}/${path.relative(ROOT, site)}/posts/rain.html`);
    // The baked chart fits: the element keeps it and loads no engine.
    await p.waitForFunction(() => document.querySelector('strata-chart').status === 'baked', null, { timeout: 15000 });
    assert.deepEqual(wasm, []);
    // Asked to draw, it draws the baked bytes.
    const [drawn, inPage] = await p.evaluate(async () => {
      const el = document.querySelector('strata-chart');
      await el.render();
      return [el.svgText, document.querySelectorAll('strata-chart > svg').length];
    });
    assert.ok(baked.replace(/ strata-baked( strata-(from|until)-\d+)*/g, '').includes(drawn.trimEnd()));
    assert.equal(inPage, 1, 'the drawing replaced the baked SVGs');
    assert.deepEqual(errors, []);
  } finally {
    await browser.close();
  }
});

test('a failing block names its page, its line and the JSON path, and stays as code', () => {
  const file = path.join(site, 'posts', 'deep', 'typo.html');
  const html = page('typo.md').replace('../data/rain.csv', '../../data/rain.csv');
  fs.writeFileSync(file, html);
  // The line of the misspelt column in the generated page, found by text.
  const line = html.split('\n').findIndex((l) => l.includes('&quot;y&quot;: &quot;rain_mn&quot;')) + 1;
  const r = cli(['bake', site]);
  assert.equal(r.status, 1);
  assert.ok(r.stderr.includes(`${file}:${line}: chart 1 (line `), r.stderr);
  assert.match(r.stderr, /error at layers\[0\]\.y: there is no column `rain_mn`/);
  assert.match(r.stderr, /strata: baked 1 chart in 2 pages, 1 chart failed\n/);
  assert.equal(fs.readFileSync(file, 'utf8'), html, 'the failing page is left as it was');
  // check finds the same, in JSON for CI.
  const c = cli(['check', '--format', 'json', site]);
  assert.equal(c.status, 2);
  const d = JSON.parse(c.stdout).diagnostics.find((x) => x.file === file);
  assert.deepEqual([d.line, d.path, d.code], [line, 'layers[0].y', 'spec.unknown_column']);
});
