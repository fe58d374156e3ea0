import { spawnSync } from 'node:child_process';
import { copyFileSync, cpSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HELP, MAIN_HELP } from '../../src/cli/help.js';
import { oneLine, spawnExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const BUNDLE = join(import.meta.dirname, '../../dist/bundle');

// bin/exine.cjs runs one build per command (scripts/bundle.mjs); these run the program users run.
describe('the bundled program, one build per command', () => {
  it('every command answers from its own build: its help, and an error its own code throws, worded as main words it', () => {
    for (const name of Object.keys(HELP)) {
      const help = spawnExine([name, '--help']);
      expect(help.code, name).toBe(0);
      expect(help.stdout, name).toBe(`${HELP[name]}\n`);
    }
    const missing = spawnExine(['verify', 'nowhere.jsonl'], BUNDLE);
    expect(missing.code).not.toBe(0);
    expect(oneLine(missing)).toMatch(/nowhere\.jsonl/);
    expect(missing.stderr).not.toMatch(/\n\s+at /);
  });

  it('no command, --help and a name that is no command are answered by the build without commands', () => {
    expect(spawnExine([])).toMatchObject({ code: 2, stdout: `${MAIN_HELP}\n` });
    expect(spawnExine(['--help'])).toMatchObject({ code: 0, stdout: `${MAIN_HELP}\n` });
    for (const name of ['nosuch', 'exine', 'chunk', '../x', 'Verify']) {
      const run = spawnExine([name]);
      expect(run.code, name).toBe(2);
      expect(oneLine(run), name).toMatch(/unknown command/);
    }
  });

  it('every build that draws a screen holds Ink and the layout engine patched (patches/), with no top-level await left', () => {
    for (const name of ['count', 'demo', 'audit', 'core', 'keys']) {
      const source = readFileSync(join(BUNDLE, `${name}.cjs`), 'utf8');
      expect(source, name).toContain('ink-root');
      // ink-6.8.0-frame-caches.patch, ink-6.8.0-no-top-level-await.patch, yoga-layout-3.2.1-sync-instantiate.patch
      expect(source, name).toMatch(/framesCaches/);
      expect(source, name).toMatch(/React devtools are not part of this build of exine/);
      expect(source, name).toMatch(/new WebAssembly\.Instance\(new WebAssembly\.Module\(wa\(\)\)/);
      expect(source, name).not.toMatch(/await loadYoga\(\)/);
    }
  });

  it("the @stdlib functions and the commands without a screen load through V8's code cache made at install, and give the same numbers when V8 refuses it or it is gone", () => {
    // In a child process, as users run it: a test worker's V8 flags differ, and V8 would refuse the cache.
    const probe = (dir: string) => {
      const script = `const c = require(${JSON.stringify(join(dir, 'code-cache.cjs'))}); const l = c.load('stdlib.cjs'); const f = l.exports;
        console.log(JSON.stringify([l.codeCache, f['@stdlib/stats-base-dists-beta-quantile'](0.025, 5, 96), f['@stdlib/stats-base-dists-chisquare-quantile'](0.95, 24), f['@stdlib/math-base-special-gammaln'](301)]));`;
      const run = spawnSync(process.execPath, ['-e', script], { encoding: 'utf8' });
      expect(run.stderr).toBe('');
      return JSON.parse(run.stdout) as [string, ...number[]];
    };
    const [used, ...numbers] = probe(BUNDLE);
    expect(used).toBe('used');
    // Beta(5, 96) 2.5% quantile, the Clopper–Pearson lower limit of 5 in 100: scipy 1.17.1 beta.ppf(0.025, 5, 96) = 0.016431879182052155.
    expect(numbers[0]).toBeCloseTo(0.016431879182052155, 13);
    const copy = tempDir();
    for (const f of ['stdlib.cjs', 'code-cache.cjs']) copyFileSync(join(BUNDLE, f), join(copy, f));
    expect(probe(copy)).toEqual(['none', ...numbers]);
    writeFileSync(join(copy, 'stdlib.cjs.cache'), Buffer.alloc(4096, 7));
    expect(probe(copy)).toEqual(['refused', ...numbers]);
    for (const name of ['exine', 'verify', 'summary', 'export', 'prefs']) {
      const run = spawnSync(process.execPath, ['-e', `console.log(require(${JSON.stringify(join(BUNDLE, 'code-cache.cjs'))}).load('${name}.cjs').codeCache)`], { encoding: 'utf8' });
      expect(run.stdout.trim(), name).toBe('used');
    }
  });

  it('a command without its cache makes one when a run has done its work, not on --help or a failure; the next start uses it', () => {
    // A copy of the installed program, so that the caches of the real one stay as they are.
    const root = tempDir();
    const ROOT = join(import.meta.dirname, '../..');
    mkdirSync(join(root, 'bin'));
    mkdirSync(join(root, 'dist/bundle'), { recursive: true });
    copyFileSync(join(ROOT, 'bin/exine.cjs'), join(root, 'bin/exine.cjs'));
    copyFileSync(join(ROOT, 'package.json'), join(root, 'package.json'));
    cpSync(join(ROOT, 'keymaps'), join(root, 'keymaps'), { recursive: true });
    for (const f of ['code-cache.cjs', 'keys.cjs', 'verify.cjs', 'stdlib.cjs']) copyFileSync(join(BUNDLE, f), join(root, 'dist/bundle', f));
    const exine = (...args: string[]) => spawnSync(process.execPath, [join(root, 'bin/exine.cjs'), ...args], { encoding: 'utf8', env: { ...process.env, EXINE_WRITE_CODE_CACHE: '' } });
    const cacheOf = (name: string) =>
      spawnSync(process.execPath, ['-e', `console.log(require(${JSON.stringify(join(root, 'dist/bundle/code-cache.cjs'))}).load('${name}.cjs').codeCache)`], { encoding: 'utf8' }).stdout.trim();
    expect(exine('keys', '--help').status).toBe(0);
    expect(exine('verify', join(root, 'nowhere.jsonl')).status).not.toBe(0);
    expect(readdirSync(join(root, 'dist/bundle')).filter((f) => f.endsWith('.cache'))).toEqual([]);
    const run = exine('keys', 'temperate-lowland');
    expect(run.status, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/Quercus/);
    expect(cacheOf('keys')).toBe('used');
    expect(cacheOf('verify')).toBe('none');
  });

  it('verify, summary and export are one CommonJS file each: no chunk to load beside them', () => {
    for (const name of ['verify', 'summary', 'export']) {
      const source = readFileSync(join(BUNDLE, `${name}.cjs`), 'utf8');
      expect(source, name).not.toMatch(/require\(["']\.\/[^"']+\.js["']\)|import\(\s*["']\.\//);
      expect(readdirSync(BUNDLE), name).not.toContain(`${name}.js`);
    }
  });
});
