/**
 * The explorer page's script (bundled with the library by esbuild into one file that the page
 * inlines): reads the page's data, keeps the controls, the figures, the tables and the URL
 * fragment in step, and exports the figures. Every number comes from the library through
 * view.ts; this file only wires the DOM.
 */

import { InputError } from '../src/core/errors.js';
import { absorptionSpectrum } from '../src/spectra/absorptionSpectrum.js';
import { readSpectrum } from '../src/spectra/spectrumAnalysis.js';
import {
  DATA_ELEMENT_ID,
  type ExplorerData,
  type ExplorerParams,
  type ExplorerSpectrum,
  PARAM_RANGES,
} from './data.js';
import { diagramSvg } from './diagramSvg.js';
import { exportPng, exportSvg } from './exportFigure.js';
import { describeCurve, describeLevel } from './hoverText.js';
import { paramsFromFragment, paramsToFragment } from './permalink.js';
import { spectrumSvg } from './spectrumSvg.js';
import { levelTable, spinOrbitTable } from './tables.js';
import { type ExplorerView, viewComputer } from './view.js';

function element<T extends HTMLElement>(id: string): T {
  const e = document.getElementById(id);
  if (!e) throw new Error(`the page has no #${id}`);
  return e as T;
}

const data = JSON.parse(element(DATA_ELEMENT_ID).textContent ?? '{}') as ExplorerData;
const spectra: (ExplorerSpectrum | undefined)[] = data.samples.map((s) => s.spectrum);
const compute = viewComputer();
const main = element('explorer');
const status = element('status');
const info = element('hover-info');
const diagramBox = element('diagram');
const spectrumBox = element('spectrum');
const spectrumFigure = element('spectrum-figure');
const tables = element('tables');
const permalink = element<HTMLAnchorElement>('permalink');
const sampleSelect = element<HTMLSelectElement>('sample');
const nSelect = element<HTMLSelectElement>('n');
const geometrySelect = element<HTMLSelectElement>('geometry');

/** The slider and number box of each numeric parameter. */
const NUMERIC = ['dq', 'B', 'cOverB', 'zeta'] as const;
type Numeric = (typeof NUMERIC)[number];
const sliders = Object.fromEntries(NUMERIC.map((k) => [k, element<HTMLInputElement>(k)])) as Record<
  Numeric,
  HTMLInputElement
>;
const boxes = Object.fromEntries(NUMERIC.map((k) => [k, element<HTMLInputElement>(`${k}-value`)])) as Record<
  Numeric,
  HTMLInputElement
>;

function startParams(sample: number): ExplorerParams {
  const s = data.samples[sample] ?? data.samples[0];
  if (!s) throw new Error('the page has no sample');
  return { sample, n: s.n, geometry: s.geometry, dq: s.dq, B: s.B, cOverB: s.cOverB, zeta: s.zeta };
}

let params = paramsFromFragment(window.location.hash, startParams(0), data.samples.length);
let view: ExplorerView | undefined;

function showControls(p: ExplorerParams): void {
  sampleSelect.value = String(p.sample);
  nSelect.value = String(p.n);
  geometrySelect.value = p.geometry;
  for (const k of NUMERIC) {
    sliders[k].value = String(p[k]);
    boxes[k].value = String(p[k]);
  }
}

/** Recomputes and redraws everything; the time it took goes on the page (`data-update-ms`, of which `data-compute-ms` the library's). */
function update(): void {
  const t0 = performance.now();
  try {
    view = compute(params);
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    status.textContent = e.message;
    status.setAttribute('role', 'alert');
    return;
  }
  main.dataset.computeMs = (performance.now() - t0).toFixed(1);
  const bands = data.samples[params.sample]?.bands ?? [];
  diagramBox.innerHTML = diagramSvg(view, bands);
  const spectrum = spectra[params.sample];
  spectrumFigure.hidden = spectrum === undefined;
  spectrumBox.innerHTML = spectrum ? spectrumSvg(view, spectrum, bands) : '';
  tables.innerHTML = levelTable(view.levels.levels) + (view.spinOrbit ? spinOrbitTable(view.spinOrbit) : '');
  const ms = performance.now() - t0;
  main.dataset.updateMs = ms.toFixed(1);
  status.removeAttribute('role');
  status.textContent = `d${params.n}, ${params.geometry === 'oct' ? 'octahedral' : 'tetrahedral'}: Δ/B = ${view.deltaOverB.toFixed(2)}, C = ${view.C.toFixed(0)} cm⁻¹, ground ${view.levels.ground.label}; updated in ${ms.toFixed(0)} ms`;
  const fragment = paramsToFragment(params);
  permalink.href = `#${fragment}`;
  window.history.replaceState(null, '', `#${fragment}`);
}

let pending = false;
/** One update per frame however fast the slider moves. */
function schedule(): void {
  if (pending) return;
  pending = true;
  requestAnimationFrame(() => {
    pending = false;
    update();
  });
}

for (const k of NUMERIC) {
  const take = (from: HTMLInputElement, to: HTMLInputElement) => {
    const typed = Number(from.value);
    if (from.value === '' || !Number.isFinite(typed)) return;
    // A typed value outside the slider's range is brought inside it (the permalink keeps only those).
    const { min, max } = PARAM_RANGES[k];
    const v = Math.min(max, Math.max(min, typed));
    from.value = String(v);
    to.value = String(v);
    params = { ...params, [k]: v };
    schedule();
  };
  sliders[k].addEventListener('input', () => take(sliders[k], boxes[k]));
  boxes[k].addEventListener('change', () => take(boxes[k], sliders[k]));
}
nSelect.addEventListener('change', () => {
  params = { ...params, n: Number(nSelect.value) };
  schedule();
});
geometrySelect.addEventListener('change', () => {
  params = { ...params, geometry: geometrySelect.value === 'tet' ? 'tet' : 'oct' };
  schedule();
});
sampleSelect.addEventListener('change', () => {
  params = startParams(Number(sampleSelect.value));
  showControls(params);
  schedule();
});

element<HTMLInputElement>('spectrum-file').addEventListener('change', async (event) => {
  const file = (event.target as HTMLInputElement).files?.[0];
  if (!file) return;
  try {
    const s = absorptionSpectrum(readSpectrum(await file.text(), { fileName: file.name }));
    spectra[params.sample] = {
      wavenumber: Array.from(s.wavenumber),
      value: Array.from(s.value),
      quantity: s.quantity,
    };
    update();
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    status.textContent = `${file.name}: ${e.message}`;
    status.setAttribute('role', 'alert');
  }
});

/** Hover (or keyboard focus) on a curve or a table row: its details in the line under the diagram. */
function highlight(label: string | undefined): void {
  for (const e of diagramBox.querySelectorAll('.hot')) e.classList.remove('hot');
  if (!view || label === undefined) return;
  const i = view.diagram.curves.findIndex((c) => c.label === label);
  for (const e of diagramBox.querySelectorAll(`[data-line="${i}"]`)) e.classList.add('hot');
}
diagramBox.addEventListener('pointerover', (event) => {
  const i = (event.target as Element).getAttribute('data-curve');
  if (!view || i === null) return;
  const curve = view.diagram.curves[Number(i)];
  if (!curve) return;
  info.textContent = describeCurve(curve, view);
  highlight(curve.label);
});
diagramBox.addEventListener('pointerleave', () => highlight(undefined));
for (const type of ['pointerover', 'focusin'] as const) {
  tables.addEventListener(type, (event) => {
    const row = (event.target as Element).closest('tr[data-label]');
    const level = view?.levels.levels.find((l) => l.label === row?.getAttribute('data-label'));
    if (!view || !level) return;
    info.textContent = describeLevel(level, view);
    highlight(level.label);
  });
}

const figureName = () => `termsplit-d${params.n}-${params.geometry}`;
element('export-diagram-svg').addEventListener('click', () =>
  exportSvg(diagramBox, `${figureName()}-diagram`),
);
element('export-diagram-png').addEventListener('click', () =>
  exportPng(diagramBox, `${figureName()}-diagram`),
);
element('export-spectrum-svg').addEventListener('click', () =>
  exportSvg(spectrumBox, `${figureName()}-spectrum`),
);
element('export-spectrum-png').addEventListener('click', () =>
  exportPng(spectrumBox, `${figureName()}-spectrum`),
);
window.addEventListener('hashchange', () => {
  const next = paramsFromFragment(window.location.hash, params, data.samples.length);
  if (paramsToFragment(next) === paramsToFragment(params)) return;
  params = next;
  showControls(params);
  update();
});

showControls(params);
update();
