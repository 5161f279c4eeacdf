import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { memoryIo } from '../cli/io.js';
import { run } from '../cli/program.js';

/** Repository root. */
export const ROOT = resolve(import.meta.dirname, '..');

/** The built command line; built by `npm ci` (prepare) or `npm run build`. */
export const BIN = resolve(ROOT, 'dist/cli/main.js');

/** Splits a command line into words, honouring single and double quotes. */
export function words(line: string): string[] {
  return [...line.matchAll(/'([^']*)'|"([^"]*)"|(\S+)/g)].map((m) => m[1] ?? m[2] ?? m[3] ?? '');
}

/** Runs the program in process. */
export async function runInProcess(
  argv: string[],
  cwd = ROOT,
): Promise<{ code: number; stdout: string; stderr: string }> {
  const io = memoryIo(cwd);
  const code = await run(argv, io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

function newestSource(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = resolve(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestSource(path) : statSync(path).mtimeMs);
  }
  return newest;
}

/** Builds dist/ once if it is missing or older than the sources. */
export function ensureBuilt(): void {
  const sources = Math.max(
    ...['src', 'cli', 'charts', 'explorer', 'tools'].map((d) => newestSource(resolve(ROOT, d))),
  );
  const bundle = resolve(ROOT, 'dist/explorer/bundle.js');
  const stale = [BIN, bundle].some((f) => !existsSync(f) || statSync(f).mtimeMs < sources);
  if (stale) {
    const r = spawnSync('npm', ['run', 'build'], { cwd: ROOT, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`build failed: ${r.stdout}${r.stderr}`);
  }
}

/** Runs the built binary as a user would. */
export function runBinary(argv: string[], cwd = ROOT): { code: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [BIN, ...argv], { cwd, encoding: 'utf8' });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
