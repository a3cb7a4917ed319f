// The installable package: scripts/package.sh builds the folder and `npm
// pack`s it; the tarball installs into a scratch project (offline: a local
// tarball needs no registry), resolves through its `exports`, typechecks
// with its declarations (TypeScript), and draws a chart in Chromium with the
// same bytes as the CLI.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import { serve, launch, settled, cli, ROOT } from './harness.mjs';

const TSC = path.join(ROOT, 'tests', 'browser', 'node_modules', '.bin', 'tsc');
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; img-src 'self' data:";
const SPEC = { title: 'Rain <mm> by town', layers: [{ draw: 'bar', x: 'town', y: 'rain_mm' }], size: { width: 420, height: 260 } };
// Invented demo data.
const CSV = 'town,rain_mm\nAsh,12.5\nBirch,30\nCedar,7.25\n';

let out, site, tarball, server, browser;

before(() => {
  fs.mkdirSync(path.join(ROOT, 'target'), { recursive: true });
  // Under the repository, so the test server can serve the scratch site.
  out = fs.mkdtempSync(path.join(ROOT, 'target', 'package-test-'));
  tarball = execFileSync('bash', [path.join(ROOT, 'scripts', 'package.sh'), out], { encoding: 'utf8' }).trim().split('\n').pop();
  site = path.join(out, 'site');
  fs.mkdirSync(site);
  fs.writeFileSync(path.join(site, 'package.json'), JSON.stringify({ name: 'scratch-site', private: true, type: 'module' }));
  execFileSync('npm', ['install', '--offline', '--no-audit', '--no-fund', '--loglevel=error', tarball], { cwd: site, stdio: 'pipe' });
});

after(async () => {
  await browser?.close();
  await server?.close();
  if (out) fs.rmSync(out, { recursive: true, force: true });
});

test('npm pack gives a tarball with the element, its types, the theme, the fonts and the engine', () => {
  const files = execFileSync('tar', ['-tzf', tarball], { encoding: 'utf8' }).trim().split('\n').sort();
  for (const f of [
    'package/package.json',
    'package/strata-chart.js',
    'package/strata-chart.d.ts',
    'package/strata-downloads.js',
    'package/strata-theme.css',
    'package/fonts/AtkinsonHyperlegibleNext-Regular.ttf',
    'package/fonts/AtkinsonHyperlegibleNext-Bold.ttf',
    'package/pkg/strata_wasm.js',
    'package/pkg/strata_wasm_bg.wasm',
    'package/pkg/strata_wasm_full.js',
    'package/pkg/strata_wasm_full_bg.wasm',
    'package/pkg/strata_wasm_arrow.js',
    'package/pkg/strata_wasm_arrow_bg.wasm',
  ]) {
    assert.ok(files.includes(f), `${f} in ${files.join(', ')}`);
  }
  const pkg = JSON.parse(fs.readFileSync(path.join(site, 'node_modules', 'strata-chart', 'package.json'), 'utf8'));
  assert.equal(pkg.type, 'module');
  // The version is the workspace's (Cargo.toml).
  const cargo = fs.readFileSync(path.join(ROOT, 'Cargo.toml'), 'utf8');
  assert.equal(pkg.version, /^version = "([^"]+)"/m.exec(cargo)[1]);
});

test('the exports resolve (Node resolution, as bundlers follow it)', () => {
  const resolve = (spec) =>
    execFileSync(process.execPath, ['--input-type=module', '-e', `console.log(import.meta.resolve(${JSON.stringify(spec)}))`], {
      cwd: site,
      encoding: 'utf8',
    }).trim();
  assert.match(resolve('strata-chart'), /node_modules\/strata-chart\/strata-chart\.js$/);
  assert.match(resolve('strata-chart/strata-theme.css'), /node_modules\/strata-chart\/strata-theme\.css$/);
  assert.match(resolve('strata-chart/pkg/strata_wasm.js'), /node_modules\/strata-chart\/pkg\/strata_wasm\.js$/);
});

test('the type declarations describe the properties, methods and events', () => {
  const tsc = (source) => {
    fs.writeFileSync(path.join(site, 'use.ts'), source);
    try {
      execFileSync(TSC, ['--noEmit', '--strict', '--target', 'es2022', '--module', 'nodenext', '--moduleResolution', 'nodenext', '--lib', 'es2022,dom', 'use.ts'], {
        cwd: site,
        encoding: 'utf8',
        stdio: 'pipe',
      });
      return '';
    } catch (e) {
      return String(e.stdout) + String(e.stderr);
    }
  };
  const good = `import { StrataChart, describeError, type StrataDiagnostic, type StrataStatus } from 'strata-chart';
const el = document.querySelector('strata-chart');
if (el) {
  const chart: StrataChart = el;
  chart.spec = { layers: [{ draw: 'point', x: 'a', y: 'b' }] };
  chart.rows = [{ a: 1, b: 2 }];
  chart.table = new Uint8Array(0);
  const svg: string = chart.svgText + chart.tableHtml;
  const status: StrataStatus = chart.status;
  void status;
  const done: Promise<void> = chart.render();
  chart.addEventListener('strata-render', (e) => { const w: number = e.detail.width + e.detail.height; const n = e.detail.warnings.length; });
  chart.addEventListener('strata-error', (e) => { const d: StrataDiagnostic[] = e.detail.errors; describeError(d[0]); });
  document.addEventListener('strata-error', (e) => e.detail.errors.map((d) => d.path ?? d.code));
  void svg; void done;
}
`;
  assert.equal(tsc(good), '');
  // And they are no blanket `any`: misuse is caught.
  assert.match(tsc(`import 'strata-chart';\nconst el = document.querySelector('strata-chart')!;\nel.svgText = 'x';\n`), /read-only/);
  assert.match(tsc(`import 'strata-chart';\nconst el = document.querySelector('strata-chart')!;\nel.status = 'drawn';\n`), /read-only/);
  assert.match(tsc(`import 'strata-chart';\nconst el = document.querySelector('strata-chart')!;\nconst s: 'drawn' | 'error' = el.status;\n`), /baked|not assignable/);
  assert.match(tsc(`import 'strata-chart';\nconst el = document.querySelector('strata-chart')!;\nel.addEventListener('strata-render', (e) => e.detail.errors);\n`), /errors/);
  assert.match(tsc(`import 'strata-chart';\nconst el = document.querySelector('strata-chart')!;\nel.spec = { title: 'no layers' };\n`), /layers/);
});

test('the installed package draws the same bytes as the CLI, under a strict CSP', async () => {
  fs.writeFileSync(path.join(site, 'rain.csv'), CSV);
  const json = JSON.stringify(SPEC).replace(/</g, '\\u003c');
  fs.writeFileSync(
    path.join(site, 'index.html'),
    `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${CSP}"><link rel="icon" href="data:,">
<link rel="stylesheet" href="node_modules/strata-chart/strata-theme.css"></head><body>
<strata-chart id="c" src="rain.csv"><script type="application/json">${json}</script></strata-chart>
<script type="module" src="node_modules/strata-chart/strata-chart.js"></script></body></html>`
  );
  fs.writeFileSync(path.join(site, 'spec.json'), JSON.stringify(SPEC));
  const r = cli(['render', path.join(site, 'spec.json'), '--data', path.join(site, 'rain.csv'), '-o', path.join(site, 'cli.svg')]);
  assert.equal(r.status, 0, r.stderr);

  server = await serve();
  browser = await launch();
  const page = await browser.context.newPage();
  const errors = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
  await page.goto(`${server.url}/${path.relative(ROOT, site)}/index.html`);
  await settled(page);
  const drawn = await page.evaluate(() => document.getElementById('c').svgText);
  assert.ok(drawn.startsWith('<svg'), await page.evaluate(() => document.getElementById('c').textContent));
  assert.equal(drawn, fs.readFileSync(path.join(site, 'cli.svg'), 'utf8'));
  // The engine came from the installed package.
  const wasm = await page.evaluate(() => performance.getEntriesByType('resource').map((e) => e.name).filter((n) => n.endsWith('.wasm')));
  assert.ok(wasm.length > 0 && wasm.every((n) => n.includes('/site/node_modules/strata-chart/pkg/')), wasm.join(', '));
  assert.deepEqual(errors, []);
});
