// The program users run (bin/exine.cjs loads dist/bundle/NAME.cjs through code-cache.cjs):
// src/cli/main.ts bundled once per command as CommonJS, React in its production build. A screen
// stays behind a dynamic import, which runs its modules (Ink, React) only when it opens.
// What a good start never needs sits in CommonJS files beside them, read on first use: zod (it
// words errors) and the @stdlib special functions. (dist/ from tsc stays for the bench and the
// test fixtures; there the same code loads them with plain imports and createRequire.)
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { copyFileSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { basename, dirname, join, resolve } from 'node:path';
import { sourcePatch } from './source-patch.mjs';

// A failed build says what failed in a line each, without the script's stack.
process.setUncaughtExceptionCaptureCallback((error) => {
  const texts = error?.errors?.length ? error.errors.map((e) => e.text) : [String(error?.message ?? error)];
  process.stderr.write(texts.map((t) => `exine build: ${t}\n`).join(''));
  process.exit(1);
});

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

// The @stdlib functions are 400-odd small modules: compiling them is about half of the 20–30 ms
// that summary's first interval costs. They are read through code-cache.cjs, with V8's code cache
// made here, by the Node that installs exine, after each function has run once.
copyFileSync('scripts/code-cache.cjs', join(outdir, 'code-cache.cjs'));
const codeCache = createRequire(import.meta.url)(resolve(outdir, 'code-cache.cjs'));
{
  const stdlib = codeCache.load('stdlib.cjs');
  const f = stdlib.exports;
  // Each function once, with arguments of the sizes a level gives, so that their code is compiled.
  f['@stdlib/stats-base-dists-beta-quantile'](0.025, 30, 271);
  f['@stdlib/stats-base-dists-beta-quantile'](0.975, 1, 300);
  f['@stdlib/stats-base-dists-chisquare-quantile'](0.95, 24);
  f['@stdlib/math-base-special-gammainc'](40.5, 30, true, true);
  f['@stdlib/math-base-special-gammainc'](1500.5, 1312, true, false);
  f['@stdlib/math-base-special-gammaln'](301);
  stdlib.writeCodeCache();
}

// Each `await import('./x.js')` of a source becomes what decide(path) says: 'static' (an import at
// the top of the file), 'dynamic' (left as it is) or 'elsewhere' (an error: another command's build
// holds it, and bin/exine.cjs never lets the call happen).
function rewriteImports(source, decide) {
  const kept = [];
  const out = source.replace(/\bawait import\('(\.{1,2}\/[^']+)'\)/g, (call, path) => {
    const how = decide(path);
    if (how === 'dynamic') return call;
    if (how === 'elsewhere') return `(() => { throw new Error(${JSON.stringify(`exine: ${path} is in a bundle of its own; bin/exine.cjs chooses it by the command's name`)}); })()`;
    kept.push(`import * as staticModule${kept.length} from '${path}';\n`);
    return `staticModule${kept.length - 1}`;
  });
  return kept.join('') + out;
}

// Within one command's bundle, only the screens, the part that needs Ink and React, stay behind a
// dynamic import (a lazy require in CommonJS); the rest is imported statically.
const screensApart = (path) => (/(^|\/)screens\/run-[\w-]+\.js$/.test(path) ? 'dynamic' : 'static');

// In the bundles, a deferred file and each load('@stdlib/…') read those files through require().
const deferLoads = {
  name: 'defer-loads',
  setup(b) {
    b.onResolve({ filter: /^\.\/[\w-]+\.cjs$/ }, (args) => ({ path: args.path, external: true }));
    b.onLoad({ filter: /\.tsx?$/ }, (args) => {
      const d = deferredFiles.get(args.path);
      if (d) return { contents: d.gets.map((g) => `export const ${g.name} = () => require('./${d.out}')[${JSON.stringify(g.name)}];`).join('\n'), loader: 'ts' };
      const read = readFileSync(args.path, 'utf8');
      const source = rewriteImports(read, screensApart);
      const loader = args.path.endsWith('x') ? 'tsx' : 'ts';
      if (!/\bload\('@stdlib\//.test(source)) return source === read ? undefined : { contents: source, loader };
      const contents = source
        .replace(/^const load = createRequire\(import\.meta\.url\);$/m, '')
        .replace(/\bload\('(@stdlib\/[^']+)'\)/g, "require('./code-cache.cjs').load('stdlib.cjs').exports['$1']");
      return { contents, loader };
    });
  },
};

// One build per command, each of whose entries is main.ts with only that command's import kept:
// a command then loads one file (and a chunk per screen it opens) instead of a dozen chunks that
// one shared build splits its code into, which Node 20's module loader takes one by one (about
// 0.7 ms each). Each build holds one copy of every module it uses, so classes such as ExineError
// stay one class within a process. bin/exine.cjs picks the build from the command's name;
// the build named exine, with no command kept, answers --help and unknown names.
const mainSource = readFileSync('src/cli/main.ts', 'utf8');
const commandModules = new Map([...mainSource.matchAll(/^ {2}([a-z]+): async \(\) => \(await import\('(\.\/commands\/[\w-]+\.js)'\)\)/gm)].map((m) => [m[1], m[2]]));
if (commandModules.size === 0) throw new Error('src/cli/main.ts: no command imports found; scripts/bundle.mjs reads its COMMANDS table');

// main.ts, rewritten for one command: its import made static (so that it is in the entry file),
// the others into the error of rewriteImports.
const keepOnly = (command) => ({
  name: 'keep-only',
  setup(b) {
    b.onLoad({ filter: /[\\/]src[\\/]cli[\\/]main\.ts$/ }, () => ({
      contents: rewriteImports(mainSource, (path) => (path === commandModules.get(command) ? 'static' : 'elsewhere')),
      loader: 'ts',
    }));
  },
});

// Ink builds each frame's styled characters and text widths afresh, which is most of a key's time
// to its frame; patches/ink-6.8.0-frame-caches.patch keeps them from frame to frame (README, "Dependencies, and why").
// The layout engine's loader and Ink's reconciler await at their top level, which CommonJS cannot;
// the other two patches take those awaits out (README, "Dependencies, and why").
const patches = [
  sourcePatch('ink', 'patches/ink-6.8.0-frame-caches.patch'),
  sourcePatch('ink', 'patches/ink-6.8.0-no-top-level-await.patch'),
  sourcePatch('yoga-layout', 'patches/yoga-layout-3.2.1-sync-instantiate.patch'),
];

const program = {
  // fetch: the layout engine's WebAssembly loader asks for it before it sees that its module is
  // inline; reading Node's global fetch loads its HTTP client (undici), tens of milliseconds of a
  // first frame. exine fetches nothing, so in the bundle fetch is undefined.
  define: { 'process.env.NODE_ENV': '"production"', fetch: 'undefined' },
  // Ink loads React's devtools only when DEV=true; they are not installed.
  external: ['react-devtools-core'],
  // CommonJS inside ES modules still calls require(): for Node's own modules and the .cjs files.
  banner: { js: "import { createRequire as __exineCreateRequire } from 'node:module'; const require = __exineCreateRequire(import.meta.url);" },
};

// Every command is CommonJS, read by bin/exine.cjs through code-cache.cjs: Node 20 keeps no code
// cache for ES modules, and compiling the code is a good part of a start (the counting screen's
// first frame: about 200 -> 167 ms). A command's screen stays behind its dynamic import, which
// esbuild turns into a lazy require: `audit --plain` never runs the screen's modules.
// A command without a screen gets its cache here, from one run on a demo level, so that the
// functions a run calls are compiled in it too; a screen command gets it from its first run
// (bin/exine.cjs), as a screen cannot run here without a terminal.
const demoLevel = join('demo-sessions', readdirSync('demo-sessions').filter((f) => f.endsWith('.jsonl')).sort()[0]);
const cacheRuns = { exine: ['--help'], verify: ['verify', demoLevel], summary: ['summary', demoLevel], export: ['export', demoLevel], prefs: ['prefs', '--help'] };
// The thread that checks a long session file's hashes while the scan reads it (src/log/parallel-scan.ts):
// one file beside the commands, where their new URL('./hash-worker.js', import.meta.url) finds it.
await build({ ...common, entryPoints: { 'hash-worker': 'src/log/hash-worker.ts' }, outdir, format: 'esm' });

const metas = {};
for (const command of ['exine', ...commandModules.keys()]) {
  const result = await build({
    ...common,
    entryPoints: { [command]: 'src/cli/main.ts' },
    outdir,
    format: 'cjs',
    outExtension: { '.js': '.cjs' },
    ...program,
    define: { ...program.define, 'import.meta.url': '__exineUrl' },
    banner: { js: "const __exineUrl = require('node:url').pathToFileURL(__filename).href;" },
    plugins: [keepOnly(command), deferLoads, ...patches],
    metafile: true,
  });
  metas[command] = result.metafile;
  const withScreen = Object.keys(result.metafile.inputs).some((f) => /(^|\/)src\/screens\/run-/.test(f));
  if (withScreen) continue;
  const run = spawnSync(process.execPath, ['bin/exine.cjs', ...(cacheRuns[command] ?? [command, '--help'])], { env: { ...process.env, EXINE_WRITE_CODE_CACHE: '1' }, stdio: 'ignore' });
  if (run.error) throw run.error;
}
if (process.env.EXINE_BUNDLE_META) writeFileSync(process.env.EXINE_BUNDLE_META, JSON.stringify(metas));

// The key-to-frame benchmark renders the counting screen in its own process: built here like the
// program, so that it measures the React and the patched Ink that users run.
await build({
  ...common,
  entryPoints: { 'bench-key-frame': 'src/bench/key-frame.tsx' },
  outdir,
  splitting: true,
  format: 'esm',
  chunkNames: 'bench-key-frame-[name]-[hash]',
  ...program,
  plugins: [deferLoads, ...patches],
});
