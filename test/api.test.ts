import { readFileSync } from 'node:fs';
import { expect, it } from 'vitest';
import * as api from '../src/index.js';

it('the public API exports exactly the reviewed names (update this list on purpose)', () => {
  expect(Object.keys(api).sort()).toMatchInlineSnapshot(`
    [
      "BAND_CEILING",
      "CM_PER_EV",
      "DEFAULT_C_OVER_B",
      "DEFAULT_GEOMETRY",
      "FIT_DEFAULTS",
      "FREE_IONS",
      "GEOMETRY_PRESETS",
      "InputError",
      "absorptionSpectrum",
      "analyseSpectrum",
      "cmToEv",
      "cmToNm",
      "coordinationSphere",
      "crossoverAnalysis",
      "cubicCautions",
      "diagramCsv",
      "diagramJson",
      "distortedCautions",
      "distortionCsv",
      "distortionSweep",
      "findBands",
      "findIon",
      "fitBands",
      "fitDistorted",
      "fitFoundBands",
      "fitParameterNames",
      "fitSpinVerdict",
      "fittedSample",
      "freeIonLevels",
      "freeIonRatio",
      "freeIonTerms",
      "groundStateCrossings",
      "groundStateMap",
      "hasSpinChoice",
      "hundGround",
      "impliedPairingEnergy",
      "jLevels",
      "microstates",
      "momentEstimate",
      "oneElectronStates",
      "pairingEnergy",
      "parseConfiguration",
      "parseEnergy",
      "parseEnergyList",
      "parseJcampSpectrum",
      "parseSampleSheet",
      "parseSpectrumText",
      "parseXyz",
      "pointGroup",
      "presetLigands",
      "readSpectrum",
      "refineFitWithZeta",
      "refineWithSpinOrbit",
      "sampleVerdict",
      "seriesOrders",
      "seriesTable",
      "solveCubic",
      "solveDistorted",
      "solveSpinOrbit",
      "spinOnlyMoment",
      "susceptibility",
      "sweepDiagram",
      "sweepSpinOrbit",
      "termsOf",
      "toWavenumber",
      "transitions",
      "trigonalFromSplitting",
      "unicodeLabel",
    ]
  `);
});

it('the program version is package.json’s', async () => {
  const { VERSION } = await import('../cli/version.js');
  const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8'));
  expect(VERSION).toBe(pkg.version);
});
