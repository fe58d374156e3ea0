import { resolveKey } from '../keymap/resolve-key.js';
import type { KeyPress } from '../input/key-press.js';
import { editLine, LINE_FULL_MESSAGE, lineFull } from '../input/line-edit.js';
import type { Burst, Outcome } from './burst.js';
import { nextFreeKey } from './free-key.js';
import { parseNewType, parseNote, type InputMode } from './input-mode.js';

const NOT_FINISHED = 'not finished: counting goes on (that key counted nothing)';

type ModeOf<K extends InputMode['kind']> = Extract<InputMode, { kind: K }>;

/** The answer to "finish this level?": y finishes and quits, any other key goes on counting. */
function finishKey(b: Burst, key: KeyPress): Outcome {
  b.mode = null;
  if (key.kind === 'char' && (key.char === 'y' || key.char === 'Y')) {
    b.stage({ type: 'finish' });
    return 'quit';
  }
  if (key.kind === 'interrupt') return 'quit';
  b.say(NOT_FINISHED);
  return 'go-on';
}

/** Any key closes the help and counts nothing; Ctrl-C still quits. */
function helpKey(b: Burst, key: KeyPress): Outcome {
  b.mode = null;
  if (key.kind === 'interrupt') return 'quit';
  b.say('help closed: that key counted nothing');
  return 'go-on';
}

function noteKey(b: Burst, mode: ModeOf<'note'>, key: KeyPress): Outcome {
  const next = editLine(mode.text, key);
  if (next === 'quit') return 'quit';
  if (next === 'cancel') {
    b.mode = null;
    b.say('note cancelled: nothing recorded');
    return 'go-on';
  }
  if (next !== 'enter') {
    b.mode = { ...mode, text: next };
    if (lineFull(mode.text, key)) b.say(LINE_FULL_MESSAGE, 'warning');
    return 'go-on';
  }
  b.mode = null;
  const { text, stage } = parseNote(mode.text);
  if (!text && !stage) {
    b.say('empty note: nothing recorded');
    return 'go-on';
  }
  b.stage({ type: 'note', text, grain: mode.grain, stage });
  b.say(`note recorded${mode.grain === null ? ' for the level' : ` on #${mode.grain} ${mode.taxon ?? ''}`}`.trimEnd());
  return 'go-on';
}

/** "name, group" then Enter: a type on a key already counts one grain there; a new one gets the next free key and its first grain. */
function newTypeKey(b: Burst, mode: ModeOf<'new-type'>, key: KeyPress): Outcome {
  const next = editLine(mode.text, key);
  if (next === 'quit') return 'quit';
  if (next === 'cancel') {
    b.mode = null;
    b.say('new type cancelled: nothing counted');
    return 'go-on';
  }
  if (next !== 'enter') {
    b.mode = { ...mode, text: next };
    if (lineFull(mode.text, key)) b.say(LINE_FULL_MESSAGE, 'warning');
    return 'go-on';
  }
  const parsed = parseNewType(mode.text, b.state().keymap.groups.map((g) => g.name));
  if (!parsed.ok) {
    b.say(parsed.message, 'warning');
    return 'go-on';
  }
  const state = b.state();
  const known = Object.entries(state.keymap.keys).find(([, binding]) => binding.taxon === parsed.taxon);
  b.mode = null;
  if (known) {
    b.stage({ type: 'grain', taxon: parsed.taxon, traverse: state.traverse, key: known[0] });
    b.judge();
    b.say(`${parsed.taxon} is on key ${known[0]} already: one grain counted`);
    return 'go-on';
  }
  const freeKey = nextFreeKey(state.keymap);
  if (freeKey === null) {
    b.say('no free key left for a new type: add it to a keymap of your own', 'warning');
    return 'go-on';
  }
  b.stage({ type: 'taxon', taxon: parsed.taxon, group: parsed.group, key: freeKey });
  b.stage({ type: 'grain', taxon: parsed.taxon, traverse: state.traverse, key: freeKey });
  b.judge();
  b.say(`new type ${parsed.taxon} (${parsed.group}) on key ${freeKey}: one grain counted`);
  return 'go-on';
}

/** The question asked at opening after a failed sync, in words. */
export function unconfirmedQuestion(mode: ModeOf<'unconfirmed'>): string {
  const list = mode.grains.slice(0, 4).map((g) => `#${g.seq} ${g.taxon}`).join(', ');
  const more = mode.grains.length > 4 ? ` and ${mode.grains.length - 4} more` : '';
  const n = mode.grains.length;
  return `${n === 1 ? 'A grain was' : `${n} grains were`} written while a disk sync failed and never shown as counted (${list}${more}): k keeps ${n === 1 ? 'it' : 'them'}, v voids ${n === 1 ? 'it' : 'them'}`;
}

/** k keeps the grains of a failed sync (a note on the level says so), v voids each of them; any other key counts nothing and asks again. */
function unconfirmedKey(b: Burst, mode: ModeOf<'unconfirmed'>, key: KeyPress): Outcome {
  if (key.kind === 'interrupt') return 'quit';
  const answer = key.kind === 'char' ? key.char.toLowerCase() : '';
  const range = mode.fromSeq === mode.toSeq ? `#${mode.fromSeq}` : `#${mode.fromSeq}–#${mode.toSeq}`;
  if (answer === 'k') {
    b.stage({ type: 'note', text: `kept ${mode.grains.length} grains of ${range}, written while a disk sync failed`, grain: null, stage: null });
    b.mode = null;
    b.say(`kept: ${mode.grains.length} grains of ${range} count`);
    return 'go-on';
  }
  if (answer === 'v') {
    for (const g of mode.grains) b.stage({ type: 'void', grain: g.seq, traverse: null, reason: 'not confirmed on disk when counted (a disk sync failed); voided at the next sitting' });
    b.judge();
    b.mode = null;
    b.say(`voided: ${mode.grains.length} grains of ${range} no longer count`);
    return 'go-on';
  }
  b.say(`that key counted nothing: ${unconfirmedQuestion(mode)}`, 'warning');
  return 'go-on';
}

/** After the cf. key: a taxon key counts a cf. grain of it; the cf. key again or any other key counts nothing. */
function cfKey(b: Burst, key: KeyPress): Outcome {
  b.mode = null;
  const state = b.state();
  const command = resolveKey(state.keymap, key);
  if (command.kind === 'quit') return 'quit';
  if (command.kind === 'tally') {
    b.stage({ type: 'grain', taxon: command.taxon, traverse: state.traverse, key: command.key, cf: true });
    b.judge();
    const after = b.state();
    b.say(`cf. ${command.taxon} counted (${command.taxon}: ${after.counts[command.taxon] ?? 0}, of them cf. ${after.cf[command.taxon] ?? 0})`);
    return 'go-on';
  }
  if (command.kind === 'action' && command.action === 'cf') {
    b.say('cf. cancelled: nothing counted');
    return 'go-on';
  }
  b.miss('cf. cancelled: that key is no taxon key, nothing counted');
  return 'go-on';
}

/** A key while a question, the help or a typed line is open: one reducer per mode. */
export function modeKey(b: Burst, mode: InputMode, key: KeyPress): Outcome {
  switch (mode.kind) {
    case 'confirm-finish':
      return finishKey(b, key);
    case 'help':
      return helpKey(b, key);
    case 'cf':
      return cfKey(b, key);
    case 'note':
      return noteKey(b, mode, key);
    case 'new-type':
      return newTypeKey(b, mode, key);
    case 'unconfirmed':
      return unconfirmedKey(b, mode, key);
    default:
      return mode satisfies never;
  }
}
