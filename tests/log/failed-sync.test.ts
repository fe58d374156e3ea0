import * as fs from 'node:fs';
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { WriterFs } from '../../src/log/session-writer.js';
import { unconfirmedPathOf } from '../../src/log/unconfirmed.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const keys = (text: string) => [...text].map((char) => ({ kind: 'char' as const, char }));
const EIO = () => Object.assign(new Error('EIO: i/o error'), { code: 'EIO' });

/** Real file operations, except that the sync after `goodSyncs` fails, and, when `cutFails`, so does cutting back. */
function failingSync(goodSyncs: number, cutFails: boolean): WriterFs {
  let syncs = 0;
  return {
    writeSync: (fd, b, o, l) => fs.writeSync(fd, b, o, l),
    fsyncSync: (fd) => {
      if (++syncs > goodSyncs) throw EIO();
      fs.fsyncSync(fd);
    },
    ftruncateSync: (fd, l) => {
      if (cutFails) throw EIO();
      fs.ftruncateSync(fd, l);
    },
  };
}

/** A level with three confirmed grains, then a burst of three whose sync fails. */
function levelWithFailedSync(cutFails: boolean) {
  const { path, writer } = newLevelFile(tempDir());
  writer.close();
  // Resume: the repair check, the sitting and three grains are synced; the next sync fails.
  const opened = resumeLevel(path, { ops: failingSync(2, cutFails) });
  const session = new CountingSession(opened.writer, opened.state);
  session.pressAll(keys('abc'));
  expect(session.getSnapshot().state.grains).toBe(3);
  session.pressAll(keys('aao'));
  const shown = session.getSnapshot();
  session.shutdown();
  return { path, shown };
}

describe('after a failed sync, the screen and the file agree', () => {
  it('cuts the unconfirmed lines back when it can; the next sitting says so and counts what was shown', () => {
    const { path, shown } = levelWithFailedSync(false);
    expect(shown.state.grains).toBe(3);
    expect(shown.message?.text).toMatch(/not confirmed on disk: syncing .* failed \(EIO\); those keys were cut back from the file and counted nothing; the session is now read-only/);
    expect(readLevel(path).state.grains).toBe(3);
    const next = resumeLevel(path);
    next.writer.close();
    expect(next.notices.join(' ')).toMatch(/a sync to disk failed at the last sitting; what it could not confirm \(#\d+–#\d+\) was cut back and is not in the file/);
    expect(next.unconfirmed).toBeUndefined();
    expect(next.state.grains).toBe(3);
    expect(existsSync(unconfirmedPathOf(path))).toBe(false);
  });

  it('where the lines could not be cut back, the next sitting names those grains and v voids them with one key', () => {
    const { path, shown } = levelWithFailedSync(true);
    expect(shown.message?.text).toMatch(/could not be cut back: the next sitting names them and asks whether to keep them/);
    // The file holds the three grains the screen refused: they must not count silently.
    const next = resumeLevel(path);
    expect(next.unconfirmed?.grains.map((g) => g.taxon)).toEqual(['Alnus', 'Alnus', 'Poaceae']);
    const session = new CountingSession(next.writer, next.state, next.notices, next.unconfirmed);
    expect(session.getSnapshot().message?.text).toMatch(/3 grains were written while a disk sync failed and never shown as counted \(#\d+ Alnus, #\d+ Alnus, #\d+ Poaceae\): k keeps them, v voids them/);
    // A counting key first counts nothing and asks again; then v voids all three.
    session.pressAll(keys('b'));
    expect(session.getSnapshot().state.grains).toBe(6);
    expect(session.getSnapshot().message?.text).toMatch(/^that key counted nothing/);
    session.pressAll(keys('vb'));
    expect(session.getSnapshot().state.counts).toEqual({ Alnus: 1, Betula: 2, Corylus: 1 });
    session.shutdown();
    expect(existsSync(unconfirmedPathOf(path))).toBe(false);
    const events = readFileSync(path, 'utf8').trim().split('\n').map((l) => JSON.parse(l) as { type: string; reason?: string });
    expect(events.filter((e) => e.type === 'void').map((e) => e.reason)).toEqual(Array(3).fill('not confirmed on disk when counted (a disk sync failed); voided at the next sitting'));
  });

  it('k keeps them, with a note on the level that says which they were', () => {
    const { path } = levelWithFailedSync(true);
    const next = resumeLevel(path);
    const session = new CountingSession(next.writer, next.state, next.notices, next.unconfirmed);
    session.pressAll(keys('k'));
    expect(session.getSnapshot().state.grains).toBe(6);
    expect(session.getSnapshot().state.notes.at(-1)?.text).toMatch(/^kept 3 grains of #\d+–#\d+, written while a disk sync failed$/);
    session.shutdown();
    expect(existsSync(unconfirmedPathOf(path))).toBe(false);
  });

  it('quitting before answering asks again at the next sitting', () => {
    const { path } = levelWithFailedSync(true);
    const next = resumeLevel(path);
    const session = new CountingSession(next.writer, next.state, next.notices, next.unconfirmed);
    session.pressAll([{ kind: 'interrupt' }]);
    session.shutdown();
    const again = resumeLevel(path);
    again.writer.close();
    expect(again.unconfirmed?.grains).toHaveLength(3);
  });
});
