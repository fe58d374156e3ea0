import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * The folders of src/ from the bottom up. A file may import from its own folder
 * and from folders on a lower layer, never from one above or beside it, so the
 * pure core can be read, tested and changed without the layers that use it.
 */
const LAYERS: readonly (readonly string[])[] = [
  ['errors'],
  ['text', 'validation', 'io'],
  ['input'],
  ['keymap', 'prefs'],
  ['stats'],
  ['rules'],
  ['model'],
  ['log'],
  ['session'],
  ['core'],
  ['audit', 'export'],
  ['screens'],
  ['demo'],
  ['cli'],
  // The benchmark runs the program's own commands in-process beside their baselines.
  ['bench'],
];

const SRC = path.resolve(import.meta.dirname, '../../src');
const rank = new Map(LAYERS.flatMap((names, i) => names.map((n) => [n, i] as const)));

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? sourceFiles(p) : /\.tsx?$/.test(e.name) ? [p] : [];
  });
}

const unitOf = (file: string) => (path.relative(SRC, file).split(path.sep)[0] as string).replace(/\.(js|tsx?)$/, '');

function importsOf(file: string): string[] {
  const text = fs.readFileSync(file, 'utf8');
  const specs = [...text.matchAll(/(?:from\s+|import\s*\(\s*|import\s+)['"](\.{1,2}\/[^'"]+)['"]/g)].map((m) => m[1] as string);
  return specs.map((s) => path.resolve(path.dirname(file), s));
}

/** Every import that points up or sideways, as "from → to". */
export function wrongWayImports(): string[] {
  const wrong: string[] = [];
  for (const file of sourceFiles(SRC)) {
    const from = unitOf(file);
    for (const target of importsOf(file)) {
      const to = unitOf(target);
      if (to === from) continue;
      const a = rank.get(from);
      const b = rank.get(to);
      if (a === undefined || b === undefined || b >= a) wrong.push(`${path.relative(SRC, file)} → ${path.relative(SRC, target)}`);
    }
  }
  return wrong;
}

describe('the layers of src/', () => {
  it('names every folder of src/ in one layer', () => {
    const units = fs.readdirSync(SRC).map((u) => u.replace(/\.tsx?$/, ''));
    expect(units.filter((u) => !rank.has(u))).toEqual([]);
  });

  it('has no import that runs up or sideways', () => {
    expect(wrongWayImports()).toEqual([]);
  });

  it('finds an import that runs up (the check itself can fail)', () => {
    const probe = path.join(SRC, 'stats', '__probe.ts');
    fs.writeFileSync(probe, "import type { LevelState } from '../model/level-state.js';\n");
    try {
      expect(wrongWayImports()).toContain('stats/__probe.ts → model/level-state.js');
    } finally {
      fs.rmSync(probe);
    }
  });

  it('keeps Ink and React out of the pure core', () => {
    const pure = ['text', 'input', 'keymap', 'stats', 'rules', 'model', 'core', 'export', 'audit'];
    const offenders = sourceFiles(SRC)
      .filter((f) => pure.includes(unitOf(f)) && !f.endsWith('read-audit.ts'))
      .filter((f) => /from ['"](ink|react)['"]/.test(fs.readFileSync(f, 'utf8')));
    expect(offenders.map((f) => path.relative(SRC, f))).toEqual([]);
  });
});
