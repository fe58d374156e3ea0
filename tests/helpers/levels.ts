import { join } from 'node:path';
import { loadKeymap } from '../../src/keymap/load-keymap.js';
import type { Keymap } from '../../src/keymap/keymap.js';
import { encodeLine } from '../../src/log/line-codec.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { FORMAT_VERSION, type EventPayload, type OpenPayload } from '../../src/session/events.js';
import { createLevel } from '../../src/session/session-files.js';

export const lowland = (): Keymap => loadKeymap('temperate-lowland').keymap;

export const TINY_KEYMAP: Keymap = {
  name: 'tiny',
  keys: {
    a: { taxon: 'Alnus', group: 'trees' },
    b: { taxon: 'Betula', group: 'trees' },
    c: { taxon: 'Corylus', group: 'shrubs' },
    o: { taxon: 'Poaceae', group: 'herbs' },
    s: { taxon: 'Sphagnum', group: 'spores' },
    l: { taxon: 'Lycopodium', group: 'markers' },
  },
  actions: { undo: 'backspace', traverse: 'tab', note: 'enter' },
  sum: ['trees', 'shrubs', 'herbs'],
};

export function openPayload(keymap: Keymap = TINY_KEYMAP, overrides: Partial<OpenPayload> = {}): OpenPayload {
  return {
    type: 'open',
    format: FORMAT_VERSION,
    session: '0123456789abcdef0123456789abcdef',
    level: 'T-1',
    depth: 10,
    site: 'Test Mere',
    core: 'TM-1',
    slide: 'TM1-010-A',
    analyst: null,
    keymap,
    rules: DEFAULT_RULES,
    ...overrides,
  };
}

/** Session lines as exine writes them, with a fixed clock; `open` first. */
export function sessionText(payloads: readonly EventPayload[], start = Date.parse('2026-11-02T09:00:00.000Z'), stepMs = 1000): string {
  let prev = '';
  return payloads
    .map((p, i) => {
      const { line, hash } = encodeLine(p, { seq: i + 1, at: new Date(start + i * stepMs).toISOString() }, prev);
      prev = hash;
      return `${line}\n`;
    })
    .join('');
}

export const grain = (taxon: string, traverse = 1, key = taxon[0]?.toLowerCase() ?? 'x'): EventPayload => ({ type: 'grain', taxon, traverse, key });

/** A new level file made by the real writer, in `dir`. */
export function newLevelFile(dir: string, name = 'level.jsonl', keymap: Keymap = TINY_KEYMAP) {
  const path = join(dir, name);
  const opened = createLevel(path, {
    info: { level: 'T-1', depth: 10, site: 'Test Mere', core: 'TM-1', slide: 'A', analyst: null },
    keymap,
    rules: DEFAULT_RULES,
  });
  return { path, ...opened };
}
