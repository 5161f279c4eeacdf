// The explorer page's script: explorer/page.ts and the library it imports, bundled by esbuild
// into one browser file (dist/explorer/bundle.js) that `termsplit explore` inlines into the page.
// Run by `npm run build` after tsc, which type-checks the sources (tsconfig.explorer.json).
import { build } from 'esbuild';

// The generated data modules (cubic bases, free-ion parts) would triple the page, which is
// written once per sample of a report; in the page they stand empty and the library builds
// what it needs, as it does wherever the stored copy cannot be read.
const STORED_DATA = {
  'cubicBasisData.ts': 'STORED_CUBIC_BASES',
  'freeIonData.ts': 'STORED_D_FREE_ION_PARTS',
};

const withoutStoredData = {
  name: 'without-stored-data',
  setup(b) {
    b.onLoad({ filter: /(cubicBasisData|freeIonData)\.ts$/ }, (args) => {
      const name = STORED_DATA[args.path.split('/').pop()];
      return { contents: `export const ${name} = [];`, loader: 'js' };
    });
  },
};

await build({
  entryPoints: ['explorer/page.ts'],
  bundle: true,
  format: 'iife',
  platform: 'browser',
  target: 'es2020',
  minify: true,
  legalComments: 'none',
  outfile: 'dist/explorer/bundle.js',
  logLevel: 'warning',
  plugins: [withoutStoredData],
});
