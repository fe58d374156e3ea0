import fc from 'fast-check';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { assignKeys } from '../../src/keymap/assign-keys.js';
import { keymapFromList } from '../../src/keymap/keymap-from-list.js';
import { parseTaxonList } from '../../src/keymap/list-file.js';
import { DEFAULT_ACTIONS } from '../../src/keymap/keymap.js';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const ACTION_KEYS = new Set(Object.values(DEFAULT_ACTIONS).filter((k) => k.length === 1));
const keysOf = (taxa: string[]) => {
  const r = assignKeys(taxa, ACTION_KEYS);
  if (!r.ok) throw new Error(r.message);
  return r.assigned.map((a) => `${a.taxon}=${a.key} (${a.why})`);
};

/** A list made into a keymap and read back as a person's keymap file. */
function keymapOfList(text: string, name: string, out: string) {
  const list = parseTaxonList(text, 'l.txt');
  if (!list.ok) throw new Error(list.message);
  const r = keymapFromList(list.entries, name, out);
  if (!r.ok) throw new Error(r.message);
  const k = parseKeymap(r.text, out);
  if (!k.ok) throw new Error(k.message);
  return { r, k };
}

describe('the from-list key rule', () => {
  // Each case: the list in order, and the keys and reasons the README's rule gives by hand.
  it.each([
    [['Quercus'], ['Quercus=q (initial)']],
    [['Pinus', 'Poaceae'], ['Pinus=p (initial)', "Poaceae=o (second letter (p is Pinus's))"]],
    [['Pinus', 'Poaceae', 'Picea'], ['Pinus=p (initial)', "Poaceae=o (second letter (p is Pinus's))", "Picea=i (second letter (p is Pinus's))"]],
    [['Pinus', 'Picea', 'Pistacia'], ['Pinus=p (initial)', "Picea=i (second letter (p is Pinus's))", "Pistacia=q (next free key after p (p is Pinus's, i is Picea's))"]],
    // Going round the alphabet after z.
    [['Zea', 'Zelkova', 'Ziziphus'], ['Zea=z (initial)', "Zelkova=e (second letter (z is Zea's))", "Ziziphus=i (second letter (z is Zea's))"]],
    [['Zea', 'Zelkova', 'Zz'], ['Zea=z (initial)', "Zelkova=e (second letter (z is Zea's))", "Zz=a (next free key after z (z is Zea's, z is Zea's))"]],
    // Accents and ligatures dropped for the key; digits and signs skipped.
    [['Æsculus', 'Ölandia'], ['Æsculus=a (initial)', 'Ölandia=o (initial)']],
    [['2-ring NPP'], ['2-ring NPP=r (initial)']],
    [['???'], ['???=a (next free key (no letter in the name))']],
  ])('%j', (taxa, expected) => {
    expect(keysOf(taxa)).toEqual(expected);
  });

  it('after the 26 letters come the digits, then signs, then capitals', () => {
    const taxa = Array.from({ length: 40 }, (_, i) => `Aa${i}`);
    const keys = (assignKeys(taxa, ACTION_KEYS) as { ok: true; assigned: { key: string }[] }).assigned.map((a) => a.key);
    expect(keys.join('')).toBe("abcdefghijklmnopqrstuvwxyz1234567890;,./");
  });

  it('property: every taxon gets exactly one key, no key twice, action keys never taken (fast-check)', () => {
    const name = fc.stringMatching(/^[A-Za-zÄÖÜäöüé .()-]{1,12}$/);
    fc.assert(
      fc.property(fc.uniqueArray(name, { minLength: 1, maxLength: 70, selector: (s) => s }), (taxa) => {
        const r = assignKeys(taxa, ACTION_KEYS);
        if (!r.ok) return taxa.length > 26 + 10 + 8 + 26;
        const keys = r.assigned.map((a) => a.key);
        return r.assigned.length === taxa.length && r.assigned.every((a, i) => a.taxon === taxa[i]) && new Set(keys).size === keys.length && keys.every((k) => !ACTION_KEYS.has(k));
      }),
    );
  });
});

describe('taxon lists', () => {
  it('reads "taxon, group" lines and a CSV with taxon and group columns in any order', () => {
    expect(parseTaxonList('Quercus, trees\n# a comment\n\nSphagnum,spores\n', 'l.txt')).toMatchObject({ ok: true, entries: [{ taxon: 'Quercus', group: 'trees', line: 1 }, { taxon: 'Sphagnum', group: 'spores', line: 4 }] });
    const csv = 'code,group,taxon,role\r\n1,NPP,"HdV-18, Gelasinospora",outside\r\n2,trees,Betula,\r\n';
    expect(parseTaxonList(csv, 'l.csv')).toMatchObject({ ok: true, entries: [{ taxon: 'HdV-18, Gelasinospora', group: 'NPP', role: 'outside' }, { taxon: 'Betula', group: 'trees', role: null }] });
  });

  it('reads lists saved with semicolons or tabs', () => {
    expect(parseTaxonList('taxon;group\nQuercus;trees\n"Rumex; acetosa";herbs\n', 'l.csv')).toMatchObject({ ok: true, entries: [{ taxon: 'Quercus', group: 'trees' }, { taxon: 'Rumex; acetosa', group: 'herbs' }] });
    expect(parseTaxonList('Quercus\ttrees\nPlantago lanceolata\therbs\n', 'l.tsv')).toMatchObject({ ok: true, entries: [{ taxon: 'Quercus' }, { taxon: 'Plantago lanceolata', group: 'herbs' }] });
  });

  it('names the line of a taxon without a group, listed twice, or with a wrong role', () => {
    expect(parseTaxonList('Quercus, trees\nBetula\n', 'l.txt')).toEqual({ ok: false, message: 'l.txt: line 2: Betula has no group (write "Betula, group")' });
    expect(parseTaxonList('Quercus, trees\nQuercus, trees\n', 'l.txt')).toEqual({ ok: false, message: 'l.txt: line 2: Quercus is listed twice (lines 1 and 2); keep one' });
    expect(parseTaxonList('Pediastrum, algae, outsid\n', 'l.txt')).toMatchObject({ ok: false, message: expect.stringMatching(/line 1: role "outsid" is not one of sum, outside/) });
    expect(parseTaxonList('taxon,name\nQuercus,trees\n', 'l.csv')).toMatchObject({ ok: false, message: expect.stringMatching(/line 1: the header needs both columns "taxon" and "group"/) });
  });

  it('makes a keymap that reads back, its own groups with their roles, and says which taxon got which key and why', () => {
    const { r, k } = keymapOfList('Pinus, trees\nPoaceae, herbs\nCalluna, dwarf shrubs, sum\nHdV-18, NPP\nEucalyptus, exotic, marker\n', 'Bog', 'bog.json');
    expect(k.keymap.order).toEqual(['p', 'o', 'c', 'h', 'e']);
    expect(k.keymap.groups.find((g) => g.name === 'dwarf shrubs')?.role).toBe('sum');
    expect(k.keymap.groups.find((g) => g.name === 'NPP')?.role).toBe('outside');
    expect(r.report).toEqual([
      'group dwarf shrubs: sum',
      "group NPP: outside (a group of your own with no role given: outside the sum; give a role in a third column to change it)",
      'group exotic: marker',
      'p  Pinus (trees): initial',
      "o  Poaceae (herbs): second letter (p is Pinus's)",
      'c  Calluna (dwarf shrubs): initial',
      'h  HdV-18 (NPP): initial',
      'e  Eucalyptus (exotic): initial',
    ]);
    // One key a line, as a person would write it.
    expect(r.text).toContain('\n    "p": { "taxon": "Pinus", "group": "trees" },\n');
  });

  it('refuses markers in the pollen sum from a list too', () => {
    const list = parseTaxonList('Pinus, trees\nLycopodium, markers, sum\n', 'l.txt');
    if (!list.ok) throw new Error(list.message);
    expect(keymapFromList(list.entries, 'x', 'x.json')).toMatchObject({ ok: false, message: expect.stringMatching(/"markers" are exotic marker grains and cannot be in the pollen sum/) });
  });
});

describe('exine keys from-list', () => {
  it('writes the keymap and the report, and never replaces a file without --force', async () => {
    const dir = tempDir();
    const taxa = Array.from({ length: 40 }, (_, i) => `${'BCDFGHKLMNPRSTVW'[i % 16]}axon ${i}, ${i % 3 ? 'trees' : 'algae'}`);
    writeFileSync(join(dir, 'taxa.txt'), `${taxa.join('\n')}\n`);
    const run = await runExine(['keys', 'from-list', 'taxa.txt', '--out', 'lab.json'], dir);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/lab\.json: 40 taxa written/);
    expect(run.stdout.split('\n').filter((l) => /^\S+ {2}\S/.test(l))).toHaveLength(40);
    const k = parseKeymap(readFileSync(join(dir, 'lab.json'), 'utf8'), 'lab.json');
    expect(k.ok && k.keymap.order.length).toBe(40);
    const again = await runExine(['keys', 'from-list', 'taxa.txt', '--out', 'lab.json'], dir);
    expect([again.code, oneLine(again)]).toEqual([1, 'exine: lab.json already exists; add --force to replace it']);
    expect((await runExine(['keys', 'from-list', 'taxa.txt', '--out', 'lab.json', '--force'], dir)).code).toBe(0);
    expect((await runExine(['keys', 'from-list', 'taxa.txt'], dir)).code).toBe(2);
  });

  it('reads a built-in group as a lab writes it ("herb", "Spores"), and refuses a near miss instead of taking it out of the sum', () => {
    const { r, k } = keymapOfList('Pinus, Trees\nRumex, herb\nPteridium, Spores\nHdV-18, NPP\n', 'Fen', 'fen.json');
    expect(Object.values(k.keymap.keys).map((b) => b.group)).toEqual(['trees', 'herbs', 'spores', 'NPP']);
    expect(r.report.slice(0, 3)).toEqual([
      'group "Trees" read as the built-in group trees',
      'group "herb" read as the built-in group herbs',
      'group "Spores" read as the built-in group spores',
    ]);
    const typo = parseTaxonList('Pinus, tres\n', 'l.txt');
    if (!typo.ok) throw new Error(typo.message);
    expect(keymapFromList(typo.entries, 'x', 'x.json', 'l.txt')).toEqual({
      ok: false,
      message: 'l.txt: line 1: group "tres" is not a built-in group; did you mean "trees"? For a group of your own, give its role in a third column (sum, outside, marker, indeterminable)',
    });
    // With a role given, the name is the analyst's own group, as written.
    const own = parseTaxonList('Pinus, tres, sum\n', 'l.txt');
    if (!own.ok) throw new Error(own.message);
    expect(keymapFromList(own.entries, 'x', 'x.json').ok).toBe(true);
  });
});
