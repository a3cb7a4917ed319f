// Shared pieces of the browser tests: a static server on 127.0.0.1 for the
// repository, Debian's Chromium driven by playwright-core, and the CLI.
import http from 'node:http';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** The gallery's charts (www/index.html) by id, without `typo`, the chart that fails on purpose. */
export const GALLERY_IDS = [...fs.readFileSync(path.join(ROOT, 'www', 'index.html'), 'utf8').matchAll(/<strata-chart id="([^"]+)"/g)]
  .map((m) => m[1])
  .filter((id) => id !== 'typo');
/** The element's guess of the charts that need the full engine (FULL_WORDS in www/src/strata-chart.js, the readable source). */
export const FULL_WORDS = new RegExp(fs.readFileSync(path.join(ROOT, 'www', 'src', 'strata-chart.js'), 'utf8').match(/const FULL_WORDS = \/(.+)\/;\n/)[1]);
/** The gallery's charts that draw with the full engine (maps, expressions, fitted statistics...). */
export const GALLERY_FULL = [...fs.readFileSync(path.join(ROOT, 'www', 'index.html'), 'utf8').matchAll(/<strata-chart id="([^"]+)"([^>]*)>([^]*?)<\/strata-chart>/g)]
  .filter((m) => GALLERY_IDS.includes(m[1]) && (m[2].includes('shapes-src') || FULL_WORDS.test(m[3])))
  .map((m) => m[1]);
const TARGET = process.env.CARGO_TARGET_DIR ? path.resolve(ROOT, process.env.CARGO_TARGET_DIR) : path.join(ROOT, 'target');
export const CLI = process.env.STRATA_CLI || path.join(TARGET, 'debug', 'strata');

const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.wasm': 'application/wasm',
  '.csv': 'text/csv; charset=utf-8',
  '.tsv': 'text/tab-separated-values; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.md': 'text/plain; charset=utf-8',
  '.arrow': 'application/vnd.apache.arrow.file',
};

/**
 * The tests load what ships: www/strata-chart.js and www/strata-downloads.js,
 * which scripts/build-wasm.sh minifies from www/src/. Stop when they are
 * missing or older than their source, rather than test a stale element.
 */
function checkShippedElement() {
  for (const name of ['strata-chart.js', 'strata-downloads.js']) {
    const built = path.join(ROOT, 'www', name);
    const source = path.join(ROOT, 'www', 'src', name);
    if (!fs.existsSync(built) || fs.statSync(built).mtimeMs < fs.statSync(source).mtimeMs) {
      throw new Error(`www/${name} is missing or older than www/src/${name}: run scripts/build-wasm.sh (or scripts/build-wasm.sh --element)`);
    }
  }
}

/** Serve the repository read-only on 127.0.0.1; resolves to { url, close }. */
export function serve() {
  checkShippedElement();
  const server = http.createServer((req, res) => {
    const u = new URL(req.url, 'http://127.0.0.1');
    const file = path.normalize(path.join(ROOT, decodeURIComponent(u.pathname)));
    if (!file.startsWith(ROOT + path.sep) || !fs.existsSync(file) || fs.statSync(file).isDirectory()) {
      res.writeHead(404, { 'content-type': 'text/plain' });
      res.end('not found');
      return;
    }
    res.writeHead(200, { 'content-type': TYPES[path.extname(file)] || 'application/octet-stream' });
    fs.createReadStream(file).pipe(res);
  });
  return new Promise((resolve) => {
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      resolve({ url: `http://127.0.0.1:${port}`, close: () => new Promise((r) => server.close(r)) });
    });
  });
}

/** Debian's Chromium, headless, with a scratch profile; `options` go to the context (e.g. `javaScriptEnabled`). */
export async function launch(options = {}) {
  const scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'strata-chromium-'));
  const executablePath = fs.existsSync('/usr/lib/chromium/chromium') ? '/usr/lib/chromium/chromium' : '/usr/bin/chromium';
  const context = await chromium.launchPersistentContext(scratch, {
    executablePath,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
    env: { ...process.env, TMPDIR: scratch, XDG_CONFIG_HOME: scratch, XDG_CACHE_HOME: scratch },
    ...options,
  });
  return {
    context,
    async close() {
      await context.close();
      fs.rmSync(scratch, { recursive: true, force: true });
    },
  };
}

/** Run the CLI; returns { status, stdout, stderr }. */
export function cli(args) {
  try {
    const stdout = execFileSync(CLI, args, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
    return { status: 0, stdout, stderr: '' };
  } catch (e) {
    return { status: e.status, stdout: e.stdout || '', stderr: e.stderr || '' };
  }
}

/**
 * Wait until every <strata-chart> on the page has drawn, failed or kept a
 * baked SVG. Charts far below the fold wait to be scrolled near; here they
 * are told to draw now (`render()`), as a reader scrolling would.
 */
export async function settled(page, timeout = 15000) {
  await page.waitForFunction(
    () =>
      [...document.querySelectorAll('strata-chart')].every((el) => {
        if (el.status === 'waiting') el.render();
        return el.status === 'drawn' || el.status === 'baked' || el.querySelector(':scope > .strata-error');
      }),
    null,
    { timeout, polling: 50 }
  );
}

/** playwright-core's Chromium driver, for the benches under bench/browser (which have no node_modules of their own). */
export { chromium };
