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
