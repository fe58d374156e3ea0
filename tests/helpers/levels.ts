import { join } from 'node:path';
import { loadKeymap } from '../../src/keymap/load-keymap.js';
import { DEFAULT_ACTIONS, DEFAULT_GROUPS, type Keymap } from '../../src/keymap/keymap.js';
import { encodeLine } from '../../src/log/line-codec.js';
import { DEFAULT_RULES, type RuleSet } from '../../src/rules/rule-set.js';
import type { Spike } from '../../src/stats/concentration.js';
import { FORMAT_VERSION, type EventPayload, type OpenEvent, type OpenPayload, type SessionEvent } from '../../src/model/events.js';
import { foldEvents } from '../../src/model/fold.js';
import type { LevelState } from '../../src/model/level-state.js';
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
  order: ['a', 'b', 'c', 'o', 's', 'l'],
  actions: { ...DEFAULT_ACTIONS },
  groups: DEFAULT_GROUPS,
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
    spike: null,
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
export function newLevelFile(dir: string, name = 'level.jsonl', keymap: Keymap = TINY_KEYMAP, rules: RuleSet = DEFAULT_RULES, spike: Spike | null = null) {
  const path = join(dir, name);
  const opened = createLevel(path, {
    info: { level: 'T-1', depth: 10, site: 'Test Mere', core: 'TM-1', slide: 'A', analyst: null },
    keymap,
    rules,
    spike,
  });
  return { path, ...opened };
}

/** A keymap of `n` taxa in the pollen sum (T01, T02 …) plus a marker, for reference data sets. */
export function keymapOf(n: number): Keymap {
  const chars = [...'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789'];
  const keys: Record<string, { taxon: string; group: 'trees' | 'markers' }> = {};
  for (let i = 0; i < n; i++) keys[chars[i] as string] = { taxon: `T${String(i + 1).padStart(2, '0')}`, group: 'trees' };
  keys['.'] = { taxon: 'Marker', group: 'markers' };
  return { name: `reference-${n}`, keys, order: Object.keys(keys), actions: { ...DEFAULT_ACTIONS }, groups: DEFAULT_GROUPS, sum: ['trees', 'shrubs', 'herbs'] };
}

/** Grain events for counts laid out per taxon (T01 gets counts[0] …), then `markers` marker grains. */
export function grainsFor(counts: readonly number[], markers = 0): EventPayload[] {
  const out: EventPayload[] = [];
  counts.forEach((c, i) => {
    for (let k = 0; k < c; k++) out.push(grain(`T${String(i + 1).padStart(2, '0')}`));
  });
  for (let k = 0; k < markers; k++) out.push(grain('Marker', 1, '.'));
  return out;
}

/** The folded state of an open event plus payloads, with made-up stamps. */
export function stateOf(open: OpenPayload, payloads: readonly EventPayload[]): LevelState {
  const at = (i: number) => new Date(Date.UTC(2026, 10, 2, 9, 0, 0, i)).toISOString();
  const events = payloads.map((p, i) => ({ ...p, seq: i + 2, at: at(i + 1) }) as SessionEvent);
  return foldEvents({ ...open, seq: 1, at: at(0) } as OpenEvent, open.keymap, events);
}

/** Session lines with a time of its own for each event: [payload, ms after the start]. */
export function timedSessionText(entries: readonly (readonly [EventPayload, number])[], start = Date.parse('2026-11-02T09:00:00.000Z')): string {
  let prev = '';
  return entries
    .map(([p, ms], i) => {
      const { line, hash } = encodeLine(p, { seq: i + 1, at: new Date(start + ms).toISOString() }, prev);
      prev = hash;
      return `${line}\n`;
    })
    .join('');
}
