/**
 * Guards the start-up of the command line: reads the static import graph of the sources (dynamic
 * `await import()` is not followed) and of the shipped bundle's chunks (tools/bundleCli.ts), and
 * checks that a command that prints text or JSON loads no figure stack (canvas, chart.js), no
 * spectrum reader and no sheet schema until it needs them.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { build, type Metafile } from 'esbuild';
import { beforeAll, describe, expect, it } from 'vitest';
import { cliBundleOptions } from '../../tools/bundleCli.js';
import { BIN, ROOT } from '../cliRunner.js';

/** `import … from '…'` and `export … from '…'` that load at run time (not `import type`), and bare `import '…'`. */
const STATIC_IMPORT =
  /^\s*(?:import|export)\s+(?!type\b)[^'"`;]*?\bfrom\s+'([^']+)'|^\s*import\s+'([^']+)'/gm;

/** Every package a source file loads, following its relative static imports. */
function staticPackages(entries: readonly string[]): Set<string> {
  return staticGraph(entries).packages;
}

/** The package a bare import specifier names. */
function packageName(spec: string): string {
  return spec.startsWith('@') ? spec.split('/').slice(0, 2).join('/') : (spec.split('/')[0] ?? spec);
}

/** The source files (relative to the root) and packages that `entries` load statically. */
function staticGraph(entries: readonly string[]): { files: Set<string>; packages: Set<string> } {
  const seen = new Set<string>();
  const packages = new Set<string>();
  const stack = entries.map((e) => resolve(ROOT, e));
  while (stack.length > 0) {
    const file = stack.pop() as string;
    if (seen.has(file)) continue;
    seen.add(file);
    for (const m of readFileSync(file, 'utf8').matchAll(STATIC_IMPORT)) {
      const spec = m[1] ?? m[2] ?? '';
      if (spec.startsWith('.')) stack.push(resolve(dirname(file), spec.replace(/\.js$/, '.ts')));
      else if (!spec.startsWith('node:')) packages.add(packageName(spec));
    }
  }
  return { files: new Set([...seen].map((f) => relative(ROOT, f))), packages };
}

const FIGURES = ['@napi-rs/canvas', 'chart.js'];
const READERS = ['jcampconverter', 'ml-spectra-processing', 'zod'];

/** The source files a --help may not load: commands, presenters, charts and physics. */
const HEAVY_SOURCES =
  /^(cli\/commands|cli\/present|charts|src\/(atom|analysis|field\/(?!labels)|fit|numeric|spectra|sheets))/;

/** The commands that draw or read spectra only when asked (spectrum is checked on its own). */
const TEXT_COMMANDS = [
  'terms',
  'levels',
  'ions',
  'fit',
  'diagram',
  'crossover',
  'magnetism',
  'report',
  'demo',
  'explore',
];

describe('start-up: what a command loads before it runs', () => {
  it('cli/main.ts with cli/program.ts statically loads commander and no command', () => {
    expect([...staticPackages(['cli/main.ts'])]).toEqual(['commander']);
    expect(readFileSync(resolve(ROOT, 'cli/program.ts'), 'utf8')).not.toMatch(/^import .*commands\//m);
  });

  it('termsplit --help, --version and no words load no command module and no physics (commandSummaries.ts)', () => {
    const { files } = staticGraph(['cli/main.ts']);
    expect(files).toContain('cli/commandSummaries.ts');
    expect([...files].filter((f) => HEAVY_SOURCES.test(f))).toEqual([]);
  });

  for (const command of TEXT_COMMANDS) {
    it(`termsplit ${command} loads no figure stack, spectrum reader or sheet schema before it runs`, () => {
      const loaded = staticPackages(['cli/main.ts', `cli/commands/${command}.ts`]);
      for (const heavy of [...FIGURES, ...READERS]) expect(loaded).not.toContain(heavy);
    });
  }

  it('termsplit --help (every command registered) loads no figure stack, reader or sheet schema', () => {
    const loaded = staticPackages(['cli/main.ts', ...TEXT_COMMANDS.map((c) => `cli/commands/${c}.ts`)]);
    for (const heavy of [...FIGURES, ...READERS]) expect(loaded).not.toContain(heavy);
  });

  it('termsplit spectrum loads the readers when it runs and the figure stack only when it draws', () => {
    const loaded = staticPackages(['cli/main.ts', 'cli/commands/spectrum.ts']);
    for (const heavy of [...FIGURES, ...READERS]) expect(loaded).not.toContain(heavy);
  });

  it('the import graph reader finds the figure stack where it is loaded', () => {
    expect(staticPackages(['charts/diagram.ts'])).toContain('@napi-rs/canvas');
    expect(staticPackages(['cli/report/analyse.ts'])).toContain('chart.js');
  });
});

/**
 * The sources and packages (bundled in or left as imports) that the bundle loads before running
 * code from `outputs`: their static chunk imports are followed, `import()` is not.
 */
function bundleGraph(
  meta: Metafile,
  outputs: readonly string[],
): { sources: Set<string>; packages: Set<string> } {
  const seen = new Set<string>();
  const sources = new Set<string>();
  const packages = new Set<string>();
  const stack = [...outputs];
  while (stack.length > 0) {
    const out = stack.pop() as string;
    if (seen.has(out)) continue;
    seen.add(out);
    const output = meta.outputs[out];
    if (output === undefined) throw new Error(`no bundle output ${out}`);
    for (const input of Object.keys(output.inputs)) {
      const inPackage = input.split('node_modules/').pop() as string;
      if (inPackage === input) sources.add(input);
      else packages.add(packageName(inPackage));
    }
    for (const i of output.imports) {
      if (i.kind === 'dynamic-import') continue;
      if (!i.external) stack.push(i.path);
      else if (!i.path.startsWith('node:')) packages.add(packageName(i.path));
    }
  }
  return { sources, packages };
}

describe('start-up of the bundled command line: what each chunk loads before it runs', () => {
  let meta: Metafile;
  beforeAll(async () => {
    meta = (await build({ ...cliBundleOptions(ROOT), write: false })).metafile;
  });
  const chunkOf = (entry: string): string => {
    const found = Object.entries(meta.outputs).find(([, o]) => o.entryPoint === entry)?.[0];
    if (found === undefined) throw new Error(`no chunk for ${entry}`);
    return found;
  };

  it('dist/cli/main.js (--help, --version, no words) loads commander and no command or physics', () => {
    const { sources, packages } = bundleGraph(meta, ['dist/cli/main.js']);
    expect(sources).toContain('cli/commandSummaries.ts');
    expect([...sources].filter((f) => HEAVY_SOURCES.test(f))).toEqual([]);
    expect([...packages]).toEqual(['commander']);
  });

  for (const command of [...TEXT_COMMANDS, 'spectrum']) {
    it(`the chunk of termsplit ${command} loads no figure stack, spectrum reader or sheet schema before it runs`, () => {
      const { packages } = bundleGraph(meta, ['dist/cli/main.js', chunkOf(`cli/commands/${command}.ts`)]);
      for (const heavy of [...FIGURES, ...READERS]) expect(packages).not.toContain(heavy);
    });
  }

  it('the bundle graph reader finds the figure stack where it is loaded', () => {
    expect(bundleGraph(meta, [chunkOf('charts/diagram.ts')]).packages).toContain('@napi-rs/canvas');
    expect(bundleGraph(meta, [chunkOf('cli/report/analyse.ts')]).packages).toContain('chart.js');
    expect(bundleGraph(meta, [chunkOf('cli/commands/fit.ts')]).packages).toContain('ml-matrix');
  });
});

describe('start-up of the bundled command line: the built-in modules it loads', () => {
  // node:child_process (which commander asks for at load) and node:crypto cost about 5 ms each.
  for (const argv of [['--help'], ['terms', 'd3'], ['diagram', 'd6', '--points', '2', '--json']]) {
    it(`termsplit ${argv.join(' ')} loads neither node:child_process nor node:crypto`, () => {
      const dir = mkdtempSync(join(tmpdir(), 'termsplit-modules-'));
      try {
        const hook = join(dir, 'loaded.mjs');
        writeFileSync(
          hook,
          "process.on('exit', () => process.stderr.write('\\nLOADED ' + process.moduleLoadList.join(',') + '\\n'));",
        );
        const r = spawnSync(process.execPath, ['--import', pathToFileURL(hook).href, BIN, ...argv], {
          cwd: ROOT,
          encoding: 'utf8',
        });
        expect(r.status).toBe(0);
        const loaded = /LOADED (.*)/.exec(r.stderr)?.[1]?.split(',') ?? [];
        expect(loaded).toContain('NativeModule fs');
        expect(loaded.filter((m) => /\b(child_process|crypto)\b/.test(m))).toEqual([]);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    });
  }
});
