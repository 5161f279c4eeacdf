/**
 * Work shared by the whole suite, done once: the build of the command line (for the tests that
 * spawn it) and one run of `termsplit demo` by the built binary, whose folder several test files read.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { ensureBuilt, runBinary } from './cliRunner.js';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The folder in which `termsplit demo` ran; the report is in its `termsplit-demo/`. */
    demoCwd: string;
    /** What that run printed and its exit code. */
    demoRun: { code: number; stdout: string; stderr: string };
  }
}

export default function setup(project: TestProject): () => void {
  ensureBuilt();
  const cwd = mkdtempSync(join(tmpdir(), 'termsplit-demo-'));
  project.provide('demoCwd', cwd);
  project.provide('demoRun', runBinary(['demo'], cwd));
  return () => rmSync(cwd, { recursive: true, force: true });
}
