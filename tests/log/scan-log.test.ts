import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { verdictOf } from '../../src/log/verify-log.js';
import { grain, openPayload, sessionText } from '../helpers/levels.js';
import type { EventPayload } from '../../src/model/events.js';

const payloads: EventPayload[] = [
  openPayload(),
  { type: 'sitting', sitting: 1 },
  grain('Alnus'),
  grain('Betula'),
  { type: 'traverse', traverse: 2 },
  grain('Corylus', 2),
  { type: 'close' },
];
const text = sessionText(payloads);
const lines = text.split('\n').slice(0, -1);
const join = (ls: string[]) => Buffer.from(`${ls.join('\n')}\n`);

describe('reading a session file', () => {
  it('reads an intact file: every line, the chain and the keymap', () => {
    const scan = scanLog(Buffer.from(text));
    expect(scan.events.map((e) => e.type)).toEqual(['open', 'sitting', 'grain', 'grain', 'traverse', 'grain', 'close']);
    expect([scan.tail, scan.corruption, scan.goodBytes]).toEqual([null, null, Buffer.byteLength(text)]);
    expect(scan.keymap?.keys.a?.taxon).toBe('Alnus');
    expect(verdictOf('f', scan).intact).toBe(true);
  });

  it('keeps fields it does not know (written by a later version)', () => {
    const withExtra = sessionText([openPayload(), { ...grain('Alnus'), stageX: 12.5 } as unknown as EventPayload]);
    const scan = scanLog(Buffer.from(withExtra));
    expect(scan.corruption).toBeNull();
    expect((scan.events[1] as unknown as { stageX: number }).stageX).toBe(12.5);
  });

  it('finds an edited taxon by its line number', () => {
    const edited = [...lines];
    edited[3] = (edited[3] as string).replace('"Betula"', '"Pinus"');
    const scan = scanLog(join(edited));
    expect(scan.corruption).toMatchObject({ line: 4, problem: 'hash-mismatch' });
    expect(scan.events.length).toBe(3);
  });

  it('finds a deleted line', () => {
    const scan = scanLog(join(lines.filter((_, i) => i !== 2)));
    expect(scan.corruption).toMatchObject({ line: 3, problem: 'seq' });
    expect(scan.corruption?.message).toMatch(/line 3 has seq 4 where 3 was expected/);
  });

  it('finds two swapped lines', () => {
    const swapped = [...lines];
    [swapped[2], swapped[3]] = [swapped[3] as string, swapped[2] as string];
    expect(scanLog(join(swapped)).corruption).toMatchObject({ line: 3, problem: 'seq' });
  });

  it('finds a line whose seq was renumbered to hide a deletion: the chain breaks', () => {
    // Delete line 3, then forge seq numbers without the hash: the hash no longer matches.
    const forged = lines.filter((_, i) => i !== 2).map((l, i) => l.replace(/^\{"seq":\d+/, `{"seq":${i + 1}`));
    expect(scanLog(join(forged)).corruption).toMatchObject({ line: 3, problem: 'hash-mismatch' });
  });

  it('finds a line copied in from another session', () => {
    const other = sessionText([{ ...openPayload(), session: 'ffffffffffffffffffffffffffffffff' }, { type: 'sitting', sitting: 1 }, grain('Alnus')]).split('\n');
    const mixed = [...lines];
    mixed[2] = other[2] as string;
    expect(scanLog(join(mixed)).corruption).toMatchObject({ line: 3, problem: 'chain' });
  });

  it('treats a torn last line, cut at any byte, as repairable tail damage', () => {
    const head = `${lines.slice(0, -1).join('\n')}\n`;
    const last = `${lines.at(-1)}\n`;
    for (let cut = 1; cut < last.length; cut++) {
      const scan = scanLog(Buffer.from(head + last.slice(0, cut)));
      expect(scan.corruption, `cut at ${cut}`).toBeNull();
      expect(scan.tail?.line, `cut at ${cut}`).toBe(lines.length);
      expect(scan.goodBytes).toBe(Buffer.byteLength(head));
      expect(scan.events.length).toBe(lines.length - 1);
    }
  });

  it('treats NUL padding after the last line as repairable, and names it', () => {
    const scan = scanLog(Buffer.concat([Buffer.from(text), Buffer.alloc(512)]));
    expect(scan.tail).toMatchObject({ problem: 'nul-padding', line: lines.length + 1 });
    expect(scan.events.length).toBe(lines.length);
  });

  it('treats a damaged last line followed only by NULs as repairable, but damage followed by good lines as corruption', () => {
    const damagedLast = [...lines];
    damagedLast[damagedLast.length - 1] = (damagedLast.at(-1) as string).replace('close', 'clos\u0000');
    expect(scanLog(Buffer.concat([join(damagedLast), Buffer.alloc(10)])).tail).toMatchObject({ line: lines.length });
    const damagedMiddle = [...lines];
    damagedMiddle[4] = `${(damagedMiddle[4] as string).slice(0, 30)}`;
    const scan = scanLog(join(damagedMiddle));
    expect(scan.tail).toBeNull();
    expect(scan.corruption).toMatchObject({ line: 5 });
    expect(verdictOf('f', scan).summary).toMatch(/line 5/);
  });

  it('refuses a file from a future format version, an empty file and a file not starting with open', () => {
    const future = scanLog(Buffer.from(sessionText([{ ...openPayload(), format: 99 }])));
    expect(future.corruption?.message).toMatch(/session format 99, written by a newer exine/);
    expect(scanLog(Buffer.alloc(0)).corruption?.problem).toBe('empty');
    expect(scanLog(Buffer.from(sessionText([grain('Alnus')]))).corruption?.problem).toBe('not-open');
  });

  it('refuses a line with an unknown event type instead of dropping it', () => {
    const scan = scanLog(Buffer.from(sessionText([openPayload(), { type: 'wobble' } as unknown as EventPayload, grain('Alnus')])));
    expect(scan.corruption).toMatchObject({ line: 2, problem: 'unknown-type' });
  });

  it('verify warns when time runs backwards but still calls the file intact', () => {
    const t = sessionText([openPayload(), grain('Alnus'), grain('Betula')], Date.parse('2026-11-02T09:00:00.000Z'), -60_000);
    const v = verdictOf('f', scanLog(Buffer.from(t)));
    expect(v.intact).toBe(true);
    expect(v.warnings[0]).toMatch(/line 2: time .* is earlier than the line before/);
  });
});
