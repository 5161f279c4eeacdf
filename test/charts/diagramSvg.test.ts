import { describe, expect, it } from 'vitest';
import { automaticEMax, renderDiagram } from '../../charts/diagram.js';
import { overlaps } from '../../charts/labelLayout.js';
import { levelView, renderLevelDiagram } from '../../charts/levelDiagram.js';
import { type Geometry, solveCubic, sweepDiagram } from '../../src/index.js';
import { type SvgText, svgTexts } from './svgParse.js';

/** C/B near the free-ion ratios of common ions of each dⁿ (from memory; any value near 4–5 would do). */
const C_OVER_B: Record<number, number> = { 2: 4.5, 3: 4.5, 4: 4.61, 5: 4.48, 6: 4.8, 7: 4.63, 8: 4.71 };

/** A box shrunk by 1 px each side, so that estimated boxes that only touch are not counted. */
function inset(t: SvgText) {
  return { left: t.box.left + 1, right: t.box.right - 1, top: t.box.top + 1, bottom: t.box.bottom - 1 };
}

/** Every pair of texts that overlap, by their estimated boxes. */
function overlapping(texts: readonly SvgText[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < texts.length; i++)
    for (let j = i + 1; j < texts.length; j++) {
      const a = texts[i] as SvgText;
      const b = texts[j] as SvgText;
      if (overlaps(inset(a), inset(b))) out.push(`"${a.text}" / "${b.text}"`);
    }
  return out;
}

describe('renderLevelDiagram: the SVG read back', () => {
  it.each([
    ['Cr3+', 3, 1740, 725, 3190],
    ['Co3+', 6, 2300, 635, 3048],
    ['Mn2+', 5, 850, 860, 3850],
  ] as const)('%s: every level shown named once, no two texts overlapping', (ion, n, dq, B, C) => {
    const result = solveCubic({ n, dq, B, C });
    const texts = svgTexts(renderLevelDiagram(result, { format: 'svg' }, { ion }).toString()).filter(
      (t) => !t.halo,
    );
    const written = texts.map((t) => t.text);
    for (const l of levelView(result).levels)
      expect(
        written.filter((t) => t === l.label),
        l.label,
      ).toHaveLength(1);
    expect(overlapping(texts)).toEqual([]);
  });
});

describe('renderDiagram: the SVG read back', () => {
  const cases: [number, Geometry][] = [
    [2, 'oct'],
    [3, 'oct'],
    [4, 'oct'],
    [5, 'oct'],
    [6, 'oct'],
    [7, 'oct'],
    [8, 'oct'],
    [3, 'tet'],
    [7, 'tet'],
  ];
  it.each(cases)(
    'd%s %s: every spin-allowed curve in the plot named in a <text>, no two texts overlapping',
    (n, geometry) => {
      const d = sweepDiagram(n, { geometry, cOverB: C_OVER_B[n] ?? 4.5, points: 100 });
      const texts = svgTexts(renderDiagram(d, { format: 'svg' }).toString()).filter((t) => !t.halo);
      const written = new Set(texts.map((t) => t.text));
      const top = automaticEMax(d);
      for (const c of d.curves) {
        const allowed = d.regions.some(
          (r) =>
            r.S === c.S &&
            c.values.some((v, i) => {
              const x = d.deltaOverB[i] ?? 0;
              return v <= top && x >= r.fromDeltaOverB && x <= r.toDeltaOverB;
            }),
        );
        if (allowed) expect(written, `${c.label} of d${n} ${geometry}`).toContain(c.label);
      }
      for (let i = 0; i < texts.length; i++)
        for (let j = i + 1; j < texts.length; j++) {
          const a = texts[i] as SvgText;
          const b = texts[j] as SvgText;
          expect(overlaps(inset(a), inset(b)), `"${a.text}" and "${b.text}"`).toBe(false);
        }
    },
  );
});
