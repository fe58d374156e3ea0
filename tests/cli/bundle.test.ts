import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HELP, MAIN_HELP } from '../../src/cli/help.js';
import { oneLine, spawnExine } from '../helpers/run-exine.js';

const BUNDLE = join(import.meta.dirname, '../../dist/bundle');

// bin/exine.js runs one build per command (scripts/bundle.mjs); these run the program users run.
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

  it('every build that draws a screen holds Ink with its frame caches patched in (patches/ink-6.8.0-frame-caches.patch)', () => {
    const files = readdirSync(BUNDLE).filter((f) => f.endsWith('.js'));
    for (const name of ['count', 'demo', 'audit', 'core', 'keys']) {
      const own = files.filter((f) => f === `${name}.js` || f.startsWith(`${name}-`));
      const withInk = own.filter((f) => readFileSync(join(BUNDLE, f), 'utf8').includes('ink-root'));
      expect(withInk.length, name).toBeGreaterThan(0);
      for (const f of withInk) expect(readFileSync(join(BUNDLE, f), 'utf8'), f).toMatch(/framesCaches/);
    }
  });

  it('verify, summary and export are one file each: no chunk to load beside them', () => {
    for (const name of ['verify', 'summary', 'export']) {
      const source = readFileSync(join(BUNDLE, `${name}.js`), 'utf8');
      expect(source, name).not.toMatch(/from\s*["']\.\/[^"']+\.js["']|import\(\s*["']\.\//);
    }
  });
});
