import { describe, expect, it } from 'vitest';
import { INPUT_FILE_MAX_TEXT } from '../../cli/files.js';
import { SHEET_SAMPLES_LIMIT, SPECTRUM_ROWS_LIMIT } from '../../src/core/limits.js';
import { parseSampleSheet } from '../../src/sheets/sampleSheet.js';
import { parseSpectrumText } from '../../src/spectra/spectrumText.js';
import { runInProcess } from '../cliRunner.js';

/**
 * The limits of big inputs: stated in --help, refused in one line past them. The limit logic is
 * checked with small limits here; the 10⁶-row and 500-sample runs are measured in the benchmark
 * and DEVELOPERS.md, not in the suite.
 */

describe('input limits', () => {
  it('parseSpectrumText refuses more rows than maxRows in one line naming the line, and reads up to it', () => {
    const text = ['nm,A', '400,0.1', '410,0.2', '420,0.3', '430,0.4'].join('\n');
    expect(parseSpectrumText(text, { maxRows: 4 }).x).toHaveLength(4);
    expect(() => parseSpectrumText(text, { maxRows: 3 })).toThrow(
      /^line 5: more than 3 rows of numbers: expected at most 3 \(bin the data first\)$/,
    );
  });

  it('parseSampleSheet refuses more samples than maxSamples, JSON and CSV alike', () => {
    const json = JSON.stringify({
      samples: [1, 2, 3].map((i) => ({ name: `s${i}`, ion: 'Ni2+', bands: '8500' })),
    });
    expect(parseSampleSheet(json, 'json', 3).samples).toHaveLength(3);
    expect(() => parseSampleSheet(json, 'json', 2)).toThrow(/^sample sheet: 3 samples: expected at most 2/);
    const csv = 'name,ion,bands\ns1,Ni2+,8500\ns2,Ni2+,8500\ns3,Ni2+,8500\n';
    expect(() => parseSampleSheet(csv, 'csv', 2)).toThrow(/^sample sheet: 3 samples: expected at most 2/);
  });

  it('spectrum --help and report --help state the limits', async () => {
    const spectrum = await runInProcess(['spectrum', '--help']);
    const report = await runInProcess(['report', '--help']);
    const help = (r: { stdout: string; stderr: string }) => (r.stdout + r.stderr).replace(/\s+/g, ' ');
    expect(help(spectrum)).toContain(`at most ${SPECTRUM_ROWS_LIMIT} rows and ${INPUT_FILE_MAX_TEXT}`);
    expect(help(report)).toContain(
      `at most ${SHEET_SAMPLES_LIMIT} samples and ${INPUT_FILE_MAX_TEXT} per file`,
    );
  });
});
