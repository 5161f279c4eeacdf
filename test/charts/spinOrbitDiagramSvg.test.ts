import { describe, expect, it } from 'vitest';
import { automaticEMax, renderDiagram } from '../../charts/diagram.js';
import { overlaps } from '../../charts/labelLayout.js';
import { STYLE } from '../../charts/style.js';
import { spinOrbitAsCorrelation, sweepSpinOrbit } from '../../src/analysis/spinOrbitSweep.js';
import { type SvgText, svgTexts } from './svgParse.js';

/** A box shrunk by 1 px each side, so that estimated boxes that only touch are not counted. */
function inset(t: SvgText) {
  return { left: t.box.left + 1, right: t.box.right - 1, top: t.box.top + 1, bottom: t.box.bottom - 1 };
}

describe('renderDiagram with ζ: the SVG read back', () => {
  // Ni²⁺-like d⁸ (C/B 4.46, ζ/B 0.6) and Co²⁺-like tetrahedral d⁷ (C/B 3.92, ζ/B 0.48): free-ion
  // ratios of the ion table; any values near these would do.
  const cases = [
    { n: 8, geometry: 'oct', cOverB: 4.46, zetaOverB: 0.6, max: 30 },
    { n: 7, geometry: 'tet', cOverB: 3.92, zetaOverB: 0.48, max: 20 },
  ] as const;

  it.each(cases)(
    'd$n $geometry: each curve of spin-allowed parentage at the right edge named "Γ parent" in the strong colour, the others light, no texts overlapping',
    ({ n, geometry, cOverB, zetaOverB, max }) => {
      const d = spinOrbitAsCorrelation(
        sweepSpinOrbit(n, { geometry, cOverB, zetaOverB, maxDeltaOverB: max, points: 80 }),
      );
      const svg = renderDiagram(d, { format: 'svg' }).toString();
      const texts = svgTexts(svg).filter((t) => !t.halo);
      const top = automaticEMax(d);
      const groundS = d.regions.at(-1)?.S;
      let named = 0;
      for (const c of d.curves) {
        const end = c.values.at(-1) ?? 0;
        const parent = c.stretches?.at(-1)?.parent ?? '';
        const caption = `${c.irrep}\u2009${parent}`;
        const text = texts.find((t) => t.text === caption);
        if (c.S === groundS && end <= top) {
          expect(text, `${caption} of d${n}`).toBeDefined();
          expect(text?.fill.toLowerCase()).toBe(STYLE.allowed);
          named++;
        } else if (text && c.S !== groundS) expect(text.fill.toLowerCase()).toBe(STYLE.forbiddenText);
      }
      expect(named).toBeGreaterThan(3);
      // Both line styles are drawn: strong lines of spin-allowed parentage, light ones of the rest.
      expect(svg.toLowerCase()).toContain(`stroke="${STYLE.allowed}"`);
      expect(svg.toLowerCase()).toContain(`stroke="${STYLE.forbidden}"`);
      expect(texts.map((t) => t.text)).toContain('from spin-allowed ²ˢ⁺¹Γ');
      for (let i = 0; i < texts.length; i++)
        for (let j = i + 1; j < texts.length; j++) {
          const a = texts[i] as SvgText;
          const b = texts[j] as SvgText;
          expect(overlaps(inset(a), inset(b)), `"${a.text}" and "${b.text}"`).toBe(false);
        }
    },
  );

  it('spinOrbitAsCorrelation of high-spin/low-spin d⁶ marks where the ground level’s parent changes spin (⁵T₂g → ¹A₁g)', () => {
    const d = spinOrbitAsCorrelation(sweepSpinOrbit(6, { cOverB: 4.8, zetaOverB: 0.4, points: 120 }));
    expect(d.crossings).toHaveLength(1);
    expect(d.crossings[0]).toMatchObject({ from: '5T2g', to: '1A1g(I)', fromS: 2, toS: 0 });
    expect(d.regions.map((r) => r.S)).toEqual([2, 0]);
  });
});
