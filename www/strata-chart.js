// <strata-chart>: draws a Strata chart spec as SVG in the page.
//
//   <strata-chart src="data.csv">
//     <script type="application/json">{ "layers": [ ... ] }</script>
//   </strata-chart>
//   <script type="module" src="strata/strata-chart.js"></script>
//
// The WebAssembly engine loads once per page, on first use. Any failure (bad
// spec, unreachable data, a parse error) shows a message in the chart's
// place and fires `strata-error`; nothing is thrown into the page, and a
// pre-rendered <svg> already inside the element is kept until a new drawing
// replaces it. Nothing from the spec or the data is ever run as script or
// parsed as HTML: the engine escapes all text, and messages are set as text.

const ENGINE_URLS = {
  core: new URL('./pkg/strata_wasm.js', import.meta.url),
  // The Arrow add-on: decodes Arrow IPC into columns the core engine reads
  // (render_columns). Loaded only for Arrow data.
  arrow: new URL('./pkg/strata_wasm_arrow.js', import.meta.url),
  // The core engine with maps, loaded instead of the core for specs with
  // `shapes` or `coords.kind: map` (the core refuses those).
  maps: new URL('./pkg/strata_wasm_maps.js', import.meta.url),
};
const SVG_NS = 'http://www.w3.org/2000/svg';

const engines = {};
const loaded = {};
let instances = 0;

/**
 * Load an engine module once for the whole page. After a trap, `dropEngine`
 * forgets it and the next chart loads a fresh instance: a new module URL
 * (the `instance` query) gives a new module record and so new WebAssembly
 * memory, since the old instance's state cannot be trusted.
 */
function loadEngine(kind = 'core') {
  if (!engines[kind]) {
    const url = new URL(ENGINE_URLS[kind]);
    if (instances > 0) url.searchParams.set('instance', String(instances));
    const loading = import(url.href).then(async (m) => {
      await m.default();
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

export class StrataChart extends HTMLElement {
  static get observedAttributes() {
    return ['src', 'spec-src', 'shapes-src', 'theme', 'timeout'];
  }

  #spec = null; // object set from JavaScript
  #rows = null;
  #table = null;
  #svgText = '';
  #tableHtml = '';
  #generation = 0;
  #scheduled = false;
  #resize = null;
  #lastWidth = 0;
  #drawing = Promise.resolve();

  connectedCallback() {
    adoptStyles();
    this.addEventListener('focusin', this.#showTip);
    this.addEventListener('focusout', this.#hideTip);
    this.addEventListener('keydown', this.#moveFocus);
    this.#schedule();
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

  /**
   * The chart is one tab stop (the engine gives the first mark with tips
   * tabindex 0 and the rest -1); the arrow keys, Home and End move the stop
   * from mark to mark in drawing order (WAI-ARIA's roving tabindex).
   */
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

  disconnectedCallback() {
    this.#resize?.disconnect();
    this.#resize = null;
  }

  attributeChangedCallback() {
    if (this.isConnected) this.#schedule();
  }

  /** The spec as an object; setting it redraws. */
  get spec() {
    return this.#spec;
  }
  set spec(value) {
    this.#spec = value;
    this.#schedule();
  }
  /** Records to draw instead of fetched data. */
  set rows(value) {
    this.#rows = value;
    this.#schedule();
  }
  /** Arrow IPC bytes to draw instead of fetched data. */
  set table(value) {
    this.#table = value;
    this.#schedule();
  }
  /** The SVG text of the last drawing, exactly as the engine wrote it. */
  get svgText() {
    return this.#svgText;
  }
  /** The data table HTML of the last drawing, exactly as the engine wrote it. */
  get tableHtml() {
    return this.#tableHtml;
  }

  /**
   * Redraw now; resolves when the element shows its current spec (errors are
   * shown, not thrown). A spec, data or attribute set while this drawing is
   * under way starts a newer one, and the promise waits for that too.
   */
  async render() {
    this.#draw();
    for (;;) {
      const p = this.#drawing;
      await p;
      if (p === this.#drawing && !this.#scheduled) return;
      if (this.#scheduled) await new Promise((r) => queueMicrotask(r));
    }
  }

  #schedule() {
    if (this.#scheduled) return;
    this.#scheduled = true;
    queueMicrotask(() => {
      this.#scheduled = false;
      this.#draw();
    });
  }

  #draw() {
    const p = this.#drawOnce();
    this.#drawing = p;
    return p;
  }

  /** Seconds a fetch may take: the `timeout` attribute, else 30. */
  #timeoutSeconds() {
    const t = Number(this.getAttribute('timeout'));
    return Number.isFinite(t) && t > 0 ? t : DEFAULT_TIMEOUT_S;
  }

  /**
   * Fetch with the element's time limit; the limit covers the whole body, so
   * a response that starts and never finishes is also stopped.
   */
  async #fetchBytes(url, code, what, path) {
    const seconds = this.#timeoutSeconds();
    const ctl = new AbortController();
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
    }
  }

  async #specSource() {
    if (this.#spec) return { text: JSON.stringify(this.#spec), base: document.baseURI };
    const specSrc = this.getAttribute('spec-src');
    if (specSrc) {
      const url = new URL(specSrc, document.baseURI);
      const bytes = await this.#fetchBytes(url, 'spec.fetch', 'spec', null);
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

  #fetchData(url, path = 'data.url') {
    return path === 'data.url' ? this.#fetchBytes(url, 'data.fetch', 'data', path) : this.#fetchBytes(url, 'shapes.fetch', 'shapes', path);
  }

  #width(spec) {
    const fixed = spec && spec.size && typeof spec.size.width === 'number';
    if (fixed) {
      this.#resize?.disconnect();
      this.#resize = null;
      return spec.size.width;
    }
    // No width in the spec: fill the container and redraw when it resizes.
    if (!this.#resize && typeof ResizeObserver !== 'undefined') {
      this.#resize = new ResizeObserver((entries) => {
        const w = Math.round(entries[entries.length - 1].contentRect.width);
        if (w > 0 && Math.abs(w - this.#lastWidth) >= 1) this.#schedule();
      });
      this.#resize.observe(this);
    }
    const w = Math.round(this.clientWidth || this.getBoundingClientRect().width || 0);
    return w > 0 ? w : 640;
  }

  async #drawOnce() {
    const generation = ++this.#generation;
    try {
      const source = await this.#specSource();
      let text = source.text;
      let spec = null;
      try {
        spec = JSON.parse(text);
      } catch {
        // Leave it to the engine, which names the line and column.
      }
      let bytes;
      let name = '';
      if (spec && typeof spec === 'object' && !Array.isArray(spec)) {
        let changed = false;
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
        if (changed) text = JSON.stringify(spec);
        if (this.#table) {
          bytes = this.#table instanceof Uint8Array ? this.#table : new Uint8Array(this.#table);
          name = 'table.arrow';
        } else if (!this.#rows) {
          const declared = typeof spec.data === 'string' ? spec.data : spec.data && spec.data.url;
          const src = this.getAttribute('src');
          const url = src ? new URL(src, document.baseURI) : declared ? new URL(declared, source.base) : null;
          if (url) {
            bytes = await this.#fetchData(url);
            name = url.pathname;
          }
        }
      }
      // GeoJSON shapes of a map: the `shapes-src` attribute, or `shapes.url`.
      let shapes;
      const shapesDeclared = spec && typeof spec === 'object' && spec.shapes && typeof spec.shapes === 'object' ? spec.shapes.url : null;
      const shapesSrc = this.getAttribute('shapes-src');
      const shapesUrl = shapesSrc ? new URL(shapesSrc, document.baseURI) : typeof shapesDeclared === 'string' ? new URL(shapesDeclared, source.base) : null;
      if (shapesUrl) shapes = await this.#fetchData(shapesUrl, 'shapes.url');
      const width = this.#width(spec);
      const arrow = !!bytes && isArrow(bytes, name, spec);
      let raw;
      for (let attempt = 0; ; attempt += 1) {
        // Arrow data: the add-on decodes it into the column interchange the core reads.
        const kind = spec && typeof spec === 'object' && (spec.shapes || (spec.coords && spec.coords.kind === 'map')) ? 'maps' : 'core';
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
              : engine.render(text, bytes, name, width);
          break;
        } catch (e) {
          // The engine trapped (a panic, a stack overflow, out of memory):
          // its memory can no longer be trusted, so no later chart uses this
          // instance; the next one starts a fresh engine. When the instance
          // was already retired by another chart's trap, try once more.
          dropEngine(kind, engine);
          if (arrow) dropEngine('arrow', addon);
          if (current || attempt >= 2) {
            throw fail('engine.trap', `the chart engine stopped on this chart (${e && e.message ? e.message : e}); other charts are not affected`, {
              hint: 'this is a bug in Strata or a spec beyond its limits: simplify the spec, and please report it',
            });
          }
        }
      }
      const answer = JSON.parse(raw);
      if (generation !== this.#generation) return;
      if (!answer.ok) throw new ChartError(answer.errors);
      this.#lastWidth = width;
      this.#show(answer.svg, answer.table || '');
      this.dispatchEvent(
        new CustomEvent('strata-render', {
          bubbles: true,
          detail: { width: answer.width, height: answer.height, warnings: answer.warnings || [] },
        })
      );
    } catch (e) {
      if (generation !== this.#generation) return;
      const errors = e instanceof ChartError ? e.errors : [{ severity: 'error', code: 'internal', message: String(e && e.message ? e.message : e) }];
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
    // The data table: the engine's HTML, every text in it escaped. Parsed
    // inertly (DOMParser runs no script and loads nothing) and checked to be
    // the one <details> the engine writes before it enters the page.
    let table = null;
    if (tableHtml) {
      const t = new DOMParser().parseFromString(trusted(tableHtml), 'text/html').body.firstElementChild;
      if (!t || t.localName !== 'details' || !t.classList.contains('strata-data')) {
        throw fail('internal', 'the engine returned a data table the browser could not parse');
      }
      table = document.importNode(t, true);
    }
    const svg = document.importNode(root, true);
    const old = this.querySelector(':scope > svg');
    if (old) old.replaceWith(svg);
    else this.append(svg);
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
  }
}

if (!customElements.get('strata-chart')) customElements.define('strata-chart', StrataChart);
