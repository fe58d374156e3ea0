import { isAscii, isUtf8 } from 'node:buffer';
import type { Keymap } from '../keymap/keymap.js';
import { checkEventContent, References, type Problem } from './check-event.js';
import type { ParsedEvent } from './event-schema.js';
import { bufferSource, type ByteSource } from '../io/byte-source.js';
import { lineHashes } from './line-codec.js';

export type { Problem } from './check-event.js';
/** What is wrong with a line: a content problem, or a line longer than the reader reads. */
export type ScanProblem = Problem | 'too-long';

export interface Damage {
  /** 1-based line number where the damage starts. */
  readonly line: number;
  /** Byte offset where that line starts. */
  readonly offset: number;
  readonly problem: ScanProblem;
  /** What is wrong, in words, naming the line. */
  readonly message: string;
}

export interface LogScan {
  /** Events of the valid prefix, in order (empty when they were streamed to `onEvent` instead). */
  readonly events: readonly ParsedEvent[];
  /** Number of valid lines. */
  readonly lines: number;
  /** Length in bytes of the valid prefix. */
  readonly goodBytes: number;
  readonly totalBytes: number;
  /** Hash of the last valid line ("" when there is none). */
  readonly lastHash: string;
  /** The keymap recorded in line 1, when line 1 is valid. */
  readonly keymap: Keymap | null;
  /** Damage confined to the end of the file, which can be cut off safely. */
  readonly tail: Damage | null;
  /** Damage followed by good data, or an unreadable first line: never repaired automatically. */
  readonly corruption: Damage | null;
}

type LineCheck = { ok: true; event: ParsedEvent; hash: string; keymap?: Keymap } | { ok: false; problem: Problem; message: string };

function checkLine(line: string, lineNo: number, prevHash: string, bytes?: Buffer): LineCheck {
  const bad = (problem: Problem, message: string): LineCheck => ({ ok: false, problem, message: `line ${lineNo} ${message}` });
  const hashes = lineHashes(line, bytes);
  if (!hashes && lineNo === 1 && !line.includes('"hash"')) {
    return bad('no-hash', 'is not an exine session line: this is not a session file, or its first line was replaced');
  }
  if (!hashes) return bad('no-hash', 'has no valid integrity field ("hash" at the end): it was edited or damaged');
  if (hashes.claimed !== hashes.actual) return bad('hash-mismatch', 'does not match its hash: its content was changed after it was written');
  let value: unknown;
  try {
    value = JSON.parse(line);
  } catch {
    return bad('not-json', 'is not valid JSON');
  }
  const record = value as Record<string, unknown>;
  if (typeof record !== 'object' || record === null || Array.isArray(record)) return bad('not-json', 'is not a JSON object');
  if (record.seq !== lineNo) {
    return bad('seq', `has seq ${JSON.stringify(record.seq)} where ${lineNo} was expected: a line was deleted, inserted or moved`);
  }
  if (record.prev !== prevHash) {
    return bad('chain', 'does not chain to the line before it: lines were reordered, removed or taken from another session');
  }
  const content = checkEventContent(record, lineNo);
  if (!content.ok) return bad(content.problem, content.message);
  return { ok: true, event: content.event, hash: hashes.actual, ...(content.keymap ? { keymap: content.keymap } : {}) };
}

const PHYSICAL: ReadonlySet<ScanProblem> = new Set(['no-hash', 'hash-mismatch', 'not-json']);

/** What the reader holds at once. Injectable so a test can reach the limits without writing a gigabyte. */
export interface ScanLimits {
  /** Longest line read, in bytes: far above any line exine writes (a keymap of thousands of types in line 1). */
  readonly maxLineBytes: number;
  /** Bytes read from the source at a time; a longer line grows the block up to maxLineBytes. */
  readonly blockBytes: number;
}

// One block and one line are held at a time, never the whole file, and never a string near V8's limit.
export const SCAN_LIMITS: ScanLimits = { maxLineBytes: 16 * 1024 * 1024, blockBytes: 1024 * 1024 };

const mib = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MiB`;

/** Whether every byte from `from` to the end is NUL (a power cut pads a file with them). */
function allNul(source: ByteSource, from: number, to: number, blockBytes: number): boolean {
  const block = Buffer.allocUnsafe(Math.min(blockBytes, Math.max(1, to - from)));
  for (let pos = from; pos < to; ) {
    const n = source.read(block, 0, Math.min(block.length, to - pos), pos);
    if (n === 0) return true;
    for (let i = 0; i < n; i++) if (block[i] !== 0) return false;
    pos += n;
  }
  return true;
}

/**
 * Read a session file: validate every line and the chain, and classify any
 * damage. With `onEvent`, valid events are handed over one by one and not
 * kept, which spares the garbage collector on a long session. The source is
 * read block by block and decoded line by line, so a file of any size reads
 * holding one block and one line, and no giant string.
 */
export function scanLog(
  input: ByteSource | Buffer,
  onEvent?: (event: ParsedEvent, keymap: Keymap) => void,
  limits: Partial<ScanLimits> = SCAN_LIMITS,
): LogScan {
  const source = Buffer.isBuffer(input) ? bufferSource(input) : input;
  const maxLineBytes = limits.maxLineBytes ?? SCAN_LIMITS.maxLineBytes;
  const blockBytes = Math.max(1, limits.blockBytes ?? SCAN_LIMITS.blockBytes);
  const events: ParsedEvent[] = [];
  let keymap: Keymap | null = null;
  let lastHash = '';
  const refs = new References();
  // A file that shrinks while it is read ends where the reading found its end.
  let size = source.size;
  let bytePos = 0;
  let lineNo = 0;
  let valid = 0;
  const result = (tail: Damage | null, corruption: Damage | null): LogScan => ({
    events,
    lines: valid,
    goodBytes: bytePos,
    totalBytes: size,
    lastHash,
    keymap,
    tail,
    corruption,
  });
  if (size === 0) {
    return result(null, { line: 1, offset: 0, problem: 'empty', message: 'the file is empty: it holds no level (an older exine stopped while creating it); delete it and count the level again' });
  }
  const unfinished = (): LogScan => {
    const damage: Damage = allNul(source, bytePos, size, blockBytes)
      ? { line: lineNo, offset: bytePos, problem: 'nul-padding', message: `NUL bytes after line ${lineNo - 1} (typical of a power cut)` }
      : { line: lineNo, offset: bytePos, problem: 'torn', message: `line ${lineNo} is incomplete (the program stopped while writing it)` };
    return lineNo === 1 ? result(null, { ...damage, message: `${damage.message}; the level was never created` }) : result(damage, null);
  };
  const tooLong = (): LogScan =>
    result(null, {
      line: lineNo,
      offset: bytePos,
      problem: 'too-long',
      message: `line ${lineNo} is longer than ${mib(maxLineBytes)}, far more than any line exine writes: this is not a session file exine can read`,
    });

  // The block holds file bytes [blockPos, blockPos + view.length); lines are found in `view`.
  let block = Buffer.allocUnsafe(Math.min(blockBytes, size));
  let view = block.subarray(0, 0);
  let blockPos = 0;
  // Pure ASCII decodes faster as latin1 (the same characters) and hashes as fast from its text.
  let ascii = true;
  /** Keep the unread rest of the block, read more after it; false at the end of the source. */
  const readMore = (): boolean => {
    const keep = blockPos + view.length - bytePos;
    if (bytePos + keep >= size) return false;
    if (keep === block.length) {
      // A line longer than the block: grow it, never past the longest line read (and its newline).
      const grown = Buffer.allocUnsafe(Math.min(Math.max(block.length * 2, 1), maxLineBytes + 1, size - bytePos));
      block.copy(grown, 0, bytePos - blockPos, bytePos - blockPos + keep);
      block = grown;
    } else if (keep > 0) {
      block.copy(block, 0, bytePos - blockPos, bytePos - blockPos + keep);
    }
    const n = source.read(block, keep, Math.min(block.length - keep, size - bytePos - keep), bytePos + keep);
    if (n === 0) size = bytePos + keep;
    blockPos = bytePos;
    view = block.subarray(0, keep + n);
    ascii = isAscii(view);
    return n > 0;
  };

  while (bytePos < size) {
    lineNo++;
    let searched = bytePos;
    let nl = view.indexOf(10, searched - blockPos);
    while (nl === -1) {
      searched = blockPos + view.length;
      if (searched - bytePos > maxLineBytes) return allNul(source, bytePos, size, blockBytes) ? unfinished() : tooLong();
      if (!readMore()) return unfinished();
      nl = view.indexOf(10, searched - blockPos);
    }
    const from = bytePos - blockPos;
    if (nl - from > maxLineBytes) return tooLong();
    // A newline byte is never part of a multi-byte character, so lines decode alone.
    // Valid UTF-8 that is not ASCII is hashed from its bytes; other bytes decode as U+FFFD and fail the hash.
    const bytes = ascii ? undefined : view.subarray(from, nl);
    const utf8 = bytes === undefined || isUtf8(bytes);
    const line = view.toString(bytes === undefined ? 'latin1' : 'utf8', from, nl);
    const end = blockPos + nl;
    let check = checkLine(line, lineNo, lastHash, utf8 ? bytes : undefined);
    if (!check.ok && check.problem === 'hash-mismatch' && !utf8) {
      check = { ok: false, problem: 'hash-mismatch', message: `line ${lineNo} is not valid UTF-8: its bytes were changed after it was written` };
    }
    if (!check.ok) {
      const damage: Damage = { line: lineNo, offset: bytePos, problem: check.problem, message: check.message };
      // Only physical damage of the very last line is cut off: a line whose own hash holds was
      // written whole, so a wrong seq or chain there is an edit, not a crash.
      const repairable = lineNo > 1 && PHYSICAL.has(check.problem) && allNul(source, end + 1, size, blockBytes);
      return repairable ? result(damage, null) : result(null, damage);
    }
    const dangling = refs.check(check.event);
    if (dangling) return result(null, { line: lineNo, offset: bytePos, problem: 'bad-reference', message: `line ${lineNo} ${dangling}` });
    if (check.keymap) keymap = check.keymap;
    valid++;
    if (onEvent) onEvent(check.event, keymap as Keymap);
    else events.push(check.event);
    lastHash = check.hash;
    bytePos = end + 1;
  }
  return result(null, null);
}
