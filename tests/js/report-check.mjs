// Opens a RankFreq profile report in headless Chromium (driven by puppeteer-core) at a desktop and a phone width and
// checks what a reader would notice: horizontal overflow, plots clipped or without a viewBox, unreadable text,
// console errors. Prints one JSON object ({ ok, failures, widths }) on stdout; exit code 0 when every check passed.
//
// Usage: node report-check.mjs REPORT.html [--shots DIR] [--widths 1280,390]
// Environment: RANKFREQ_NODE_MODULES (folder holding puppeteer-core), RANKFREQ_CHROMIUM (browser executable).
import { createRequire } from 'node:module';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

const args = process.argv.slice(2);
const report = args[0];
const opt = (name, dflt) => { const i = args.indexOf(name); return i >= 0 ? args[i + 1] : dflt; };
const shots = opt('--shots', null);
const widths = opt('--widths', '1280,390').split(',').map(Number);
if (!report) { console.error('usage: node report-check.mjs REPORT.html [--shots DIR] [--widths 1280,390]'); process.exit(2); }

const modules = process.env.RANKFREQ_NODE_MODULES;
const require = createRequire(modules ? path.join(path.resolve(modules), 'noop.js') : import.meta.url);
const puppeteer = require('puppeteer-core');
const executablePath = process.env.RANKFREQ_CHROMIUM || '/usr/bin/chromium';

// Runs in the page. Contrast follows WCAG 2.1 (W3C Recommendation, 2018), "relative luminance" and "contrast ratio"
// definitions (https://www.w3.org/TR/WCAG21/#dfn-relative-luminance, #dfn-contrast-ratio):
// L = 0.2126 R + 0.7152 G + 0.0722 B with each channel c/255 linearised as c/12.92 when c <= 0.04045 (the
// specification's 0.03928 threshold gives the same result for 8-bit channels), ((c + 0.055)/1.055)^2.4 otherwise;
// ratio = (L1 + 0.05)/(L2 + 0.05). Level AA asks 4.5:1 for normal text (success criterion 1.4.3).
function inspect() {
  const failures = [];
  const parse = (c) => {
    const m = c && c.match(/rgba?\(([^)]+)\)/);
    if (!m) return null;
    const p = m[1].split(/[ ,/]+/).filter(Boolean).map(Number);
    return { r: p[0], g: p[1], b: p[2], a: p.length > 3 ? p[3] : 1 };
  };
  const over = (top, bottom) => ({
    r: top.r * top.a + bottom.r * (1 - top.a), g: top.g * top.a + bottom.g * (1 - top.a),
    b: top.b * top.a + bottom.b * (1 - top.a), a: 1,
  });
  const lin = (c) => { c /= 255; return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4); };
  const lum = (c) => 0.2126 * lin(c.r) + 0.7152 * lin(c.g) + 0.0722 * lin(c.b);
  const ratio = (a, b) => { const x = lum(a), y = lum(b); return (Math.max(x, y) + 0.05) / (Math.min(x, y) + 0.05); };
  // self-check against the specification's end points: black on white is 21:1, a colour on itself 1:1
  const W = { r: 255, g: 255, b: 255, a: 1 }, K = { r: 0, g: 0, b: 0, a: 1 };
  if (Math.abs(ratio(W, K) - 21) > 1e-9 || Math.abs(ratio(W, W) - 1) > 1e-12) failures.push('contrast formula self-check failed');

  // effective background of an HTML element: its own and its ancestors' background colours composited
  const htmlBackground = (el) => {
    const layers = [];
    for (let e = el; e && e.nodeType === 1; e = e.parentElement) {
      const bg = parse(getComputedStyle(e).backgroundColor);
      if (bg && bg.a > 0) { layers.push(bg); if (bg.a >= 1) break; }
    }
    let c = W; // the canvas
    for (let i = layers.length - 1; i >= 0; i--) c = over(layers[i], c);
    return c;
  };
  const opacity = (el) => { let o = 1; for (let e = el; e && e.nodeType === 1; e = e.parentElement) o *= Number(getComputedStyle(e).opacity); return o; };
  // effective background of SVG text: the last filled rect or path drawn before it that covers its centre
  const svgBackground = (text) => {
    const svg = text.ownerSVGElement;
    const box = text.getBoundingClientRect();
    const cx = box.left + box.width / 2, cy = box.top + box.height / 2;
    let bg = null;
    for (const shape of svg.querySelectorAll('rect, path')) {
      if (shape.compareDocumentPosition(text) & Node.DOCUMENT_POSITION_PRECEDING) break; // shape comes after text
      if (shape.closest('clipPath')) continue;
      const fill = parse(getComputedStyle(shape).fill);
      if (!fill || fill.a === 0) continue;
      const r = shape.getBoundingClientRect();
      if (cx >= r.left && cx <= r.right && cy >= r.top && cy <= r.bottom && r.width > box.width && r.height > box.height)
        bg = bg ? over(fill, bg) : over(fill, htmlBackground(svg));
    }
    return bg ?? htmlBackground(svg);
  };

  const vw = document.documentElement.clientWidth;
  const sw = document.documentElement.scrollWidth;
  if (sw > vw) failures.push(`page is ${sw - vw} px wider than the viewport (${sw} > ${vw})`);

  const ids = new Map();
  for (const e of document.querySelectorAll('[id]')) ids.set(e.id, (ids.get(e.id) ?? 0) + 1);
  for (const [id, n] of ids) if (n > 1) failures.push(`id "${id}" occurs ${n} times (inline SVGs must not share ids)`);

  const figures = [...document.querySelectorAll('figure')];
  if (figures.length === 0) failures.push('no figures');
  for (const f of figures) {
    const name = f.querySelector('figcaption')?.textContent ?? '(no caption)';
    const svg = f.querySelector('svg');
    if (!svg) { failures.push(`figure "${name}": no inline SVG`); continue; }
    if (!svg.getAttribute('viewBox')) failures.push(`figure "${name}": SVG has no viewBox`);
    const fb = f.getBoundingClientRect(), sb = svg.getBoundingClientRect();
    if (sb.width < 1 || sb.height < 1) failures.push(`figure "${name}": SVG has no size`);
    if (sb.left < fb.left - 0.5 || sb.right > fb.right + 0.5 || sb.top < fb.top - 0.5 || sb.bottom > fb.bottom + 0.5)
      failures.push(`figure "${name}": SVG (${sb.width.toFixed(0)}×${sb.height.toFixed(0)}) outside its box`);
    if (fb.right > vw + 0.5) failures.push(`figure "${name}": box ends at ${fb.right.toFixed(0)} px, past the viewport`);
    const texts = [...svg.querySelectorAll('text')].filter(t => t.textContent.trim());
    if (texts.length < 5) failures.push(`figure "${name}": only ${texts.length} text elements (labels missing?)`);
    for (const t of texts) {
      const r = t.getBoundingClientRect();
      if (r.left < sb.left - 0.5 || r.right > sb.right + 0.5 || r.top < sb.top - 0.5 || r.bottom > sb.bottom + 0.5)
        failures.push(`figure "${name}": label "${t.textContent.trim()}" runs outside the plot`);
    }
  }

  // every element with its own visible text: HTML elements with a direct text node, and SVG text elements
  let checked = 0;
  const all = [...document.body.querySelectorAll('*')];
  for (const el of all) {
    const own = [...el.childNodes].some(n => n.nodeType === 3 && n.textContent.trim());
    if (!own) continue;
    const cs = getComputedStyle(el);
    if (cs.visibility === 'hidden' || cs.display === 'none') continue;
    const r = el.getBoundingClientRect();
    if (r.width === 0 || r.height === 0) continue;
    const isSvg = el instanceof SVGElement;
    let fg = parse(isSvg ? cs.fill : cs.color);
    if (!fg) continue;
    fg = { ...fg, a: fg.a * opacity(el) };
    // upper-casing turns Greek α and β into Α and Β, which read as Latin A and B
    if (/[\u0370-\u03FF]/.test(el.textContent) && cs.textTransform !== 'none')
      failures.push(`text-transform ${cs.textTransform} on Greek text "${el.textContent.trim().slice(0, 40)}"`);
    const bg = isSvg ? svgBackground(el) : htmlBackground(el);
    const c = ratio(over(fg, bg), bg);
    checked++;
    if (c < 4.5) failures.push(`contrast ${c.toFixed(2)}:1 < 4.5:1 for <${el.tagName.toLowerCase()}> "${el.textContent.trim().slice(0, 40)}"`);
  }
  if (checked < 20) failures.push(`only ${checked} text elements checked`);
  return { failures, checked, figures: figures.length, scrollWidth: sw, viewport: vw };
}

const browser = await puppeteer.launch({
  executablePath, headless: true,
  args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
const result = { ok: true, failures: [], widths: {} };
try {
  for (const width of widths) {
    const page = await browser.newPage();
    const errors = [];
    page.on('console', m => { if (m.type() === 'error') errors.push(m.text()); });
    page.on('pageerror', e => errors.push(String(e)));
    page.on('requestfailed', r => errors.push(`request failed: ${r.url()}`));
    page.on('request', r => { if (!r.url().startsWith('file:') && !r.url().startsWith('data:')) errors.push(`network request: ${r.url()}`); });
    await page.setViewport({ width, height: 900, deviceScaleFactor: 1 });
    await page.goto(pathToFileURL(path.resolve(report)).href, { waitUntil: 'load' });
    const r = await page.evaluate(inspect);
    r.failures.push(...errors.map(e => `console: ${e}`));
    result.widths[width] = { checked: r.checked, figures: r.figures, scrollWidth: r.scrollWidth, viewport: r.viewport };
    result.failures.push(...r.failures.map(f => `${width} px: ${f}`));
    if (shots) await page.screenshot({ path: path.join(shots, `report-${width}.png`), fullPage: true });
    await page.close();
  }
} finally {
  await browser.close();
}
result.ok = result.failures.length === 0;
console.log(JSON.stringify(result, null, 1));
process.exit(result.ok ? 0 : 1);
