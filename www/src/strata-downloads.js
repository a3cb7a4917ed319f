// The files behind <strata-chart downloads>: the chart as SVG, as PNG (the
// SVG in the page drawn onto a canvas) and each data table as CSV. Loaded by
// the element on the first press of a download button.

/** One field of RFC 4180 CSV. */
const csvField = (s) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** A data table (`<table>` of the engine's `<details>`) as RFC 4180 CSV: the header, then the rows as shown. */
export function tableCsv(table) {
  const lines = [];
  const head = [...table.querySelectorAll(':scope > thead > tr > th')].map((c) => c.textContent);
  if (head.length) lines.push(head);
  for (const tr of table.querySelectorAll(':scope > tbody > tr')) lines.push([...tr.children].map((c) => c.textContent));
  return lines.map((cells) => cells.map(csvField).join(',') + '\r\n').join('');
}

/** The SVG element as a standalone file's text. */
function svgFileText(svg) {
  return '<?xml version="1.0" encoding="UTF-8"?>\n' + new XMLSerializer().serializeToString(svg);
}

/** Draw the SVG in the page onto a canvas (twice its size, or the screen's pixel ratio when higher) and encode a PNG. */
async function pngOf(svg) {
  const box = svg.getBoundingClientRect();
  const w = Number(svg.getAttribute('width')) || box.width;
  const h = Number(svg.getAttribute('height')) || box.height;
  const img = new Image();
  img.src = 'data:image/svg+xml;charset=utf-8,' + encodeURIComponent(new XMLSerializer().serializeToString(svg));
  await img.decode();
  const scale = Math.max(2, Math.ceil(window.devicePixelRatio || 1));
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(w * scale);
  canvas.height = Math.round(h * scale);
  canvas.getContext('2d').drawImage(img, 0, 0, canvas.width, canvas.height);
  return new Promise((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the browser could not encode the PNG'))), 'image/png'));
}

/** Hand a file to the browser's downloads (an <a download> with a blob: URL: no inline script, no navigation). */
function save(blob, filename) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  a.hidden = true;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60000);
}

/** Make the file a button asks for (`svg`, `png`, `csv-<table index>`) and hand it to the browser. */
export async function download(kind, svg, tables, base) {
  if (kind === 'svg') {
    save(new Blob([svgFileText(svg)], { type: 'image/svg+xml' }), `${base}.svg`);
  } else if (kind === 'png') {
    save(await pngOf(svg), `${base}.png`);
  } else if (kind.startsWith('csv-')) {
    const i = Number(kind.slice(4));
    if (!tables[i]) return;
    save(new Blob([tableCsv(tables[i])], { type: 'text/csv;charset=utf-8' }), tables.length > 1 ? `${base}-layer-${i + 1}.csv` : `${base}.csv`);
  }
}
