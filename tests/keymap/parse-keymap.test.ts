import { describe, expect, it } from 'vitest';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { loadKeymap } from '../../src/keymap/load-keymap.js';

const ok = (text: string) => {
  const r = parseKeymap(text, 'my.json');
  if (!r.ok) throw new Error(r.message);
  return r.keymap;
};
const err = (text: string) => {
  const r = parseKeymap(text, 'my.json');
  if (r.ok) throw new Error('expected an error');
  return r.message;
};

describe('keymap files', () => {
  it('loads both bundled keymaps, with default actions and sum filled in', () => {
    const lowland = loadKeymap('temperate-lowland').keymap;
    expect(Object.keys(lowland.keys).length).toBeGreaterThan(20);
    expect(lowland.sum).toEqual(['trees', 'shrubs', 'herbs']);
    const keypad = loadKeymap('keypad').keymap;
    expect(Object.keys(keypad.keys).every((k) => '0123456789.+-*/'.includes(k))).toBe(true);
    expect(keypad.actions).toEqual({ undo: '0', traverse: 'enter', note: '.', help: '?', newType: '=', cf: "'" });
    // The file's order, home row first, whatever a JS object does with digit keys.
    expect(keypad.order.slice(0, 3)).toEqual(['4', '5', '6']);
  });

  it('defaults the actions to Backspace, Tab, Enter, ? (help) and = (new type)', () => {
    const keymap = ok('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"}}}');
    expect(keymap.actions).toEqual({ undo: 'backspace', traverse: 'tab', note: 'enter', help: '?', newType: '=', cf: "'" });
  });

  it('a keymap written with a taxon on ? or = keeps it; that action then has no key unless given one', () => {
    const keymap = ok('{"name":"x","keys":{"?":{"taxon":"Unknown","group":"other"},"=":{"taxon":"Ilex","group":"shrubs"}}}');
    expect([keymap.actions.help, keymap.actions.newType]).toEqual([null, null]);
    expect(ok('{"name":"x","keys":{"?":{"taxon":"Unknown","group":"other"}},"actions":{"help":"h"}}').actions.help).toBe('h');
    expect(parseKeymap('{"name":"x","keys":{"?":{"taxon":"Unknown","group":"other"}},"actions":{"help":"?"}}', 'k.json')).toMatchObject({ ok: false, message: expect.stringMatching(/key "\?" is bound to both taxon "Unknown" and action "help"/) });
  });

  it('keys are case-sensitive', () => {
    const keymap = ok('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"},"Q":{"taxon":"Quercus robur-type","group":"trees"}}}');
    expect(Object.keys(keymap.keys)).toEqual(['q', 'Q']);
  });

  it('names the line of malformed JSON', () => {
    expect(err('{\n "name": "x",\n "keys": {\n   "q": { "taxon": "Quercus" "group": "trees" }\n }\n}')).toMatch(
      /^keymap my\.json: line 4: expected ","/,
    );
  });

  it('finds a key written twice, which JSON.parse would silently merge', () => {
    const text = '{\n "name": "x",\n "keys": {\n  "q": {"taxon":"Quercus","group":"trees"},\n  "b": {"taxon":"Betula","group":"trees"},\n  "q": {"taxon":"Pinus","group":"trees"}\n }\n}';
    expect(err(text)).toBe('keymap my.json: key "q" is bound twice (lines 4 and 6); keep one');
  });

  it('names the key with an unknown group and lists the groups', () => {
    expect(err('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"treez"}}}')).toBe(
      'keymap my.json: key "q" has unknown group "treez" (expected one of trees, shrubs, herbs, spores, aquatics, markers, indeterminable, other); did you mean "trees"?; a group of your own goes in "groups" with its role',
    );
  });

  it('refuses a key bound to both a taxon and an action', () => {
    expect(err('{"name":"x","keys":{"u":{"taxon":"Ulmus","group":"trees"}},"actions":{"undo":"u"}}')).toBe(
      'keymap my.json: key "u" is bound to both taxon "Ulmus" and action "undo"; pick one',
    );
  });

  it('refuses two actions on one key, multi-character keys, control keys and a missing field', () => {
    expect(err('{"name":"x","keys":{"q":{"taxon":"Q","group":"trees"}},"actions":{"undo":"tab"}}')).toMatch(/both actions "undo" and "traverse"/);
    expect(err('{"name":"x","keys":{"qu":{"taxon":"Q","group":"trees"}}}')).toMatch(/key "qu" must be a single character a person can see on the keyboard/);
    expect(err('{"name":"x","keys":{"\\t":{"taxon":"Q","group":"trees"}}}')).toMatch(/key "\\u\{9\}" must be a single character a person can see/);
    expect(err('{"name":"x","keys":{"q":{"group":"trees"}}}')).toMatch(/"keys\.q\.taxon" is missing/);
    expect(err('{"keys":{"q":{"taxon":"Q","group":"trees"}}}')).toMatch(/"name" is missing/);
  });

  it('refuses one taxon on two keys and an unknown sum group', () => {
    expect(err('{"name":"x","keys":{"q":{"taxon":"Quercus","group":"trees"},"w":{"taxon":"Quercus","group":"trees"}}}')).toMatch(
      /taxon "Quercus" is on two keys, "q" and "w"/,
    );
    expect(err('{"name":"x","keys":{"q":{"taxon":"Q","group":"trees"}},"sum":["trees","herb"]}')).toMatch(/"sum" lists unknown group "herb"/);
  });

  it('reads a file saved with a byte-order mark and CRLF line ends', () => {
    expect(ok('\uFEFF{\r\n"name":"x",\r\n"keys":{"q":{"taxon":"Quercus","group":"trees"}}\r\n}\r\n').keys.q?.taxon).toBe('Quercus');
  });

  it('takes the pollen sum groups from "sum"', () => {
    expect(ok('{"name":"x","keys":{"q":{"taxon":"Q","group":"trees"}},"sum":["trees"]}').sum).toEqual(['trees']);
  });
});
