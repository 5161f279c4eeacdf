/**
 * Writes a report folder all or nothing, replacing an earlier report but never other files, and
 * names the program that wrote it.
 */

import {
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../../src/index.js';

/** The marker report.json carries, so that a later run may replace the folder. */
export const REPORT_GENERATOR = 'termsplit report';

/**
 * Writes a report folder whole or not at all: every file goes into a fresh sibling folder, which
 * then takes the place of `dir`. An existing `dir` is replaced only when it is empty or an
 * earlier termsplit report; anything else is refused, so no other files are ever lost.
 * @throws InputError naming the folder and the reason.
 */
export function writeReportFolder(dir: string, files: ReadonlyMap<string, string | Uint8Array>): void {
  const parent = dirname(dir);
  if (!existsSync(parent) || !statSync(parent).isDirectory()) {
    throw new InputError(`cannot write the report to ${dir}: directory ${parent} does not exist`);
  }
  if (existsSync(dir)) {
    if (!statSync(dir).isDirectory()) throw new InputError(`cannot write the report to ${dir}: it is a file`);
    const entries = readdirSync(dir);
    if (entries.length > 0 && !isReport(dir)) {
      throw new InputError(`${dir} exists and is not a termsplit report; choose another -o or empty it`);
    }
  }
  const staging = join(parent, `.${basename(dir)}.${process.pid}.${Date.now()}.partial`);
  try {
    for (const [name, data] of files) {
      const path = join(staging, name);
      mkdirSync(dirname(path), { recursive: true });
      writeFileSync(path, data);
    }
    if (existsSync(dir)) rmSync(dir, { recursive: true, force: true });
    renameSync(staging, dir);
  } catch (e) {
    rmSync(staging, { recursive: true, force: true });
    if (e instanceof InputError) throw e;
    throw new InputError(`cannot write the report to ${dir}: ${(e as Error).message}`);
  }
}

function isReport(dir: string): boolean {
  try {
    const json = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8')) as { generator?: string };
    return json.generator === REPORT_GENERATOR;
  } catch {
    return false;
  }
}
