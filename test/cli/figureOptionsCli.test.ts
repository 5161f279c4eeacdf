import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../cli/io.js';
import { run } from '../../cli/program.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'termsplit-figure-options-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('figure options of diagram and levels (in process)', () => {
  it('diagram --db-range --eb-range --forbidden --size: a zoomed one-column figure', async () => {
    const io = memoryIo(dir);
    const args = ['diagram', 'd6', '--cb', '4.8', '--points', '60', '--dq', '1900', '--B', '1050'];
    const zoom = ['--db-range', '12:24', '--eb-range', '0:40', '--forbidden', '2', '--size', 'one-column'];
    expect(await run([...args, ...zoom, '-o', 'zoom.svg'], io)).toBe(0);
    const svg = readFileSync(join(dir, 'zoom.svg'), 'utf8');
    expect(svg).toMatch(/width="85mm"/);
    expect(svg).toContain('spin-forbidden, lowest only');
  });

  it('levels --emax --forbidden --size --dpi draw the level diagram as asked', async () => {
    const io = memoryIo(dir);
    const args = [
      'levels',
      '--ion',
      'Co3+',
      '--dq',
      '2300',
      '--B',
      '635',
      '--emax',
      '40000',
      '--forbidden',
      '1',
    ];
    expect(await run([...args, '--size', 'two-column', '-o', 'co.svg'], io)).toBe(0);
    const svg = readFileSync(join(dir, 'co.svg'), 'utf8');
    expect(svg).toMatch(/width="175mm"/);
    expect(svg).toContain('lowest 1 of');
  });

  it.each([
    [['diagram', 'd6', '--db-range', '30:20', '-o', 'x.png'], /--db-range "30:20"/],
    [
      ['diagram', 'd6', '--size', 'poster', '-o', 'x.png'],
      /--size "poster": expected one-column or two-column/,
    ],
    [
      ['levels', '--ion', 'Cr3+', '--dq', '1740', '--B', '725', '--forbidden', '-1', '-o', 'x.png'],
      /--forbidden/,
    ],
    [['diagram', 'd1', '-o', 'x.png'], /d1: .*means nothing/],
  ])('refuses %j with one line and exit code 2', async (argv, message) => {
    const io = memoryIo(dir);
    expect(await run(argv, io)).toBe(2);
    expect(io.stderr).toMatch(message);
    expect(io.stderr.trim().split('\n')).toHaveLength(1);
  });
});
