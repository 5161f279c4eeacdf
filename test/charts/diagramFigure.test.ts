import { loadImage } from '@napi-rs/canvas';
import type { ChartDataset } from 'chart.js';
import { describe, expect, it } from 'vitest';
import {
  automaticEMax,
  type DiagramLabel,
  diagramChart,
  diagramTitleText,
  renderDiagram,
} from '../../charts/diagram.js';
import { overlaps, spreadLabels } from '../../charts/labelLayout.js';
import {
  DEFAULT_LEVEL_CEILING,
  DEFAULT_LEVEL_FORBIDDEN,
  levelDiagramHeight,
  levelView,
  renderLevelDiagram,
} from '../../charts/levelDiagram.js';
import { renderChart } from '../../charts/render.js';
import { samplePosition, withSample } from '../../charts/sampleOverlay.js';
import { type CorrelationDiagram, InputError, solveCubic, sweepDiagram } from '../../src/index.js';
import { expectClose } from '../helpers.js';

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

const d6 = sweepDiagram(6, { cOverB: 4.8, points: 120 });
const d3 = sweepDiagram(3, { cOverB: 4.5, points: 120 });

/** Checks an SVG file: well-formed tag nesting, an <svg> root, and Skia reads it back at the right size. */
async function expectSvg(bytes: Buffer, width: number, height: number): Promise<void> {
  const text = bytes.toString('utf8');
  expect(text).toMatch(/^(<\?xml[^>]*>\s*)?<svg[\s>]/);
  const stack: string[] = [];
  for (const m of text.matchAll(/<(\/?)([A-Za-z][\w:.-]*)[^>]*?(\/?)>/g)) {
    const [, closing, name, selfClosing] = m;
    if (selfClosing) continue;
    if (closing) expect(stack.pop()).toBe(name);
    else stack.push(name ?? '');
  }
  expect(stack).toEqual([]);
  const image = await loadImage(bytes);
  expect([image.width, image.height]).toEqual([width, height]);
}

describe('renderDiagram: files', () => {
  it('writes a PNG with the PNG signature, at twice the CSS size', async () => {
    const png = renderDiagram(d6, { format: 'png' });
    expect([...png.subarray(0, 8)]).toEqual(PNG_SIGNATURE);
    expect(png.length).toBeGreaterThan(50_000);
    const image = await loadImage(png);
    expect([image.width, image.height]).toEqual([1800, 1300]);
  });

  it('writes an SVG that parses', async () => {
    const svg = renderDiagram(
      d6,
      { format: 'svg' },
      { sample: { dq: 1900, B: 1050, bands: [16500, 23000] } },
    );
    expect(svg.length).toBeGreaterThan(10_000);
    await expectSvg(svg, 900, 650);
  });

  it('writes a PDF with its header and end marker', () => {
    const pdf = renderDiagram(d3, { format: 'pdf' });
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.subarray(-1024).toString('latin1')).toMatch(/%%EOF\s*$/);
    expect(pdf.length).toBeGreaterThan(20_000);
  });
});

describe('diagramChart: labels in the figure', () => {
  /** The labels placed when the figure is drawn. */
  function labelsOf(diagram: CorrelationDiagram): DiagramLabel[] {
    let labels: DiagramLabel[] = [];
    renderChart(
      diagramChart(diagram, {
        onLabels: (l) => {
          labels = [...l];
        },
      }),
      { format: 'svg' },
    );
    return labels;
  }

  it.each([
    [2, 'oct', 4.5],
    [3, 'oct', 4.5],
    [5, 'oct', 4.48],
    [6, 'oct', 4.8],
    [8, 'oct', 4.71],
    [7, 'tet', 4.5],
  ] as const)(
    'labels every spin-allowed curve ending inside the plot of d%s %s, with no two labels overlapping',
    (n, geometry, cOverB) => {
      const d = sweepDiagram(n, { geometry, cOverB, points: 120 });
      const labels = labelsOf(d);
      const top = automaticEMax(d);
      const named = new Set(labels.map((l) => l.text));
      for (const c of d.curves) {
        const allowedSomewhere = d.regions.some((r) => r.S === c.S);
        const end = c.values.at(-1) ?? Number.POSITIVE_INFINITY;
        if (allowedSomewhere && end <= top) expect(named, c.label).toContain(c.label);
      }
      for (let i = 0; i < labels.length; i++) {
        for (let j = i + 1; j < labels.length; j++) {
          const a = labels[i];
          const b = labels[j];
          if (a && b) expect(overlaps(a.box, b.box), `${a.text} / ${b.text}`).toBe(false);
        }
      }
    },
  );

  it('names the ground state of the high-spin side on the zero line, and the free-ion ground term', () => {
    const labels = labelsOf(d6);
    expect(labels).toContainEqual(expect.objectContaining({ text: '5T2g', kind: 'ground' }));
    expect(labels).toContainEqual(expect.objectContaining({ text: '5D', kind: 'term' }));
    expect(labels).toContainEqual(expect.objectContaining({ text: '5Eg' }));
  });

  it('diagramChart draws each curve as runs of one style joined end to end, allowed curves first', () => {
    const datasets = diagramChart(d6).data.datasets as ChartDataset<'scatter'>[];
    // Each curve's runs stand together, once, and every curve is drawn.
    const order = datasets.map((d) => d.label).filter((l, i, all) => l !== all[i - 1]);
    expect(order).toHaveLength(d6.curves.length);
    expect(new Set(order)).toEqual(new Set(d6.curves.map((c) => c.label)));
    const first = datasets[0];
    expect(d6.regions.some((r) => r.S === d6.curves.find((c) => c.label === first?.label)?.S)).toBe(true);
    // ⁵T₂g is spin-allowed on the high-spin side only: two runs, drawn left to right (the
    // later dataset first), meeting at one sweep point, with the whole curve's points.
    const runs = datasets.filter((d) => d.label === '5T2g').reverse();
    expect(runs.map((d) => d.borderColor)).toEqual(['#1d4e89', '#9aa7b4']);
    const [left, right] = runs.map((d) => d.data as { x: number; y: number }[]);
    expect(left?.at(-1)).toEqual(right?.[0]);
    expect((left?.length ?? 0) + (right?.length ?? 0) - 1).toBe(d6.deltaOverB.length);
    // The sweep has a point at the crossover, where the style changes.
    expect(left?.at(-1)?.x).toBeCloseTo(d6.crossings[0]?.deltaOverB ?? 0, 9);
  });

  it('titles the figure with dⁿ, the geometry and C/B (none for d¹ and d⁹), and the ion if named', () => {
    expect(diagramTitleText(d6, 'Fe2+')).toBe('Fe2+, d6 in an octahedral (Oh) field, C/B = 4.80');
    expect(diagramTitleText(sweepDiagram(9, { geometry: 'tet', points: 5 }))).toBe(
      'd9 in a tetrahedral (Td) field',
    );
  });

  it('tops the E/B axis at the highest curve, at most twice the largest Δ/B', () => {
    expect(automaticEMax(d6)).toBe(80);
    const d1 = sweepDiagram(1, { points: 20 });
    // d¹: ²E_g ends at E/B = 40, the axis ends just above it.
    expect(automaticEMax(d1)).toBe(45);
    expect(() => diagramChart(d3, { eMax: -1 })).toThrow(InputError);
  });
});

describe('withSample: the sample on the diagram', () => {
  it('places the sample at Δ/B = 10Dq/B and its bands at E/B = band/B', () => {
    expect(samplePosition({ dq: 1900, B: 1050, bands: [16500, 23000] })).toEqual({
      deltaOverB: 19000 / 1050,
      bandsOverB: [16500 / 1050, 23000 / 1050],
    });
    const config = withSample(diagramChart(d6), { dq: 1900, B: 1050, bands: [16500, 23000] });
    const points = config.data.datasets.at(-1) as ChartDataset<'scatter'>;
    expect(points.data).toEqual([
      { x: 19000 / 1050, y: 16500 / 1050 },
      { x: 19000 / 1050, y: 23000 / 1050 },
    ]);
    expect(config.data.datasets).toHaveLength(diagramChart(d6).data.datasets.length + 1);
  });

  it('raises the E/B axis to show a band above its top, and leaves it otherwise', () => {
    const base = diagramChart(d3);
    expect(withSample(base, { dq: 1500, B: 700, bands: [20000] }).options?.scales?.y?.max).toBe(80);
    const raised = withSample(base, { dq: 1500, B: 500, bands: [50000] }).options?.scales?.y?.max;
    expect(Number(raised)).toBeGreaterThanOrEqual(100);
  });

  it.each([
    [{ dq: 5000, B: 1000 }, /beyond the diagram's largest Δ\/B 40/],
    [{ dq: 0, B: 1000 }, /sample Dq = 0/],
    [{ dq: 1000, B: -5 }, /sample B = -5/],
    [{ dq: 1000, B: 800, bands: [Number.NaN] }, /band NaN/],
  ])('refuses %o', (mark, message) => {
    expect(() => withSample(diagramChart(d3), mark)).toThrow(InputError);
    expect(() => withSample(diagramChart(d3), mark)).toThrow(message);
  });
});

describe('renderLevelDiagram: free ion → field', () => {
  const cr = solveCubic({ n: 3, dq: 1740, B: 725, C: 3190 });

  it('writes PNG, SVG and PDF files', async () => {
    const png = renderLevelDiagram(cr, { format: 'png' }, { ion: 'Cr3+' });
    expect([...png.subarray(0, 8)]).toEqual(PNG_SIGNATURE);
    expect(png.length).toBeGreaterThan(30_000);
    await expectSvg(renderLevelDiagram(cr, { format: 'svg' }), 900, 650);
    const pdf = renderLevelDiagram(cr, { format: 'pdf' });
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.length).toBeGreaterThan(10_000);
  });

  it('grows taller with the number of levels shown so each label has a line', () => {
    const mn = solveCubic({ n: 5, dq: 1000, B: 800, C: 3600 });
    expect(levelDiagramHeight(cr)).toBe(650);
    expect(levelDiagramHeight(mn, { forbidden: 100, eMax: 1e6 })).toBeGreaterThan(650);
  });

  it('levelView: both columns on one zero, the ground level in the field', () => {
    // ⁴A₂g lies 12Dq below ⁴F and ⁵T₂g 4Dq below ⁵D, exactly (neither mixes with another level of
    // its symbol from a lower term): Lever, Inorganic Electronic Spectroscopy, 2nd ed., 1984 (from memory).
    const view = levelView(cr);
    expectClose(view.terms.find((t) => t.name === '4F')?.energy ?? 0, 12 * 1740, 1e-6, 1e-6);
    const co = solveCubic({ n: 6, dq: 2300, B: 635, C: 3048 });
    const coView = levelView(co);
    const t2g = co.levels.find((l) => l.label === '5T2g')?.energy ?? 0;
    expectClose((coView.terms.find((t) => t.name === '5D')?.energy ?? 0) - t2g, 4 * 2300, 1e-6, 1e-6);
  });

  it('levelView: every spin-allowed level under the ceiling and the lowest spin-forbidden ones', () => {
    const co = solveCubic({ n: 6, dq: 2300, B: 635, C: 3048 });
    const view = levelView(co);
    expect(view.top).toBeLessThanOrEqual(DEFAULT_LEVEL_CEILING);
    expect(view.levels.every((l) => l.energy <= DEFAULT_LEVEL_CEILING)).toBe(true);
    const allowed = co.levels.filter((l) => l.spinAllowed && l.energy <= DEFAULT_LEVEL_CEILING);
    expect(view.levels.filter((l) => l.spinAllowed)).toEqual(allowed);
    const forbidden = view.levels.filter((l) => !l.spinAllowed);
    expect(forbidden).toEqual(co.levels.filter((l) => !l.spinAllowed).slice(0, DEFAULT_LEVEL_FORBIDDEN));
    expect(() => levelView(co, { forbidden: -1 })).toThrow(InputError);
  });
});

describe('spreadLabels', () => {
  it('keeps labels at their targets when they do not collide', () => {
    expect(spreadLabels([10, 50, 30], 10, 0, 100)).toEqual([10, 50, 30]);
  });

  it('spreads colliding labels apart symmetrically about their mean, in target order', () => {
    expect(spreadLabels([50, 50, 50], 10, 0, 100)).toEqual([40, 50, 60]);
    const out = spreadLabels([52, 49, 50, 51], 12, 0, 200);
    const sorted = [...out].sort((a, b) => a - b);
    for (let i = 1; i < sorted.length; i++)
      expect((sorted[i] ?? 0) - (sorted[i - 1] ?? 0)).toBeCloseTo(12, 9);
    expect(out[1]).toBeLessThan(out[2] ?? 0);
    expect(out.reduce((s, x) => s + x, 0) / 4).toBeCloseTo(50.5, 9);
  });

  it('keeps a block inside the bounds', () => {
    expect(spreadLabels([1, 1, 1], 10, 0, 100)).toEqual([0, 10, 20]);
    expect(spreadLabels([99, 99], 10, 0, 100)).toEqual([90, 100]);
  });
});
