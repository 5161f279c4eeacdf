/** Benchmark of the spectrum pipeline: reading a large text file and finding bands, on synthetic and demo spectra. */

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { readTextFile } from '../cli/files.js';
import { DEMO_SPECTRA, demoSpectrumText } from '../fixtures/spectra/generate.js';
import { absorptionSpectrum } from '../src/spectra/absorptionSpectrum.js';
import { findBands } from '../src/spectra/bandFinding.js';
import { syntheticSpectrum } from '../src/spectra/gaussianBands.js';
import { isJcamp, parseJcampSpectrum } from '../src/spectra/spectrumJcamp.js';
import { parseSpectrumText } from '../src/spectra/spectrumText.js';

/** Rows of the large-file benchmark. */
const BIG_ROWS = 1_000_000;

function time<T>(work: () => T): { value: T; ms: number } {
  const t0 = performance.now();
  const value = work();
  return { value, ms: performance.now() - t0 };
}

/**
 * Benchmarks of `termsplit spectrum`: reading a 10⁶-row CSV file (file read, parsing, units) and
 * finding its bands, and finding the bands of each demo spectrum. Prints one line per figure.
 */
export function benchSpectrum(): void {
  const dir = mkdtempSync(join(tmpdir(), 'termsplit-bench-'));
  try {
    const nm = Float64Array.from({ length: BIG_ROWS }, (_, i) => 300 + (1000 * i) / (BIG_ROWS - 1));
    const y = syntheticSpectrum(
      [
        { center: 17400, height: 0.3, fwhm: 3000 },
        { center: 24600, height: 0.35, fwhm: 3600 },
      ],
      nm.map((v) => 1e7 / v),
      { noise: 0.002, seed: 1 },
    );
    const rows = ['Wavelength (nm),Absorbance'];
    for (let i = 0; i < BIG_ROWS; i++)
      rows.push(`${(nm[i] as number).toFixed(4)},${(y[i] as number).toFixed(5)}`);
    const path = join(dir, 'big.csv');
    writeFileSync(path, rows.join('\n'));
    const read = time(() => absorptionSpectrum(parseSpectrumText(readTextFile(path))));
    console.log(`spectrum: read ${BIG_ROWS} rows (file, parse, units): ${read.ms.toFixed(0)} ms`);
    const bands = time(() => findBands(read.value));
    console.log(
      `spectrum: bands of the ${BIG_ROWS}-row spectrum: ${bands.ms.toFixed(0)} ms (${bands.value.bands.length} bands)`,
    );
    for (const demo of DEMO_SPECTRA) {
      const text = demoSpectrumText(demo);
      const found = time(() =>
        findBands(absorptionSpectrum(isJcamp(text) ? parseJcampSpectrum(text) : parseSpectrumText(text))),
      );
      console.log(
        `spectrum: read and find bands of ${demo.file}: ${found.ms.toFixed(0)} ms (${found.value.bands.length} bands)`,
      );
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) benchSpectrum();
