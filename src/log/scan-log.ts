import { isUtf8 } from 'node:buffer';
import type { Keymap } from '../keymap/keymap.js';
import { checkEventContent, References, type Problem } from './check-event.js';
import type { ParsedEvent } from './event-schema.js';
import { bufferSource, type ByteSource } from '../io/byte-source.js';
import { lineHashes } from './line-codec.js';
import { LineReader, SCAN_LIMITS, type ScanLimits } from './line-reader.js';

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

const badLine = (lineNo: number, problem: Problem, message: string): LineCheck => ({ ok: false, problem, message: `line ${lineNo} ${message}` });

function checkLine(line: string, lineNo: number, prevHash: string, bytes: Buffer | undefined, claimed: boolean): LineCheck {
  const bad = (problem: Problem, message: string) => badLine(lineNo, problem, message);
  const hashes = lineHashes(line, bytes, claimed);
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
  return content.keymap ? { ok: true, event: content.event, hash: hashes.actual, keymap: content.keymap } : { ok: true, event: content.event, hash: hashes.actual };
}

const PHYSICAL: ReadonlySet<ScanProblem> = new Set(['no-hash', 'hash-mismatch', 'not-json']);

export { SCAN_LIMITS, type ScanLimits } from './line-reader.js';

const mib = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MiB`;

/** How the reader goes about it. */
export interface ScanOptions {
  /**
   * Take each line's claimed hash as its hash without computing it: only for a
   * caller that checks every hash itself (see parallel-scan.ts) and reads again
   * in full when that check finds a line this scan relied on.
   */
  readonly claimedHashes?: boolean;
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
  options: ScanOptions = {},
): LogScan {
  const source = Buffer.isBuffer(input) ? bufferSource(input) : input;
  const maxLineBytes = limits.maxLineBytes ?? SCAN_LIMITS.maxLineBytes;
  const reader = new LineReader(source, maxLineBytes, Math.max(1, limits.blockBytes ?? SCAN_LIMITS.blockBytes));
  const trust = options.claimedHashes === true;
  const events: ParsedEvent[] = [];
  let keymap: Keymap | null = null;
  let lastHash = '';
  const refs = new References();
  let lineNo = 0;
  let valid = 0;
  const result = (tail: Damage | null, corruption: Damage | null): LogScan => ({
    events,
    lines: valid,
    goodBytes: reader.offset,
    totalBytes: reader.size,
    lastHash,
    keymap,
    tail,
    corruption,
  });
  if (source.size === 0) {
    return result(null, { line: 1, offset: 0, problem: 'empty', message: 'the file is empty: it holds no level (an older exine stopped while creating it); delete it and count the level again' });
  }
  for (;;) {
    const found = reader.next();
    if (found === 'end') return result(null, null);
    lineNo++;
    const offset = reader.offset;
    if (found === 'unfinished') {
      const damage: Damage = reader.allNul(offset)
        ? { line: lineNo, offset, problem: 'nul-padding', message: `NUL bytes after line ${lineNo - 1} (typical of a power cut)` }
        : { line: lineNo, offset, problem: 'torn', message: `line ${lineNo} is incomplete (the program stopped while writing it)` };
      return lineNo === 1 ? result(null, { ...damage, message: `${damage.message}; the level was never created` }) : result(damage, null);
    }
    if (found === 'too-long') {
      const message = `line ${lineNo} is longer than ${mib(maxLineBytes)}, far more than any line exine writes: this is not a session file exine can read`;
      return result(null, { line: lineNo, offset, problem: 'too-long', message });
    }
    // Valid UTF-8 that is not ASCII is hashed from its bytes; other bytes decode as U+FFFD and fail the hash.
    const bytes = reader.ascii ? undefined : reader.bytes();
    const utf8 = bytes === undefined || isUtf8(bytes);
    let check = checkLine(reader.text(), lineNo, lastHash, utf8 ? bytes : undefined, trust);
    if (!check.ok && check.problem === 'hash-mismatch' && !utf8) {
      check = { ok: false, problem: 'hash-mismatch', message: `line ${lineNo} is not valid UTF-8: its bytes were changed after it was written` };
    }
    if (!check.ok) {
      const damage: Damage = { line: lineNo, offset, problem: check.problem, message: check.message };
      // Only physical damage of the very last line is cut off: a line whose own hash holds was
      // written whole, so a wrong seq or chain there is an edit, not a crash.
      const repairable = lineNo > 1 && PHYSICAL.has(check.problem) && reader.allNul(reader.end);
      return repairable ? result(damage, null) : result(null, damage);
    }
    const dangling = refs.check(check.event);
    if (dangling) return result(null, { line: lineNo, offset, problem: 'bad-reference', message: `line ${lineNo} ${dangling}` });
    if (check.keymap) keymap = check.keymap;
    valid++;
    if (onEvent) onEvent(check.event, keymap as Keymap);
    else events.push(check.event);
    lastHash = check.hash;
  }
}
