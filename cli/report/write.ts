/**
 * Writes a report folder all or nothing and never removes a file the program did not write. The
 * folder is reserved before the work (a fresh staging folder, removed on an interrupt); the
 * finished report is written there with a manifest listing its files; then the files of the
 * earlier report — only those its manifest lists — are moved aside, the new files renamed into
 * place, and the old ones removed. Other files in the folder (notes, spectra, the sheet) stay.
 * One run at a time writes a folder: a lock file holding the run's process id is made (with an
 * exclusive create) before anything else, and another run finding it refuses at once unless that
 * process is gone.
 */

import {
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  renameSync,
  rmdirSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { basename, dirname, join, sep } from 'node:path';
import { InputError } from '../../src/core/errors.js';
import { trackTemporary, uniqueTag } from '../files.js';

/** The marker report.json carries, so that a later run may replace the report. */
export const REPORT_GENERATOR = 'termsplit report';

/** The manifest: the report's own files, the only ones a later run replaces or removes. */
export const MANIFEST = '.termsplit-manifest.json';

/** The name part of staging and set-aside folders, so that stale ones can be recognised. */
const STAGING_MARK = '.termsplit-partial-';
const ASIDE_MARK = '.termsplit-old-';

/**
 * The lock file: inside the folder, or, while the folder does not exist yet, beside it as
 * `.<name>.termsplit-lock`. It holds the process id of the run writing the folder.
 */
export const LOCK = '.termsplit-lock';

/** A report folder reserved before the work: where it goes and where it is being assembled. */
export interface ReportFolder {
  readonly dir: string;
  readonly staging: string;
  /** The lock file this run holds. */
  readonly lock: string;
  /** Forgets the staging folder for interrupt clean-up (after it is renamed or removed). */
  readonly forget: () => void;
  /** Removes the lock file. */
  readonly releaseLock: () => void;
}

/**
 * Checks that `dir` may take a report — it does not exist, is empty, or holds an earlier
 * termsplit report — and creates the staging folder, before any long work.
 * @throws InputError naming the folder and the reason.
 */
export function reserveReportFolder(dir: string): ReportFolder {
  const parent = dirname(dir);
  if (!existsSync(parent) || !statSync(parent).isDirectory()) {
    throw new InputError(`cannot write the report to ${dir}: directory ${parent} does not exist`);
  }
  const exists = existsSync(dir);
  if (exists && !statSync(dir).isDirectory()) {
    throw new InputError(`cannot write the report to ${dir}: it is a file`);
  }
  const lock = takeLock(dir, exists);
  try {
    if (exists) {
      const entries = readdirSync(dir).filter((e) => !isStale(e) && e !== LOCK);
      if (entries.length > 0 && readManifest(dir) === undefined && !isMarkedReport(dir)) {
        throw new InputError(`${dir} exists and is not a termsplit report; choose another -o or empty it`);
      }
      removeStale(dir);
    }
    return { ...staged(dir, exists), lock: lock.path, releaseLock: lock.release };
  } catch (e) {
    lock.release();
    throw e;
  }
}

/** Creates the staging folder and registers it for interrupt clean-up. */
function staged(dir: string, exists: boolean): { staging: string; dir: string; forget: () => void } {
  const parent = dirname(dir);
  const tag = uniqueTag();
  // Inside an existing folder, so the final renames stay on one file system and need no write
  // access to its parent (`-o .`); beside a new one, which it then becomes whole.
  const staging = exists
    ? join(dir, `${STAGING_MARK}${tag}`)
    : join(parent, `.${basename(dir)}${STAGING_MARK}${tag}`);
  try {
    mkdirSync(staging);
  } catch (e) {
    throw new InputError(`cannot write the report to ${dir}: ${(e as Error).message}`);
  }
  const forget = trackTemporary(
    staging,
    `the report was not written to ${dir}; anything there before is unchanged`,
  );
  return { dir, staging, forget };
}

/**
 * Takes the folder's lock: creates the lock file exclusively with this process's id. A lock
 * whose process is gone (killed outright, no clean-up) is stale and taken over; a live one is
 * refused in one line.
 * @throws InputError naming the folder and the process that holds it.
 */
function takeLock(dir: string, exists: boolean): { path: string; release: () => void } {
  const path = exists ? join(dir, LOCK) : join(dirname(dir), `.${basename(dir)}${LOCK}`);
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      writeFileSync(path, `${process.pid}\n`, { flag: 'wx' });
      const forget = trackTemporary(path, '');
      return {
        path,
        release: () => {
          rmSync(path, { force: true });
          forget();
        },
      };
    } catch (e) {
      if ((e as { code?: string }).code !== 'EEXIST') {
        throw new InputError(`cannot write the report to ${dir}: ${(e as Error).message}`);
      }
    }
    const holder = lockHolder(path);
    if (holder !== undefined) {
      throw new InputError(
        `${dir} is being written by another termsplit report (process ${holder}); wait for it to finish or choose another -o`,
      );
    }
    rmSync(path, { force: true });
  }
  throw new InputError(`cannot write the report to ${dir}: its lock ${path} could not be taken`);
}

/** The live process that holds a lock file, or undefined when the lock is stale (gone or unreadable). */
function lockHolder(path: string): number | undefined {
  let pid: number;
  try {
    pid = Number(readFileSync(path, 'utf8').trim());
  } catch {
    return undefined;
  }
  return Number.isInteger(pid) && pid > 0 && isAlive(pid) ? pid : undefined;
}

/** Whether a process exists (a process of another user counts: signal 0 is then refused with EPERM). */
function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as { code?: string }).code !== 'ESRCH';
  }
}

/** Removes the staging folder of a report that will not be written, and gives up the lock. */
export function abandonReportFolder(folder: ReportFolder): void {
  rmSync(folder.staging, { recursive: true, force: true });
  folder.forget();
  folder.releaseLock();
}

/**
 * Writes the report's files into the reserved folder and puts them in place, replacing only the
 * files the earlier report's manifest lists. On failure the earlier report is put back.
 * @throws InputError naming the folder and the reason.
 */
export function commitReportFolder(
  folder: ReportFolder,
  files: ReadonlyMap<string, string | Uint8Array>,
): void {
  const { dir, staging } = folder;
  const names = [...files.keys()].sort();
  try {
    for (const [name, data] of files) {
      const path = join(staging, name);
      mkdirSync(dirname(path), { recursive: true });
      writeFileSync(path, data);
    }
    writeFileSync(
      join(staging, MANIFEST),
      `${JSON.stringify({ generator: REPORT_GENERATOR, files: names }, null, 2)}\n`,
    );
    if (!existsSync(dir)) renameSync(staging, dir);
    else replaceListedFiles(dir, staging, [...names, MANIFEST]);
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`cannot write the report to ${dir}: ${(e as Error).message}`);
  } finally {
    rmSync(staging, { recursive: true, force: true });
    folder.forget();
  }
}

/**
 * Moves the earlier report's listed files aside, the new files in, then removes the old ones;
 * a failure half-way moves everything back.
 */
function replaceListedFiles(dir: string, staging: string, names: readonly string[]): void {
  const manifest = readManifest(dir);
  // An earlier report without a manifest: only files of the new report's names are its own.
  const old = (manifest ?? names).filter((n) => n !== MANIFEST && existsSync(join(dir, n)));
  if (manifest) {
    const foreign = names.filter((n) => n !== MANIFEST && !manifest.includes(n) && existsSync(join(dir, n)));
    if (foreign.length > 0) {
      throw new InputError(
        `cannot write the report to ${dir}: ${foreign[0]} is there and was not written by termsplit; move it away or choose another -o`,
      );
    }
  }
  const aside = join(dir, `${ASIDE_MARK}${uniqueTag()}`);
  const forget = trackTemporary(aside, `the earlier report in ${dir} was being replaced`);
  const movedAside: string[] = [];
  const movedIn: string[] = [];
  try {
    for (const n of [...old, ...(existsSync(join(dir, MANIFEST)) ? [MANIFEST] : [])]) {
      moveFile(join(dir, n), join(aside, n));
      movedAside.push(n);
    }
    for (const n of names) {
      moveFile(join(staging, n), join(dir, n));
      movedIn.push(n);
    }
  } catch (e) {
    for (const n of movedIn) rmSync(join(dir, n), { force: true });
    for (const n of movedAside) moveFile(join(aside, n), join(dir, n));
    rmSync(aside, { recursive: true, force: true });
    forget();
    throw e;
  }
  rmSync(aside, { recursive: true, force: true });
  forget();
  removeEmptyFolders(
    dir,
    old.filter((n) => !names.includes(n)),
  );
}

function moveFile(from: string, to: string): void {
  mkdirSync(dirname(to), { recursive: true });
  renameSync(from, to);
}

/** Removes the sub-folders of removed report files when nothing else is left in them. */
function removeEmptyFolders(dir: string, removed: readonly string[]): void {
  const folders = new Set(removed.map((n) => dirname(n)).filter((d) => d !== '.'));
  for (const f of [...folders].sort((a, b) => b.split(sep).length - a.split(sep).length)) {
    const path = join(dir, f);
    if (existsSync(path) && readdirSync(path).length === 0) rmdirSync(path);
  }
}

/** The file list of the folder's manifest, or undefined when there is none (or it is unreadable). */
function readManifest(dir: string): string[] | undefined {
  try {
    const json = JSON.parse(readFileSync(join(dir, MANIFEST), 'utf8')) as {
      generator?: unknown;
      files?: unknown;
    };
    if (json.generator !== REPORT_GENERATOR || !Array.isArray(json.files)) return undefined;
    // Only plain relative names inside the folder: a manifest never points elsewhere.
    return json.files.filter(
      (f): f is string =>
        typeof f === 'string' && f !== '' && !f.startsWith('/') && !f.split(/[\\/]/).includes('..'),
    );
  } catch {
    return undefined;
  }
}

/** Whether the folder holds a report.json of an earlier version, written before manifests. */
function isMarkedReport(dir: string): boolean {
  try {
    const json = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8')) as { generator?: string };
    return json.generator === REPORT_GENERATOR;
  } catch {
    return false;
  }
}

/**
 * A staging or set-aside folder of a run that was killed outright (no clean-up was possible):
 * its process is gone. Set-aside folders hold an earlier report's files, so only staging
 * folders are ever removed.
 */
function isStale(entry: string, marks = [STAGING_MARK, ASIDE_MARK]): boolean {
  const mark = marks.find((m) => entry.startsWith(m));
  const pid = mark === undefined ? undefined : /^(\d+)-[0-9a-z-]+$/.exec(entry.slice(mark.length))?.[1];
  return pid !== undefined && !isAlive(Number(pid));
}

function removeStale(dir: string): void {
  for (const e of readdirSync(dir)) {
    if (isStale(e, [STAGING_MARK])) rmSync(join(dir, e), { recursive: true, force: true });
  }
}
