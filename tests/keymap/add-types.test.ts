import { copyFileSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { addTypesToKeymap } from '../../src/keymap/add-types.js';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const FILE = `{
  "name": "Mine",
  "keys": {
    "q": { "taxon": "Quercus", "group": "trees" },
    "c": { "taxon": "Corylus", "group": "shrubs" }
  }
}
`;

describe('adding the types of a count to a keymap file', () => {
  it('puts each new type on its key after the last one, keeping the file as it was written', () => {
    const r = addTypesToKeymap(FILE, 'mine.json', [{ key: 'A', taxon: 'Ilex aquifolium', group: 'shrubs' }]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.text).toBe(FILE.replace('"group": "shrubs" }\n', '"group": "shrubs" },\n    "A": { "taxon": "Ilex aquifolium", "group": "shrubs" }\n'));
    const parsed = parseKeymap(r.text, 'mine.json');
    expect(parsed.ok && Object.keys(parsed.keymap.keys)).toEqual(['q', 'c', 'A']);
  });

  it('skips a taxon already in the file and refuses a key that holds another one', () => {
    const skip = addTypesToKeymap(FILE, 'mine.json', [{ key: 'A', taxon: 'Corylus', group: 'shrubs' }]);
    expect(skip).toMatchObject({ ok: true, added: [], skipped: ['Corylus'], text: FILE });
    expect(addTypesToKeymap(FILE, 'mine.json', [{ key: 'q', taxon: 'Ilex', group: 'shrubs' }])).toEqual({
      ok: false,
      message: 'keymap mine.json: key "q" holds Quercus there, so Ilex cannot take it; add it by hand on a free key',
    });
  });

  it('exine keys --add-types writes a copy of a keymap, never a bundled one', async () => {
    const dir = tempDir();
    const demo = join(dir, 'km1-084cm.jsonl');
    copyFileSync(new URL('../../demo-sessions/km1-084cm.jsonl', import.meta.url), demo);
    const bundled = await runExine(['keys', 'temperate-lowland', '--add-types', demo], dir);
    expect(bundled.code).toBe(2);
    expect(oneLine(bundled)).toMatch(/temperate-lowland is a bundled keymap and is never changed; copy it/);
    copyFileSync(new URL('../../keymaps/temperate-lowland.json', import.meta.url), join(dir, 'mine.json'));
    const run = await runExine(['keys', 'mine.json', '--add-types', demo], dir);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe('added Ilex aquifolium (shrubs) on key A\nmine.json: 1 type added\n');
    expect(readFileSync(join(dir, 'mine.json'), 'utf8')).toMatch(/"A": \{ "taxon": "Ilex aquifolium", "group": "shrubs" \}/);
    expect((await runExine(['keys', 'mine.json'], dir)).stdout).toMatch(/Ilex/);
    // A second time there is nothing to add.
    expect((await runExine(['keys', 'mine.json', '--add-types', demo], dir)).stdout).toMatch(/Ilex aquifolium is in mine\.json already\nmine\.json: 0 types added/);
  });
});
