import { readFileSync } from 'node:fs';
import { extname, resolve } from 'node:path';
import { ExineError, UsageError } from '../../errors.js';
import { refuseOwnInput } from '../../io/same-file.js';
import { writeFileAtomic } from '../../io/write-atomic.js';
import { addTypesToKeymap, type AddedType } from '../../keymap/add-types.js';
import { drawLayout } from '../../keymap/draw-layout.js';
import { isBundledKeymap, loadKeymap, resolveKeymapPath } from '../../keymap/load-keymap.js';
import { plural } from '../../text/cells.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';

/** The types a session added while counting, with the keys they got there. */
async function addedTypesOf(sessionPath: string, cwd: string): Promise<AddedType[]> {
  // Loaded only here: drawing a keymap needs none of the session code.
  const { readLevel } = await import('../../session/session-files.js');
  const { state } = readLevel(resolve(cwd, sessionPath));
  return state.addedTypes.map((taxon) => {
    const [key, binding] = Object.entries(state.keymap.keys).find(([, b]) => b.taxon === taxon) as [string, { group: AddedType['group'] }];
    return { key, taxon, group: binding.group };
  });
}

// The card, the builder and the list reader load only for their own subcommands: `exine keys FILE` starts fast.
async function writeCard(name: string, card: string, paperFlag: string | undefined, force: boolean, io: Io): Promise<number> {
  const { keyCardSvg, PAPER } = await import('../../keymap/key-card.js');
  const paper = (paperFlag ?? 'a4').toLowerCase();
  if (!(paper in PAPER)) throw new UsageError(`exine keys: --paper must be ${Object.keys(PAPER).join(' or ')}, not "${paperFlag}"`);
  const ext = extname(card).toLowerCase();
  if (ext !== '.svg' && ext !== '.txt') throw new UsageError(`exine keys: --card must end in .svg (a drawing to print) or .txt (plain text), not "${card}"`);
  const { keymap, path } = loadKeymap(name, io.cwd);
  refuseOwnInput('keys', card, [path], io.cwd);
  const body = ext === '.svg' ? keyCardSvg(keymap, paper as keyof typeof PAPER) : `${drawLayout(keymap)}\n`;
  writeFileAtomic(resolve(io.cwd, card), body, force);
  io.stdout.write(`${card}: key card of ${keymap.name}${ext === '.svg' ? ` (${paper.toUpperCase()} landscape; print at 100%)` : ''}\n`);
  return 0;
}

export async function keysCommand(args: string[], io: Io): Promise<number> {
  const sub = args[0];
  if (sub === 'new' || sub === 'edit') return (await import('./keys-make.js')).keysBuild(sub, args.slice(1), io);
  if (sub === 'from-list') return (await import('./keys-make.js')).keysFromList(args.slice(1), io);
  const { values, positionals } = parseFlags('keys', args, {
    'add-types': { type: 'string' },
    card: { type: 'string' },
    paper: { type: 'string' },
    force: { type: 'boolean' },
  });
  if (positionals.length !== 1) throw new UsageError('exine keys: give one keymap PATH or bundled NAME (see exine keys --help)');
  const name = positionals[0] as string;
  if (values.card !== undefined) return writeCard(name, values.card, values.paper, values.force === true, io);
  const from = values['add-types'];
  if (from === undefined) {
    const { keymap } = loadKeymap(name, io.cwd);
    io.stdout.write(`${drawLayout(keymap)}\n`);
    return 0;
  }
  const path = resolveKeymapPath(name, io.cwd);
  if (isBundledKeymap(path)) {
    throw new UsageError(`exine keys: ${name} is a bundled keymap and is never changed; copy it (cp ${path} my-keymap.json) and add the types to the copy`);
  }
  // The keymap is rewritten on purpose; the session it learns from must never be.
  refuseOwnInput('keys', path, [from], io.cwd);
  loadKeymap(name, io.cwd);
  const types = await addedTypesOf(from, io.cwd);
  if (types.length === 0) {
    io.stdout.write(`${from} added no types while counting; ${name} is unchanged\n`);
    return 0;
  }
  const result = addTypesToKeymap(readFileSync(path, 'utf8'), name, types);
  if (!result.ok) throw new ExineError(result.message);
  if (result.added.length) writeFileAtomic(path, result.text, true);
  const lines = [
    ...result.added.map((t) => `added ${t.taxon} (${t.group}) on key ${t.key}`),
    ...result.skipped.map((t) => `${t} is in ${name} already`),
    `${name}: ${plural(result.added.length, 'type')} added`,
  ];
  io.stdout.write(`${lines.join('\n')}\n`);
  return 0;
}
