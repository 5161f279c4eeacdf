import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, inject, it } from 'vitest';
import { svgTexts } from './svgParse.js';

/** The demo report (run once per suite by the global setup) holds every figure kind the CLI writes. */
const demo = () => join(inject('demoCwd'), 'termsplit-demo');

describe('demo report: sizes of the figures and the page', () => {
  it('writes every SVG figure under 150 kB, its text as <text>', () => {
    const dir = join(demo(), 'figures');
    const files = readdirSync(dir).filter((f) => f.endsWith('.svg'));
    expect(files.length).toBeGreaterThan(5);
    for (const f of files) {
      const svg = readFileSync(join(dir, f), 'utf8');
      expect(svg.length, f).toBeLessThan(150_000);
      expect(svgTexts(svg).length, f).toBeGreaterThan(5);
    }
  });

  it('keeps report.html, figures inlined, under 1.5 MB', () => {
    expect(statSync(join(demo(), 'report.html')).size).toBeLessThan(1_500_000);
  });
});
