import { bindingsOf, keyLabel, type Keymap } from '../keymap/keymap.js';
import { fit } from '../text/cells.js';
import { line, type Line } from './styled-line.js';

/** The keymap and the actions, in columns that fit `width`: what the help overlay shows. */
export function helpLines(keymap: Keymap, width: number, room: number): string[] {
  const a = keymap.actions;
  const actions = [
    `${keyLabel(a.undo)} undo the last grain, or a traverse change made after it`,
    `${keyLabel(a.traverse)} next traverse`,
    `${keyLabel(a.note)} note on the last grain ("@x,y" = stage position)`,
    `${keyLabel(a.newType)} a type not in the keymap ("name, group")`,
    `${keyLabel(a.cf)} then a taxon key: a cf. grain of it (probable, not certain)`,
    `${keyLabel(a.help)} this help · Ctrl-F finish the level · Ctrl-C save and quit`,
  ];
  const taxa = bindingsOf(keymap).map(([k, b]) => `${keyLabel(k)} ${b.taxon}`);
  const columnWidth = 24;
  const perLine = Math.max(1, Math.floor(width / columnWidth));
  const rowsNeeded = Math.ceil(taxa.length / perLine);
  const grid: string[] = [];
  for (let r = 0; r < rowsNeeded; r++) {
    grid.push(Array.from({ length: perLine }, (_, c) => fit(taxa[c * rowsNeeded + r] ?? '', columnWidth - 1)).join(' '));
  }
  const lines = [`Help: ${keymap.name} · any key closes this and counts nothing`, ...actions, '', ...grid];
  return (lines.length > room ? [...lines.slice(0, room - 1), '… (a taller terminal shows every key)'] : lines).map((l) => fit(l, width));
}

/** The help overlay: its title across the screen, inverse, then the keys. */
export function helpOverlay(keymap: Keymap, width: number, room: number): Line[] {
  return helpLines(keymap, width, room).map((text, i) => line(text, { bold: i === 0, inverse: i === 0 }));
}
