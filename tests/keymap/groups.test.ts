import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { bindingsOf, inPollenSum, keyLabel, roleOf, withKey, type Keymap } from '../../src/keymap/keymap.js';
import { checkKeymapValue } from '../../src/keymap/parse-keymap.js';
import { levelTable } from '../../src/stats/level-table.js';
import { LONG_COLUMNS, longRows, wideTable } from '../../src/export/level-export.js';
import { levelSummary } from '../../src/export/level-summary.js';
import { levelStats } from '../../src/stats/level-stats.js';
import { evaluateRules } from '../../src/rules/evaluate-rules.js';
import { NO_RULES } from '../../src/rules/rule-set.js';
import { createLevel, readLevel } from '../../src/session/session-files.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { grain, openPayload, sessionText, stateOf } from '../helpers/levels.js';
import type { EventPayload } from '../../src/model/events.js';
import { tempDir } from '../helpers/temp-dir.js';

const ok = (text: string): Keymap => {
  const r = parseKeymap(text, 'my.json');
  if (!r.ok) throw new Error(r.message);
  return r.keymap;
};
const err = (text: string): string => {
  const r = parseKeymap(text, 'my.json');
  if (r.ok) throw new Error('expected an error');
  return r.message;
};

// Written as text: a JS object would put the digit keys first.
const UPLAND = `{
  "name": "Upland bog",
  "groups": { "dwarf shrubs": "sum", "NPP": "outside", "reworked": "outside", "exotic": "marker", "broken": "indeterminable" },
  "keys": {
    "9": { "taxon": "Betula", "group": "trees" },
    "c": { "taxon": "Calluna", "group": "dwarf shrubs" },
    "1": { "taxon": "Cyperaceae", "group": "herbs", "inSum": false },
    "o": { "taxon": "Poaceae", "group": "herbs" },
    "h": { "taxon": "HdV-18", "group": "NPP" },
    "r": { "taxon": "Pre-Quaternary spores", "group": "reworked" },
    "e": { "taxon": "Eucalyptus (exotic)", "group": "exotic" },
    "x": { "taxon": "Broken grain", "group": "broken" }
  }
}`;

describe('groups of the keymap\'s own, with roles', () => {
  it('places each of its own groups after the built-in group of its role, in the file\'s order', () => {
    const k = ok(UPLAND);
    expect(k.groups.map((g) => `${g.name}:${g.role}`)).toEqual([
      'trees:sum', 'shrubs:sum', 'herbs:sum', 'dwarf shrubs:sum', 'spores:outside', 'aquatics:outside', 'NPP:outside', 'reworked:outside',
      'markers:marker', 'exotic:marker', 'indeterminable:indeterminable', 'broken:indeterminable', 'other:outside',
    ]);
    expect(k.sum).toEqual(['trees', 'shrubs', 'herbs', 'dwarf shrubs']);
  });

  it('keeps the keys in the file\'s order, digits included', () => {
    const k = ok(UPLAND);
    expect(k.order).toEqual(['9', 'c', '1', 'o', 'h', 'r', 'e', 'x']);
    expect(Object.keys(k.keys)).not.toEqual(k.order); // what a JS object alone would have given
    expect(bindingsOf(k).map(([key]) => key)).toEqual(k.order);
  });

  it('fold, table, rules, summary and export follow the roles, not the names', () => {
    const k = ok(UPLAND);
    // 10 Betula, 5 Calluna, 5 Poaceae in the sum (20); 5 Cyperaceae out of it; 4 HdV-18, 2 exotic, 3 broken.
    const events = [
      ...Array.from({ length: 10 }, () => grain('Betula')),
      ...Array.from({ length: 5 }, () => grain('Calluna')),
      ...Array.from({ length: 5 }, () => grain('Poaceae')),
      ...Array.from({ length: 5 }, () => grain('Cyperaceae')),
      ...Array.from({ length: 4 }, () => grain('HdV-18')),
      ...Array.from({ length: 2 }, () => grain('Eucalyptus (exotic)')),
      ...Array.from({ length: 3 }, () => grain('Broken grain')),
    ];
    const open = openPayload(k, { spike: { tablets: 1, perTablet: 1000, perTabletSd: null, volume: 1, mass: null, accumulationRate: null } });
    const state = stateOf(open, events);
    const t = levelTable(state);
    expect(t.pollenSum).toBe(20);
    expect(t.markers).toBe(2);
    const by = Object.fromEntries(t.rows.map((r) => [r.taxon, r]));
    expect(by.Calluna).toMatchObject({ inSum: true, basis: 20, percent: 25 });
    // Taken out of the sum on its own: a percent of the sum plus itself.
    expect(by.Cyperaceae).toMatchObject({ inSum: false, basis: 25, percent: 20 });
    // A group outside the sum: of sum + group.
    expect(by['HdV-18']).toMatchObject({ inSum: false, basis: 24 });
    expect(t.rows.map((r) => r.taxon)).toEqual(['Betula', 'Cyperaceae', 'Poaceae', 'Calluna', 'HdV-18', 'Pre-Quaternary spores', 'Eucalyptus (exotic)', 'Broken grain']);
    const stats = levelStats(state);
    expect(stats.markers).toBe(2);
    expect(stats.concentration?.value).toBeCloseTo((20 / 2) * 1000, 6);
    const rules = evaluateRules({ ...NO_RULES, markers: 2 }, stats, state.spike);
    expect(rules.rules.find((s) => s.rule === 'markers')?.met).toBe(true);
    const summary = levelSummary(state);
    expect(summary.groupOrder.slice(0, 4)).toEqual(['trees', 'shrubs', 'herbs', 'dwarf shrubs']);
    expect(summary.groupRoles.exotic).toBe('marker');
    const long = longRows([{ state, source: 'x.jsonl' }]);
    const calluna = long.find((r) => r[5] === 'Calluna');
    expect(calluna?.slice(6, 8)).toEqual(['dwarf shrubs', 'yes']);
    // The marker row has no concentration of its own; the others do.
    expect(long.find((r) => r[5] === 'Eucalyptus (exotic)')?.[LONG_COLUMNS.indexOf('concentration')]).toBeNull();
    expect(long.find((r) => r[5] === 'Calluna')?.[LONG_COLUMNS.indexOf('concentration')]).toBe(2500);
    const wide = wideTable([{ state, source: 'x.jsonl' }]);
    expect(wide.columns.slice(wide.columns.indexOf('influx') + 1)).toEqual(['Betula', 'Cyperaceae', 'Poaceae', 'Calluna', 'HdV-18', 'Pre-Quaternary spores', 'Eucalyptus (exotic)', 'Broken grain']);
  });

  it('a level keeps its copy: groups, roles and key order read back from line 1', () => {
    const dir = tempDir();
    const path = join(dir, 'l.jsonl');
    const k = ok(UPLAND);
    const { writer } = createLevel(path, { info: { level: 'x', depth: null, site: null, core: null, slide: null, analyst: null }, keymap: k, rules: DEFAULT_RULES, spike: null });
    writer.close();
    const back = readLevel(path).state.keymap;
    expect(back.order).toEqual(k.order);
    expect(back.groups).toEqual(k.groups);
    expect(back.keys['1']).toEqual({ taxon: 'Cyperaceae', group: 'herbs', inSum: false });
    expect(readFileSync(path, 'utf8')).toMatch(/"format":3/);
  });

  it('a format-2 copy (no groups, no order) reads with the built-in roles and its "sum"', () => {
    const copy = { name: 'old', keys: { q: { taxon: 'Quercus', group: 'trees' }, s: { taxon: 'Sphagnum', group: 'spores' } }, actions: { undo: 'backspace', traverse: 'tab', note: 'enter', help: '?', newType: '=' }, sum: ['trees', 'spores'] };
    const r = checkKeymapValue(copy, 'recorded in line 1');
    if (!r.ok) throw new Error(r.message);
    expect(roleOf(r.keymap, 'spores')).toBe('sum');
    expect(roleOf(r.keymap, 'shrubs')).toBe('outside');
    expect(roleOf(r.keymap, 'markers')).toBe('marker');
    expect(r.keymap.order).toEqual(['q', 's']);
  });

  it('a level counted with the earlier keypad keymap keeps its own keys (its copy), whatever the bundled file says now', () => {
    const earlier = {
      name: 'Upland one-hand keypad',
      keys: { '0': { taxon: 'Lycopodium (exotic marker)', group: 'markers' }, '7': { taxon: 'Pinus', group: 'trees' }, '.': { taxon: 'Indeterminable', group: 'indeterminable' } },
      actions: { undo: '-', traverse: '+', note: 'enter', help: '?', newType: '=' },
      sum: ['trees', 'shrubs', 'herbs'],
    };
    const dir = tempDir();
    const path = join(dir, 'old.jsonl');
    writeFileSync(path, sessionText([{ ...openPayload(), format: 2, keymap: earlier } as unknown as EventPayload, grain('Pinus')]));
    const { state } = readLevel(path);
    expect(state.keymap.actions).toMatchObject({ undo: '-', traverse: '+', note: 'enter' });
    expect(state.keymap.keys['0']?.taxon).toBe('Lycopodium (exotic marker)');
    expect(state.counts.Pinus).toBe(1);
  });

  it('refuses markers or indeterminables inside the sum, and says why', () => {
    expect(err('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"}},"sum":["trees","markers"]}')).toBe(
      'keymap my.json: "markers" are exotic marker grains and cannot be in the pollen sum; take "markers" out of "sum"',
    );
    expect(err('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"}},"groups":{"indeterminable":"sum"}}')).toMatch(/"indeterminable" are indeterminable grains and cannot be in the pollen sum/);
    expect(err('{"name":"x","groups":{"exotic":"marker"},"keys":{"q":{"taxon":"Quercus","group":"trees"}},"sum":["trees","exotic"]}')).toMatch(/"sum" lists group "exotic", which holds exotic markers \(role marker\)/);
  });

  it('names a wrong role with the nearest one, and a group used but not defined', () => {
    expect(err('{"name":"x","groups":{"algae":"outsde"},"keys":{"q":{"taxon":"Quercus","group":"trees"}}}')).toBe(
      'keymap my.json: group "algae" has role "outsde" (expected one of sum, outside, marker, indeterminable); did you mean "outside"?',
    );
    expect(err('{"name":"x","groups":{"algae":"outside"},"keys":{"p":{"taxon":"Pediastrum","group":"algea"}}}')).toMatch(/key "p" has unknown group "algea" .*did you mean "algae"\?/);
    expect(err('{"name":"x","groups":{"a,b":"outside"},"keys":{"q":{"taxon":"Quercus","group":"trees"}}}')).toMatch(/group "a,b" has a comma/);
  });

  it('"inSum" may only take a taxon out of the sum', () => {
    expect(err('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees","inSum":true}}}')).toMatch(/keys\.q\.inSum/);
  });
});

describe('strict checks', () => {
  it('an unknown top-level field is an error naming the field, its line and the nearest known name', () => {
    expect(err('{\n  "name": "x",\n  "keys": {"q":{"taxon":"Quercus","group":"trees"}},\n  "sums": ["trees"]\n}')).toBe(
      'keymap my.json: line 4: unknown field "sums"; did you mean "sum"? (a keymap has name, keys, actions, sum, groups)',
    );
    expect(err('{"name": "x",\n"action": {"undo": "-"},\n"keys": {"q":{"taxon":"Quercus","group":"trees"}}}')).toMatch(/^keymap my\.json: line 2: unknown field "action"; did you mean "actions"\?/);
    expect(err('{"name": "x", "colour": 1, "keys": {"q":{"taxon":"Quercus","group":"trees"}}}')).toBe(
      'keymap my.json: line 1: unknown field "colour" (a keymap has name, keys, actions, sum, groups)',
    );
  });

  it('an unknown field on a key is named with its line', () => {
    expect(err('{"name": "x", "keys": {\n"q": {"taxon":"Quercus","grup":"trees"}}}')).toBe(
      'keymap my.json: line 2: key "q" has unknown field "grup"; did you mean "group"? (a key has taxon, group, inSum)',
    );
  });

  it('a space key is drawn and listed as "Space"', () => {
    const k = ok('{"name":"x","keys":{" ":{"taxon":"Pinus","group":"trees"},"q":{"taxon":"Quercus","group":"trees"}}}');
    expect(keyLabel(k.order[0] ?? null)).toBe('Space');
    expect([keyLabel('\u2002'), keyLabel('\u00a0'), keyLabel('q')]).toEqual(['U+2002', 'NBSP', 'q']);
  });
});

describe('groups written as a list', () => {
  it('a person writes "groups" as name → role; the list form is only a session copy\'s', () => {
    expect(err('{"name":"x","groups":[{"name":"NPP","role":"outside"}],"keys":{"q":{"taxon":"Quercus","group":"trees"}}}')).toMatch(/"groups" must be an object of group name → role/);
  });
});

describe('a type added while counting, into a group of the keymap\'s own', () => {
  it('is planned, recorded, folded and tabled with its group\'s role', async () => {
    const { planBurst } = await import('../../src/session/plan-burst.js');
    const { foldEvents, applyEvents } = await import('../../src/model/fold.js');
    const { splitRaw } = await import('../../src/input/key-press.js');
    const k = ok(UPLAND);
    const open = { ...openPayload(k), seq: 1, at: '2026-11-02T09:00:00.000Z' } as unknown as import('../../src/model/events.js').OpenEvent;
    const start = foldEvents(open, k, []);
    const p = planBurst(start, null, splitRaw('=Pediastrum, NP\r99'));
    expect(p.payloads.slice(0, 2)).toEqual([
      { type: 'taxon', taxon: 'Pediastrum', group: 'NPP', key: 'A' },
      { type: 'grain', taxon: 'Pediastrum', traverse: 1, key: 'A' },
    ]);
    const events = p.payloads.map((e, i) => ({ ...e, seq: i + 2, at: '2026-11-02T09:00:01.000Z' })) as unknown as import('../../src/model/events.js').SessionEvent[];
    const state = applyEvents(start, events);
    expect(state.keymap.order.at(-1)).toBe('A');
    const t = levelTable(state);
    expect(t.pollenSum).toBe(2);
    expect(t.rows.find((r) => r.taxon === 'Pediastrum')).toMatchObject({ group: 'NPP', inSum: false, count: 1, basis: 3 });
  });
});

describe('a session file with a type of a group of the keymap\'s own', () => {
  it('reads back: the taxon line, its group and role', () => {
    const k = ok(UPLAND);
    const dir = tempDir();
    const path = join(dir, 'l.jsonl');
    writeFileSync(path, sessionText([openPayload(k), { type: 'taxon', taxon: 'Pediastrum', group: 'NPP', key: 'A' }, grain('Pediastrum'), grain('Betula')]));
    const { state } = readLevel(path);
    expect(state.keymap.keys.A).toEqual({ taxon: 'Pediastrum', group: 'NPP' });
    expect(levelTable(state).rows.find((r) => r.taxon === 'Pediastrum')).toMatchObject({ inSum: false, basis: 2 });
  });
});

describe('whether a taxon counts in the pollen sum (inPollenSum, remembered per keymap)', () => {
  it('reads the binding, its group\'s role and "other" for a taxon the keymap does not list; a new keymap asks afresh', () => {
    const km = ok(`{
      "name": "t",
      "groups": { "other": "sum", "exotic": "marker" },
      "keys": {
        "b": { "taxon": "Betula", "group": "trees" },
        "c": { "taxon": "Cyperaceae", "group": "herbs", "inSum": false },
        "l": { "taxon": "Lycopodium", "group": "exotic" }
      }
    }`);
    // Asked twice each: the second answer comes from what was remembered.
    for (let round = 0; round < 2; round++) {
      expect(inPollenSum(km, 'Betula')).toBe(true);
      expect(inPollenSum(km, 'Cyperaceae')).toBe(false);
      expect(inPollenSum(km, 'Lycopodium')).toBe(false);
      expect(inPollenSum(km, 'Unlisted type')).toBe(true);
    }
    const outside = ok(`{ "name": "u", "groups": { "other": "outside" }, "keys": { "b": { "taxon": "Betula", "group": "trees" } } }`);
    expect(inPollenSum(outside, 'Unlisted type')).toBe(false);
    expect(inPollenSum(km, 'Unlisted type')).toBe(true);
    // A type added while counting makes a new keymap, with verdicts of its own.
    const added = withKey(km, 'x', { taxon: 'Unlisted type', group: 'exotic' });
    expect(inPollenSum(added, 'Unlisted type')).toBe(false);
    expect(inPollenSum(km, 'Unlisted type')).toBe(true);
  });
});
