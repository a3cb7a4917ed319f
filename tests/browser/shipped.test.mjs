// What pages load is minified (scripts/build-wasm.sh runs terser): the
// element and its download module from www/src/ into www/, the wasm-bindgen
// glue in place in www/pkg/. Every other browser test loads these files; this
// one checks they are the minified ones, that no eval crept in (a strict CSP
// forbids it), and that their modules still export what pages and the
// element use.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, serve, launch } from './harness.mjs';

const ELEMENT = ['strata-chart.js', 'strata-downloads.js'];
const GLUE = ['strata_wasm.js', 'strata_wasm_full.js', 'strata_wasm_arrow.js'];
const read = (...p) => fs.readFileSync(path.join(ROOT, ...p), 'utf8');

let server, browser, page;

before(async () => {
  server = await serve();
  browser = await launch();
  page = await browser.context.newPage();
  await page.goto(`${server.url}/tests/browser/pages/lifecycle.html`);
});

after(async () => {
  await browser?.close();
  await server?.close();
});

test('the element pages load is the minified source, without its comments', () => {
  for (const name of ELEMENT) {
    const source = read('www', 'src', name);
    const shipped = read('www', name);
    assert.ok(shipped.length < source.length * 0.7, `www/${name}: ${shipped.length} bytes, its source ${source.length}`);
    assert.ok(!/^\s*\/\//m.test(shipped) && !shipped.includes('/**'), `www/${name} still has comments`);
  }
  // The element finds the engine and the download module relative to itself.
  const element = read('www', 'strata-chart.js');
  for (const url of ['./pkg/strata_wasm.js', './pkg/strata_wasm_full.js', './pkg/strata_wasm_arrow.js', './strata-downloads.js']) {
    assert.ok(element.includes(url), url);
  }
});

test('the shipped glue is minified', () => {
  for (const name of GLUE) {
    const glue = read('www', 'pkg', name);
    assert.ok(!glue.includes('/**') && !/^ {4}/m.test(glue), `www/pkg/${name} is not minified`);
  }
});

test('no shipped script evaluates strings as code', () => {
  for (const file of [...ELEMENT.map((n) => ['www', n]), ...GLUE.map((n) => ['www', 'pkg', n])]) {
    assert.doesNotMatch(read(...file), /\beval\s*\(|\bnew\s+Function\s*\(|\bFunction\s*\(\s*["'`]/, file.join('/'));
  }
});

test('the minified modules keep their exports', async () => {
  const exports = await page.evaluate(async () => {
    const names = async (url) => Object.keys(await import(url)).sort();
    return {
      element: await names('/www/strata-chart.js'),
      downloads: await names('/www/strata-downloads.js'),
      core: await names('/www/pkg/strata_wasm.js'),
      full: await names('/www/pkg/strata_wasm_full.js'),
      arrow: await names('/www/pkg/strata_wasm_arrow.js'),
    };
  });
  assert.deepEqual(exports.element, ['StrataChart', 'describeError']);
  assert.ok(['download', 'tableCsv'].every((n) => exports.downloads.includes(n)), exports.downloads.join(', '));
  for (const kind of ['core', 'full']) {
    for (const n of ['default', 'initSync', 'render', 'render_columns']) assert.ok(exports[kind].includes(n), `${kind}: ${n}`);
    // Maps (shapes) are the full engine's only.
    assert.equal(exports[kind].includes('render_with_shapes'), kind === 'full', `${kind}: render_with_shapes`);
  }
  assert.ok(['default', 'decode'].every((n) => exports.arrow.includes(n)), exports.arrow.join(', '));
});
