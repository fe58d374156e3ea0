import { isUtf8 } from 'node:buffer';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { ExineError } from '../errors.js';
import { packageDir } from '../io/package-dir.js';
import type { Keymap } from './keymap.js';
import { parseKeymap } from './parse-keymap.js';

export const BUNDLED_KEYMAP_DIR = join(packageDir(), 'keymaps');
export const DEFAULT_KEYMAP = 'temperate-lowland';

/** A path (from `cwd`), or the name of a bundled keymap ("keypad" finds keymaps/keypad.json). */
export function resolveKeymapPath(nameOrPath: string, cwd = process.cwd()): string {
  const bundled = join(BUNDLED_KEYMAP_DIR, `${nameOrPath}.json`);
  return /^[a-z0-9-]+$/.test(nameOrPath) && existsSync(bundled) ? bundled : resolve(cwd, nameOrPath);
}

export function bundledNames(): string[] {
  return readdirSync(BUNDLED_KEYMAP_DIR)
    .filter((f) => f.endsWith('.json'))
    .map((f) => basename(f, '.json'))
    .sort();
}

export function isBundledKeymap(path: string): boolean {
  return dirname(resolve(path)) === BUNDLED_KEYMAP_DIR;
}

export function loadKeymap(nameOrPath: string, cwd = process.cwd()): { keymap: Keymap; path: string } {
  const path = resolveKeymapPath(nameOrPath, cwd);
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') {
      throw new ExineError(`keymap ${nameOrPath}: no such file (bundled keymaps: ${bundledNames().join(', ')})`);
    }
    throw new ExineError(`keymap ${nameOrPath}: cannot be read (${code ?? String(error)})`);
  }
  const shown = isBundledKeymap(path) ? `keymaps/${basename(path)}` : nameOrPath;
  // Decoding would quietly turn bad bytes into U+FFFD, and a taxon name with them.
  if (!isUtf8(bytes)) throw new ExineError(`keymap ${shown}: line ${firstBadUtf8Line(bytes)} is not valid UTF-8; save the file as UTF-8`);
  const result = parseKeymap(bytes.toString('utf8'), shown);
  if (!result.ok) throw new ExineError(result.message);
  return { keymap: result.keymap, path };
}

/** The 1-based line holding the first byte that is not UTF-8. */
export function firstBadUtf8Line(bytes: Buffer): number {
  let line = 1;
  let start = 0;
  for (let i = 0; i <= bytes.length; i++) {
    if (i === bytes.length || bytes[i] === 10) {
      if (!isUtf8(bytes.subarray(start, i))) return line;
      line++;
      start = i + 1;
    }
  }
  return line;
}
