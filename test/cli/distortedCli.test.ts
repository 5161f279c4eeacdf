import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { distortedFitCommand, distortedLevels, distortionDiagramCommand } from '../../cli/distorted.js';
import { memoryIo } from '../../cli/io.js';
import { findIon, InputError } from '../../src/index.js';

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

  it('distortionDiagramCommand writes the figure and CSV of the octahedron-to-square-plane path', () => {
    const text = distortionDiagramCommand(
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
