import { render } from 'ink-testing-library';
import { describe, expect, it } from 'vitest';
import { emptyKeymapText } from '../../src/keymap/edit-keymap-text.js';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { builderKey, startBuilder, type BuilderUi } from '../../src/screens/keymap-builder-keys.js';
import { KeymapBuilder } from '../../src/screens/keymap-builder.js';
import { splitRaw } from '../../src/input/key-press.js';
import { driveScreen, until } from '../helpers/ink-screen.js';

const start = (text = emptyKeymapText('Mire')): BuilderUi => {
  const s = startBuilder(text, 'Mire', 'mire.json');
  if ('error' in s) throw new Error(s.error);
  return s;
};
const press = (ui: BuilderUi, keys: string) => splitRaw(keys).reduce(builderKey, ui);

async function builder(text?: string) {
  let result: BuilderUi | null = null;
  const screen = await driveScreen(render(<KeymapBuilder start={start(text)} file="mire.json" onDone={(ui) => (result = ui)} columns={100} rows={30} />));
  return { ...screen, result: () => result };
}

describe('the keymap builder', () => {
  it('a key, its taxon and group arriving in one burst each; the drawing fills; Enter on an empty taxon ends', async () => {
    const s = await builder();
    await s.shows(/no keys yet/);
    s.type('qQuercus\rtr\r');
    await s.shows(/q T[\s\S]*Quercus/);
    // Enter on an empty group line takes the group chosen last.
    s.type('bBetula\r\r');
    await s.shows(/b T[\s\S]*Betula/);
    s.type('hHdV-18\rNPP\r2');
    await s.shows(/h N[\s\S]*HdV-18/);
    s.type('x\r');
    await until(() => expect(s.result()).not.toBeNull());
    const end = s.result() as unknown as BuilderUi;
    const k = parseKeymap(end.text, 'mire.json');
    if (!k.ok) throw new Error(k.message);
    expect(k.keymap.order).toEqual(['q', 'b', 'h']);
    expect(k.keymap.keys.h).toEqual({ taxon: 'HdV-18', group: 'NPP' });
    expect(k.keymap.groups.find((g) => g.name === 'NPP')?.role).toBe('outside');
    expect(end.text).toBe(`{
  "name": "Mire",
  "groups": { "NPP": "outside" },
  "keys": {
    "q": { "taxon": "Quercus", "group": "trees" },
    "b": { "taxon": "Betula", "group": "trees" },
    "h": { "taxon": "HdV-18", "group": "NPP" }
  }
}
`);
  });

  it('a used key says by what; an action key says which action; a taxon on two keys is refused', () => {
    let ui = press(start(), 'qQuercus\rtr\r');
    ui = press(ui, 'q');
    expect(ui.message?.text).toBe('q holds Quercus (trees): type a new taxon to put there, "-" to free the key, or Enter to keep it');
    ui = press(ui, '\r');
    expect(ui.message?.text).toBe('q keeps Quercus');
    expect(press(ui, '?').message?.text).toBe('? is the help action: press another key');
    expect(press(ui, '\x7f').message?.text).toBe('Backspace is the undo action: press a character key, or Enter to finish');
    expect(press(ui, 'rQuercus\r').message?.text).toBe('Quercus is on key q already: type another name, or Esc');
  });

  it('replaces and frees a key; an ambiguous group asks for more; markers cannot join the sum', () => {
    let ui = press(start(), 'qQuercus\rtr\rpPinus\r\r');
    ui = press(ui, 'qQuercus robur\r\r');
    expect(ui.keymap.keys.q?.taxon).toBe('Quercus robur');
    ui = press(ui, 'p-\r');
    expect(ui.keymap.order).toEqual(['q']);
    ui = press(ui, 'sSalix\rs\r');
    expect(ui.message?.text).toBe('"s" could be shrubs, spores: type more of it');
    ui = press(ui, 'h\r');
    expect(ui.keymap.keys.s).toEqual({ taxon: 'Salix', group: 'shrubs' });
    // A group of role marker is never in the sum; the choice is of the role only.
    ui = press(ui, 'eEucalyptus\rexotic\r3');
    expect(ui.keymap.groups.find((g) => g.name === 'exotic')?.role).toBe('marker');
    expect(ui.keymap.sum).not.toContain('exotic');
  });

  it('edits a file in place: its own layout and order stay, the new key goes after the last', () => {
    const file = '{\n  "name": "Mine",\n  "keys": {\n    "9": { "taxon": "Betula", "group": "trees" },\n    "c": {\n      "taxon": "Corylus",\n      "group": "shrubs"\n    }\n  },\n  "sum": ["trees", "shrubs", "herbs"]\n}\n';
    const ui = press(start(file), 'oPoaceae\rher\r\r');
    expect(ui.done).toBe(true);
    expect(ui.text).toBe(file.replace('      "group": "shrubs"\n    }\n', '      "group": "shrubs"\n    },\n    "o": { "taxon": "Poaceae", "group": "herbs" }\n'));
    expect(ui.keymap.order).toEqual(['9', 'c', 'o']);
  });

  it('Ctrl-C ends and keeps what was made', () => {
    const ui = press(start(), 'qQuercus\rtr\rbBet\x03');
    expect(ui.done).toBe(true);
    expect(ui.keymap.order).toEqual(['q']);
  });
});
