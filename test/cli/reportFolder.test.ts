import { spawn, spawnSync } from 'node:child_process';
import {
  chmodSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { slugs } from '../../cli/report/runReport.js';
import { LOCK, MANIFEST, REPORT_GENERATOR } from '../../cli/report/write.js';
import { BIN, runInProcess } from '../cliRunner.js';

const dir = mkdtempSync(join(tmpdir(), 'termsplit-report-folder-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const NI = { name: 'a', ion: 'Ni2+', bands: '8500,13800,25300' };
const CR = { name: 'b', ion: 'Cr3+', bands: '17400,24600' };

function sheet(name: string, samples: unknown[], where = dir): string {
  const path = join(where, `${name}.json`);
  writeFileSync(path, JSON.stringify({ title: name, samples }));
  return path;
}

function manifest(folder: string): string[] {
  return (JSON.parse(readFileSync(join(folder, MANIFEST), 'utf8')) as { files: string[] }).files;
}

/** Every file under `folder`, relative, sorted. */
function tree(folder: string): string[] {
  return readdirSync(folder, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => join(e.parentPath, e.name).slice(folder.length + 1))
    .sort();
}

describe('report -o: never deletes what the program did not write', () => {
  it('report writes a manifest listing exactly its own files', async () => {
    const out = join(dir, 'listed');
    expect((await runInProcess(['report', sheet('listed', [NI, CR]), '-o', out], dir)).code).toBe(0);
    expect([...manifest(out), MANIFEST].sort()).toEqual(tree(out));
  });

  it('a second report into a folder with an earlier report keeps the files the user added', async () => {
    const out = join(dir, 'kept');
    const first = sheet('kept-1', [NI, CR]);
    expect((await runInProcess(['report', first, '-o', out], dir)).code).toBe(0);
    writeFileSync(join(out, 'notes.txt'), 'my notes');
    mkdirSync(join(out, 'spectra'));
    writeFileSync(join(out, 'spectra', 'raw.csv'), '1,2\n');
    writeFileSync(join(out, 'figures', 'my-own.svg'), '<svg/>');
    const copy = join(out, 'sheet.json');
    writeFileSync(copy, readFileSync(first));
    // The second report has one sample fewer: the files of the dropped sample go, the user's stay.
    const r = await runInProcess(['report', sheet('kept-2', [NI]), '-o', out], dir);
    expect(r.code).toBe(0);
    expect(readFileSync(join(out, 'notes.txt'), 'utf8')).toBe('my notes');
    expect(readFileSync(join(out, 'spectra', 'raw.csv'), 'utf8')).toBe('1,2\n');
    expect(readFileSync(join(out, 'figures', 'my-own.svg'), 'utf8')).toBe('<svg/>');
    expect(readFileSync(copy, 'utf8')).toBe(readFileSync(first, 'utf8'));
    expect(tree(out).filter((f) => f.startsWith('figures/b-'))).toEqual([]);
    expect(JSON.parse(readFileSync(join(out, 'report.json'), 'utf8')).title).toBe('kept-2');
    expect(
      readdirSync(out).filter((f) => f.includes('termsplit-partial') || f.includes('termsplit-old')),
    ).toEqual([]);
  });

  it('report -o . writes beside the other files of the current folder and removes none of them', async () => {
    const here = join(dir, 'here');
    mkdirSync(here);
    // A folder that is neither empty nor a report is refused; one that holds a report is not.
    const path = sheet('here', [NI], dir);
    expect((await runInProcess(['report', path, '-o', '.'], here)).code).toBe(0);
    writeFileSync(join(here, 'lab-book.txt'), 'keep');
    const copy = sheet('here', [NI], here);
    expect((await runInProcess(['report', copy, '-o', '.'], here)).code).toBe(0);
    expect(readFileSync(join(here, 'lab-book.txt'), 'utf8')).toBe('keep');
    expect(existsSync(copy)).toBe(true);
    expect(existsSync(join(here, 'report.md'))).toBe(true);
  });

  it('an earlier report without a manifest (report.json with the generator mark) is replaced file by file, the rest kept', async () => {
    const out = join(dir, 'old-style');
    mkdirSync(out);
    writeFileSync(join(out, 'report.json'), JSON.stringify({ generator: REPORT_GENERATOR }));
    writeFileSync(join(out, 'samples.json'), '{"the":"sheet"}');
    const r = await runInProcess(['report', sheet('old-style', [NI]), '-o', out], dir);
    expect(r.code).toBe(0);
    expect(readFileSync(join(out, 'samples.json'), 'utf8')).toBe('{"the":"sheet"}');
    expect(JSON.parse(readFileSync(join(out, 'report.json'), 'utf8')).title).toBe('old-style');
  });

  it('refuses to overwrite a file of a report name that the earlier report did not write, and leaves everything as it was', async () => {
    const out = join(dir, 'clash');
    const path = sheet('clash', [NI]);
    expect((await runInProcess(['report', path, '-o', out], dir)).code).toBe(0);
    // The user's own file under a name the next report will use.
    const listed = manifest(out).filter((f) => f !== 'report.md');
    writeFileSync(join(out, MANIFEST), JSON.stringify({ generator: REPORT_GENERATOR, files: listed }));
    writeFileSync(join(out, 'report.md'), 'mine');
    const before = tree(out);
    const r = await runInProcess(['report', path, '-o', out], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/report\.md is there and was not written by termsplit/);
    expect(readFileSync(join(out, 'report.md'), 'utf8')).toBe('mine');
    expect(tree(out)).toEqual(before);
  });

  it('a failure while putting the new files in place puts the earlier report back', async () => {
    const out = join(dir, 'rollback');
    const path = sheet('rollback', [NI]);
    expect((await runInProcess(['report', path, '-o', out], dir)).code).toBe(0);
    const before = readFileSync(join(out, 'report.json'), 'utf8');
    // A read-only tables/ folder: the report's CSV tables cannot be moved out of or into it.
    chmodSync(join(out, 'tables'), 0o555);
    try {
      const r = await runInProcess(['report', sheet('rollback-2', [NI]), '-o', out], dir);
      if (process.getuid?.() === 0) return; // root ignores the permission; nothing to test
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/^termsplit: cannot write the report to /);
    } finally {
      chmodSync(join(out, 'tables'), 0o755);
    }
    expect(readFileSync(join(out, 'report.json'), 'utf8')).toBe(before);
    expect([...manifest(out), MANIFEST].sort()).toEqual(tree(out));
  });

  it('a staging folder left by a killed run does not stop the next run, and is cleared', async () => {
    const out = join(dir, 'stale');
    const path = sheet('stale', [NI]);
    expect((await runInProcess(['report', path, '-o', out], dir)).code).toBe(0);
    // No process has id 2^22 + 1 (above Linux's largest).
    const stale = join(out, '.termsplit-partial-4194305-00ff00ff');
    mkdirSync(stale);
    writeFileSync(join(stale, 'report.md'), 'half');
    expect((await runInProcess(['report', path, '-o', out], dir)).code).toBe(0);
    expect(existsSync(stale)).toBe(false);
  });

  it('refuses a missing parent folder at once, before any sample is analysed (demo -o nodir/x)', async () => {
    const started = Date.now();
    const r = await runInProcess(['demo', '-o', join('nodir', 'x')], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/directory .*nodir does not exist/);
    expect(Date.now() - started).toBeLessThan(3000);
  });

  it('an interrupted replace (SIGINT) leaves the earlier report and the user files intact and no temporary folder', async () => {
    const out = join(dir, 'interrupted');
    const path = sheet('interrupted', [NI]);
    expect((await runInProcess(['report', path, '-o', out], dir)).code).toBe(0);
    writeFileSync(join(out, 'notes.txt'), 'my notes');
    const before = new Map(tree(out).map((f) => [f, readFileSync(join(out, f), 'utf8')]));
    // Enough samples that the analysis is still running when the staging folder appears.
    const many = sheet(
      'interrupted-many',
      Array.from({ length: 12 }, (_, i) => ({ ...(i % 2 ? NI : CR), name: `s${i}` })),
    );
    const child = spawn(process.execPath, [BIN, 'report', many, '-o', out], { cwd: dir });
    let stderr = '';
    child.stderr.on('data', (d) => {
      stderr += String(d);
    });
    const exited = new Promise<number | null>((res) => child.on('exit', (code) => res(code)));
    const staging = () => readdirSync(out).some((f) => f.startsWith('.termsplit-partial-'));
    for (let i = 0; i < 400 && !staging(); i++) await new Promise((res) => setTimeout(res, 25));
    expect(staging()).toBe(true);
    // A second run into the folder while the first holds its lock is refused in one line.
    expect(readFileSync(join(out, LOCK), 'utf8').trim()).toBe(String(child.pid));
    const second = await runInProcess(['report', path, '-o', out], dir);
    expect(second.code).toBe(2);
    expect(second.stderr).toMatch(
      new RegExp(
        `^termsplit: .*interrupted is being written by another termsplit report \\(process ${child.pid}\\); wait for it to finish or choose another -o\n$`,
      ),
    );
    child.kill('SIGINT');
    expect(await exited).toBe(130);
    expect(stderr).toMatch(/interrupted \(SIGINT\): the report was not written to .*interrupted/);
    expect(tree(out)).toEqual([...before.keys()]);
    for (const [f, text] of before) expect(readFileSync(join(out, f), 'utf8')).toBe(text);
    expect(readdirSync(out).filter((f) => f.startsWith('.termsplit-'))).toEqual([MANIFEST]);
  });
});

/** The id of a process that has ended. */
function deadPid(): number {
  const r = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], {
    encoding: 'utf8',
  });
  return Number(r.stdout);
}

describe('report -o: one run at a time per folder', () => {
  it('refuses a folder whose lock a live process holds, in one line with exit 2, and changes nothing', async () => {
    const out = join(dir, 'locked');
    expect((await runInProcess(['report', sheet('locked', [NI]), '-o', out], dir)).code).toBe(0);
    expect(existsSync(join(out, LOCK))).toBe(false);
    const before = new Map(tree(out).map((f) => [f, readFileSync(join(out, f), 'utf8')]));
    writeFileSync(join(out, LOCK), `${process.ppid}\n`);
    const r = await runInProcess(['report', sheet('locked-2', [CR]), '-o', out], dir);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(`being written by another termsplit report (process ${process.ppid})`);
    expect(tree(out)).toEqual([...before.keys(), LOCK].sort());
    for (const [f, text] of before) expect(readFileSync(join(out, f), 'utf8')).toBe(text);
    expect(readFileSync(join(out, LOCK), 'utf8')).toBe(`${process.ppid}\n`);
  });

  it('a lock left by a process that is gone (or unreadable) is cleared, and the run goes on', async () => {
    const out = join(dir, 'stale-lock');
    mkdirSync(out);
    writeFileSync(join(out, LOCK), `${deadPid()}\n`);
    expect((await runInProcess(['report', sheet('stale-lock', [NI]), '-o', out], dir)).code).toBe(0);
    expect(existsSync(join(out, LOCK))).toBe(false);
    writeFileSync(join(out, LOCK), 'not a pid');
    expect((await runInProcess(['report', sheet('stale-lock', [NI]), '-o', out], dir)).code).toBe(0);
    expect(existsSync(join(out, LOCK))).toBe(false);
  });

  it('a folder not made yet is locked beside it, so two first runs cannot both make it', async () => {
    const out = join(dir, 'not-yet');
    const beside = join(dir, `.not-yet${LOCK}`);
    writeFileSync(beside, `${process.ppid}\n`);
    const r = await runInProcess(['report', sheet('not-yet', [NI]), '-o', out], dir);
    expect(r.code).toBe(2);
    expect(existsSync(out)).toBe(false);
    rmSync(beside);
    expect((await runInProcess(['report', sheet('not-yet', [NI]), '-o', out], dir)).code).toBe(0);
    expect(existsSync(beside)).toBe(false);
    expect(readdirSync(out).filter((f) => f.startsWith('.termsplit-'))).toEqual([MANIFEST]);
  });
});

describe('report file names from sample names', () => {
  it('slugs keep only lower-case letters, digits and dashes, so "/", ".." and markup never reach a path', () => {
    const names = ['../../etc/passwd', 'a/b', '<img src=x onerror=alert(1)>', '..', 'Ni(H2O)6 2+', 'a/b'];
    const out = slugs(names);
    expect(out).toEqual(['etc-passwd', 'a-b', 'img-src-x-onerror-alert-1', 'sample', 'ni-h2o-6-2', 'a-b-2']);
    for (const s of out) expect(s).toMatch(/^[a-z0-9-]+$/);
  });

  it('a report of samples named with "/", ".." and markup writes only inside its folder, and escapes the names in HTML', async () => {
    const out = join(dir, 'names');
    const samples = [
      { ...NI, name: '../../outside' },
      { ...CR, name: '<b onmouseover="x()">a/b</b>' },
    ];
    const r = await runInProcess(['report', sheet('names', samples), '-o', out], dir);
    expect(r.code).toBe(0);
    expect(existsSync(join(dir, 'outside'))).toBe(false);
    for (const f of tree(out)) expect(f).not.toMatch(/\.\.|</);
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).not.toContain('<b onmouseover');
    expect(html).toContain('&lt;b onmouseover=');
  });
});
