// The explorer page's script: explorer/page.ts and the library it imports, bundled by esbuild
// into one browser file (dist/explorer/bundle.js) that `termsplit explore` inlines into the page.
// Run by `npm run build` after tsc, which type-checks the sources (tsconfig.explorer.json).
import { build } from 'esbuild';

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
});
