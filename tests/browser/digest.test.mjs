// `data.sha256` in the page: the core engine has no SHA-256 of its own, the
// element hands it the digest of the fetched bytes from the browser's
// SubtleCrypto; a wrong digest shows the CLI's very message in the chart's
// place, and a page without SubtleCrypto (plain http) refuses the data
// rather than skip the check.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ROOT, serve, launch, cli } from './harness.mjs';

const DATA = 'examples/data/orchard_harvest.csv';
// The right digest from node's own SHA-256 (OpenSSL), not from Strata.
const RIGHT = crypto.createHash('sha256').update(fs.readFileSync(path.join(ROOT, DATA))).digest('hex');
const spec = (sha256) => ({ data: { sha256 }, size: { width: 480 }, layers: [{ draw: 'bar', x: 'variety', y: 'harvest_kg' }] });

let server, browser;

before(async () => {
  server = await serve();
  browser = await launch();
});

after(async () => {
  await browser?.close();
  await server?.close();
});

/** Draw `spec` with the demo data in a fresh page; `noSubtle` takes SubtleCrypto away, as on a plain-http page. */
async function draw(s, noSubtle = false) {
  const page = await browser.context.newPage();
  if (noSubtle) await page.addInitScript(() => Object.defineProperty(Crypto.prototype, 'subtle', { get: () => undefined }));
  await page.goto(`${server.url}/tests/browser/pages/digest.html`);
  const got = await page.evaluate(
    async ({ s, src }) => {
      await customElements.whenDefined('strata-chart');
      const el = document.createElement('strata-chart');
      el.setAttribute('src', src);
      el.setAttribute('loading', 'eager');
      const errors = new Promise((r) => el.addEventListener('strata-error', (e) => r(e.detail.errors)));
      el.spec = s;
      document.body.append(el);
      await el.render();
      return {
        status: el.status,
        svg: el.svgText,
        box: el.querySelector(':scope > .strata-error')?.textContent ?? null,
        errors: el.status === 'error' ? await errors : [],
      };
    },
    { s, src: `/${DATA}` }
  );
  await page.close();
  return got;
}

/** The CLI on the same spec and data: { status, stderr, svg }. */
function render(s) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'strata-digest-'));
  fs.writeFileSync(path.join(dir, 's.json'), JSON.stringify(s));
  const r = cli(['render', path.join(dir, 's.json'), '--data', path.join(ROOT, DATA), '-o', path.join(dir, 's.svg')]);
  const svg = r.status === 0 ? fs.readFileSync(path.join(dir, 's.svg'), 'utf8') : null;
  fs.rmSync(dir, { recursive: true, force: true });
  return { ...r, svg };
}

test('the right digest draws, as the CLI does', async () => {
  const got = await draw(spec(RIGHT));
  assert.equal(got.box, null, got.box);
  assert.equal(got.status, 'drawn');
  const c = render(spec(RIGHT));
  assert.equal(c.status, 0, c.stderr);
  assert.equal(got.svg.trimEnd(), c.svg.trimEnd(), 'the same SVG bytes as the CLI');
});

test('a wrong digest shows the CLI\'s message in the chart\'s place', async () => {
  const wrong = '0'.repeat(64);
  const got = await draw(spec(wrong));
  assert.equal(got.status, 'error');
  assert.deepEqual(
    got.errors.map((e) => [e.code, e.path]),
    [['data.sha256_mismatch', 'data.sha256']]
  );
  assert.ok(got.errors[0].message.includes(RIGHT) && got.errors[0].message.includes(wrong), got.errors[0].message);
  const c = render(spec(wrong));
  assert.notEqual(c.status, 0);
  // The CLI prints `strata: SPEC: error at PATH: MESSAGE` and `  hint: HINT`;
  // the element `Chart error at PATH: MESSAGE` and `Hint: HINT`.
  const fromCli = c.stderr
    .trim()
    .replace(/^strata: .*?: error at /, 'Chart error at ')
    .replace(/\n {2}hint: /, '\nHint: ');
  assert.equal(got.box, fromCli);
});

test('without SubtleCrypto (plain http) the data is refused, never drawn unchecked', async () => {
  const got = await draw(spec(RIGHT), true);
  assert.equal(got.status, 'error');
  assert.deepEqual(
    got.errors.map((e) => [e.code, e.path]),
    [['data.sha256_unchecked', 'data.sha256']]
  );
  assert.match(got.box, /at data\.sha256: this page cannot check the data's SHA-256 digest/);
  assert.match(got.box, /https/);
});
