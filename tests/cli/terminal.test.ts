import { readdirSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { FORMAT_VERSION } from '../../src/model/events.js';
import { isProcessRunning } from '../../src/io/process-info.js';
import { scanLog } from '../../src/log/scan-log.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { demoFolder } from '../../src/demo/demo-copy.js';
import { startInPty } from '../helpers/pty.js';
import { tempDir } from '../helpers/temp-dir.js';
import { until } from '../helpers/until.js';

/** SIGKILL is delivered asynchronously: wait until the process is gone (or a zombie) before reading its file. */
const untilDead = (pid: number) => until(() => expect(isProcessRunning(pid)).toBe(false));

// End-to-end: the real program in a real pseudo-terminal, keys typed as bursts.
describe('exine count in a terminal', () => {
  it('counts a burst, quits on Ctrl-C with a close event, and resumes where it stopped', async () => {
    const dir = tempDir();
    const t = startInPty(['count', 'l.jsonl', '--core', 'KM-1', '--depth', '84'], dir);
    await t.ready(/Pollen sum 0 \/ 500/);
    t.type('qqqbb\x7f\tpp');
    await t.waitFor(/Pollen sum 6 \/ 500/);
    t.type('\x03');
    expect(await t.exited()).toBe(0);
    expect(t.output()).toMatch(/saved .*l\.jsonl: 6 grains, pollen sum 6/);
    const { state } = readLevel(join(dir, 'l.jsonl'));
    expect(state.counts).toEqual({ Quercus: 3, Betula: 1, Pinus: 2 });
    expect([state.traverse, state.closed]).toEqual([2, true]);

    const again = startInPty(['count', 'l.jsonl'], dir);
    await again.ready(/Pollen sum 6 \/ 500/);
    expect(again.output()).toMatch(/traverse 2/);
    expect(again.output()).toMatch(/sitting 2/);
    again.type('\x03');
    expect(await again.exited()).toBe(0);
  });

  it('records stop rules and spike data from the flags, shows them converging, and changes them on resume', async () => {
    const dir = tempDir();
    const flags = ['--precision', '40', '--precision-share', '30', '--markers', '2', '--tablets', '1', '--per-tablet', '10000', '--volume', '0.5'];
    const t = startInPty(['count', 'l.jsonl', ...flags], dir);
    await t.ready(/Stop if all/);
    t.type('qqqbbb.');
    await t.waitFor(/markers 1\/2\s+\+6/);
    t.type('.');
    await t.waitFor(/STOP RULES MET at pollen sum 6/);
    t.type('\x03');
    expect(await t.exited()).toBe(0);
    const events = scanLog(readFileSync(join(dir, 'l.jsonl'))).events;
    expect(events[0]).toMatchObject({
      format: FORMAT_VERSION,
      rules: { targetSum: null, precision: { halfWidth: 40, share: 30, taxa: null }, markers: 2, mode: 'all' },
      spike: { tablets: 1, perTablet: 10000, perTabletSd: null, volume: 0.5, mass: null, accumulationRate: null },
    });
    expect(events.find((e) => e.type === 'rules-met')).toMatchObject({ sum: 6, grains: 8 });

    const again = startInPty(['count', 'l.jsonl', '--markers', '5'], dir);
    await again.ready(/markers 2\/5/);
    // The notice is drawn in the same frame, but a frame may reach the pty in more than one chunk.
    await again.waitFor(/stop rules changed from/);
    again.type('\x03');
    expect(await again.exited()).toBe(0);
    const tail = scanLog(readFileSync(join(dir, 'l.jsonl'))).events.slice(-4).map((e) => e.type);
    expect(tail).toEqual(['sitting', 'rules', 'rules-unmet', 'close']);
  });

  it('a note and a new type typed in a real terminal, each in one burst, then resumed', async () => {
    const dir = tempDir();
    const t = startInPty(['count', 'l.jsonl', '--quiet'], dir);
    await t.ready(/Pollen sum 0/);
    t.type('qq\r@4.5,77 cf. Quercus robur\r');
    await t.waitFor(/note recorded on #4 Quercus/);
    t.type('=Ilex aquifolium, sh\rAb');
    await t.waitFor(/Pollen sum 5/);
    t.type('\x03');
    expect(await t.exited()).toBe(0);
    const events = scanLog(readFileSync(join(dir, 'l.jsonl'))).events;
    expect(events.find((e) => e.type === 'note')).toMatchObject({ grain: 4, text: 'cf. Quercus robur', stage: { x: 4.5, y: 77 } });
    expect(events.find((e) => e.type === 'taxon')).toMatchObject({ taxon: 'Ilex aquifolium', group: 'shrubs', key: 'A' });
    const again = startInPty(['count', 'l.jsonl', '--quiet'], dir);
    await again.ready(/Pollen sum 5/);
    again.type('A');
    await again.waitFor(/Pollen sum 6/);
    again.type('\x03');
    expect(await again.exited()).toBe(0);
    expect(readLevel(join(dir, 'l.jsonl')).state.counts).toEqual({ Quercus: 2, 'Ilex aquifolium': 3, Betula: 1 });
  });

  it('a second exine on the same file is refused while the first counts', async () => {
    const dir = tempDir();
    const first = startInPty(['count', 'l.jsonl'], dir);
    await first.ready(/Pollen sum 0/);
    const second = startInPty(['count', 'l.jsonl'], dir);
    expect(await second.exited()).toBe(1);
    expect(second.output()).toMatch(/l\.jsonl is already open in exine process \d+/);
    first.type('\x03');
    expect(await first.exited()).toBe(0);
  });

  it('SIGKILL in the middle of a burst loses no grain that was on screen', async () => {
    const dir = tempDir();
    const t = startInPty(['count', 'l.jsonl'], dir);
    await t.ready(/Pollen sum 0/);
    // Keys keep arriving in small bursts while the process is killed.
    const typing = setInterval(() => t.type('qbaco'.repeat(4)), 5);
    await t.waitFor(/Pollen sum \d{3,} \//);
    const pid = t.programPid();
    const shown = Math.max(...[...t.output().matchAll(/Pollen sum (\d+) \//g)].map((m) => Number(m[1])));
    process.kill(pid, 'SIGKILL');
    clearInterval(typing);
    // `script` itself lingers on its open input: end it too.
    t.proc.kill('SIGKILL');
    await t.exited();
    await untilDead(pid);
    const scan = scanLog(readFileSync(join(dir, 'l.jsonl')));
    expect(scan.corruption).toBeNull();
    const onDisk = scan.events.filter((e) => e.type === 'grain').length;
    expect(onDisk).toBeGreaterThanOrEqual(shown);
    const opened = resumeLevel(join(dir, 'l.jsonl'));
    opened.writer.close();
    expect(opened.state.grains).toBe(onDisk);
    expect(opened.notices.join()).toMatch(/not closed cleanly|incomplete/);
  });

  it('SIGTERM closes the sitting cleanly', async () => {
    const dir = tempDir();
    const t = startInPty(['count', 'l.jsonl'], dir);
    await t.ready(/Pollen sum 0/);
    t.type('qq');
    await t.waitFor(/Pollen sum 2/);
    process.kill(t.programPid(), 'SIGTERM');
    await t.exited();
    expect(readLevel(join(dir, 'l.jsonl')).state.closed).toBe(true);
    expect(readdirSync(dir)).toEqual(['l.jsonl']);
  });
});

describe('exine demo in a terminal', () => {
  it('opens a fresh copy of the half-counted demo level in the temp folder, says where, and leaves the bundled file alone', async () => {
    const bundled = join(import.meta.dirname, '../../demo-sessions/km1-084cm.jsonl');
    const before = readFileSync(bundled);
    const tmp = tempDir();
    const t = startInPty(['demo'], tempDir(), { env: { TMPDIR: tmp } });
    await t.ready(/Kestrel Mere KM-1 · level KM1-84/);
    const sum = Number(/Pollen sum (\d+)/.exec(t.output())?.[1]);
    t.type('cc');
    await t.waitFor(new RegExp(`Pollen sum ${sum + 2}\\b`));
    t.type('\x03');
    expect(await t.exited()).toBe(0);
    const copy = join(demoFolder(tmp), 'km1-084cm.jsonl');
    expect(t.output()).toMatch(`the demo copy is ${copy}; the next exine demo starts afresh`);
    expect(t.output()).toMatch(`the whole demo core is beside it: exine core ${demoFolder(tmp)}`);
    expect(readdirSync(tmp)).toEqual([basename(demoFolder(tmp))]);
    expect(readLevel(copy).state.grains).toBe(readLevel(bundled).state.grains + 2);
    expect(readFileSync(bundled).equals(before)).toBe(true);
  });
});
