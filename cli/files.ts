/**
 * Files for the commands: reading text, writing one or several outputs whole or not at all, and
 * finding the package's own folder (for the shipped fixtures).
 */

import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { InputError } from '../src/index.js';

/**
 * Writes a file whole or not at all: to a temporary name in the same directory, then renamed,
 * so a failure never leaves a half-written output. Missing parent directories are an error
 * unless `makeDirs`.
 * @throws InputError naming the path and the reason.
 */
export function writeFileAtomic(path: string, data: string | Uint8Array, makeDirs = false): void {
  const dir = dirname(path);
  if (makeDirs) {
    try {
      mkdirSync(dir, { recursive: true });
    } catch (e) {
      throw new InputError(`cannot create directory ${dir}: ${reason(e)}`);
    }
  } else {
    checkOutputDirectory(path);
  }
  const temp = `${path}.${randomBytes(4).toString('hex')}.tmp`;
  try {
    writeFileSync(temp, data);
    renameSync(temp, path);
  } catch (e) {
    rmSync(temp, { force: true });
    throw new InputError(`cannot write ${path}: ${reason(e)}`);
  }
}

/**
 * Checks that the directory of an output path exists, so a command can refuse before long work.
 * @throws InputError naming the path.
 */
export function checkOutputDirectory(path: string): void {
  const dir = dirname(path);
  if (!existsSync(dir) || !statSync(dir).isDirectory()) {
    throw new InputError(`cannot write ${path}: directory ${dir} does not exist`);
  }
}

/**
 * Writes several files all or none: each to a temporary name beside its target first; only when
 * every one is written are they renamed into place, so a failure leaves every existing file as
 * it was.
 * @throws InputError naming the path that failed and the reason.
 */
export function writeFilesAtomic(files: readonly { path: string; data: string | Uint8Array }[]): void {
  const temps: { temp: string; path: string }[] = [];
  try {
    for (const f of files) {
      const dir = dirname(f.path);
      if (!existsSync(dir) || !statSync(dir).isDirectory()) {
        throw new InputError(`cannot write ${f.path}: directory ${dir} does not exist`);
      }
      if (existsSync(f.path) && statSync(f.path).isDirectory()) {
        throw new InputError(`cannot write ${f.path}: it is a directory`);
      }
      const temp = `${f.path}.${randomBytes(4).toString('hex')}.tmp`;
      temps.push({ temp, path: f.path });
      try {
        writeFileSync(temp, f.data);
      } catch (e) {
        throw new InputError(`cannot write ${f.path}: ${reason(e)}`);
      }
    }
    for (const t of temps) {
      try {
        renameSync(t.temp, t.path);
      } catch (e) {
        throw new InputError(`cannot write ${t.path}: ${reason(e)}`);
      }
    }
  } finally {
    for (const t of temps) rmSync(t.temp, { force: true });
  }
}

/** Reads a text file. @throws InputError naming the path. */
export function readTextFile(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new InputError(`cannot read ${path}: ${reason(e)}`);
  }
}

function reason(e: unknown): string {
  const code = (e as { code?: string }).code;
  if (code === 'ENOENT') return 'no such file or directory';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (code === 'EISDIR') return 'is a directory';
  if (code === 'ENOSPC') return 'no space left on device';
  return e instanceof Error ? e.message : String(e);
}

/** The package's root directory (where package.json and fixtures/ are), from compiled or source code. */
export function packageRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 6; i++) {
    if (existsSync(resolve(dir, 'package.json')) && existsSync(resolve(dir, 'fixtures'))) return dir;
    dir = dirname(dir);
  }
  throw new Error('termsplit: cannot find the package root (package.json with fixtures/)');
}
