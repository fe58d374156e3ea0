// The program users run: one ES module bundle of src/cli/main.ts with React in its production build.
// Each command is a dynamic import in main.ts, so each becomes a chunk of its own: Ink and React
// load only for the commands that draw a screen. (dist/ from tsc stays for the bench and test fixtures.)
import { build } from 'esbuild';
import { readFileSync, rmSync } from 'node:fs';

// src/stats loads the @stdlib functions on first use through createRequire (the compiled modules
// resolve them in node_modules at run time). Here the same calls become plain require() calls,
// which esbuild bundles as modules that run when first called: lazy, and one file instead of hundreds.
const lazyStdlib = {
  name: 'lazy-stdlib',
  setup(b) {
    b.onLoad({ filter: /src[\\/]stats[\\/].*\.ts$/ }, (args) => {
      const source = readFileSync(args.path, 'utf8');
      if (!source.includes('createRequire(import.meta.url)')) return undefined;
      const contents = source
        .replace(/^const load = createRequire\(import\.meta\.url\);$/m, '')
        .replace(/\bload\('(@stdlib\/[^']+)'\)/g, "require('$1')");
      return { contents, loader: 'ts' };
    });
  },
};

const outdir = 'dist/bundle';
rmSync(outdir, { recursive: true, force: true });
const result = await build({
  entryPoints: { exine: 'src/cli/main.ts' },
  outdir,
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  // jsonc-parser's "main" is a UMD file that a bundler cannot follow; its "module" is plain ESM.
  mainFields: ['module', 'main'],
  chunkNames: 'chunks/[name]-[hash]',
  define: { 'process.env.NODE_ENV': '"production"' },
  // Ink loads React's devtools only when DEV=true; they are not installed.
  external: ['react-devtools-core'],
  // CommonJS packages inside an ES module bundle still call require() for Node's own modules.
  banner: { js: "import { createRequire as __exineCreateRequire } from 'node:module'; const require = __exineCreateRequire(import.meta.url);" },
  minifySyntax: true,
  minifyWhitespace: true,
  legalComments: 'eof',
  plugins: [lazyStdlib],
  metafile: true,
  logLevel: 'warning',
});
if (process.env.EXINE_BUNDLE_META) (await import('node:fs')).writeFileSync(process.env.EXINE_BUNDLE_META, JSON.stringify(result.metafile));
