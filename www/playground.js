// The Strata playground: open a data file, write a spec, see the chart in
// light, dark and narrow previews, with every problem listed and located.
// Everything happens in this page: the file is read with the File API and
// handed to the WebAssembly engine here; nothing is sent anywhere.
//
// It uses the engine's public wasm API: `render(spec, data, name, width)`
// (JSON with the SVG or located errors) and `columns(data, name)` (the
// columns and their inferred types, for the starter spec); for Arrow files the
// add-on's `decode` and the core's `render_columns` / `columns_of_interchange`.

// The full engine (the core with maps, expressions, fitted statistics...): the playground's examples include them.
import initCore, * as core from './pkg/strata_wasm_full.js';

const $ = (id) => document.getElementById(id);
const ui = {
  file: $('file'),
  drop: $('drop'),
  dataStatus: $('data-status'),
  columns: $('columns'),
  starter: $('starter'),
  spec: $('spec'),
  status: $('status'),
  problems: $('problems'),
  embed: $('embed'),
  copy: $('copy-embed'),
  svg: $('download-svg'),
  png: $('download-png'),
  html: $('download-html'),
  light: $('preview-light'),
  dark: $('preview-dark'),
  narrow: $('preview-narrow'),
};

const SVG_NS = 'http://www.w3.org/2000/svg';
const NARROW = 360;

// ------------------------------------------------------------ the engine

const engines = {};
/** The engine module: the core one, or the Arrow add-on that decodes IPC for it. */
function engine(kind) {
  if (!engines[kind]) {
    engines[kind] =
      kind === 'arrow'
        ? import('./pkg/strata_wasm_arrow.js').then(async (m) => {
            await m.default();
            return m;
          })
        : initCore().then(() => core);
    engines[kind].catch(() => delete engines[kind]);
  }
  return engines[kind];
}

function isArrow(bytes, name) {
  if (bytes && bytes.length >= 6) {
    if (String.fromCharCode(...bytes.subarray(0, 6)) === 'ARROW1') return true;
    if (bytes[0] === 0xff && bytes[1] === 0xff && bytes[2] === 0xff && bytes[3] === 0xff) return true;
  }
  return /\.(arrow|arrows|ipc|feather)$/i.test(name || '');
}

// ------------------------------------------------------------ JSON paths

/**
 * Where a JSON path such as `layers[0].stat.bin.rule` sits in the spec's
 * text: the offset of the member's key (or of an array element), as deep as
 * the text has the path. The same walk as the CLI's `locate.rs`.
 */
export function locate(text, path) {
  const steps = [];
  for (let i = 0; i < path.length; ) {
    const c = path[i];
    if (c === '.') i++;
    else if (c === '[') {
      const end = path.indexOf(']', i);
      steps.push(Number(path.slice(i + 1, end < 0 ? path.length : end)));
      i = end < 0 ? path.length : end + 1;
    } else if (c === '"') {
      let j = i + 1;
      while (j < path.length && path[j] !== '"') j += path[j] === '\\' ? 2 : 1;
      const quoted = path.slice(i, j + 1);
      try {
        steps.push(String(JSON.parse(quoted)));
      } catch {
        steps.push(quoted.replace(/^"|"$/g, ''));
      }
      i = j + 1;
    } else {
      let end = i;
      while (end < path.length && path[end] !== '.' && path[end] !== '[') end++;
      steps.push(path.slice(i, end));
      i = end;
    }
  }
  let i = 0;
  const ws = () => {
    while (i < text.length && ' \t\n\r'.includes(text[i])) i++;
  };
  const string = () => {
    const start = i++;
    while (i < text.length) {
      if (text[i] === '\\') i += 2;
      else if (text[i] === '"') {
        i++;
        try {
          return JSON.parse(text.slice(start, i));
        } catch {
          return null;
        }
      } else i++;
    }
    return null;
  };
  const skip = () => {
    ws();
    if (text[i] === '"') return void string();
    if (text[i] === '{' || text[i] === '[') {
      let depth = 0;
      while (i < text.length) {
        const c = text[i];
        if (c === '"') {
          string();
          continue;
        }
        if (c === '{' || c === '[') depth++;
        else if (c === '}' || c === ']') {
          depth--;
          if (depth === 0) {
            i++;
            return;
          }
        }
        i++;
      }
      return;
    }
    while (i < text.length && !',}] \t\n\r'.includes(text[i])) i++;
  };
  const find = (k) => {
    ws();
    const here = i;
    if (k >= steps.length) return here;
    const want = steps[k];
    if (text[i] === '{' && typeof want === 'string') {
      i++;
      for (;;) {
        ws();
        if (text[i] !== '"') return here;
        const keyAt = i;
        const key = string();
        ws();
        if (key === null || text[i] !== ':') return here;
        i++;
        if (key === want) return k + 1 === steps.length ? keyAt : find(k + 1);
        skip();
        ws();
        if (text[i] !== ',') return here;
        i++;
      }
    }
    if (text[i] === '[' && typeof want === 'number') {
      i++;
      for (let n = 0; ; n++) {
        ws();
        if (i >= text.length || text[i] === ']') return here;
        if (n === want) return find(k + 1);
        skip();
        ws();
        if (text[i] !== ',') return here;
        i++;
      }
    }
    return here;
  };
  return Math.min(find(0), text.length);
}

/** The offset a syntax error names ("spec line 3, column 7"), if it names one. */
function syntaxOffset(text, message) {
  const m = /spec line (\d+), column (\d+)/.exec(message || '');
  if (!m) return null;
  const lines = text.split('\n');
  const line = Math.min(Number(m[1]), lines.length);
  let at = 0;
  for (let l = 0; l < line - 1; l++) at += lines[l].length + 1;
  return Math.min(at + Math.max(0, Number(m[2]) - 1), text.length);
}

// ------------------------------------------------------------ state

const state = {
  bytes: null, // Uint8Array of the opened file
  name: '', // its file name
  columns: [],
  interchange: null, // Arrow data decoded by the add-on into the column interchange
  answer: null, // the last drawing of the spec as written
  width: 640,
};

// ------------------------------------------------------------ data

async function openFile(file) {
  if (!file) return;
  const bytes = new Uint8Array(await file.arrayBuffer());
  state.bytes = bytes;
  state.name = file.name;
  state.columns = [];
  state.interchange = null;
  ui.columns.replaceChildren();
  try {
    const eng = await engine('core');
    // Arrow IPC: the add-on decodes it once into the column interchange,
    // which the core engine reads (it carries no Arrow code itself).
    state.interchange = isArrow(bytes, file.name) ? (await engine('arrow')).decode(bytes) : null;
    const info = JSON.parse(state.interchange ? eng.columns_of_interchange(state.interchange) : eng.columns(bytes, file.name));
    if (!info.ok) {
      ui.dataStatus.textContent = `${file.name}: could not read it: ${info.errors.map(describe).join('; ')}`;
      ui.starter.disabled = true;
    } else {
      state.columns = info.columns;
      ui.dataStatus.textContent = `${file.name}: ${info.rows} rows, ${info.columns.length} columns (read in this browser, not uploaded).`;
      for (const c of info.columns) {
        const li = document.createElement('li');
        const type = document.createElement('span');
        type.textContent = ` ${c.type}`;
        li.append(c.name, type);
        ui.columns.append(li);
      }
      ui.starter.disabled = false;
      // An empty editor gets a first chart straight away.
      if (!ui.spec.value.trim()) useStarter();
    }
  } catch (e) {
    ui.dataStatus.textContent = `${file.name}: the engine could not load: ${e.message}`;
  }
  schedule(0);
}

/** A first chart from the columns' types. */
export function starterSpec(columns, name) {
  const of = (t) => columns.filter((c) => c.type === t).map((c) => c.name);
  const [num, text, date] = [of('number'), of('text'), of('date')];
  // A lone text column is likely a grouping (long data); with several, the
  // first is often an identifier, which would make a colour for every row.
  const group = text.length === 1 ? { color: text[0] } : {};
  let layer;
  if (num.length >= 2) {
    // Two measures: points.
    layer = { draw: 'point', x: num[0], y: num[1], ...group };
  } else if (date.length && num.length) {
    // A measure over time: a line.
    layer = { draw: 'line', x: date[0], y: num[0], ...group };
  } else if (text.length && num.length) {
    // A measure for each category: bars.
    layer = { draw: 'bar', x: text[0], y: num[0] };
  } else if (num.length) {
    // One measure: its distribution.
    layer = { draw: 'bar', x: num[0], stat: { bin: { rule: 'fd' } } };
  } else if (text.length || date.length) {
    // Only categories or dates: rows per value.
    layer = { draw: 'bar', x: (text.length ? text : date)[0], stat: 'count' };
  } else {
    layer = { draw: 'point', x: columns[0] ? columns[0].name : 'x', y: columns[1] ? columns[1].name : 'y' };
  }
  const spec = { title: name.replace(/\.[^.]*$/, ''), layers: [layer] };
  return JSON.stringify(spec, null, 2);
}

function useStarter() {
  ui.spec.value = starterSpec(state.columns, state.name);
  schedule(0);
}

// ------------------------------------------------------------ drawing

/** One diagnostic as a line of text. */
function describe(d) {
  let where = '';
  if (d.path) where += ` at ${d.path}`;
  if (d.line != null) where += d.column != null ? ` (data line ${d.line}, column ${d.column})` : ` (data line ${d.line})`;
  return `${d.severity === 'warning' ? 'Warning' : 'Error'}${where}: ${d.message}${d.hint ? `\nHint: ${d.hint}` : ''}`;
}

/** The spec text with changes for a preview (theme, width), when it parses. */
function variant(text, change) {
  try {
    const spec = JSON.parse(text);
    if (!spec || typeof spec !== 'object' || Array.isArray(spec)) return text;
    change(spec);
    return JSON.stringify(spec);
  } catch {
    return text;
  }
}

function showSvg(box, svgText, message) {
  if (!svgText) {
    const p = document.createElement('p');
    p.className = 'empty';
    p.textContent = message;
    box.replaceChildren(p);
    return;
  }
  const doc = new DOMParser().parseFromString(svgText, 'image/svg+xml');
  const root = doc.documentElement;
  if (!root || root.namespaceURI !== SVG_NS || root.localName !== 'svg') return;
  box.replaceChildren(document.importNode(root, true));
}

let timer = null;
let generation = 0;
function schedule(delay = 250) {
  clearTimeout(timer);
  timer = setTimeout(draw, delay);
}

async function draw() {
  const gen = ++generation;
  const text = ui.spec.value;
  if (!text.trim()) {
    state.answer = null;
    showProblems([]);
    ui.status.textContent = 'Write a spec, or open a data file for a first one.';
    for (const box of [ui.light, ui.dark, ui.narrow]) showSvg(box, '', 'No chart yet.');
    setOutputs(false);
    return;
  }
  let eng;
  try {
    eng = await engine('core');
  } catch (e) {
    ui.status.textContent = `The engine could not load: ${e.message}`;
    return;
  }
  if (gen !== generation) return;
  const bytes = state.bytes || undefined;
  // `data.sha256`: the core engine checks it against SubtleCrypto's digest, as in <strata-chart>.
  const digest = bytes && /"sha256"/.test(text) && globalThis.crypto?.subtle ? new Uint8Array(await crypto.subtle.digest('SHA-256', bytes)) : undefined;
  if (gen !== generation) return;
  const name = state.name;
  const width = Math.max(200, Math.round(ui.light.clientWidth || 640));
  const run = (t, w) => JSON.parse(state.interchange ? eng.render_columns(t, state.interchange, w) : eng.render(t, bytes, name, w, digest));
  const answer = run(text, width);
  state.answer = answer;
  state.width = width;
  const light = run(variant(text, (s) => (s.theme = 'light')), width);
  const dark = run(variant(text, (s) => (s.theme = 'dark')), width);
  const narrow = run(
    variant(text, (s) => {
      s.size = { ...(s.size && typeof s.size === 'object' ? s.size : {}), width: NARROW };
    }),
    NARROW
  );
  const failed = answer.ok ? '' : 'The chart has errors: see Problems.';
  showSvg(ui.light, light.ok ? light.svg : '', failed);
  showSvg(ui.dark, dark.ok ? dark.svg : '', failed);
  showSvg(ui.narrow, narrow.ok ? narrow.svg : '', failed);
  const problems = answer.ok ? answer.warnings || [] : answer.errors || [];
  showProblems(problems);
  const count = (n, w) => `${n} ${w}${n === 1 ? '' : 's'}`;
  ui.status.textContent = answer.ok
    ? `Drawn, ${Math.round(answer.width)} × ${Math.round(answer.height)} px; ${count(problems.length, 'warning')}.`
    : `Not drawn: ${count(problems.length, 'error')}.`;
  setOutputs(answer.ok);
  if (answer.ok) ui.embed.value = embedSnippet();
}

function setOutputs(on) {
  for (const b of [ui.copy, ui.svg, ui.png, ui.html]) b.disabled = !on;
}

function showProblems(list) {
  ui.problems.replaceChildren();
  if (!list.length) {
    const li = document.createElement('li');
    li.className = 'plain';
    li.textContent = 'No problems.';
    ui.problems.append(li);
    return;
  }
  for (const d of list) {
    const li = document.createElement('li');
    li.className = d.severity === 'warning' ? 'warning' : 'error';
    const text = describe(d);
    const at = d.path ? locate(ui.spec.value, d.path) : d.code === 'spec.json_syntax' ? syntaxOffset(ui.spec.value, d.message) : null;
    if (at == null) {
      li.classList.add('plain');
      li.textContent = text;
    } else {
      const b = document.createElement('button');
      b.type = 'button';
      b.textContent = text;
      b.title = 'Move the cursor to this place in the spec';
      b.dataset.offset = String(at);
      b.addEventListener('click', () => {
        const off = Math.min(at, ui.spec.value.length);
        ui.spec.focus();
        ui.spec.setSelectionRange(off, off);
        scrollToCursor(off);
      });
      li.append(b);
    }
    ui.problems.append(li);
  }
}

/** Scroll the editor so the cursor's line shows. */
function scrollToCursor(offset) {
  const line = ui.spec.value.slice(0, offset).split('\n').length - 1;
  const lineHeight = parseFloat(getComputedStyle(ui.spec).lineHeight) || 18;
  ui.spec.scrollTop = Math.max(0, line * lineHeight - ui.spec.clientHeight / 3);
}

// ------------------------------------------------------------ output

/** Inline JSON in a script: `<` as `\u003c`, so no text can end the script. */
const inlineJson = (text) => text.trim().replace(/</g, '\\u003c');

const escapeAttr = (s) => s.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');

function embedSnippet() {
  const src = state.name ? ` src="${escapeAttr(state.name)}"` : '';
  return `<strata-chart${src}>\n<script type="application/json">\n${inlineJson(ui.spec.value)}\n</script>\n</strata-chart>`;
}

function bakedPage() {
  const a = state.answer;
  const src = state.name ? ` src="${escapeAttr(state.name)}"` : '';
  return (
    '<!doctype html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n' +
    '<meta name="viewport" content="width=device-width, initial-scale=1">\n' +
    '<title>Chart</title>\n<link rel="stylesheet" href="strata/strata-theme.css">\n</head>\n<body>\n' +
    `<strata-chart${src}><script type="application/json">\n${inlineJson(ui.spec.value)}\n</script>` +
    `${a.svg.trimEnd()}${a.table || ''}</strata-chart>\n` +
    '<script type="module" src="strata/strata-chart.js"></script>\n</body>\n</html>\n'
  );
}

function download(blob, filename) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10000);
}

const baseName = () => (state.name ? state.name.replace(/\.[^.]*$/, '') : 'chart') || 'chart';

const base64 = (bytes) => {
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin);
};

let fontFaces;
/**
 * The bundled font as @font-face rules with data URLs: an SVG drawn as an
 * image loads nothing from outside, so the font the engine measured text
 * with goes inside it. Empty when the font files are not served.
 */
function fontCss() {
  fontFaces ??= Promise.all(
    [
      ['AtkinsonHyperlegibleNext-Regular.ttf', 400],
      ['AtkinsonHyperlegibleNext-Bold.ttf', 700],
    ].map(async ([file, weight]) => {
      const res = await fetch(new URL(`fonts/${file}`, import.meta.url));
      if (!res.ok) throw new Error(`HTTP ${res.status}`);
      const data = base64(new Uint8Array(await res.arrayBuffer()));
      return `@font-face{font-family:"Atkinson Hyperlegible Next";font-weight:${weight};src:url(data:font/ttf;base64,${data}) format("truetype")}`;
    })
  )
    .then((rules) => rules.join(''))
    .catch(() => '');
  return fontFaces;
}

/** The SVG drawn into a canvas at twice its size, as PNG. */
async function pngBlob(svgText, width, height) {
  const css = await fontCss();
  const withFont = css ? svgText.replace(/^(<svg[^>]*>)/, `$1<defs><style>${css}</style></defs>`) : svgText;
  const img = new Image();
  img.src = `data:image/svg+xml;base64,${base64(new TextEncoder().encode(withFont))}`;
  await img.decode();
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(width * 2);
  canvas.height = Math.round(height * 2);
  const ctx = canvas.getContext('2d');
  ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
  return new Promise((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('no PNG'))), 'image/png'));
}

// ------------------------------------------------------------ wiring

ui.file.addEventListener('change', () => openFile(ui.file.files[0]));
for (const kind of ['dragenter', 'dragover']) {
  ui.drop.addEventListener(kind, (e) => {
    e.preventDefault();
    ui.drop.classList.add('over');
  });
}
ui.drop.addEventListener('dragleave', () => ui.drop.classList.remove('over'));
ui.drop.addEventListener('drop', (e) => {
  e.preventDefault();
  ui.drop.classList.remove('over');
  openFile(e.dataTransfer && e.dataTransfer.files[0]);
});
// A file dropped anywhere else must not make the browser navigate away.
window.addEventListener('dragover', (e) => e.preventDefault());
window.addEventListener('drop', (e) => e.preventDefault());

ui.spec.addEventListener('input', () => schedule());
ui.starter.addEventListener('click', useStarter);
ui.copy.addEventListener('click', async () => {
  const snippet = embedSnippet();
  ui.embed.value = snippet;
  ui.embed.select();
  try {
    await navigator.clipboard.writeText(snippet);
    ui.status.textContent = 'Embed snippet copied.';
  } catch {
    ui.status.textContent = 'Embed snippet selected below: copy it with Ctrl+C.';
  }
});
ui.svg.addEventListener('click', () => {
  if (state.answer && state.answer.ok) download(new Blob([state.answer.svg], { type: 'image/svg+xml' }), `${baseName()}.svg`);
});
ui.png.addEventListener('click', async () => {
  const a = state.answer;
  if (!a || !a.ok) return;
  try {
    download(await pngBlob(a.svg, a.width, a.height), `${baseName()}.png`);
  } catch (e) {
    ui.status.textContent = `Could not make the PNG: ${e.message}`;
  }
});
ui.html.addEventListener('click', () => {
  if (state.answer && state.answer.ok) download(new Blob([bakedPage()], { type: 'text/html' }), `${baseName()}.html`);
});
let lastWidth = 0;
new ResizeObserver(() => {
  const w = Math.round(ui.light.clientWidth);
  if (w && Math.abs(w - lastWidth) >= 1) {
    lastWidth = w;
    schedule(100);
  }
}).observe(ui.light);

schedule(0);
