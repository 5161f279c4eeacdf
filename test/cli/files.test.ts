import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { removeTemporaries, trackTemporary, writeFileAtomic, writeFilesAtomic } from '../../cli/files.js';
import { InputError } from '../../src/index.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-files-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('temporary files and interrupts', () => {
  it('removeTemporaries (the SIGINT/SIGTERM clean-up) removes every registered file and folder and says what was not written', () => {
    const file = join(dir, 'd6.png.1a2b3c4d.tmp');
    const folder = join(dir, '.report.termsplit-partial-1-00');
    writeFileSync(file, 'half a figure');
    mkdirSync(folder);
    writeFileSync(join(folder, 'report.md'), 'half a report');
    trackTemporary(file, 'd6.png not written');
    trackTemporary(folder, 'the report was not written');
    expect(removeTemporaries()).toEqual(['d6.png not written', 'the report was not written']);
    expect(existsSync(file)).toBe(false);
    expect(existsSync(folder)).toBe(false);
    expect(removeTemporaries()).toEqual([]);
  });

  it('a forgotten temporary (renamed into place) is not removed by the clean-up', () => {
    const file = join(dir, 'kept.svg');
    writeFileSync(file, '<svg/>');
    const forget = trackTemporary(file, 'kept.svg not written');
    forget();
    expect(removeTemporaries()).toEqual([]);
    expect(existsSync(file)).toBe(true);
  });

  it('writeFileAtomic and writeFilesAtomic leave no *.tmp file and nothing for the clean-up, after success or failure', () => {
    const out = join(dir, 'out');
    mkdirSync(out);
    writeFileAtomic(join(out, 'a.svg'), '<svg/>');
    writeFilesAtomic([
      { path: join(out, 'b.svg'), data: '<svg/>' },
      { path: join(out, 'c.csv'), data: '1,2\n' },
    ]);
    mkdirSync(join(out, 'taken.svg'));
    expect(() => writeFileAtomic(join(out, 'taken.svg'), '<svg/>')).toThrow(InputError);
    expect(() =>
      writeFilesAtomic([
        { path: join(out, 'd.svg'), data: '<svg/>' },
        { path: join(out, 'taken.svg'), data: '<svg/>' },
      ]),
    ).toThrow(/taken\.svg: it is a directory/);
    expect(readdirSync(out).sort()).toEqual(['a.svg', 'b.svg', 'c.csv', 'taken.svg']);
    expect(removeTemporaries()).toEqual([]);
  });
});
