import { drawGrid } from '../keymap/draw-layout.js';
import { groupLetters } from '../keymap/group-labels.js';
import { onKeypad } from '../keymap/key-grid.js';
import { keyLabel } from '../keymap/keymap.js';
import { fit } from '../text/cells.js';
import { matchingGroups, ROLE_CHOICES, type BuilderUi } from './keymap-builder-keys.js';
import { line, truncated, type Line } from './styled-line.js';

/** What the builder shows: the drawing as it fills, the step being asked, and the last message. */
export function builderLines(ui: BuilderUi, file: string, columns: number, rows: number): Line[] {
  const { keymap, step } = ui;
  const letters = groupLetters(keymap.groups.map((g) => g.name));
  // Narrow terminals get narrower key cells.
  const drawing = keymap.order.length ? drawGrid(keymap, onKeypad(keymap) ? Math.min(12, Math.floor(columns / 4) - 1) : columns < 100 ? 5 : 7) : ['(no keys yet: the keyboard is drawn as they are added)', ''];
  const groups = keymap.groups.map((g) => `${letters.get(g.name)} ${g.name}`).join(' · ');
  const head = [
    truncated(`Keymap ${file} · ${keymap.order.length} taxa · Enter on an empty taxon (or Ctrl-C) saves and ends`, { bold: true, inverse: true }),
    // Ink gives an empty line no height.
    line(' '),
  ];
  const ask: Line[] = [];
  switch (step.kind) {
    case 'key':
      ask.push(line('Press the key for the next taxon (Enter: save and end)', { bold: true }));
      break;
    case 'taxon':
      ask.push(line(`Key ${keyLabel(step.key)} · taxon: ${step.text}▏`, { bold: true }), line('Enter with no name saves and ends · Esc: another key', { tone: 'dim' }));
      break;
    case 'group': {
      const m = step.text ? matchingGroups(keymap, step.text) : [];
      const hint = step.text && m.length === 0 ? `a new group "${step.text.trim()}": Enter asks its role` : m.length === 1 ? `Enter: ${m[0]}` : m.length ? `could be ${m.join(', ')}: type more` : ui.lastGroup ? `Enter: ${ui.lastGroup} again` : 'type its first letters; a new name makes a new group';
      ask.push(line(`Key ${keyLabel(step.key)} · ${step.taxon} · group: ${step.text}▏`, { bold: true }), line(hint, { tone: 'dim' }));
      break;
    }
    case 'role':
      ask.push(
        line(`New group "${step.group}": what are its grains?`, { bold: true }),
        line(ROLE_CHOICES.map(([k, , words]) => `${k} ${words}`).join(' · '), { tone: 'accent' }),
      );
      break;
  }
  const message = ui.message ? [line(ui.message.text, { tone: ui.message.warning ? 'warning' : 'ok' })] : [line(' ')];
  const foot = [line(fit(`groups: ${groups}`, columns), { tone: 'dim' })];
  const room = Math.max(0, rows - head.length - ask.length - message.length - foot.length - 1);
  return [...head, ...drawing.slice(0, room).map((t) => line(t || ' ')), ...ask, ...message, ...foot];
}
