import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ByteSource } from '../../src/io/byte-source.js';
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

  it('reads the same in blocks of any size as in one block: lines across blocks, non-ASCII and broken UTF-8, cut, padded and changed files', () => {
    // Notes in several scripts put multi-byte characters across block edges.
    const noteArb = fc.constantFrom('Pinus ×', 'Ericaceae – tetrad', '花粉', 'naïve 🌲', 'plain').map((text): EventPayload => ({ type: 'note', text, grain: null, stage: null }));
    const bytesArb = fc.array(fc.oneof(payloadArb, noteArb), { minLength: 1, maxLength: 30 }).map((ps) => Buffer.from(sessionText([openPayload(), ...ps])));
    fc.assert(
      fc.property(bytesArb, fc.nat(), fc.constantFrom('whole', 'cut', 'nul', 'flip', 'nul-inside'), fc.integer({ min: 1, max: 700 }), (whole, at, how, blockBytes) => {
        let bytes = whole;
        if (how === 'cut') bytes = bytes.subarray(0, at % bytes.length);
        if (how === 'nul') bytes = Buffer.concat([bytes, Buffer.alloc(at % 3000)]);
        if (how === 'flip' || how === 'nul-inside') {
          bytes = Buffer.from(bytes);
          bytes[at % bytes.length] = how === 'flip' ? (bytes[at % bytes.length] as number) ^ 0xc0 : 0;
        }
        const reads: number[] = [];
        const source: ByteSource = {
          size: bytes.length,
          read: (into, offset, length, position) => {
            reads.push(length);
            return bytes.copy(into, offset, position, Math.min(bytes.length, position + length));
          },
        };
        const scan = scanLog(source, undefined, { blockBytes });
        expect(scan).toEqual(scanLog(bytes, undefined, { blockBytes: bytes.length + 1 }));
        if (how === 'whole') expect([scan.corruption, scan.tail, scan.lines]).toEqual([null, null, whole.toString('utf8').split('\n').length - 1]);
        // Blocks grow only for a line longer than the block.
        const longest = Math.max(...bytes.toString('latin1').split('\n').map((l) => l.length)) + 1;
        expect(Math.max(0, ...reads)).toBeLessThanOrEqual(Math.max(blockBytes, 2 * longest));
      }),
      { numRuns: 400 },
    );
  });

  it('a file that is shorter than its size said when it is read ends where its bytes end', () => {
    const bytes = Buffer.from(sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula')]));
    const cut = bytes.subarray(0, bytes.length - 10);
    const shrunk: ByteSource = { size: bytes.length, read: (into, offset, length, position) => cut.copy(into, offset, position, Math.min(cut.length, position + length)) };
    for (const blockBytes of [1, 64, 100_000]) expect(scanLog(shrunk, undefined, { blockBytes })).toEqual(scanLog(cut));
  });
});
