import { isAscii, isUtf8 } from 'node:buffer';
import type { Keymap } from '../keymap/keymap.js';
import { checkEventContent, References, type Problem } from './check-event.js';
import type { ParsedEvent } from './event-schema.js';
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
}

// One line is decoded at a time, never more than maxLineBytes: far below V8's string limit.
export const SCAN_LIMITS: ScanLimits = { maxLineBytes: 16 * 1024 * 1024 };

const mib = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MiB`;

function allNul(buf: Buffer, from: number): boolean {
  for (let i = from; i < buf.length; i++) if (buf[i] !== 0) return false;
  return true;
}

/**
 * Read a whole session file's bytes: validate every line and the chain, and
 * classify any damage. With `onEvent`, valid events are handed over one by one
 * and not kept, which spares the garbage collector on a long session. The bytes
 * are decoded line by line, so a file of any size reads without one giant string
 * and is held once.
 */
export function scanLog(buf: Buffer, onEvent?: (event: ParsedEvent, keymap: Keymap) => void, limits: ScanLimits = SCAN_LIMITS): LogScan {
  const events: ParsedEvent[] = [];
  let keymap: Keymap | null = null;
  let lastHash = '';
  const refs = new References();
  // Decode one line at a time rather than the whole file, so the file is held once (as bytes).
  // A newline byte is never part of a multi-byte character, so the lines are the same either way.
  // Pure ASCII decodes faster as latin1 (the same characters); valid UTF-8 is hashed from its bytes.
  const ascii = isAscii(buf);
  const utf8 = ascii || isUtf8(buf);
  const encoding = ascii ? 'latin1' : 'utf8';
  let bytePos = 0;
  let lineNo = 0;
  let valid = 0;
  const result = (tail: Damage | null, corruption: Damage | null): LogScan => ({
    events,
    lines: valid,
    goodBytes: bytePos,
    totalBytes: buf.length,
    lastHash,
    keymap,
    tail,
    corruption,
  });
  if (buf.length === 0) {
    return result(null, { line: 1, offset: 0, problem: 'empty', message: 'the file is empty: it holds no level (an older exine stopped while creating it); delete it and count the level again' });
  }
  const unfinished = (): LogScan => {
    const damage: Damage = allNul(buf, bytePos)
      ? { line: lineNo, offset: bytePos, problem: 'nul-padding', message: `NUL bytes after line ${lineNo - 1} (typical of a power cut)` }
      : { line: lineNo, offset: bytePos, problem: 'torn', message: `line ${lineNo} is incomplete (the program stopped while writing it)` };
    return lineNo === 1 ? result(null, { ...damage, message: `${damage.message}; the level was never created` }) : result(damage, null);
  };
  const tooLong = (): LogScan =>
    result(null, {
      line: lineNo,
      offset: bytePos,
      problem: 'too-long',
      message: `line ${lineNo} is longer than ${mib(limits.maxLineBytes)}, far more than any line exine writes: this is not a session file exine can read`,
    });
  while (bytePos < buf.length) {
    lineNo++;
    const nl = buf.indexOf(10, bytePos);
    if (nl === -1) return buf.length - bytePos > limits.maxLineBytes && !allNul(buf, bytePos) ? tooLong() : unfinished();
    if (nl - bytePos > limits.maxLineBytes) return tooLong();
    const line = buf.toString(encoding, bytePos, nl);
    // ASCII text hashes as fast as its bytes, without a Buffer view per line; other UTF-8 from its bytes.
    let check = checkLine(line, lineNo, lastHash, utf8 && !ascii ? buf.subarray(bytePos, nl) : undefined);
    // Bytes that are not UTF-8 decode as U+FFFD and so fail the hash: say what they are.
    if (!check.ok && check.problem === 'hash-mismatch' && !utf8 && line.includes('\uFFFD')) {
      check = { ok: false, problem: 'hash-mismatch', message: `line ${lineNo} is not valid UTF-8: its bytes were changed after it was written` };
    }
    if (!check.ok) {
      const damage: Damage = { line: lineNo, offset: bytePos, problem: check.problem, message: check.message };
      // Only physical damage of the very last line is cut off: a line whose own hash holds was
      // written whole, so a wrong seq or chain there is an edit, not a crash.
      const repairable = lineNo > 1 && allNul(buf, nl + 1) && PHYSICAL.has(check.problem);
      return repairable ? result(damage, null) : result(null, damage);
    }
    const dangling = refs.check(check.event);
    if (dangling) return result(null, { line: lineNo, offset: bytePos, problem: 'bad-reference', message: `line ${lineNo} ${dangling}` });
    if (check.keymap) keymap = check.keymap;
    valid++;
    if (onEvent) onEvent(check.event, keymap as Keymap);
    else events.push(check.event);
    lastHash = check.hash;
    bytePos = nl + 1;
  }
  return result(null, null);
}
