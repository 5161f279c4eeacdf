import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { absorptionSpectrum, parseJcampSpectrum } from '../../src/index.js';
import { isJcamp } from '../../src/spectra/spectrumJcamp.js';

const header = (xUnits: string, yUnits: string) =>
  [
    '##TITLE=test',
    '##JCAMP-DX=4.24',
    '##DATA TYPE=UV/VIS SPECTRUM',
    `##XUNITS=${xUnits}`,
    `##YUNITS=${yUnits}`,
    '##XFACTOR=1',
    '##YFACTOR=0.01',
    '##FIRSTX=10000',
    '##LASTX=10030',
    '##DELTAX=10',
    '##NPOINTS=4',
  ].join('\n');

describe('parseJcampSpectrum', () => {
  it('reads the demo JCAMP-DX file with its units', () => {
    const text = readFileSync(resolve(__dirname, '../../fixtures/spectra/co-ors4-absorbance-nm.jdx'), 'utf8');
    expect(isJcamp(text)).toBe(true);
    const raw = parseJcampSpectrum(text);
    expect(raw.x.length).toBe(901);
    expect(raw.x[0]).toBe(400);
    expect(raw.xUnit).toEqual({ unit: 'nm', origin: 'JCAMP-DX ##XUNITS=NANOMETERS' });
    expect(raw.yUnit?.unit).toBe('absorbance');
    expect(raw.format).toBe('JCAMP-DX');
  });

  it('decodes the compressed SQZ/DIF form (JCAMP-DX 4.24; McDonald & Wilks, Appl. Spectrosc. 42, 151, 1988)', () => {
    // A0 = 10 (SQZ), then differences J = +1, K = +2, j = −1 (DIF), times YFACTOR 0.01.
    const raw = parseJcampSpectrum(
      `${header('1/CM', 'ABSORBANCE')}\n##XYDATA=(X++(Y..Y))\n10000A0JKj\n##END=\n`,
    );
    expect(Array.from(raw.x)).toEqual([10000, 10010, 10020, 10030]);
    expect(Array.from(raw.y).map((v) => Number(v.toFixed(10)))).toEqual([0.1, 0.11, 0.13, 0.12]);
    expect(raw.xUnit?.unit).toBe('cm-1');
  });

  it('reads a fraction TRANSMITTANCE, which becomes absorbance', () => {
    const raw = parseJcampSpectrum(
      `${header('1/CM', 'TRANSMITTANCE')}\n##XYDATA=(X++(Y..Y))\n10000 100 10 1 50\n##END=\n`,
    );
    expect(raw.yUnit?.unit).toBe('transmittance');
    const s = absorptionSpectrum(raw);
    expect(s.value[0]).toBeCloseTo(0, 12);
    expect(s.value[1]).toBeCloseTo(1, 12);
    expect(s.value[2]).toBeCloseTo(2, 12);
  });

  it('leaves an unknown YUNITS to the user', () => {
    const raw = parseJcampSpectrum(
      `${header('1/CM', 'ARBITRARY UNITS')}\n##XYDATA=(X++(Y..Y))\n10000 1 2 3 4\n##END=\n`,
    );
    expect(raw.yUnit).toBeUndefined();
    expect(() => absorptionSpectrum(raw)).toThrow(/does not say what y is/);
    expect(absorptionSpectrum(raw, { yUnit: 'arbitrary' }).quantity).toBe('arbitrary');
  });

  it('refuses a JCAMP-DX text without XY data', () => {
    expect(() => parseJcampSpectrum(`${header('1/CM', 'ABSORBANCE')}\n##END=\n`)).toThrow(/no XY data/);
  });
});
