import { describe, expect, it } from 'vitest';
import { runInProcess } from '../cliRunner.js';

/** The fit command with its defaults on textbook spectra (band maxima from the check set, fixtures/reference/band-fit-check-set.json). */
describe('termsplit fit with default options', () => {
  it('fits [Co(H2O)6]2+ 8100,19400 without --assign: Dq 922, B 828, no bound reaches the user', async () => {
    const r = await runInProcess(['fit', '--ion', 'Co2+', '--bands', '8100,19400', '--json']);
    expect(r.code).toBe(0);
    const best = JSON.parse(r.stdout).solutions[0];
    expect(best.dq).toBeCloseTo(921.6, 0);
    expect(best.B).toBeCloseTo(828, -1);
    expect(best.score.total).toBe(0);
  });

  it('fits the spin-forbidden bands of [Mn(H2O)6]2+ as high-spin with C fitted, and says so', async () => {
    const r = await runInProcess(['fit', '--ion', 'Mn2+', '--bands', '18900,23100,24950,27950,29700']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/C fitted because the bands fix it/);
    expect(r.stdout).toMatch(/high-spin S = 5\/2, its ΔS = 1 bands .*: best is #1/);
    expect(r.stdout).not.toMatch(/Mössbauer/);
  });

  it('keeps --spin-state high for Fe2+ 8302±110,10401±125: the Jahn–Teller pair is merged, Dq from the centroid, B not fixed', async () => {
    const r = await runInProcess([
      'fit',
      '--ion',
      'Fe2+',
      '--bands',
      '8302±110,10401±125',
      '--spin-state',
      'high',
      '--json',
    ]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.merges[0].members).toEqual([0, 1]);
    expect(out.solutions[0].ground).toBe('5T2g');
    expect(out.solutions[0].B).toBeNull();
    expect(out.solutions[0].bDetermined).toBe(false);
  });

  it('fits Fe2+ 10400 alone: Dq 1040 and B not fixed, said in words', async () => {
    const r = await runInProcess(['fit', '--ion', 'Fe2+', '--bands', '10400']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Dq {3}= 1040/);
    expect(r.stdout).toMatch(/B {4}= not fixed by the band/);
  });

  it('names implausible β in words, not codes, among the alternatives', async () => {
    const r = await runInProcess(['fit', '--ion', 'V3+', '--bands', '17800,25700']);
    expect(r.stdout).toMatch(/β above 1: implausible/);
    expect(r.stdout).not.toMatch(/beta-above-one/);
  });

  it('refuses in one line, exit 2, bands that cannot belong to the spin state asked for', async () => {
    const r = await runInProcess([
      'fit',
      '--ion',
      'Fe2+',
      '--bands',
      '8302,10401',
      '--keep-bands',
      '--spin-state',
      'high',
    ]);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/cannot belong to high-spin d6/);
  });
});
