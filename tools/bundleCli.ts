/**
 * Bundles the command line as shipped: cli/main.ts and the report worker, by esbuild after tsc,
 * into dist/cli/main.js (the package's bin) and dist/cli/bundle/ (the worker and the shared
 * chunks). Loading a hundred separate ESM files and lexing ml-matrix's CommonJS cost more
 * start-up than most commands' own work; with code splitting each command stays a chunk of its
 * own, loaded by its `import()` in cli/program.ts. Run by `npm run build`; the tsc output of src/
 * stays the library.
 */
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { type BuildOptions, build, type Metafile } from 'esbuild';

/** Pure-JS packages bundled in: loading them separately costs start-up (ml-matrix's lexer pass). */
export const BUNDLED_PACKAGES: readonly string[] = ['commander', 'ml-matrix'];

/**
 * The worker's and every chunk's folder (relative to the package root), so that
 * `new URL('./worker.js', import.meta.url)` in cli/report/run.ts finds the worker.
 */
export const CHUNK_DIR = 'dist/cli/bundle';

/**
 * The esbuild options for the package at `root`. Every dependency but BUNDLED_PACKAGES stays a
 * package import: @napi-rs/canvas is native, dejavu-fonts-ttf is font files found through
 * require.resolve, and the others (chart.js, the spectrum readers, zod) load only with the
 * commands that draw or read files.
 */
export function cliBundleOptions(root: string): BuildOptions & { metafile: true } {
  const pkg = JSON.parse(readFileSync(resolve(root, 'package.json'), 'utf8')) as {
    dependencies: Record<string, string>;
  };
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
    external: Object.keys(pkg.dependencies).filter((name) => !BUNDLED_PACKAGES.includes(name)),
    metafile: true,
    legalComments: 'none',
    logLevel: 'warning',
    // The bundled CommonJS (commander) calls require() for Node's own modules.
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
