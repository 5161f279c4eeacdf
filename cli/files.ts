/**
 * Files for the commands: reading text (regular files only, under a size cap), writing one or
 * several outputs whole or not at all, the temporary files an interrupt must remove, and finding
 * the package's own folder (for the shipped fixtures).
 */

import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { InputError } from '../src/core/errors.js';

/**
 * The largest input file read, bytes: a spectrum of 10⁶ rows is about 30 MB; anything much
 * larger is not a spectrum or sheet (common practice, no source).
 */
export const INPUT_FILE_MAX_BYTES = 256 * 1024 * 1024;

/** The size cap in words, for help texts. */
export const INPUT_FILE_MAX_TEXT = `${INPUT_FILE_MAX_BYTES / 1024 / 1024} MB`;

/** Temporary files and folders in use, with what an interrupt leaves undone if they go. */
const temporaries = new Map<string, string>();

/**
 * Registers a temporary file or folder that an interrupt must remove; `undone` says what is then
 * not written (empty for a file, such as a lock, whose removal leaves nothing undone). Returns the function that forgets it once it is renamed into place or removed.
 */
export function trackTemporary(path: string, undone: string): () => void {
  temporaries.set(path, undone);
  return () => temporaries.delete(path);
}

/**
 * Removes every registered temporary file and folder (on SIGINT or SIGTERM) and returns what
 * was therefore not written, one entry per temporary.
 */
export function removeTemporaries(): string[] {
  const undone: string[] = [];
  for (const [path, what] of temporaries) {
    rmSync(path, { recursive: true, force: true });
    if (what !== '') undone.push(what);
  }
  temporaries.clear();
  return undone;
}

let tagsMade = 0;

/**
 * A tag for temporary names, `<pid>-<count>-<random>`: unique among the processes writing on this
 * machine (pid and a count; the report recognises a dead run's folders by the pid first) and
 * unlikely to meet another machine's in a shared folder (the random part). Not from node:crypto:
 * loading it would cost every command start-up time, and the names need no secrecy.
 */
export function uniqueTag(): string {
  tagsMade++;
  return `${process.pid}-${tagsMade.toString(36)}-${Math.random().toString(36).slice(2, 8)}`;
}

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
  const temp = `${path}.${uniqueTag()}.tmp`;
  const forget = trackTemporary(temp, `${path} not written`);
  try {
    writeFileSync(temp, data);
    renameSync(temp, path);
  } catch (e) {
    rmSync(temp, { force: true });
    throw new InputError(`cannot write ${path}: ${reason(e)}`);
  } finally {
    forget();
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
  const temps: { temp: string; path: string; forget: () => void }[] = [];
  try {
    for (const f of files) {
      const dir = dirname(f.path);
      if (!existsSync(dir) || !statSync(dir).isDirectory()) {
        throw new InputError(`cannot write ${f.path}: directory ${dir} does not exist`);
      }
      if (existsSync(f.path) && statSync(f.path).isDirectory()) {
        throw new InputError(`cannot write ${f.path}: it is a directory`);
      }
      const temp = `${f.path}.${uniqueTag()}.tmp`;
      temps.push({ temp, path: f.path, forget: trackTemporary(temp, `${f.path} not written`) });
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
    for (const t of temps) {
      rmSync(t.temp, { force: true });
      t.forget();
    }
  }
}

/**
 * Reads a text file: a regular file (not a device, pipe or folder, which could block or never
 * end) of at most {@link INPUT_FILE_MAX_BYTES}, in UTF-8 or UTF-16 with a byte-order mark.
 * @throws InputError naming the path and what is wrong.
 */
export function readTextFile(path: string): string {
  let bytes: Buffer;
  try {
    const stat = statSync(path);
    if (stat.isDirectory()) throw new InputError(`cannot read ${path}: it is a folder, not a file`);
    if (!stat.isFile()) {
      throw new InputError(`cannot read ${path}: not a regular file (a device, pipe or socket)`);
    }
    if (stat.size > INPUT_FILE_MAX_BYTES) {
      throw new InputError(
        `cannot read ${path}: ${stat.size} bytes, expected at most ${INPUT_FILE_MAX_BYTES} bytes`,
      );
    }
    bytes = readFileSync(path);
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`cannot read ${path}: ${reason(e)}`);
  }
  return decodeText(path, bytes);
}

/** UTF-8 text, or UTF-16 named by its byte-order mark; other binary data (NUL bytes) refused. */
function decodeText(path: string, bytes: Buffer): string {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder('utf-16le').decode(bytes.subarray(2));
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder('utf-16be').decode(bytes.subarray(2));
  if (bytes.includes(0)) {
    throw new InputError(
      `cannot read ${path}: it holds NUL bytes — binary data, or UTF-16 text without a byte-order mark (save it as UTF-8)`,
    );
  }
  return bytes.toString('utf8');
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
