// Cold first paint of <strata-chart> pages in Debian's Chromium, each run in
// a new browser context (empty cache), medians of RUNS runs:
//   - a 10k-row CSV line chart, on loopback and with Chromium's network
//     emulation at 10 Mbit/s and 40 ms latency;
//   - a 1M-row CSV histogram, on loopback;
// each against a baseline measured in the same run: the same page baked
// (`strata bake`) and served with no script, whose first paint is the chart.
// It also checks that the engine's request starts before the data request
// finishes (the element fetches both in parallel). The pages are served
// from 127.0.0.1 with gzip (level 6, as static hosts commonly do), so the
// emulated network carries the bytes a real one would. A third page per
// case adds the preload tags docs/element.md suggests.
//
//   node bench/browser/first-paint.mjs [--runs 7] [--before GIT_REV]
//
// --before REV also times the element as it was at REV (its www/strata-chart.js,
// with today's engine), for before/after figures.
// Needs www/pkg (scripts/build-wasm.sh), target/debug/strata or STRATA_CLI,
// and npm ci in tests/browser. Generated pages go to target/bench-paint/.
import fs from 'node:fs';
import http from 'node:http';
import zlib from 'node:zlib';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import { ROOT, cli, chromium } from '../../tests/browser/harness.mjs';

const args = process.argv.slice(2);
const opt = (name, dflt) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : dflt;
};
const RUNS = Number(opt('--runs', 7));
const BEFORE = opt('--before', null);
const OUT = path.join(ROOT, 'target', 'bench-paint');
fs.mkdirSync(OUT, { recursive: true });

function seeded(seed) {
  // SplitMix32-style generator: the same data every run.
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

/** Invented data: a random walk (10k rows) and normal-ish readings (1M rows). */
function writeData() {
  const r = seeded(7);
  let walk = 0;
  const line = ['day,level'];
  for (let i = 0; i < 10000; i++) {
    walk += r() - 0.5;
    line.push(`${i},${walk.toFixed(3)}`);
  }
  fs.writeFileSync(path.join(OUT, 'line10k.csv'), line.join('\n') + '\n');
  const big = path.join(OUT, 'hist1m.csv');
  if (!fs.existsSync(big)) {
    const h = seeded(11);
    const rows = ['reading'];
    for (let i = 0; i < 1000000; i++) rows.push((h() + h() + h() + h() - 2).toFixed(4));
    fs.writeFileSync(big, rows.join('\n') + '\n');
  }
}

const SPECS = {
  line10k: { csv: 'line10k.csv', spec: { title: 'A random walk of 10,000 days', source: 'Invented demo data', layers: [{ draw: 'line', x: 'day', y: 'level' }], size: { width: 800, height: 400 } } },
  hist1m: { csv: 'hist1m.csv', spec: { title: 'A million readings', source: 'Invented demo data', layers: [{ draw: 'bar', x: 'reading', stat: { bin: {} } }], size: { width: 800, height: 400 } } },
};

/** The live page (module from `element`), its baked copy with no script. */
function writePages(name, element = '../../www/strata-chart.js') {
  const { csv, spec } = SPECS[name];
  const preload = `<link rel="modulepreload" href="${element}">
<link rel="modulepreload" href="../../www/pkg/strata_wasm.js">
<link rel="preload" href="../../www/pkg/strata_wasm_bg.wasm" as="fetch" type="application/wasm" crossorigin>
<link rel="preload" href="${csv}" as="fetch" crossorigin>`;
  const page = (body, script, head = '') => `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${name}</title><link rel="icon" href="data:,">
${head}<link rel="stylesheet" href="../../www/strata-theme.css"></head>
<body>
<strata-chart id="chart" src="${csv}"><script type="application/json">${JSON.stringify(spec)}</script>${body}</strata-chart>
${script ? `<script type="module" src="${element}"></script>` : ''}
</body></html>
`;
  const tag = element.includes('before') ? '-before' : '';
  fs.writeFileSync(path.join(OUT, `${name}${tag}.html`), page('', true));
  if (tag) return;
  fs.writeFileSync(path.join(OUT, `${name}-preload.html`), page('', true, preload + '\n'));
  const unbaked = path.join(OUT, `${name}-static.html`);
  fs.writeFileSync(unbaked, page('', false));
  const r = cli(['bake', '--root', ROOT, '--widths', '800', unbaked]);
  if (r.status !== 0) throw new Error(r.stderr);
}

/** The element as it was at a git revision, beside a link to today's engine. */
function writeBefore(rev) {
  const dir = path.join(OUT, 'www-before');
  fs.mkdirSync(dir, { recursive: true });
  const show = (file) => execFileSync('git', ['-C', ROOT, 'show', `${rev}:${file}`], { stdio: ['ignore', 'pipe', 'ignore'] });
  const out = path.join(dir, 'strata-chart.js');
  try {
    // Since the build minifies the element, a revision keeps its source in www/src/: minify it as build-wasm.sh does.
    fs.writeFileSync(path.join(dir, 'strata-chart.src.js'), show('www/src/strata-chart.js'));
    execFileSync(path.join(ROOT, 'tests/browser/node_modules/.bin/terser'), [path.join(dir, 'strata-chart.src.js'), '--module', '--ecma', '2020', '--compress', 'passes=2', '--mangle', '--output', out]);
  } catch {
    fs.writeFileSync(out, show('www/strata-chart.js'));
  }
  const pkg = path.join(dir, 'pkg');
  if (!fs.existsSync(pkg)) fs.symlinkSync(path.join(ROOT, 'www', 'pkg'), pkg);
  for (const name of Object.keys(SPECS)) writePages(name, 'www-before/strata-chart.js');
}

const TYPES = { '.html': 'text/html; charset=utf-8', '.js': 'text/javascript', '.css': 'text/css', '.wasm': 'application/wasm', '.csv': 'text/csv', '.ttf': 'font/ttf' };
/** A static server for the repository that gzips what it sends when the browser accepts it. */
function serveGzip() {
  const cache = new Map();
  const server = http.createServer((req, res) => {
    const u = new URL(req.url, 'http://127.0.0.1');
    const file = path.normalize(path.join(ROOT, decodeURIComponent(u.pathname)));
    if (!file.startsWith(ROOT + path.sep) || !fs.existsSync(file) || fs.statSync(file).isDirectory()) {
      res.writeHead(404);
      res.end();
      return;
    }
    const type = TYPES[path.extname(file)] || 'application/octet-stream';
    const gzip = /\bgzip\b/.test(req.headers['accept-encoding'] || '') && type !== 'font/ttf';
    if (!gzip) {
      res.writeHead(200, { 'content-type': type });
      fs.createReadStream(file).pipe(res);
      return;
    }
    const key = `${file}:${fs.statSync(file).mtimeMs}`;
    if (!cache.has(key)) cache.set(key, zlib.gzipSync(fs.readFileSync(file), { level: 6 }));
    res.writeHead(200, { 'content-type': type, 'content-encoding': 'gzip', 'cache-control': 'max-age=3600' });
    res.end(cache.get(key));
  });
  return new Promise((resolve) => {
    server.listen(0, '127.0.0.1', () => resolve({ url: `http://127.0.0.1:${server.address().port}`, close: () => new Promise((r) => server.close(r)) }));
  });
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/**
 * One cold load in a new context: ms from navigation start to the first
 * frame painted after the chart is in the page (live: after `strata-render`;
 * baked: the first contentful paint, the chart being the page's content).
 */
async function once(browser, url, { live, network }) {
  const context = await browser.newContext({ viewport: { width: 1024, height: 768 } });
  const page = await context.newPage();
  if (network) {
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 40, downloadThroughput: (10e6 / 8), uploadThroughput: (10e6 / 8) });
  }
  await page.addInitScript((live) => {
    window.__painted = new Promise((resolve) => {
      if (live) {
        document.addEventListener('strata-render', () => requestAnimationFrame(() => requestAnimationFrame(() => resolve(performance.now()))), { once: true });
        document.addEventListener('strata-error', (e) => resolve(`error: ${JSON.stringify(e.detail.errors)}`), { once: true });
      } else {
        new PerformanceObserver((list) => {
          const fcp = list.getEntries().find((e) => e.name === 'first-contentful-paint');
          if (fcp) resolve(fcp.startTime);
        }).observe({ type: 'paint', buffered: true });
      }
    });
  }, live);
  await page.goto(url);
  const ms = await page.evaluate(() => window.__painted);
  if (typeof ms !== 'number') throw new Error(`${url}: ${ms}`);
  const timing = await page.evaluate(() =>
    performance.getEntriesByType('resource').map((e) => ({ name: new URL(e.name).pathname, start: e.startTime, end: e.responseEnd }))
  );
  await context.close();
  return { ms, timing };
}

/**
 * Every variant of a case, RUNS times, interleaved (baseline, live, preload,
 * before, then again), so a change in the machine's load falls on all alike.
 */
async function interleaved(browser, variants) {
  for (const v of variants) await once(browser, v.url, v.o); // warm the server and the OS file cache, not the browser's
  const out = variants.map(() => []);
  for (let i = 0; i < RUNS; i++) {
    for (const [k, v] of variants.entries()) out[k].push(await once(browser, v.url, v.o));
  }
  return out;
}

writeData();
for (const name of Object.keys(SPECS)) writePages(name);
if (BEFORE) writeBefore(BEFORE);

const executablePath = fs.existsSync('/usr/lib/chromium/chromium') ? '/usr/lib/chromium/chromium' : '/usr/bin/chromium';
const browser = await chromium.launch({ executablePath, headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--disable-background-networking', '--disable-component-update'] });
const server = await serveGzip();
const base = `${server.url}/target/bench-paint`;
const rows = [];
try {
  const cases = [
    ['10k-row line, loopback', 'line10k', {}],
    ['10k-row line, 10 Mbit/s + 40 ms', 'line10k', { network: true }],
    ['1M-row histogram, loopback', 'hist1m', {}],
  ];
  for (const [label, name, o] of cases) {
    const variants = [
      { url: `${base}/${name}-static.html`, o: { ...o, live: false } },
      { url: `${base}/${name}.html`, o: { ...o, live: true } },
      { url: `${base}/${name}-preload.html`, o: { ...o, live: true } },
    ];
    if (BEFORE) variants.push({ url: `${base}/${name}-before.html`, o: { ...o, live: true } });
    const [baseline, live, preloaded, before = null] = await interleaved(browser, variants);
    // The engine's request against the data's: starts before the data has finished?
    const order = live.map(({ timing }) => {
      const wasm = timing.find((t) => t.name.endsWith('strata_wasm_bg.wasm'));
      const data = timing.find((t) => t.name.endsWith(SPECS[name].csv));
      return { wasmStart: wasm.start, dataStart: data.start, dataEnd: data.end };
    });
    const b = median(baseline.map((r) => r.ms));
    const l = median(live.map((r) => r.ms));
    const row = {
      label,
      baseline: b,
      live: l,
      ratio: l / b,
      preload: median(preloaded.map((r) => r.ms)),
      before: before ? median(before.map((r) => r.ms)) : null,
      wasmStart: median(order.map((o) => o.wasmStart)),
      dataStart: median(order.map((o) => o.dataStart)),
      dataEnd: median(order.map((o) => o.dataEnd)),
      engineFirst: order.every((o) => o.wasmStart < o.dataEnd),
      runs: live.map((r) => Math.round(r.ms)),
    };
    if (before) {
      const w = before.map(({ timing }) => timing.find((t) => t.name.endsWith('strata_wasm_bg.wasm')).start);
      row.beforeWasmStart = median(w);
    }
    rows.push(row);
    console.log(
      `${label}: first paint ${l.toFixed(0)} ms (runs ${row.runs.join(', ')}), baked static page ${b.toFixed(0)} ms, ratio ${row.ratio.toFixed(2)}` +
        `; with preload tags ${row.preload.toFixed(0)} ms (ratio ${(row.preload / b).toFixed(2)})` +
        (before ? `; before (${BEFORE}) ${row.before.toFixed(0)} ms, engine request at ${row.beforeWasmStart.toFixed(0)} ms` : '') +
        `; engine request at ${row.wasmStart.toFixed(0)} ms, data ${row.dataStart.toFixed(0)}-${row.dataEnd.toFixed(0)} ms` +
        `, engine starts before the data finishes in every run: ${row.engineFirst}`
    );
  }
} finally {
  await browser.close();
  await server.close();
}
fs.writeFileSync(path.join(OUT, 'results.json'), JSON.stringify({ runs: RUNS, before: BEFORE, rows }, null, 2));
