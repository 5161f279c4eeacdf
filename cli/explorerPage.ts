/**
 * The explorer page: one self-contained HTML file (styles, data and the bundled script inlined;
 * no network, works from file://) holding the samples as JSON and the controls, figures and
 * tables that the script (explorer/page.ts, bundled into dist/explorer/bundle.js by
 * `npm run build`) fills in. Shared by `termsplit explore` and the report.
 */

import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { DATA_ELEMENT_ID, type ExplorerData, PARAM_RANGES, type ParamRange } from '../explorer/data.js';
import { packageRoot } from './files.js';
import { htmlEscape } from './report/formats.js';

/** Where the build writes the page's script, relative to the package root. */
export const BUNDLE_PATH = 'dist/explorer/bundle.js';

let bundle: string | undefined;

/** The bundled page script (read once). */
function pageScript(): string {
  if (bundle === undefined) {
    const path = resolve(packageRoot(), BUNDLE_PATH);
    if (!existsSync(path))
      throw new Error(`the explorer's script ${BUNDLE_PATH} is missing: run npm run build`);
    bundle = readFileSync(path, 'utf8');
  }
  return bundle;
}

/** Text that may sit inside a `<script>` element: no `</script`, no `<!--`. */
function scriptSafe(text: string): string {
  return text.replace(/<\/(script)/gi, '<\\/$1').replace(/<!--/g, '<\\!--');
}

/** JSON inside a `<script type="application/json">`: every `<` escaped. */
function jsonInHtml(value: unknown): string {
  return JSON.stringify(value).replace(/</g, '\\u003c');
}

function slider(id: string, label: string, r: ParamRange): string {
  const bounds = `min="${r.min}" max="${r.max}" step="${r.step}"`;
  return (
    `<div class="control"><label for="${id}">${label}</label>` +
    `<input type="range" id="${id}" ${bounds}>` +
    `<label class="hidden-label" for="${id}-value">${label}, exact value</label>` +
    `<input type="number" id="${id}-value" ${bounds} inputmode="decimal"></div>`
  );
}

function options(values: readonly [string, string][]): string {
  return values.map(([v, t]) => `<option value="${v}">${htmlEscape(t)}</option>`).join('');
}

function controls(data: ExplorerData): string {
  const samples = data.samples.map((s, i): [string, string] => [String(i), s.name]);
  const counts = Array.from({ length: 9 }, (_, i): [string, string] => [String(i + 1), `d${i + 1}`]);
  return (
    `<form id="controls" onsubmit="return false">` +
    `<div class="control"><label for="sample">Sample</label><select id="sample">${options(samples)}</select></div>` +
    `<div class="control"><label for="n">d electrons</label><select id="n">${options(counts)}</select></div>` +
    `<div class="control"><label for="geometry">Geometry</label><select id="geometry">${options([
      ['oct', 'octahedral'],
      ['tet', 'tetrahedral'],
    ])}</select></div>` +
    slider('dq', 'Dq / cm⁻¹', PARAM_RANGES.dq) +
    slider('B', 'Racah B / cm⁻¹', PARAM_RANGES.B) +
    slider('cOverB', 'C/B', PARAM_RANGES.cOverB) +
    slider('zeta', 'ζ (spin–orbit) / cm⁻¹', PARAM_RANGES.zeta) +
    `<div class="control"><label for="spectrum-file">Spectrum file (text or JCAMP-DX)</label><input type="file" id="spectrum-file"></div>` +
    `<p><a id="permalink" href="#">Permalink to these parameters</a></p>` +
    `</form>`
  );
}

function figures(data: ExplorerData): string {
  const origins = data.samples.map((s) => `<li>${htmlEscape(s.name)}: ${htmlEscape(s.origin)}</li>`).join('');
  return (
    `<figure id="diagram-figure"><div id="diagram" class="figure"></div>` +
    `<figcaption>Energies of the levels above the ground state against the field, both over B, at the current C/B (curves without spin–orbit coupling). Dashed violet: the current Δ/B, with the current levels as dots and the observed bands as open diamonds.` +
    ` <button type="button" id="export-diagram-svg">Save as SVG</button> <button type="button" id="export-diagram-png">Save as PNG</button></figcaption></figure>` +
    `<p id="hover-info" aria-live="polite">Point at a curve or a level for its parent term and strong-field make-up.</p>` +
    `<figure id="spectrum-figure" hidden><div id="spectrum" class="figure"></div>` +
    `<figcaption>The spectrum with the transitions at the current parameters as sticks (blue: spin-allowed; light, short: spin-forbidden).` +
    ` <button type="button" id="export-spectrum-svg">Save as SVG</button> <button type="button" id="export-spectrum-png">Save as PNG</button></figcaption></figure>` +
    `<details><summary>Starting values</summary><ul>${origins}</ul></details>`
  );
}

const STYLES = `
:root { color: #222; background: #fff; font-family: 'DejaVu Sans', system-ui, sans-serif; line-height: 1.4; }
body { margin: 0 auto; padding: 0.75rem 1rem 2rem; max-width: 1400px; }
h1 { font-size: 1.35rem; margin: 0.2rem 0 0.3rem; }
.note { color: #555d66; margin: 0 0 0.8rem; font-size: 0.92rem; }
#explorer { display: grid; grid-template-columns: 18rem minmax(0, 1fr); gap: 1.2rem; align-items: start; }
#controls { display: flex; flex-direction: column; gap: 0.55rem; }
.control { display: grid; grid-template-columns: 1fr 6.5rem; gap: 0.2rem 0.5rem; align-items: center; }
.control > label:first-child { grid-column: 1 / -1; font-weight: 600; font-size: 0.95rem; }
.control select, .control input[type=file] { grid-column: 1 / -1; }
.control input, .control select, button { font: inherit; font-size: 0.95rem; }
.hidden-label { position: absolute; width: 1px; height: 1px; overflow: hidden; clip-path: inset(50%); white-space: nowrap; }
input:focus-visible, select:focus-visible, button:focus-visible, a:focus-visible, tr:focus-visible { outline: 3px solid #6a3d9a; outline-offset: 1px; }
figure { margin: 0 0 0.8rem; }
.figure svg { width: 100%; height: auto; max-width: 900px; display: block; }
figcaption { font-size: 0.9rem; color: #555d66; max-width: 900px; }
#status { font-size: 0.92rem; margin: 0.4rem 0; min-height: 1.3em; }
#status[role=alert] { color: #a4431c; }
#hover-info { font-size: 0.92rem; min-height: 2.6em; margin: 0.2rem 0 0.8rem; max-width: 900px; }
.figure .hot { stroke-width: 4.5px; }
table { border-collapse: collapse; margin: 0.6rem 0 1.2rem; font-size: 0.9rem; }
caption { text-align: left; font-weight: 600; padding-bottom: 0.3rem; }
th, td { padding: 0.2rem 0.55rem; border-bottom: 1px solid #dde2e7; text-align: left; vertical-align: top; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
tr.forbidden { color: #6b7885; }
tbody tr:hover, tbody tr:focus { background: #f1f4f8; }
#tables { overflow-x: auto; }
@media (max-width: 760px) {
  #explorer { grid-template-columns: minmax(0, 1fr); }
  body { padding: 0.5rem; }
  .figure { overflow-x: auto; }
  .figure svg { min-width: 560px; }
  th, td { padding: 0.2rem 0.35rem; }
}
`;

/** The whole page for these samples. */
export function explorerHtml(data: ExplorerData): string {
  return [
    '<!DOCTYPE html>',
    '<html lang="en"><head><meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${htmlEscape(data.title)}</title>`,
    `<style>${STYLES}</style></head><body>`,
    `<header><h1>${htmlEscape(data.title)}</h1>`,
    `<p class="note">Levels of dⁿ in a cubic field, computed in this page by termsplit's own solver. Model limits: no Jahn–Teller distortion, no charge-transfer bands; a spin state read from here is a prediction — measurement and local practice decide.</p></header>`,
    `<main id="explorer"><section aria-label="Parameters">${controls(data)}</section>`,
    `<section aria-label="Figures and levels"><p id="status" aria-live="polite"></p>${figures(data)}<div id="tables"></div></section></main>`,
    `<script type="application/json" id="${DATA_ELEMENT_ID}">${jsonInHtml(data)}</script>`,
    `<script>${scriptSafe(pageScript())}</script>`,
    '</body></html>',
    '',
  ].join('\n');
}
