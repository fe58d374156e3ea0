// The program users run (bin/exine.js loads dist/bundle/exine.js): src/cli/main.ts bundled as ES
// modules, React in its production build. Each command is a dynamic import in main.ts, so each
// becomes a chunk of its own: Ink and React load only for the commands that draw a screen.
// What a good start never needs sits in CommonJS files beside the chunks, read on first use:
// zod (it words errors) and the @stdlib special functions. (dist/ from tsc stays for the bench
// and the test fixtures; there the same code loads them with plain imports and createRequire.)
import { build } from 'esbuild';
import { readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';

const outdir = 'dist/bundle';
const sources = readdirSync('src', { recursive: true }).map((f) => join('src', f)).filter((f) => /\.tsx?$/.test(f));

// A file named deferred-*.ts holds only `import * as M from 'P';` and `export const get = () => M;` lines.
function readDeferred(file) {
  const source = readFileSync(file, 'utf8').replace(/^\/\/.*$/gm, '');
  const paths = new Map([...source.matchAll(/^import \* as (\w+) from '([^']+)';$/gm)].map((m) => [m[1], m[2]]));
  const gets = [...source.matchAll(/^export const (\w+) = \(\) => (\w+);$/gm)].map((m) => ({ name: m[1], path: paths.get(m[2]) }));
  const rest = source.replace(/^import \* as .*$/gm, '').replace(/^export const .*$/gm, '').trim();
  if (rest || gets.length === 0 || gets.some((g) => !g.path)) {
    throw new Error(`${file}: a deferred-*.ts file holds only "import * as M from '…';" and "export const get = () => M;" lines`);
  }
  return { out: `${basename(file, '.ts').replace(/^deferred-/, '')}.cjs`, dir: resolve(dirname(file)), gets };
}
const deferredFiles = new Map(sources.filter((f) => /(^|[\\/])deferred-[\w-]+\.ts$/.test(f)).map((f) => [resolve(f), readDeferred(f)]));
const stdlibIds = [...new Set(sources.filter((f) => f.startsWith(join('src', 'stats'))).flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/\bload\('(@stdlib\/[^']+)'\)/g)].map((m) => m[1])))];

rmSync(outdir, { recursive: true, force: true });

const common = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  // jsonc-parser's "main" is a UMD file that a bundler cannot follow; its "module" is plain ESM.
  mainFields: ['module', 'main'],
  minifySyntax: true,
  minifyWhitespace: true,
  legalComments: 'eof',
  logLevel: 'warning',
};

// One CommonJS file per group; each of its modules runs when its getter is first read.
async function cjsBundle(out, resolveDir, entries) {
  const contents = `module.exports = {\n${entries.map(([name, path]) => `  get ${JSON.stringify(name)}() { return require(${JSON.stringify(path)}); },`).join('\n')}\n};\n`;
  await build({ ...common, stdin: { contents, resolveDir, loader: 'ts', sourcefile: out }, format: 'cjs', outfile: join(outdir, out) });
}
for (const d of deferredFiles.values()) await cjsBundle(d.out, d.dir, d.gets.map((g) => [g.name, g.path]));
await cjsBundle('stdlib.cjs', resolve('src/stats'), stdlibIds.map((id) => [id, id]));

// In the chunks, a deferred file and each load('@stdlib/…') read those files through require().
const deferLoads = {
  name: 'defer-loads',
  setup(b) {
    b.onResolve({ filter: /^\.\/[\w-]+\.cjs$/ }, (args) => ({ path: args.path, external: true }));
    b.onLoad({ filter: /\.tsx?$/ }, (args) => {
      const d = deferredFiles.get(args.path);
      if (d) return { contents: d.gets.map((g) => `export const ${g.name} = () => require('./${d.out}')[${JSON.stringify(g.name)}];`).join('\n'), loader: 'ts' };
      const source = readFileSync(args.path, 'utf8');
      if (!/\bload\('@stdlib\//.test(source)) return undefined;
      const contents = source
        .replace(/^const load = createRequire\(import\.meta\.url\);$/m, '')
        .replace(/\bload\('(@stdlib\/[^']+)'\)/g, "require('./stdlib.cjs')['$1']");
      return { contents, loader: args.path.endsWith('x') ? 'tsx' : 'ts' };
    });
  },
};

const result = await build({
  ...common,
  entryPoints: { exine: 'src/cli/main.ts' },
  outdir,
  splitting: true,
  format: 'esm',
  // Beside the .cjs files, so that require('./x.cjs') finds them from every chunk.
  chunkNames: '[name]-[hash]',
  // fetch: the layout engine's WebAssembly loader asks for it before it sees that its module is
  // inline; reading Node's global fetch loads its HTTP client (undici), tens of milliseconds of a
  // first frame. exine fetches nothing, so in the bundle fetch is undefined.
  define: { 'process.env.NODE_ENV': '"production"', fetch: 'undefined' },
  // Ink loads React's devtools only when DEV=true; they are not installed.
  external: ['react-devtools-core'],
  // CommonJS inside ES modules still calls require(): for Node's own modules and the .cjs files.
  banner: { js: "import { createRequire as __exineCreateRequire } from 'node:module'; const require = __exineCreateRequire(import.meta.url);" },
  plugins: [deferLoads],
  metafile: true,
});
if (process.env.EXINE_BUNDLE_META) writeFileSync(process.env.EXINE_BUNDLE_META, JSON.stringify(result.metafile));
