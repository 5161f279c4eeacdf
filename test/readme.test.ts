import { mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT, runInProcess, words } from './cliRunner.js';

/** The `npx termsplit …` commands of the README's shell blocks (continuations joined, comments dropped). */
function readmeCommands(): string[] {
  const text = readFileSync(join(ROOT, 'README.md'), 'utf8');
  const blocks = [...text.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1] ?? '');
  return blocks
    .flatMap((b) => b.replace(/\\\n\s*/g, ' ').split('\n'))
    .map((line) => line.replace(/\s+#.*$/, '').trim())
    .filter((line) => line.startsWith('npx termsplit ') && !/^npx termsplit demo\b/.test(line));
}

const dir = mkdtempSync(join(tmpdir(), 'termsplit-readme-'));
symlinkSync(join(ROOT, 'fixtures'), join(dir, 'fixtures'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('the README examples', () => {
  const commands = readmeCommands();

  it('the README has examples of every command', () => {
    for (const c of ['terms', 'levels', 'diagram', 'fit', 'spectrum', 'crossover', 'report']) {
      expect(commands.some((line) => line.startsWith(`npx termsplit ${c} `))).toBe(true);
    }
  });

  for (const line of commands) {
    it(`runs: ${line}`, async () => {
      const r = await runInProcess(words(line).slice(2), dir);
      expect(r.stderr.replace(/termsplit: sample .*\n/g, '')).toBe('');
      expect(r.code).toBe(0);
    }, 60_000);
  }
});
