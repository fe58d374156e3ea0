import fc from 'fast-check';
import { spawnSync } from 'node:child_process';
import { closeSync, openSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { bigSession } from '../../src/bench/resume.js';
import { bufferSource, type FileSource } from '../../src/io/byte-source.js';
import { withSessionFile } from '../../src/io/session-file-source.js';
import { firstBadHash } from '../../src/log/hash-check.js';
import { sha256Hex } from '../../src/log/line-codec.js';
import { claimedScanStands, scanInParallel } from '../../src/log/parallel-scan.js';
import { scanLog } from '../../src/log/scan-log.js';
import type { EventPayload } from '../../src/model/events.js';
import { oneLine, spawnExine } from '../helpers/run-exine.js';
import { grain, openPayload, sessionText } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

// The worker as npm install builds it (tsc's dist/, from the same source): vitest's .ts files cannot run in a worker.
const BUILT_WORKER = new URL('../../dist/log/hash-worker.js', import.meta.url);

const TAXA = ['Alnus', 'Betula', 'Corylus', 'Poaceae'];
const payloadArb: fc.Arbitrary<EventPayload> = fc.oneof(
  fc.constantFrom(...TAXA).map((t) => grain(t)),
  fc.integer({ min: 1, max: 9 }).map((traverse): EventPayload => ({ type: 'traverse', traverse })),
  fc.constantFrom('plain', 'Ericaceae – tetrad', '花粉').map((text): EventPayload => ({ type: 'note', text, grain: null, stage: null })),
);

/** A line changed and given the right hash again, as someone who knows the format could. */
function forge(line: string): string {
  const head = line.slice(0, line.lastIndexOf(',"hash":"')).replace(/"Alnus"|"Betula"|"Corylus"|"Poaceae"/, '"Pinus"');
  return `${head},"hash":"${sha256Hex(head)}"}`;
}

/** Line 4 (a grain of Betula) with its taxon changed and its hash left as it was. */
function editLine4(text: string): string {
  const lines = text.split('\n');
  lines[3] = (lines[3] as string).replace('"Betula"', '"Pinus "');
  return lines.join('\n');
}

/** The scan with hashes taken as claimed, the worker's answer, and the plain reading when they disagree. */
function combined(bytes: Buffer) {
  const claimed = scanLog(bytes, undefined, undefined, { claimedHashes: true });
  return claimedScanStands(claimed, firstBadHash(bufferSource(bytes))) ? claimed : scanLog(bytes);
}

describe('hashes checked beside the scan', () => {
  it('give the reading scanLog gives, for files changed, forged, cut, padded and broken as UTF-8 (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.array(payloadArb, { minLength: 1, maxLength: 25 }),
        fc.nat(),
        fc.constantFrom('whole', 'flip', 'forge', 'bad-utf8', 'cut', 'nul', 'swap'),
        (ps, at, how) => {
          const text = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, ...ps]);
          let bytes = Buffer.from(text);
          const lines = text.split('\n').slice(0, -1);
          const k = 1 + (at % (lines.length - 1));
          if (how === 'flip') {
            bytes = Buffer.from(bytes);
            bytes[at % bytes.length] = (bytes[at % bytes.length] as number) ^ 0x04;
          }
          if (how === 'forge') bytes = Buffer.from(`${lines.map((l, i) => (i === k ? forge(l) : l)).join('\n')}\n`);
          if (how === 'bad-utf8') bytes = Buffer.concat([Buffer.from(lines.slice(0, k).join('\n') + '\n'), Buffer.from([0xc3, 0x28]), Buffer.from(`${lines.slice(k).join('\n')}\n`)]);
          if (how === 'cut') bytes = bytes.subarray(0, at % bytes.length);
          if (how === 'nul') bytes = Buffer.concat([bytes, Buffer.alloc(1 + (at % 300))]);
          if (how === 'swap' && k + 1 < lines.length) {
            const swapped = [...lines];
            [swapped[k], swapped[k + 1]] = [swapped[k + 1] as string, swapped[k] as string];
            bytes = Buffer.from(`${swapped.join('\n')}\n`);
          }
          const plain = scanLog(bytes);
          expect(combined(bytes)).toEqual(plain);
          // The worker names the very line the plain reading finds with a wrong hash.
          if (plain.corruption?.problem === 'hash-mismatch' || plain.tail?.problem === 'hash-mismatch') {
            expect(firstBadHash(bufferSource(bytes))).toBe((plain.corruption ?? plain.tail)?.line);
          }
        },
      ),
      { numRuns: 500 },
    );
  });

  it('a reading that relied on a line with a wrong hash does not stand; one that stopped before it does', () => {
    const text = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula'), grain('Corylus')]);
    const edited = editLine4(text);
    const claimed = scanLog(Buffer.from(edited), undefined, undefined, { claimedHashes: true });
    // Taken as claimed, the edit passes: only the worker's answer catches it.
    expect(claimed.corruption).toBeNull();
    expect(claimedScanStands(claimed, 4)).toBe(false);
    expect(claimedScanStands(claimed, 0)).toBe(true);
    const stoppedAt3 = { ...claimed, corruption: { line: 3, offset: 0, problem: 'seq' as const, message: '' } };
    expect(claimedScanStands(stoppedAt3, 4)).toBe(true);
    expect(claimedScanStands(stoppedAt3, 3)).toBe(false);
  });

  it('uses the worker thread on a real file, and reads again the plain way when it finds a bad hash', () => {
    const dir = tempDir();
    const path = join(dir, 'level.jsonl');
    const text = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula'), grain('Corylus')]);
    const scan = (file: string) => {
      const ways: string[] = [];
      const result = withSessionFile(file, (source) => scanInParallel(source, () => undefined, { minBytes: 0, workerUrl: BUILT_WORKER, report: (how) => ways.push(how) }));
      return { result, ways };
    };
    writeFileSync(path, text);
    const intact = scan(path);
    expect(intact.ways).toEqual(['worker']);
    expect(intact.result).toEqual(scanLog(Buffer.from(text)));
    writeFileSync(path, editLine4(text));
    const edited = scan(path);
    expect(edited.ways).toEqual(['read-again']);
    expect(edited.result.corruption).toMatchObject({ line: 4, problem: 'hash-mismatch' });
    // A small file, or a worker script that is not there, is hashed in line.
    const ways: string[] = [];
    withSessionFile(path, (source) => scanInParallel(source, () => undefined, { report: (how) => ways.push(how) }));
    const fd = openSync(path, 'r');
    const missing: FileSource = { ...bufferSource(Buffer.from(text)), fd };
    scanInParallel(missing, () => undefined, { minBytes: 0, workerUrl: new URL('./no-such-worker.js', BUILT_WORKER), report: (how) => ways.push(how) });
    closeSync(fd);
    // A worker that dies before it answers is waited for a bounded time; then the file is read in line.
    writeFileSync(join(dir, 'mute-worker.mjs'), 'process.exit(0);\n');
    const mute = withSessionFile(path, (source) =>
      scanInParallel(source, () => undefined, { minBytes: 0, workerUrl: pathToFileURL(join(dir, 'mute-worker.mjs')), report: (how) => ways.push(how) }),
    );
    expect(mute.corruption).toMatchObject({ line: 4, problem: 'hash-mismatch' });
    expect(ways).toEqual(['in-line', 'in-line', 'read-again']);
    expect(fileURLToPath(BUILT_WORKER)).toMatch(/dist/);
    const intactPath = join(dir, 'intact.jsonl');
    writeFileSync(intactPath, text);
    // The worker does not take the flags of the process that starts it (here --input-type, which a worker's file refuses).
    const withFlags = spawnSync(
      process.execPath,
      ['--input-type=module', '-e', `
        const { withSessionFile } = await import(${JSON.stringify(new URL('../../dist/io/session-file-source.js', import.meta.url).href)});
        const { scanInParallel } = await import(${JSON.stringify(new URL('../../dist/log/parallel-scan.js', import.meta.url).href)});
        withSessionFile(process.argv[1], (source) => scanInParallel(source, () => undefined, { minBytes: 0, report: (how) => console.log(how) }));`, intactPath],
      { encoding: 'utf8' },
    );
    expect(withFlags.stderr).toBe('');
    expect(withFlags.stdout.trim()).toBe('worker');
  });

  it('the program users run (a child process, its hashes checked by the bundled worker) finds an edit deep in a long level, and reads an intact one', () => {
    const dir = tempDir();
    const text = bigSession(20_000);
    expect(Buffer.byteLength(text)).toBeGreaterThan(4 * 1024 * 1024);
    writeFileSync(join(dir, 'long.jsonl'), text);
    const lines = text.split('\n');
    const at = 15_001;
    lines[at - 1] = (lines[at - 1] as string).replace(/"traverse":(\d+)/, (_, n: string) => `"traverse":${Number(n) + 1}`);
    writeFileSync(join(dir, 'edited.jsonl'), lines.join('\n'));
    const intact = spawnExine(['verify', 'long.jsonl'], dir);
    expect(intact.code, intact.stderr).toBe(0);
    const edited = spawnExine(['verify', 'edited.jsonl'], dir);
    expect(edited.code).toBe(1);
    expect(oneLine(edited)).toMatch(new RegExp(`line ${at} does not match its hash`));
    const summary = spawnExine(['summary', 'edited.jsonl'], dir);
    expect(summary.code).not.toBe(0);
    expect(oneLine(summary)).toMatch(new RegExp(`line ${at} does not match its hash`));
  });
});
