/**
 * Bundles the command line as shipped: cli/main.ts and the report worker, by esbuild after tsc,
 * into dist/cli/main.js (the package's bin) and dist/cli/bundle/ (the worker and the shared
 * chunks). Loading a hundred separate ESM files and lexing ml-matrix's CommonJS cost more
 * start-up than most commands' own work; with code splitting each command stays a chunk of its
 * own, loaded by its `import()` in cli/program.ts. Run by `npm run build`; the tsc output of src/
 * stays the library.
 */
import { existsSync, rmSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { type BuildOptions, build, type Metafile, type Plugin } from 'esbuild';

/**
 * Packages that stay package imports: @napi-rs/canvas is native code, and dejavu-fonts-ttf is
 * font files found through require.resolve. Every other dependency is pure JavaScript and is
 * bundled: loaded separately it costs start-up (ml-matrix's CommonJS lexer pass, the hundreds of
 * files of ml-spectra-processing), and it still loads only with the command chunk that uses it.
 */
export const EXTERNAL_PACKAGES: readonly string[] = ['@napi-rs/canvas', 'dejavu-fonts-ttf'];

/**
 * The worker's and every chunk's folder (relative to the package root), so that
 * `new URL('./worker.js', import.meta.url)` in cli/report/run.ts finds the worker.
 */
export const CHUNK_DIR = 'dist/cli/bundle';

/**
 * commander loads node:child_process when it is loaded, for stand-alone executable subcommands,
 * which termsplit does not have; that module costs every command about 5 ms of start-up. Within
 * commander it is replaced by a stand-in that loads the real module on first use.
 */
export const lazyChildProcess: Plugin = {
  name: 'lazy-child-process',
  setup(b) {
    b.onResolve({ filter: /^node:child_process$/ }, (args) =>
      /[\\/]node_modules[\\/]commander[\\/]/.test(args.importer)
        ? { path: 'child_process', namespace: 'lazy-child-process' }
        : undefined,
    );
    b.onLoad({ filter: /.*/, namespace: 'lazy-child-process' }, () => ({
      contents:
        "let real; module.exports = new Proxy({}, { get: (_, key) => (real ??= require('node:child_process'))[key] });",
      loader: 'js',
    }));
  },
};

/** The esbuild options for the package at `root`. */
export function cliBundleOptions(root: string): BuildOptions & { metafile: true } {
  return {
    absWorkingDir: root,
    entryPoints: { main: 'cli/main.ts', 'bundle/worker': 'cli/report/worker.ts' },
    outdir: 'dist/cli',
    entryNames: '[dir]/[name]',
    chunkNames: 'bundle/[name]-[hash]',
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    external: [...EXTERNAL_PACKAGES],
    metafile: true,
    plugins: [lazyChildProcess],
    legalComments: 'none',
    logLevel: 'warning',
    // Bundled CommonJS (commander) calls require() for Node's own modules.
    banner: {
      js: "import { createRequire as createBundleRequire } from 'node:module'; const require = createBundleRequire(import.meta.url);",
    },
  };
}

/** The output file (relative to the package root) that holds the code of `input`. */
export function outputOf(meta: Metafile, input: string): string | undefined {
  return Object.entries(meta.outputs).find(([, o]) => input in o.inputs)?.[0];
}

/**
 * Writes the bundle of the package at `root` (replacing tsc's dist/cli/main.js) and checks that
 * the code of cli/report/run.ts lies next to the worker.
 * @throws Error when it does not.
 */
export async function bundleCli(root: string): Promise<void> {
  rmSync(resolve(root, CHUNK_DIR), { recursive: true, force: true });
  rmSync(resolve(root, 'dist/cli/main.js.map'), { force: true });
  const { metafile } = await build(cliBundleOptions(root));
  const run = outputOf(metafile, 'cli/report/run.ts');
  if (run === undefined || relative(CHUNK_DIR, dirname(run)) !== '') {
    throw new Error(`cli/report/run.ts must be bundled into ${CHUNK_DIR}/, next to worker.js`);
  }
  if (!existsSync(resolve(root, CHUNK_DIR, 'worker.js')))
    throw new Error(`${CHUNK_DIR}/worker.js not written`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await bundleCli(process.cwd());
}
