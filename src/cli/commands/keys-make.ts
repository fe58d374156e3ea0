import { accessSync, constants, existsSync, readFileSync } from 'node:fs';
import { basename, dirname, extname, resolve } from 'node:path';
import { ExineError, UsageError } from '../../errors.js';
import { refuseOwnInput } from '../../io/same-file.js';
import { writeFileAtomic } from '../../io/write-atomic.js';
import { emptyKeymapText } from '../../keymap/edit-keymap-text.js';
import { keymapFromList } from '../../keymap/keymap-from-list.js';
import { parseTaxonList } from '../../keymap/list-file.js';
import { isBundledKeymap, resolveKeymapPath } from '../../keymap/load-keymap.js';
import { visible } from '../../text/visible.js';
import { drawLiveOnThisTerminal } from '../interactive-terminal.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';
import { requireTerminal } from './count.js';

const taxa = (n: number) => `${n} ${n === 1 ? 'taxon' : 'taxa'}`;
const nameFrom = (path: string) => basename(path, extname(path)).replace(/[-_]+/g, ' ');

/** `exine keys from-list LIST --out FILE`: a keymap from a lab's taxon list, with a report of the keys. */
export function keysFromList(args: string[], io: Io): number {
  const { values, positionals } = parseFlags('keys from-list', args, { out: { type: 'string' }, name: { type: 'string' }, force: { type: 'boolean' } });
  if (positionals.length !== 1 || values.out === undefined) throw new UsageError('exine keys from-list: give one taxon list and --out FILE (see exine keys --help)');
  const listPath = resolve(io.cwd, positionals[0] as string);
  let text: string;
  try {
    text = readFileSync(listPath, 'utf8');
  } catch (error) {
    throw new ExineError(`${positionals[0]}: cannot be read (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
  }
  const list = parseTaxonList(text, positionals[0] as string);
  if (!list.ok) throw new ExineError(list.message);
  const out = resolve(io.cwd, values.out);
  refuseOwnInput('keys from-list', values.out, [positionals[0] as string], io.cwd);
  if (!values.force && existsSync(out)) throw new ExineError(`${values.out} already exists; add --force to replace it`);
  const made = keymapFromList(list.entries, values.name ?? nameFrom(values.out), values.out, positionals[0] as string);
  if (!made.ok) throw new ExineError(made.message);
  writeFileAtomic(out, made.text, values.force === true);
  io.stdout.write(`${made.report.join('\n')}\n${values.out}: ${taxa(list.entries.length)} written; check it with exine keys ${values.out}\n`);
  return 0;
}

/** `exine keys new FILE` and `exine keys edit FILE`: the builder at the keyboard. */
export async function keysBuild(mode: 'new' | 'edit', args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseFlags(`keys ${mode}`, args, { force: { type: 'boolean' }, name: { type: 'string' } });
  if (positionals.length !== 1) throw new UsageError(`exine keys ${mode}: give one keymap FILE (see exine keys --help)`);
  const file = positionals[0] as string;
  const path = mode === 'edit' ? resolveKeymapPath(file, io.cwd) : resolve(io.cwd, file);
  let text: string;
  if (mode === 'new') {
    if (!values.force && existsSync(path)) throw new ExineError(`${file} already exists; add --force to replace it, or change it with exine keys edit ${file}`);
    text = emptyKeymapText(values.name ?? nameFrom(file));
  } else {
    if (isBundledKeymap(path)) throw new UsageError(`exine keys edit: ${file} is a bundled keymap and is never changed; copy it (cp ${path} my-keymap.json) and edit the copy`);
    try {
      text = readFileSync(path, 'utf8');
    } catch (error) {
      throw new ExineError(`keymap ${file}: cannot be read (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
    }
  }
  // Found out now, not after forty taxa have been typed.
  try {
    accessSync(dirname(path), constants.W_OK);
  } catch (error) {
    throw new ExineError(`cannot write ${file}: its folder ${(error as NodeJS.ErrnoException).code === 'ENOENT' ? 'does not exist' : 'is not writable'}`);
  }
  const { startBuilder } = await import('../../screens/keymap-builder-keys.js');
  const start = startBuilder(text, values.name ?? nameFrom(file), file);
  if ('error' in start) throw new ExineError(start.error);
  requireTerminal(`keys ${mode}`, io);
  drawLiveOnThisTerminal(io.env);
  const { runKeymapBuilder } = await import('../../screens/run-keymap-builder.js');
  const end = await runKeymapBuilder(start, file);
  if (!end.changed || end.keymap.order.length === 0) {
    const why = end.keymap.order.length === 0 ? (mode === 'new' ? 'no keys were made' : 'every key was freed, and a keymap needs one') : 'unchanged';
    io.stdout.write(`${file}: ${why}; nothing written\n`);
    return 0;
  }
  // A new file never replaces one that appeared meanwhile (unless --force); an edit replaces its own file.
  try {
    writeFileAtomic(path, end.text, mode === 'edit' || values.force === true);
  } catch (error) {
    // What was typed is not lost: the keymap goes to the terminal, to be saved by hand.
    io.stdout.write(end.text);
    throw new ExineError(`${(error as Error).message}; the keymap is printed above: save it under another name`);
  }
  io.stdout.write(`${file}: ${taxa(end.keymap.order.length)} written (${visible(end.keymap.name)}); print a card with exine keys ${file} --card card.svg\n`);
  return 0;
}
