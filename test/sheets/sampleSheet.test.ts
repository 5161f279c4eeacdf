import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { parseSampleSheet, splitCsvLine } from '../../src/sheets/sampleSheet.js';

const good = {
  title: 'Series',
  defaults: { geometry: 'oct', cb: 4.4 },
  samples: [
    { name: 'A', ion: 'Ni2+', bands: '8500,13800,25300±300' },
    { name: 'B', ion: 'Cr(III)', bands: ['575nm', '407nm'], fitC: false },
    { name: 'C', ion: 'Co2+', geometry: 'tet', spectrum: { file: 'c.csv', xUnit: 'nm', xColumn: 1 } },
  ],
};

describe('parseSampleSheet (JSON)', () => {
  it('parseSampleSheet reads every sample, converts bands to cm⁻¹ and applies the defaults', () => {
    const sheet = parseSampleSheet(JSON.stringify(good), 'json');
    expect(sheet.problems).toEqual([]);
    expect(sheet.samples.map((s) => s.name)).toEqual(['A', 'B', 'C']);
    expect(sheet.samples[0]?.bands?.[2]).toEqual({ value: 25300, sigma: 300 });
    expect(sheet.samples[1]?.ion).toBe('Cr3+');
    expect(sheet.samples[1]?.bands?.[0]?.value).toBeCloseTo(1e7 / 575, 9);
    expect(sheet.samples[0]?.cOverB).toBe(4.4);
    expect(sheet.samples[2]).toMatchObject({ geometry: 'tet', spectrum: { file: 'c.csv', xColumn: '1' } });
  });

  it('a missing field, a wrong type and an unknown ion are reported by sample and field; the rest go on', () => {
    const sheet = parseSampleSheet(
      JSON.stringify({
        samples: [
          { name: 'ok', ion: 'Ni2+', bands: '8500,13800' },
          { name: 'no-ion', bands: '8500' },
          { name: 'bad-cb', ion: 'Ni2+', bands: '8500', cb: 'four' },
          { name: 'bad-ion', ion: 'Nx2+', bands: '8500' },
          { name: 'nothing', ion: 'Ni2+' },
          { name: 'bad-band', ion: 'Ni2+', bands: '8500,abc' },
          { ion: 'Ni2+', bands: '8500' },
          { name: 'ok', ion: 'Cr3+', bands: '17400' },
        ],
      }),
      'json',
    );
    expect(sheet.samples.map((s) => s.name)).toEqual(['ok']);
    expect(sheet.problems).toEqual([
      expect.objectContaining({ sample: 'no-ion', field: 'ion' }),
      expect.objectContaining({ sample: 'bad-cb', field: 'cb' }),
      expect.objectContaining({ sample: 'bad-ion', field: 'ion', message: expect.stringMatching(/Nx2\+/) }),
      expect.objectContaining({ sample: 'nothing', field: 'bands' }),
      expect.objectContaining({ sample: 'bad-band', field: 'bands', message: expect.stringMatching(/abc/) }),
      expect.objectContaining({ sample: '#7', field: 'name' }),
      expect.objectContaining({
        sample: 'ok',
        field: 'name',
        message: expect.stringMatching(/more than once/),
      }),
    ]);
  });

  it('an unreadable sheet is an InputError: not JSON, no samples, an unknown top-level field', () => {
    expect(() => parseSampleSheet('{nope', 'json')).toThrow(InputError);
    expect(() => parseSampleSheet('{"samples": []}', 'json')).toThrow(/samples/);
    expect(() => parseSampleSheet('{"samples": [{}], "colour": 1}', 'json')).toThrow(InputError);
  });
});

describe('parseSampleSheet (CSV)', () => {
  it('parseSampleSheet reads a header, quoted cells, ;-separated bands and yes/no flags', () => {
    const text = [
      '# an invented series',
      'name,ion,geometry,bands,fit_c',
      'A,Ni2+,oct,8500;13800;25300,no',
      '"B, aqua",Cr3+,oct,"17400,24600",yes',
    ].join('\n');
    const sheet = parseSampleSheet(text, 'csv');
    expect(sheet.problems).toEqual([]);
    expect(sheet.samples.map((s) => s.name)).toEqual(['A', 'B, aqua']);
    expect(sheet.samples[0]?.bands?.map((b) => b.value)).toEqual([8500, 13800, 25300]);
    expect(sheet.samples[1]?.fitC).toBe(true);
  });

  it('parseSampleSheet refuses an unknown column or a header without name and ion', () => {
    expect(() => parseSampleSheet('name,ion,colour\nA,Ni2+,red', 'csv')).toThrow(/unknown column "colour"/);
    expect(() => parseSampleSheet('name,bands\nA,8500', 'csv')).toThrow(/name and ion/);
    expect(() => parseSampleSheet('', 'csv')).toThrow(/empty/);
  });

  it('splitCsvLine keeps commas inside quotes and unescapes doubled quotes', () => {
    expect(splitCsvLine('a,"b,c","d ""e"""')).toEqual(['a', 'b,c', 'd "e"']);
  });
});
