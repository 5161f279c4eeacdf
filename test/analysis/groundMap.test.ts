import { loadImage } from '@napi-rs/canvas';
import { describe, expect, it } from 'vitest';
import { renderGroundMap } from '../../charts/groundMap.js';
import { MAP_B } from '../../src/analysis/groundMap.js';
import { crossoverAnalysis, groundStateMap, InputError } from '../../src/index.js';

const small = { minCOverB: 4, maxCOverB: 5, rows: 3, columns: 40 } as const;

describe('groundStateMap', () => {
  const map = groundStateMap(6, small);

  it('puts the boundary of each row at the crossover of crossoverAnalysis for that C/B', () => {
    expect(map.rows.map((r) => r.cOverB)).toEqual([4, 4.5, 5]);
    for (const row of map.rows) {
      const expected = crossoverAnalysis({ n: 6, B: MAP_B, C: row.cOverB * MAP_B }).crossings[0]?.deltaOverB;
      expect(row.crossings).toHaveLength(1);
      expect(row.crossings[0]?.deltaOverB ?? 0).toBeCloseTo(expected ?? 1, 6);
    }
  });

  it('covers 0…maxDeltaOverB with contiguous segments, high spin on the left (octahedral d6: 5T2g then 1A1g)', () => {
    for (const row of map.rows) {
      expect(row.segments[0]?.from).toBe(0);
      expect(row.segments.at(-1)?.to).toBe(map.maxDeltaOverB);
      row.segments.slice(1).forEach((s, i) => {
        expect(s.from).toBe(row.segments[i]?.to);
      });
      expect(row.segments.map((s) => s.symbol)).toEqual(['5T2g', '1A1g']);
    }
    expect(map.states).toEqual([
      { symbol: '5T2g', S: 2 },
      { symbol: '1A1g', S: 0 },
    ]);
  });

  it('moves the crossover to larger Δ/B as C/B grows (exchange favours high spin)', () => {
    const at = map.rows.map((r) => r.crossings[0]?.deltaOverB ?? 0);
    expect(at[0] ?? 0).toBeLessThan(at[1] ?? 0);
    expect(at[1] ?? 0).toBeLessThan(at[2] ?? 0);
  });

  it('has one state for d3 everywhere', () => {
    const d3 = groundStateMap(3, { ...small, rows: 2 });
    expect(d3.states).toEqual([{ symbol: '4A2g', S: 1.5 }]);
    expect(d3.rows.every((r) => r.segments.length === 1)).toBe(true);
  });

  it('reports progress once per row', () => {
    const seen: number[] = [];
    groundStateMap(3, { ...small, rows: 2, columns: 4, onRow: (done) => seen.push(done) });
    expect(seen).toEqual([1, 2]);
  });

  it('refuses empty or reversed ranges with InputError', () => {
    expect(() => groundStateMap(6, { minCOverB: 5, maxCOverB: 4 })).toThrow(InputError);
    expect(() => groundStateMap(6, { rows: 0 })).toThrow(/rows/);
    expect(() => groundStateMap(6, { maxDeltaOverB: -1 })).toThrow(/Δ\/B/);
    expect(() => groundStateMap(6, { geometry: 'sq' as 'oct' })).toThrow(/geometry/);
  });
});

describe('renderGroundMap', () => {
  const map = groundStateMap(6, small);
  const marks = { cOverB: 4.8, sample: { deltaOverB: 22, cOverB: 4.8, sigmaDeltaOverB: 0.8 } };

  it('writes a PNG (signature) of the requested size', async () => {
    const png = renderGroundMap(map, { format: 'png', width: 600, height: 450, pngScale: 1 }, marks);
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const img = await loadImage(png);
    expect([img.width, img.height]).toEqual([600, 450]);
  });

  it('writes an SVG that an SVG renderer parses', async () => {
    const svg = renderGroundMap(map, { format: 'svg', width: 600, height: 450 }, marks);
    const text = svg.toString('utf8');
    expect(text).toMatch(/<svg[\s>]/);
    expect(text.trimEnd().endsWith('</svg>')).toBe(true);
    const img = await loadImage(svg);
    expect([img.width, img.height]).toEqual([600, 450]);
  });

  it('writes a PDF (header and end-of-file marker)', () => {
    const pdf = renderGroundMap(map, { format: 'pdf', width: 600, height: 450 }, marks);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.subarray(-8).toString('latin1')).toMatch(/%%EOF\s*$/);
  });
});
