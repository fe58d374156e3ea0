import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import type { EventPayload } from '../../src/model/events.js';
import { grain, openPayload, sessionText } from '../helpers/levels.js';

const TAXA = ['Alnus', 'Betula', 'Corylus', 'Poaceae', 'Sphagnum', 'Lycopodium'];
const payloadArb: fc.Arbitrary<EventPayload> = fc.oneof(
  fc.constantFrom(...TAXA).map((t) => grain(t)),
  fc.integer({ min: 1, max: 9 }).map((traverse): EventPayload => ({ type: 'traverse', traverse })),
  fc.constant<EventPayload>({ type: 'close' }),
  fc.string({ maxLength: 30 }).map((text): EventPayload => ({ type: 'note', text, grain: null, stage: null })),
);
const sessionArb = fc.array(payloadArb, { minLength: 1, maxLength: 40 }).map((ps) => Buffer.from(sessionText([openPayload(), ...ps])));

describe('the session reader, on generated sessions (fast-check)', () => {
  it('reads back every event it was given', () => {
    fc.assert(
      fc.property(fc.array(payloadArb, { maxLength: 40 }), (ps) => {
        const scan = scanLog(Buffer.from(sessionText([openPayload(), ...ps])));
        expect([scan.tail, scan.corruption]).toEqual([null, null]);
        expect(scan.events.slice(1).map(({ type }) => type)).toEqual(ps.map((p) => p.type));
      }),
      { numRuns: 200 },
    );
  });

  it('never accepts a file with any one byte changed: the change is found at or before its line', () => {
    fc.assert(
      fc.property(sessionArb, fc.nat(), fc.integer({ min: 1, max: 255 }), (bytes, at, xor) => {
        const i = at % bytes.length;
        const changed = Buffer.from(bytes);
        changed[i] = (changed[i] as number) ^ xor;
        const scan = scanLog(changed);
        const damage = scan.corruption ?? scan.tail;
        expect(damage).not.toBeNull();
        const lineOfByte = bytes.subarray(0, i).filter((b) => b === 0x0a).length + 1;
        expect(damage!.line).toBeLessThanOrEqual(lineOfByte + 1);
        expect(scan.goodBytes).toBeLessThanOrEqual(i + 1);
      }),
      { numRuns: 500 },
    );
  });

  it('never accepts a file with one line removed or two lines swapped', () => {
    fc.assert(
      fc.property(sessionArb, fc.nat(), fc.nat(), (bytes, a, b) => {
        const lines = bytes.toString('utf8').split('\n').slice(0, -1);
        if (lines.length < 3) return;
        const i = 1 + (a % (lines.length - 1));
        const removed = lines.filter((_, k) => k !== i);
        const dropped = scanLog(Buffer.from(`${removed.join('\n')}\n`));
        // Removing the very last line leaves a valid shorter file: that is what the close event is for.
        if (i !== lines.length - 1) expect(dropped.corruption ?? dropped.tail).not.toBeNull();
        const j = 1 + (b % (lines.length - 1));
        if (i === j || lines[i] === lines[j]) return;
        const swapped = [...lines];
        [swapped[i], swapped[j]] = [swapped[j] as string, swapped[i] as string];
        const s = scanLog(Buffer.from(`${swapped.join('\n')}\n`));
        expect(s.corruption ?? s.tail).not.toBeNull();
      }),
      { numRuns: 300 },
    );
  });
});
