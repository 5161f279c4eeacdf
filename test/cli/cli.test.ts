import { spawn, spawnSync } from 'node:child_process';
import { closeSync, existsSync, openSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { VERSION } from '../../cli/version.js';
import { BIN, ensureBuilt, ROOT, runBinary, runInProcess } from '../cliRunner.js';
import { expectClose } from '../helpers.js';

describe('termsplit terms', () => {
  it('terms d3 --B 918 --C 3850 --json prints the documented shape with ⁴F ground and ⁴P at 15B', async () => {
    const r = await runInProcess(['terms', 'd3', '--B', '918', '--C', '3850', '--json']);
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const j = JSON.parse(r.stdout);
    expect(j.config).toBe('d3');
    expect(j.microstates).toBe(120);
    expect(j.ground).toBe('4F3/2');
    expect(j.terms).toContainEqual(expect.objectContaining({ term: '2D', S: 0.5, L: 2, count: 2 }));
    expect(j.energies[0]).toMatchObject({ term: '4F', energy: 0 });
    // ⁴P − ⁴F = 15B (Racah 1942)
    expectClose(j.energies.find((e: { term: string }) => e.term === '4P').energy, 15 * 918, 1e-9, 1e-5);
    expect(j.energies.filter((e: { term: string }) => e.term === '2D')).toHaveLength(2);
  });

  it('terms --ion Cr3+ takes d3 and the free-ion B, C from the table', async () => {
    const r = await runInProcess(['terms', '--ion', 'Cr3+', '--json']);
    const j = JSON.parse(r.stdout);
    expect(j.config).toBe('d3');
    expect(j.B).toBe(918);
    expect(j.C).toBe(3850);
  });

  it('terms f2 prints microstates, terms and the ³H₄ ground level in human form', async () => {
    const r = await runInProcess(['terms', 'f2']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('f2: 91 microstates');
    expect(r.stdout).toContain('³H₄');
  });

  for (const [argv, pattern] of [
    [['terms', 'd11'], /d11/],
    [['terms', 'x2'], /x2/],
    [['terms', 'd3', '--B', '-5', '--C', '3000'], /--B "-5"/],
    [['terms', '--ion', 'Xx9+'], /unknown ion "Xx9\+"/],
    [['terms', 'd3', '--B', '900'], /both --B and --C/],
    [['terms', 'p2', '--B', '900', '--C', '3000'], /d configurations/],
  ] as const) {
    it(`terms ${argv.slice(1).join(' ')} fails with one line on stderr, exit 2 and nothing on stdout`, async () => {
      const r = await runInProcess([...argv]);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    });
  }
});

describe('termsplit levels', () => {
  it('levels --ion Cr3+ --dq 1740 --B 725 --json gives the documented shape and ⁴T₂g at 17400', async () => {
    const r = await runInProcess(['levels', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j).toMatchObject({ n: 3, geometry: 'oct', dq: 1740, B: 725, ground: '4A2g' });
    // C from the free-ion ratio of Cr3+ (918, 3850).
    expectClose(j.C, (725 * 3850) / 918, 1e-9, 1e-4);
    expect(j.levels[0]).toMatchObject({
      label: '4A2g',
      energy: 0,
      degeneracy: 4,
      spinAllowed: true,
      parent: '4F',
    });
    expect(j.levels).toContainEqual(
      expect.objectContaining({
        label: '4T2g',
        S: 1.5,
        irrep: 'T2g',
        energy: 17400,
        degeneracy: 12,
        spinAllowed: true,
        parent: '4F',
        configuration: 't2g^2 eg^1',
      }),
    );
    const energies = j.levels.map((l: { energy: number }) => l.energy);
    expect([...energies].sort((a, b) => a - b)).toEqual(energies);
  });

  it('levels --d 3 without --C or --cb says it used C/B = 4.5', async () => {
    const r = await runInProcess(['levels', '--d', '3', '--dq', '1740', '--B', '725']);
    expect(r.stdout).toContain('default 4.5, no ion named');
    expect(r.stdout).toContain('Predicted spin-allowed bands');
  });

  it('levels warns of Jahn–Teller activity for octahedral Cu²⁺ (²E_g ground)', async () => {
    const r = await runInProcess(['levels', '--ion', 'Cu2+', '--dq', '1260', '--json']);
    const j = JSON.parse(r.stdout);
    expect(j.ground).toBe('2Eg');
    expect(j.cautions.join(' ')).toMatch(/Jahn–Teller/);
  });

  for (const [argv, pattern] of [
    [['levels', '--d', '10', '--dq', '1000', '--B', '900'], /--d "10"/],
    [['levels', '--d', '3', '--dq', '-1', '--B', '900'], /--dq "-1"/],
    [['levels', '--d', '3', '--dq', 'abc', '--B', '900'], /--dq "abc"/],
    [['levels', '--d', '3', '--dq', '1000', '--B', '900', '--geometry', 'square'], /--geometry "square"/],
    [['levels', '--ion', 'Ni2+', '--d', '3', '--dq', '1000', '--B', '900'], /disagrees/],
    [['levels', '--ion', 'Qq2+', '--dq', '1000', '--B', '900'], /unknown ion/],
    [['levels', '--d', '3', '--dq', '1000'], /--B is required/],
    [['levels', '--d', '3', '--dq', '1000', '--B', '900', '--C', '4000', '--cb', '4'], /not both/],
  ] as const) {
    it(`levels ${argv.slice(1).join(' ')} fails with one line, exit 2, empty stdout`, async () => {
      const r = await runInProcess([...argv]);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    });
  }
});

describe('termsplit (program)', () => {
  it('an unknown option exits with 2', async () => {
    const r = await runInProcess(['levels', '--bogus']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
  });

  it('ions --json lists Cr3+ with B, C and a source', async () => {
    const r = await runInProcess(['ions', '--json']);
    const cr = JSON.parse(r.stdout).ions.find((i: { ion: string }) => i.ion === 'Cr3+');
    expect(cr).toMatchObject({ n: 3, B: 918, C: 3850 });
    expect(cr.source).toMatch(/Lever/);
  });
});

describe('termsplit end to end (built binary)', () => {
  beforeAll(() => {
    ensureBuilt();
  }, 120_000);

  it('npx termsplit runs the installed command (executable, with its shebang), as the README says', () => {
    const r = spawnSync('npx', ['termsplit', '--version'], { cwd: ROOT, encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(r.stdout.trim()).toBe(VERSION);
  });

  it('node dist/cli/main.js terms d3 --B 918 --C 3850 --json exits 0 with JSON', () => {
    const r = runBinary(['terms', 'd3', '--B', '918', '--C', '3850', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).microstates).toBe(120);
  });

  it('node dist/cli/main.js levels --ion Cr3+ --dq 1740 --B 725 --json exits 0', () => {
    const r = runBinary(['levels', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).ground).toBe('4A2g');
  });

  it('node dist/cli/main.js with bad input prints one line and exits 2, no stack trace', () => {
    const r = runBinary(['levels', '--d', '3', '--dq', '1000', '--B', '-5']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).not.toMatch(/at .*\.js/);
  });

  it('a reader that closes the pipe early (`… --json | head`) ends the command quietly with 141, no stack trace', async () => {
    const child = spawn(process.execPath, [BIN, 'diagram', 'd6', '--json'], { cwd: ROOT });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => {
      stderr += d.toString();
    });
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((done) => child.on('close', done));
    expect(stderr).toBe('');
    expect(code).toBe(141);
  });

  it('a closed stderr ends the command silently with 141 too, instead of a crash', async () => {
    const child = spawn(process.execPath, [BIN, 'levels', '--d', '3', '--dq', '1000', '--B', '-5'], {
      cwd: ROOT,
    });
    child.stderr.destroy();
    const code = await new Promise<number | null>((done) => child.on('close', done));
    expect(code).toBe(141);
  });

  it.skipIf(!existsSync('/dev/full'))(
    'a full disk under stdout gets one line and exit 1, no stack trace',
    () => {
      const full = openSync('/dev/full', 'w');
      try {
        const r = spawnSync(process.execPath, [BIN, 'diagram', 'd6', '--json'], {
          cwd: ROOT,
          encoding: 'utf8',
          stdio: ['ignore', full, 'pipe'],
        });
        expect(r.status).toBe(1);
        expect(r.stderr.trim().split('\n')).toEqual([
          expect.stringMatching(/^termsplit: cannot write the output: ENOSPC/),
        ]);
      } finally {
        closeSync(full);
      }
    },
  );

  it('node dist/cli/main.js demo (the main command of the README) writes ./termsplit-demo and says the data are invented', () => {
    // The suite's one demo run, made by test/globalSetup.ts in a fresh folder.
    const r = inject('demoRun');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/INVENTED/);
    expect(existsSync(join(inject('demoCwd'), 'termsplit-demo', 'report.html'))).toBe(true);
  });
});
