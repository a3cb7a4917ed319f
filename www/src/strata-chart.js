// <strata-chart>: draws a Strata chart spec as SVG in the page; see docs/element.md.
//
//   <strata-chart src="data.csv">
//     <script type="application/json">{ "layers": [ ... ] }</script>
//   </strata-chart>
//   <script type="module" src="strata/strata-chart.js"></script>
//
// One engine for the page, fetched and compiled as this module runs unless
// every chart keeps a baked SVG that fits. Charts draw at their container's
// width up to `size.width`, and far below the fold they wait. Failures show
// a message in the chart's place and fire `strata-error`; nothing is thrown.
// Nothing from the spec or data runs as script or is parsed as HTML; styles
// go through CSSOM and a constructed sheet, so a strict CSP holds.
//
// This is the readable source (www/src/). scripts/build-wasm.sh minifies it
// into www/strata-chart.js, the file pages load, beside pkg/ and
// strata-downloads.js: the relative URLs below are from there.

// Engine modules by name: the wasm-bindgen glue's URL; the compiled module
// sits beside it as `<name>_bg.wasm`.
const ENGINE_URLS = {
  core: new URL('./pkg/strata_wasm.js', import.meta.url),
  // The Arrow add-on: decodes Arrow IPC into columns either engine reads
  // (render_columns). Loaded only for Arrow data.
  arrow: new URL('./pkg/strata_wasm_arrow.js', import.meta.url),
  // The full engine (the core + maps, expressions, unpivot, fitted
  // statistics and box plots), loaded instead of the core
  // for specs that need it (the core refuses those).
  full: new URL('./pkg/strata_wasm_full.js', import.meta.url),
};

// A spec that needs the full engine, by its words (spec::needs_full in
// crates/strata/src/spec/full.rs; tests/full_engine.rs keeps the two in
// step). A word this misses costs a second drawing, never a wrong chart.
const FULL_WORDS = /"(shapes|derive|where|unpivot|fit|window|interval|panels)"\s*:|"density"\s*:\s*\{|"(draw|stat)"\s*:\s*"(region|box)"|"kind"\s*:\s*"(map|polar|steps)"|"coords"\s*:\s*"(map|polar)"/;
/** Charts the core engine turned away: they draw with the full engine. */
const needsFull = new WeakSet();

/** The engine a chart needs, from its spec's text (default: the inline spec): 'full' or 'core'. */
function kindOf(el, text = el.querySelector(':scope > script[type="application/json"]')?.textContent) {
  return needsFull.has(el) || el.hasAttribute('shapes-src') || FULL_WORDS.test(text || '') ? 'full' : 'core';
}
const SVG_NS = 'http://www.w3.org/2000/svg';

const engines = {};
const loaded = {};
const compiled = {};
const downloading = {}; // kind -> AbortController of a .wasm still arriving
let instances = 0;

/** The engine's `.wasm` beside its glue. */
function wasmUrl(kind) {
  const url = new URL(ENGINE_URLS[kind]);
  url.pathname = url.pathname.replace(/\.js$/, '_bg.wasm');
  return url;
}

/** Fetch and compile (while downloading) an engine's WebAssembly once; a fresh instance after a trap reuses it. */
function compileEngine(kind) {
  if (!compiled[kind]) {
    const ctl = new AbortController();
    const p = (async () => {
      const res = await fetch(wasmUrl(kind), { credentials: 'same-origin', signal: ctl.signal });
      if (!res.ok) throw new Error(`could not load the chart engine: HTTP ${res.status}`);
      const streaming = typeof WebAssembly.compileStreaming === 'function' && /^application\/wasm\b/.test(res.headers.get('content-type') || '');
      return streaming ? WebAssembly.compileStreaming(res) : WebAssembly.compile(await res.arrayBuffer());
    })();
    compiled[kind] = p;
    downloading[kind] = ctl;
    p.then(
      () => {
        if (downloading[kind] === ctl) delete downloading[kind];
      },
      () => {
        if (compiled[kind] === p) delete compiled[kind];
        if (downloading[kind] === ctl) delete downloading[kind];
      }
    );
  }
  return compiled[kind];
}

/** When the last chart has left the page, stop engine downloads under way (a later chart starts again). */
function stopEngineDownloads() {
  if (document.querySelector('strata-chart')) return;
  for (const [kind, ctl] of Object.entries(downloading)) {
    delete downloading[kind];
    delete compiled[kind];
    delete engines[kind];
    ctl.abort();
  }
}

/**
 * Load an engine once for the page: glue and WebAssembly in parallel. After
 * a trap the next chart loads a fresh instance: a new glue URL (`instance`
 * query) gives a new module record and so new memory.
 */
function loadEngine(kind = 'core') {
  if (!engines[kind]) {
    const url = new URL(ENGINE_URLS[kind]);
    if (instances > 0) url.searchParams.set('instance', String(instances));
    const loading = Promise.all([import(url.href), compileEngine(kind)]).then(async ([m, module]) => {
      await m.default({ module_or_path: module });
      loaded[kind] = m;
      return m;
    });
    engines[kind] = loading;
    // A failed load may be retried by the next chart.
    loading.catch(() => {
      if (engines[kind] === loading) delete engines[kind];
    });
  }
  return engines[kind];
}

const warmed = new WeakSet();
/** Draw a tiny chart while the data is on its way: WebAssembly functions compile on their first call. */
function warmUp(engine) {
  if (warmed.has(engine)) return;
  warmed.add(engine);
  try {
    engine.render('{"layers":[{"draw":"line","x":"a","y":"b"},{"draw":"point","x":"a","y":"b"}],"title":"w"}', new TextEncoder().encode('a,b\n1,2\n2,3\n3,1\n'), 'warm.csv', 320);
  } catch {
    /* a warm-up is a nicety; the real drawing reports its own errors */
  }
}

/** Forget an engine that trapped (a panic, a stack overflow, out of memory). */
function dropEngine(kind, module) {
  if (loaded[kind] !== module) return; // already replaced by a fresh one
  delete loaded[kind];
  delete engines[kind];
  instances += 1;
}
/** How long a spec or data fetch may take, in seconds, when the `timeout` attribute does not say. */
const DEFAULT_TIMEOUT_S = 30;

/** Arrow IPC file ("ARROW1") or stream (continuation marker 0xFFFFFFFF). */
function isArrow(bytes, name, spec) {
  if (spec && typeof spec.data === 'object' && spec.data && spec.data.format) return spec.data.format === 'arrow';
  if (bytes && bytes.length >= 6) {
    const magic = String.fromCharCode(...bytes.subarray(0, 6));
    if (magic === 'ARROW1') return true;
    if (bytes[0] === 0xff && bytes[1] === 0xff && bytes[2] === 0xff && bytes[3] === 0xff) return true;
  }
  return /\.(arrow|arrows|ipc|feather)$/i.test(name || '');
}

let styled = false;
/** Element defaults through a constructed stylesheet: allowed under a strict CSP. */
function adoptStyles() {
  if (styled || typeof CSSStyleSheet === 'undefined' || !('adoptedStyleSheets' in document)) return;
  styled = true;
  try {
    const sheet = new CSSStyleSheet();
    sheet.replaceSync(
      'strata-chart{display:block;max-width:100%;position:relative}' +
      'strata-chart>.strata-tooltip{position:absolute;z-index:1;pointer-events:none;max-width:18em;' +
      'font:13px/1.35 system-ui,sans-serif;padding:.3em .55em;border-radius:3px;' +
      'color:var(--strata-tooltip-text,#fff);background:var(--strata-tooltip-background,#1d232b)}' +
      'strata-chart>.strata-tooltip[hidden]{display:none}' +
      'strata-chart>svg.strata{display:block;max-width:100%;height:auto}' +
      'strata-chart>.strata-downloads{display:flex;flex-wrap:wrap;gap:.4em;margin:.35em 0 0;font:13px/1.4 system-ui,sans-serif}' +
      'strata-chart>.strata-downloads>button{font:inherit;padding:.2em .7em;cursor:pointer}' +
      'strata-chart>details.strata-data{font:13px/1.4 system-ui,sans-serif;margin:.25em 0 0}' +
      'strata-chart>details.strata-data>summary{cursor:pointer}' +
      'strata-chart>details.strata-data>table{display:block;max-height:24em;overflow:auto;border-collapse:collapse;margin:.4em 0}' +
      'strata-chart .strata-data :is(th,td){padding:.15em .6em;text-align:left;white-space:nowrap}' +
      'strata-chart .strata-data td.strata-num{text-align:right;font-variant-numeric:tabular-nums}' +
      'strata-chart .strata-data caption{text-align:left;font-weight:600;padding:.2em 0}' +
      'strata-chart>.strata-error{font:14px/1.4 system-ui,sans-serif;padding:.75em 1em;' +
      'border:1px solid var(--strata-error-border,#b3261e);color:var(--strata-error-text,#8c1d18);' +
      'background:var(--strata-error-background,#fdf3f2);white-space:pre-wrap;overflow-wrap:anywhere}'
    );
    document.adoptedStyleSheets = [...document.adoptedStyleSheets, sheet];
  } catch {
    /* styling is a nicety; drawing does not depend on it */
  }
}

let policy;
/** A Trusted Types policy for the engine's SVG, where the page enforces them. */
function trusted(svgText) {
  if (typeof window.trustedTypes === 'undefined') return svgText;
  if (policy === undefined) {
    try {
      policy = window.trustedTypes.createPolicy('strata', { createHTML: (s) => s });
    } catch {
      policy = null;
    }
  }
  return policy ? policy.createHTML(svgText) : svgText;
}

/** One diagnostic from the engine as a line of text. */
export function describeError(d) {
  let where = '';
  if (d.path) where += ` at ${d.path}`;
  if (d.line != null) where += d.column != null ? ` (data line ${d.line}, column ${d.column})` : ` (data line ${d.line})`;
  return `${d.severity === 'warning' ? 'Warning' : 'Chart error'}${where}: ${d.message}${d.hint ? `\nHint: ${d.hint}` : ''}`;
}

class ChartError extends Error {
  constructor(errors) {
    super(errors.map(describeError).join('\n'));
    this.errors = errors;
  }
}

const fail = (code, message, extra = {}) => new ChartError([{ severity: 'error', code, message, ...extra }]);

/** Width changes smaller than this (CSS px) never redraw, so a scrollbar's coming and going cannot loop. */
const MIN_CHANGE = 8;
/** How long (ms) the container's width must hold still before a redraw. */
const SETTLE_MS = 150;
/** A redraw wider than a width the chart shrank from this recently (ms) is a flip-flop and is skipped. */
const FLIP_FLOP_MS = 2000;
/** Charts within this many viewport heights of the viewport draw; the rest wait. */
const NEAR = 1.5;

/** The width of an element's content box in CSS px (0 when it is not laid out). */
function contentWidth(el) {
  const r = el.getBoundingClientRect();
  if (!r.width) return 0;
  const cs = getComputedStyle(el);
  const edges = ['paddingLeft', 'paddingRight', 'borderLeftWidth', 'borderRightWidth'].reduce((s, k) => s + (parseFloat(cs[k]) || 0), 0);
  return Math.max(0, r.width - edges);
}

/** The `strata bake` SVGs inside an element. */
const bakedSvgs = (el) => [...el.querySelectorAll(':scope > svg.strata-baked')];
const shown = (node) => getComputedStyle(node).display !== 'none';

/** The one baked SVG the theme sheet shows, if it fits unscaled (or the container is not laid out). */
function bakedFit(el, cw) {
  const visible = bakedSvgs(el).filter(shown);
  if (visible.length !== 1) return null;
  const w = Number(visible[0].getAttribute('width'));
  if (!(w > 0)) return null;
  return cw === 0 || w <= cw + 0.5 ? visible[0] : null;
}

export class StrataChart extends HTMLElement {
  static get observedAttributes() {
    return ['src', 'spec-src', 'shapes-src', 'theme', 'timeout', 'downloads', 'loading'];
  }

  #spec = null; // object set from JavaScript
  #rows = null;
  #table = null;
  #svgText = '';
  #tableHtml = '';
  #generation = 0;
  #scheduled = false;
  #drawing = Promise.resolve();
  #status = 'idle';
  #connected = false;
  #ready = false; // connected once: attribute changes from then on redraw
  #force = false; // something changed since the bake: the chart must be drawn live
  #ctl = null; // aborts the current drawing's fetches
  #resize = null;
  #near = null;
  #settle = 0;
  #specWidth = 0; // the spec's size.width (0: none), as last read
  #drawnWidth = 0;
  #lastShrink = null; // { from, at }: the last redraw narrower than the one before

  constructor() {
    super();
    // Properties set on the element before it was defined sit on the
    // instance and hide the accessors: move them through the setters.
    for (const p of ['spec', 'rows', 'table']) {
      if (Object.prototype.hasOwnProperty.call(this, p)) {
        const v = this[p];
        delete this[p];
        this[p] = v;
      }
    }
  }

  connectedCallback() {
    adoptStyles();
    this.addEventListener('focusin', this.#showTip);
    this.addEventListener('focusout', this.#hideTip);
    this.addEventListener('keydown', this.#moveFocus);
    this.#connected = true;
    this.#ready = true;
    this.#watchSize();
    if (this.#status === 'drawn' && !this.#force) {
      // Moved within the page: the drawing stays; the size watch redraws if the new place is narrower.
      this.#updateDownloads();
      return;
    }
    if (!this.#force && bakedFit(this, contentWidth(this))) {
      // A baked chart that fits: no engine, no drawing.
      this.#status = 'baked';
      this.#updateDownloads();
      return;
    }
    // Start the engine now, in parallel with this chart's data.
    loadEngine(kindOf(this)).catch(() => {});
    this.#reserve();
    this.#request();
  }

  /** Hold the height the first drawing will take (an inline spec's size), so nothing jumps and far charts stay far. */
  #reserve() {
    if (this.querySelector(':scope > svg')) return;
    let size = null;
    try {
      const spec = this.#spec || JSON.parse(this.querySelector(':scope > script[type="application/json"]')?.textContent || 'null');
      if (!spec || typeof spec !== 'object') return; // a spec-src spec: its size is not known yet
      size = typeof spec.size === 'object' && spec.size ? spec.size : {};
    } catch {
      return;
    }
    const num = (v) => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : 0);
    const cw = contentWidth(this);
    const width = Math.min(4000, Math.max(120, num(size.width) ? Math.min(num(size.width), cw || num(size.width)) : cw || 640));
    const height = num(size.height) || width / (num(size.aspect) || (width <= 400 ? 1.1 : 1.6));
    this.style.minHeight = `${Math.round(Math.min(4000, Math.max(80, height)))}px`;
  }

  disconnectedCallback() {
    this.#connected = false;
    this.#generation += 1; // a drawing under way now finishes silently
    this.#ctl?.abort();
    this.#ctl = null;
    this.#resize?.disconnect();
    this.#resize = null;
    this.#unwatchNear();
    clearTimeout(this.#settle);
    if (this.#status === 'drawing' || this.#status === 'waiting') this.#status = 'idle';
    // After a move (removed and inserted again at once) a chart is back by then.
    queueMicrotask(stopEngineDownloads);
  }

  attributeChangedCallback(name, old, value) {
    // On upgrade every attribute reports once before connectedCallback: not a change.
    if (!this.#ready || old === value) return;
    if (name === 'downloads') {
      this.#updateDownloads();
      return;
    }
    if (name === 'loading') {
      if (this.#status === 'waiting' && value === 'eager') this.#request();
      return;
    }
    this.#force = true;
    if (this.#connected) {
      loadEngine(kindOf(this)).catch(() => {});
      this.#request();
    }
  }

  /** A mark with `tooltip` columns took keyboard focus: show its words beside it. */
  #showTip = (event) => {
    const mark = event.target;
    if (!(mark instanceof SVGElement) || !mark.hasAttribute('tabindex')) return;
    let tooltip = this.querySelector(':scope > .strata-tooltip');
    if (!tooltip) {
      tooltip = document.createElement('div');
      tooltip.className = 'strata-tooltip';
      tooltip.setAttribute('aria-hidden', 'true'); // the mark's aria-label already speaks
      this.append(tooltip);
    }
    tooltip.textContent = mark.getAttribute('aria-label') || '';
    const box = this.getBoundingClientRect();
    const at = mark.getBoundingClientRect();
    tooltip.style.left = `${Math.round(at.right - box.left + 6)}px`;
    tooltip.style.top = `${Math.round(at.top - box.top - 4)}px`;
    tooltip.hidden = false;
  };

  /** One tab stop per chart; arrows, Home and End move it from mark to mark (WAI-ARIA roving tabindex). */
  #moveFocus = (event) => {
    const mark = event.target;
    if (!(mark instanceof SVGElement) || !mark.hasAttribute('tabindex')) return;
    const svg = mark.ownerSVGElement;
    if (!svg || svg.parentElement !== this) return;
    const marks = [...svg.querySelectorAll('[tabindex]')];
    const at = marks.indexOf(mark);
    const to = { ArrowRight: at + 1, ArrowDown: at + 1, ArrowLeft: at - 1, ArrowUp: at - 1, Home: 0, End: marks.length - 1 }[event.key];
    if (to === undefined || at < 0) return;
    event.preventDefault();
    const next = marks[Math.max(0, Math.min(marks.length - 1, to))];
    if (next === mark) return;
    mark.setAttribute('tabindex', '-1');
    next.setAttribute('tabindex', '0');
    next.focus();
  };

  #hideTip = () => {
    const tooltip = this.querySelector(':scope > .strata-tooltip');
    if (tooltip) tooltip.hidden = true;
  };

  /** The spec as an object; setting it redraws. */
  get spec() {
    return this.#spec;
  }
  set spec(value) {
    this.#spec = value;
    this.#changed();
  }
  /** Records to draw instead of fetched data. */
  set rows(value) {
    this.#rows = value;
    this.#changed();
  }
  /** Arrow IPC bytes to draw instead of fetched data. */
  set table(value) {
    this.#table = value;
    this.#changed();
  }
  /** The SVG text of the last drawing, exactly as the engine wrote it ('' while a baked chart is kept). */
  get svgText() {
    return this.#svgText;
  }
  /** The data table HTML of the last drawing, exactly as the engine wrote it. */
  get tableHtml() {
    return this.#tableHtml;
  }
  /** 'idle', 'waiting' (far below the fold), 'drawing', 'drawn', 'baked' (a baked SVG that fits, no engine) or 'error'. */
  get status() {
    return this.#status;
  }

  #changed() {
    this.#force = true;
    if (this.#connected) {
      loadEngine(kindOf(this)).catch(() => {});
      this.#request();
    }
  }

  /** Draw now (near or not, baked or not); resolves when the current spec shows, waiting for newer drawings too. */
  async render() {
    this.#draw();
    for (;;) {
      const p = this.#drawing;
      await p;
      if (p === this.#drawing && !this.#scheduled) return;
      if (this.#scheduled) await new Promise((r) => queueMicrotask(r));
    }
  }

  /** A drawing is needed: now when the chart is near the viewport (or `loading="eager"`), else when it comes near. */
  #request() {
    if (!this.#connected) return;
    if (this.getAttribute('loading') === 'eager' || this.#isNear() || typeof IntersectionObserver === 'undefined') {
      this.#unwatchNear();
      this.#schedule();
      return;
    }
    this.#status = 'waiting';
    if (this.#near) return;
    const io = new IntersectionObserver(
      (entries) => {
        if (this.#near !== io || !entries.some((e) => e.isIntersecting)) return;
        this.#unwatchNear();
        this.#schedule();
      },
      { rootMargin: `${NEAR * 100}% 0px` }
    );
    io.observe(this);
    this.#near = io;
  }

  #isNear() {
    const r = this.getBoundingClientRect();
    if (!r.width && !r.height) return true; // not laid out (hidden): draw, as a page showing it later expects
    const h = window.innerHeight || document.documentElement.clientHeight || 0;
    return r.bottom >= -NEAR * h && r.top <= h + NEAR * h;
  }

  #unwatchNear() {
    this.#near?.disconnect();
    this.#near = null;
  }

  #watchSize() {
    if (this.#resize || typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver((entries) => {
      if (this.#resize !== ro) return;
      const w = entries[entries.length - 1].contentRect.width;
      // Wait until the width has settled.
      clearTimeout(this.#settle);
      this.#settle = setTimeout(() => {
        if (this.#resize === ro) this.#widthChanged(w);
      }, SETTLE_MS);
    });
    ro.observe(this);
    this.#resize = ro;
  }

  /** The width to draw at in a container `cw` px wide: the container's, up to the spec's `size.width`. */
  #targetWidth(cw) {
    if (!(cw > 0)) return this.#specWidth || 640;
    const w = Math.max(1, Math.floor(cw + 0.01));
    return this.#specWidth ? Math.min(this.#specWidth, w) : w;
  }

  #widthChanged(cw) {
    if (!this.#connected) return;
    if (this.#status === 'baked' || (this.#status === 'waiting' && !this.#force && bakedSvgs(this).length)) {
      // The sheet shows the baked SVG that fits; draw only when none does.
      if (bakedFit(this, cw)) {
        this.#unwatchNear();
        this.#status = 'baked';
      } else if (this.#status === 'baked') {
        loadEngine(kindOf(this)).catch(() => {});
        this.#request();
      }
      return;
    }
    // Waiting and drawing charts read the width when they draw; errors do not depend on it.
    if (this.#status !== 'drawn') return;
    const target = this.#targetWidth(cw);
    if (Math.abs(target - this.#drawnWidth) < MIN_CHANGE) return;
    // Wider again, to about the width just left: a scrollbar came and went
    // because the drawing's height changed. The narrower drawing fits both.
    const s = this.#lastShrink;
    if (target > this.#drawnWidth && s && Math.abs(target - s.from) < MIN_CHANGE && performance.now() - s.at < FLIP_FLOP_MS) return;
    this.#request();
  }

  #schedule() {
    if (this.#scheduled) return;
    this.#scheduled = true;
    queueMicrotask(() => {
      this.#scheduled = false;
      if (this.#connected) this.#draw();
    });
  }

  #draw() {
    this.#unwatchNear();
    this.#ctl?.abort(); // an outdated drawing's fetches stop
    const ctl = new AbortController();
    this.#ctl = ctl;
    const p = this.#drawOnce(ctl.signal);
    this.#drawing = p;
    return p;
  }

  /** Seconds a fetch may take: the `timeout` attribute, else 30. */
  #timeoutSeconds() {
    const t = Number(this.getAttribute('timeout'));
    return Number.isFinite(t) && t > 0 ? t : DEFAULT_TIMEOUT_S;
  }

  /** Fetch within the time limit (body included); `signal` aborts it when the drawing is outdated or the element leaves. */
  async #fetchBytes(url, code, what, path, signal) {
    const seconds = this.#timeoutSeconds();
    const ctl = new AbortController();
    const stop = () => ctl.abort();
    if (signal.aborted) ctl.abort();
    else signal.addEventListener('abort', stop, { once: true });
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      ctl.abort();
    }, seconds * 1000);
    const extra = path ? { path } : {};
    try {
      let res;
      try {
        res = await fetch(url, { signal: ctl.signal });
      } catch (e) {
        throw timedOut
          ? fail(code, `the ${what} from ${url} did not arrive within ${seconds} s`, { ...extra, hint: 'check the address, or give the element a longer timeout="seconds"' })
          : fail(code, `could not load the ${what} from ${url}: ${e.message}`, extra);
      }
      if (!res.ok) {
        throw fail(code, `could not load the ${what} from ${url}: HTTP ${res.status} ${res.statusText}`.trim(), extra);
      }
      try {
        return new Uint8Array(await res.arrayBuffer());
      } catch (e) {
        throw timedOut
          ? fail(code, `the ${what} from ${url} did not finish arriving within ${seconds} s`, { ...extra, hint: 'check the address, or give the element a longer timeout="seconds"' })
          : fail(code, `could not load the ${what} from ${url}: ${e.message}`, extra);
      }
    } finally {
      clearTimeout(timer);
      signal.removeEventListener('abort', stop);
    }
  }

  async #specSource(signal) {
    if (this.#spec) return { text: JSON.stringify(this.#spec), base: document.baseURI };
    const specSrc = this.getAttribute('spec-src');
    if (specSrc) {
      const url = new URL(specSrc, document.baseURI);
      const bytes = await this.#fetchBytes(url, 'spec.fetch', 'spec', null, signal);
      return { text: new TextDecoder().decode(bytes), base: url.href };
    }
    const script = this.querySelector(':scope > script[type="application/json"]');
    if (!script) {
      throw fail('spec.missing', 'this <strata-chart> has no spec', {
        hint: 'put the spec in a child <script type="application/json">, or set the spec-src attribute',
      });
    }
    return { text: script.textContent, base: document.baseURI };
  }

  #fetchData(url, path, signal) {
    return path === 'data.url'
      ? this.#fetchBytes(url, 'data.fetch', 'data', path, signal)
      : this.#fetchBytes(url, 'shapes.fetch', 'shapes', path, signal);
  }

  async #drawOnce(signal) {
    const generation = ++this.#generation;
    this.#status = 'drawing';
    try {
      const source = await this.#specSource(signal);
      let text = source.text;
      let spec = null;
      try {
        spec = JSON.parse(text);
      } catch {
        // Leave it to the engine, which names the line and column.
      }
      let name = '';
      let dataUrl = null;
      let table = null;
      let changed = false;
      const isObject = spec && typeof spec === 'object' && !Array.isArray(spec);
      if (isObject) {
        const theme = this.getAttribute('theme');
        if (theme) {
          spec.theme = theme;
          changed = true;
        }
        if (this.#rows) {
          spec.data = { ...(typeof spec.data === 'object' && spec.data ? spec.data : {}), rows: this.#rows };
          delete spec.data.url;
          changed = true;
        }
        if (this.#table) {
          table = this.#table instanceof Uint8Array ? this.#table : new Uint8Array(this.#table);
          name = 'table.arrow';
        } else if (!this.#rows) {
          const declared = typeof spec.data === 'string' ? spec.data : spec.data && spec.data.url;
          const src = this.getAttribute('src');
          dataUrl = src ? new URL(src, document.baseURI) : declared ? new URL(declared, source.base) : null;
          if (dataUrl) name = dataUrl.pathname;
        }
      }
      // GeoJSON shapes of a map: the `shapes-src` attribute, or `shapes.url`.
      const shapesDeclared = isObject && spec.shapes && typeof spec.shapes === 'object' ? spec.shapes.url : null;
      const shapesSrc = this.getAttribute('shapes-src');
      const shapesUrl = shapesSrc ? new URL(shapesSrc, document.baseURI) : typeof shapesDeclared === 'string' ? new URL(shapesDeclared, source.base) : null;
      // Data and shapes arrive together (the engine is already on its way).
      const arriving = Promise.all([
        dataUrl ? this.#fetchData(dataUrl, 'data.url', signal) : null,
        shapesUrl ? this.#fetchData(shapesUrl, 'shapes.url', signal) : undefined,
      ]);
      if (dataUrl || shapesUrl) {
        let arrived = false;
        arriving.then(
          () => (arrived = true),
          () => (arrived = true)
        );
        loadEngine(kindOf(this, text)).then(
          (engine) => {
            if (!arrived && generation === this.#generation) warmUp(engine);
          },
          () => {}
        );
      }
      const [fetched, shapes] = await arriving;
      const bytes = table || fetched || undefined;
      if (generation !== this.#generation) return;
      // Responsive: `size.width` is the widest the chart draws.
      const declaredWidth = isObject && spec.size && typeof spec.size === 'object' ? spec.size.width : undefined;
      this.#specWidth = typeof declaredWidth === 'number' && declaredWidth > 0 ? declaredWidth : 0;
      const width = this.#targetWidth(contentWidth(this));
      if (this.#specWidth && width < this.#specWidth) {
        spec.size = { ...spec.size, width };
        changed = true;
      }
      if (changed) text = JSON.stringify(spec);
      const arrow = !!bytes && isArrow(bytes, name, spec);
      // `data.sha256`: the engine checks it against SubtleCrypto's digest (none on plain http: the engine says so).
      const digest = !arrow && bytes && isObject && spec.data?.sha256 && globalThis.crypto?.subtle ? new Uint8Array(await crypto.subtle.digest('SHA-256', bytes)) : undefined;
      if (generation !== this.#generation) return;
      let raw;
      let kind = kindOf(this, text);
      for (let attempt = 0; ; attempt += 1) {
        // Arrow data: the add-on decodes it into the column interchange the engine reads.
        const [engine, addon] = await Promise.all([loadEngine(kind), arrow ? loadEngine('arrow') : null]);
        if (generation !== this.#generation) return;
        // Another chart's trap retired an instance while we waited: take a fresh one.
        const current = loaded[kind] === engine && (!arrow || loaded.arrow === addon);
        if (!current && attempt < 2) continue;
        try {
          raw = arrow
            ? engine.render_columns(text, addon.decode(bytes), width)
            : shapes
              ? engine.render_with_shapes(text, bytes, name, shapes, width)
              : engine.render(text, bytes, name, width, digest);
        } catch (e) {
          // The engine trapped: no later chart uses this instance. When another
          // chart's trap already retired it, try once more.
          dropEngine(kind, engine);
          if (arrow) dropEngine('arrow', addon);
          if (current || attempt >= 2) {
            throw fail('engine.trap', `the chart engine stopped on this chart (${e && e.message ? e.message : e}); other charts are not affected`, {
              hint: 'this is a bug in Strata or a spec beyond its limits: simplify the spec, and please report it',
            });
          }
          continue;
        }
        // The core leaves out what this chart asks for (a word FULL_WORDS missed): draw it with the full engine.
        if (kind === 'core' && raw.includes('"code":"spec.needs_full_engine"')) {
          needsFull.add(this);
          kind = 'full';
          continue;
        }
        break;
      }
      const answer = JSON.parse(raw);
      if (generation !== this.#generation) return;
      if (!answer.ok) throw new ChartError(answer.errors);
      this.#show(answer.svg, answer.table || '');
      if (width < this.#drawnWidth) this.#lastShrink = { from: this.#drawnWidth, at: performance.now() };
      this.#drawnWidth = width;
      this.#status = 'drawn';
      this.#force = false;
      this.#updateDownloads();
      this.dispatchEvent(
        new CustomEvent('strata-render', {
          bubbles: true,
          detail: { width: answer.width, height: answer.height, warnings: answer.warnings || [] },
        })
      );
      // The container may have changed while this drawing was under way.
      if (this.#connected && generation === this.#generation) this.#widthChanged(contentWidth(this));
    } catch (e) {
      if (generation !== this.#generation) return;
      const errors = e instanceof ChartError ? e.errors : [{ severity: 'error', code: 'internal', message: String(e && e.message ? e.message : e) }];
      this.#status = 'error';
      this.#showError(errors);
      this.dispatchEvent(new CustomEvent('strata-error', { bubbles: true, detail: { errors } }));
    }
  }

  #show(svgText, tableHtml) {
    const doc = new DOMParser().parseFromString(trusted(svgText), 'image/svg+xml');
    const root = doc.documentElement;
    if (!root || root.namespaceURI !== SVG_NS || root.localName !== 'svg') {
      throw fail('internal', 'the engine returned SVG the browser could not parse');
    }
    // The data table: the engine's escaped HTML, parsed inertly and checked to be its one <details>.
    let table = null;
    if (tableHtml) {
      const t = new DOMParser().parseFromString(trusted(tableHtml), 'text/html').body.firstElementChild;
      if (!t || t.localName !== 'details' || !t.classList.contains('strata-data')) {
        throw fail('internal', 'the engine returned a data table the browser could not parse');
      }
      table = document.importNode(t, true);
    }
    const svg = document.importNode(root, true);
    // The first SVG (pre-rendered or baked) makes way; the other baked widths go.
    const old = this.querySelector(':scope > svg');
    if (old) old.replaceWith(svg);
    else this.append(svg);
    for (const b of bakedSvgs(this)) b.remove();
    const oldTable = this.querySelector(':scope > details.strata-data');
    if (table) {
      // A redraw (a resize, say) keeps the table open if the reader opened it.
      if (oldTable && oldTable.open) table.open = true;
      if (oldTable) oldTable.replaceWith(table);
      else svg.after(table);
    } else {
      oldTable?.remove();
    }
    this.querySelector(':scope > .strata-error')?.remove();
    this.style.removeProperty('min-height');
    this.#svgText = svgText;
    this.#tableHtml = tableHtml;
  }

  #showError(errors) {
    let box = this.querySelector(':scope > .strata-error');
    if (!box) {
      box = document.createElement('div');
      box.className = 'strata-error';
      box.setAttribute('role', 'alert');
      // Before a pre-rendered chart, which stays in place.
      const svg = this.querySelector(':scope > svg');
      if (svg) svg.before(box);
      else this.append(box);
    }
    box.textContent = errors.map(describeError).join('\n');
    this.style.removeProperty('min-height');
  }

  /** The chart the reader sees: the drawn SVG, or the baked one the theme sheet shows. */
  #shownSvg() {
    return [...this.querySelectorAll(':scope > svg')].find(shown) || null;
  }

  /** The `downloads` attribute: buttons for the SVG, a PNG and the CSV of each data table. */
  #updateDownloads() {
    let bar = this.querySelector(':scope > .strata-downloads');
    const svg = this.hasAttribute('downloads') ? this.#shownSvg() : null;
    if (!svg) {
      bar?.remove();
      return;
    }
    if (!bar) {
      bar = document.createElement('div');
      bar.className = 'strata-downloads';
      bar.setAttribute('role', 'group');
      bar.setAttribute('aria-label', 'Download this chart');
      bar.addEventListener('click', this.#download);
      this.append(bar);
    }
    const tables = [...this.querySelectorAll(':scope > details.strata-data > table')];
    const buttons = [
      ['svg', 'Download SVG'],
      ['png', 'Download PNG'],
      ...tables.map((t, i) => [`csv-${i}`, tables.length > 1 ? `Download CSV (layer ${(t.caption?.textContent.match(/^Layer (\d+)/) || [, i + 1])[1]})` : 'Download CSV']),
    ];
    bar.replaceChildren(
      ...buttons.map(([kind, label]) => {
        const b = document.createElement('button');
        b.type = 'button';
        b.dataset.strataDownload = kind;
        b.textContent = label;
        return b;
      })
    );
  }

  #download = async (event) => {
    const button = event.target instanceof Element ? event.target.closest('button[data-strata-download]') : null;
    const svg = button && this.#shownSvg();
    if (!svg) return;
    const kind = button.dataset.strataDownload;
    try {
      // The file makers load on first use (strata-downloads.js), not with every chart.
      const { download } = await import('./strata-downloads.js');
      await download(kind, svg, [...this.querySelectorAll(':scope > details.strata-data > table')], (this.id || 'chart').replace(/[^\w.-]+/g, '_'));
    } catch (e) {
      const errors = [{ severity: 'error', code: 'download', message: `could not make the ${kind.replace(/-\d+$/, '').toUpperCase()} file: ${e && e.message ? e.message : e}` }];
      this.dispatchEvent(new CustomEvent('strata-error', { bubbles: true, detail: { errors } }));
    }
  };
}

if (!customElements.get('strata-chart')) customElements.define('strata-chart', StrataChart);
