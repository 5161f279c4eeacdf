import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { distortedFitCommand, distortedLevels, distortionDiagramCommand } from '../../cli/distorted.js';
import { memoryIo } from '../../cli/io.js';
import { findIon, InputError } from '../../src/index.js';
import { runInProcess, words } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-distorted-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('distorted levels, fit and diagram from options', () => {
  it('distortedLevels(--shape trans-MA4B2) prints the group, orbitals, labelled bands and cautions', () => {
    const text = distortedLevels(
      { ion: 'Cr3+', B: '700', shape: 'trans-MA4B2', bond: ['A=7200,1100', 'B=5600,900'] },
      memoryIo(dir),
    );
    expect(text).toContain('D4h');
    expect(text).toContain('⁴B₁g');
    expect(text).toMatch(/Nearest cubic field: Dq = \d+/);
    expect(text).toContain('spin–orbit coupling is left out');
  });

  it('distortedLevels --json reads an XYZ file and reports the geometry used', () => {
    writeFileSync(
      join(dir, 'plane.xyz'),
      '5\ninvented square plane (demo)\nNi 0 0 0\nN 1.9 0 0\nN -1.9 0 0\nN 0 1.9 0\nN 0 -1.9 0\n',
    );
    const json = JSON.parse(
      distortedLevels(
        { d: '8', B: '650', cb: '4.4', xyz: 'plane.xyz', bond: ['N=9500,0'], json: true },
        memoryIo(dir),
      ),
    );
    expect(json.group).toBe('D4h');
    expect(json.geometry.source).toBe('xyz');
    expect(json.ground).toBe('1A1g(1)');
    expect(json.cautions.join(' ')).toContain('d–s mixing');
  });

  it('distortedLevels refuses a missing bond kind and two geometry sources with one line each', () => {
    expect(() =>
      distortedLevels({ d: '3', B: '700', shape: 'trans-MA4B2', bond: ['A=7000,1000'] }, memoryIo(dir)),
    ).toThrow(/no parameters for ligand kind "B"/);
    expect(() =>
      distortedLevels({ d: '3', B: '700', shape: 'octahedron', tetragonal: '1,2,3' }, memoryIo(dir)),
    ).toThrow(InputError);
  });

  it('distortedFitCommand fits Dq, Ds, Dt of a d9 ion to three labelled bands', () => {
    const json = JSON.parse(
      distortedFitCommand(
        {
          d: '9',
          tetragonal: '1000,500,200',
          bands: '12500,9000,15500',
          assign: '2B2g,2A1g,2Eg',
          json: true,
        },
        memoryIo(dir),
      ),
    );
    expect(json.parameters.dq).toBeCloseTo(1250, 6);
    expect(json.group).toBe('D4h');
  });

  it('distortionDiagramCommand writes the figure and CSV of the octahedron-to-square-plane path', async () => {
    const text = await distortionDiagramCommand(
      8,
      findIon('Ni2+'),
      {
        B: '700',
        shape: 'elongated-octahedron',
        bond: ['9000,1000'],
        distort: 'ratio:ax',
        steps: '8',
        output: 'path.svg',
        data: 'path.csv',
      },
      memoryIo(dir),
    );
    expect(text).toContain('Figure written to');
    expect(readFileSync(join(dir, 'path.csv'), 'utf8').split('\n')[0]).toMatch(/^e\(ax\)/);
  });
});

describe('the commands with a geometry, in process', () => {
  it('termsplit levels --shape square-plane --json labels the levels in D4h', async () => {
    const r = await runInProcess(
      words('levels --ion Ni2+ --B 700 --shape square-plane --bond 9500,1200 --eds 1200 --json'),
      dir,
    );
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.group).toBe('D4h');
    // e_ds = 1200 pulls a1g (d_z², eσ = 9500) down by 4e_ds to 4700, below b2g (4eπ = 4800).
    expect(json.orbitals.map((o: { irrep: string }) => o.irrep)).toEqual(['eg', 'a1g', 'b2g', 'b1g']);
    expect(json.cautions.join(' ')).not.toContain('d–s mixing lowers');
  });

  it('termsplit levels --shape --zeta ion adds Kramers doublets named by their levels without ζ', async () => {
    const r = await runInProcess(
      words(
        'levels --ion Cu2+ --shape elongated-octahedron --bond eq=6500,1000 --bond ax=3500,500 --zeta ion --json',
      ),
      dir,
    );
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.spinOrbit.kramers).toBe(true);
    expect(json.spinOrbit.levels).toHaveLength(5);
    expect(json.spinOrbit.levels[0].parent.label).toBe('2B1g');
    // ²B1g ⊗ D^½ = Γ7 in D4* (Koster, Dimmock, Wheeler & Statz 1963, product table of D4).
    expect(json.spinOrbit.pointGroup).toBe('D4h');
    expect(json.spinOrbit.levels[0].pointGroupLabel).toBe('Γ7g');
    expect(json.cautions.join(' ')).not.toContain('spin–orbit coupling is left out');
    const text = await runInProcess(
      words(
        'levels --ion Cu2+ --shape elongated-octahedron --bond eq=6500,1000 --bond ax=3500,500 --zeta 600',
      ),
      dir,
    );
    expect(text.stdout).toContain('With spin–orbit coupling, ζ = 600 cm⁻¹');
    expect(text.stdout).toContain('in D4h');
    expect(text.stdout).toContain('spinor irreps of the double group D4h*');
    const bad = await runInProcess(
      words('levels --d 3 --B 700 --shape octahedron --bond 7000 --zeta -5'),
      dir,
    );
    expect(bad.code).toBe(2);
  });

  it('termsplit fit --tetragonal fits a d9 ion exactly and says so', async () => {
    const r = await runInProcess(
      words('fit --ion Cu2+ --tetragonal 1200,1500,400 --bands 9000,12500,15500 --assign 2A1g,2B2g,2Eg'),
      dir,
    );
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('the fit is exact');
    expect(r.stdout).not.toMatch(/^B\s/m);
  });

  it('termsplit diagram --distort writes the figure; bad combinations exit 2 with one line', async () => {
    const ok = await runInProcess(
      words(
        'diagram d8 --B 700 --shape elongated-octahedron --bond 9000,1000 --distort ratio:ax --steps 6 -o p.svg',
      ),
      dir,
    );
    expect(ok.code).toBe(0);
    for (const line of [
      'levels --d 3 --B 700 --shape octahedron --bond 7000,1000 --dq 1700',
      'fit --d 3 --shape octahedron --bond 7000,1000 --bands 17000 --fit-c',
      'diagram d8 --B 700 --shape square-plane --bond 9000,1000',
      'levels --d 3 --B 700 --shape hexagon --bond 7000',
      'levels --d 3 --B 700 --dq 1700 --bond 7000,1000',
    ]) {
      const r = await runInProcess(words(line), dir);
      expect(r.code, line).toBe(2);
      expect(r.stderr.trim().split('\n'), line).toHaveLength(1);
    }
  });
});
