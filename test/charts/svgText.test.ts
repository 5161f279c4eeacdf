import { loadImage } from '@napi-rs/canvas';
import { describe, expect, it } from 'vitest';
import { renderDiagram } from '../../charts/diagram.js';
import { groupedNumber, tickText } from '../../charts/numbers.js';
import { renderChart } from '../../charts/render.js';
import { compactShapes, mergeClipGroups } from '../../charts/svgShapes.js';
import { editableSvg, SVG_FONT_FAMILY } from '../../charts/svgText.js';
import { formulaHtml, formulaRuns, formulaTextHtml } from '../../charts/typeset.js';
import { sweepDiagram } from '../../src/index.js';
import { svgTexts } from './svgParse.js';

describe('editableSvg', () => {
  it('joins the words Skia writes one by one into one <text>, spaces put back from the gaps', () => {
    // Once to register the figures' font, which the gaps are measured in.
    renderChart({ type: 'scatter', data: { datasets: [] } }, { format: 'svg', width: 50, height: 50 });
    const skia = [
      '<svg>',
      '<text fill="#222" font-size="10" font-family="DejaVu Sans" x="10, 16.36, " y="20.123456, ">in</text>',
      '<text fill="#222" font-size="10" font-family="DejaVu Sans" x="" y=""></text>',
      // "in" ends at 16.36 + 6.34 (the advance of "n" at 10 px); one space of 3.18 px follows.
      '<text fill="#222" font-size="10" font-family="DejaVu Sans" x="25.88, " y="20.123456, ">O</text>',
      '</svg>',
    ].join('');
    const out = editableSvg(skia);
    const texts = svgTexts(out);
    expect(texts.map((t) => t.text)).toEqual(['in O']);
    expect(out).toContain(`font-family="${SVG_FONT_FAMILY}"`);
    expect(out).toContain('y="20.12"');
  });

  it('writes raised and lowered runs as tspans of one label, and spells ligatures as letters', () => {
    const svg = renderDiagram(sweepDiagram(3, { cOverB: 4.5, points: 60 }), { format: 'svg' }).toString();
    const texts = svgTexts(svg).map((t) => t.text);
    expect(texts).toContain('d3 in an octahedral (Oh) field, C/B = 4.50');
    expect(texts).toContain('4T2g');
    expect(svg).toMatch(/<tspan font-size="[\d.]+" dy="[-\d.]+">T<\/tspan>/);
    expect(svg).not.toContain('ﬁ');
    expect(editableSvg('<text font-size="9" x="1, " y="2, ">ﬁeld / cm⁻¹</text>')).toContain('>field / cm⁻¹<');
  });
});

describe('compactShapes', () => {
  it('drops polyline points within a tenth of a pixel of the line and keeps the corners', () => {
    const out = compactShapes('<path stroke="red" d="M0 0L1 1.00001L2 2L3 2.5L4 3"/>');
    expect(out).toBe('<path stroke="red" d="M0 0L2 2L4 3"/>');
  });

  it('writes a closed path of quadratic pieces around a square box as a circle', () => {
    const pts = Array.from({ length: 17 }, (_, k) => {
      const a = (2 * Math.PI * k) / 16;
      return `${(10 + 3 * Math.cos(a)).toFixed(3)} ${(20 + 3 * Math.sin(a)).toFixed(3)}`;
    });
    const d = `M${pts[0]}${pts
      .slice(1)
      .map((p, k) => `Q${pts[k]} ${p}`)
      .join('')}Z`;
    expect(compactShapes(`<path fill="#123" d="${d}"/>`)).toBe('<circle fill="#123" cx="10" cy="20" r="3"/>');
  });
});

describe('mergeClipGroups', () => {
  const group = (id: string, rect: string, body: string) =>
    `<clipPath id="${id}"><rect ${rect}/></clipPath><g clip-path="url(#${id})">${body}</g>`;

  it('joins neighbouring groups with the same clip rectangle and keeps the others apart', () => {
    const svg = [
      '<svg>',
      group('a', 'width="5"', '<path d="M0 0L1 1"/>'),
      group('b', 'width="5"', '<path d="M1 1L2 2"/>'),
      group('c', 'width="9"', '<path d="M2 2L3 3"/>'),
      '<text>x</text>',
      group('d', 'width="9"', '<path d="M3 3L4 4"/>'),
      '</svg>',
    ].join('');
    expect(mergeClipGroups(svg)).toBe(
      [
        '<svg>',
        group('a', 'width="5"', '<path d="M0 0L1 1"/><path d="M1 1L2 2"/>'),
        group('c', 'width="9"', '<path d="M2 2L3 3"/>'),
        '<text>x</text>',
        group('d', 'width="9"', '<path d="M3 3L4 4"/>'),
        '</svg>',
      ].join(''),
    );
  });

  it('leaves a clip group holding a group of its own as it is', () => {
    const svg = `<svg>${group('a', 'width="5"', '<g><path d="M0 0"/></g>')}${group('b', 'width="5"', '<path d="M1 1"/>')}</svg>`;
    expect(mergeClipGroups(svg)).toBe(svg);
  });
});

describe('renderDiagram: SVG size', () => {
  it('keeps a crowded diagram (d6) under 150 kB, text as <text> and not as outlines', () => {
    const svg = renderDiagram(sweepDiagram(6, { cOverB: 4.8, points: 120 }), { format: 'svg' });
    expect(svg.length).toBeLessThan(150_000);
    expect(svgTexts(svg.toString()).length).toBeGreaterThan(40);
  });
});

describe('tickText and groupedNumber', () => {
  it('prints the minus sign, never a signed zero, and decimals from the tick spacing', () => {
    const ticks = [{ value: -0.1 }, { value: 0 }, { value: 0.1 }];
    expect(tickText(-0.1, ticks)).toBe('−0.1');
    expect(tickText(-1e-17, ticks)).toBe('0.0');
    expect(tickText(0.30000000000000004, ticks)).toBe('0.3');
    expect(tickText(25000, [{ value: 0 }, { value: 5000 }])).toBe('25\u2009000');
    expect(groupedNumber(-12345)).toBe('−12\u2009345');
    expect(groupedNumber(5000)).toBe('5000');
  });
});

describe('formulaRuns and formulaHtml', () => {
  it('lowers counts and raises the charge with a minus sign, and leaves plain names alone', () => {
    expect(formulaRuns('[Ni(ors)6]4-')).toEqual([
      { text: '[Ni(ors)', shift: 'base' },
      { text: '6', shift: 'sub' },
      { text: ']', shift: 'base' },
      { text: '4−', shift: 'sup' },
    ]);
    expect(formulaHtml('[Fe(tvc)3]2+')).toBe('[Fe(tvc)<sub>3</sub>]<sup>2+</sup>');
    expect(formulaHtml('sample A1')).toBe('sample A1');
    expect(formulaHtml('A1')).toBe('A1');
  });
});

describe('renderChart: journal column sizes and dpi', () => {
  const d3 = sweepDiagram(3, { cOverB: 4.5, points: 40 });
  it('prints a one-column figure 85 mm wide: SVG in mm over a pixel viewBox, PNG at the dpi, PDF in points', async () => {
    const svg = renderDiagram(d3, { format: 'svg', size: 'one-column' }).toString();
    expect(svg).toMatch(/<svg[^>]* width="85mm" height="[\d.]+mm" viewBox="0 0 440 \d+"/);
    const png = await loadImage(renderDiagram(d3, { format: 'png', size: 'one-column', dpi: 300 }));
    // 85 mm at 300 pixels per inch.
    expect(Math.abs(png.width - (85 / 25.4) * 300)).toBeLessThan(2);
    const pdf = renderDiagram(d3, { format: 'pdf', size: 'two-column' }).toString('latin1');
    // 175 mm in points (1/72 in).
    expect(Number(/MediaBox \[0 0 ([\d.]+)/.exec(pdf)?.[1])).toBeCloseTo((175 / 25.4) * 72, 0);
  });

  it('takes --dpi without a preset as pixels per 96 CSS px, and refuses a silly one', async () => {
    const png = await loadImage(renderDiagram(d3, { format: 'png', dpi: 96 }));
    expect(png.width).toBe(900);
    expect(() => renderDiagram(d3, { format: 'png', dpi: 5 })).toThrow(/dpi/);
  });
});

describe('formulaTextHtml', () => {
  it('typesets the formulae of a sentence word by word and leaves labels, configurations and numbers', () => {
    expect(formulaTextHtml('[Cr(mz)6]3+: 4T2g at 17 400 cm⁻¹, d3, Co2+.')).toBe(
      '[Cr(mz)<sub>6</sub>]<sup>3+</sup>: 4T2g at 17 400 cm⁻¹, d3, Co<sup>2+</sup>.',
    );
  });
});
