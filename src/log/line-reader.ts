import { isAscii } from 'node:buffer';
import type { ByteSource } from '../io/byte-source.js';

/** What the reader holds at once. Injectable so a test can reach the limits without writing a gigabyte. */
export interface ScanLimits {
  /** Longest line read, in bytes: far above any line exine writes (a keymap of thousands of types in line 1). */
  readonly maxLineBytes: number;
  /** Bytes read from the source at a time; a longer line grows the block up to maxLineBytes. */
  readonly blockBytes: number;
}

// One block and one line are held at a time, never the whole file, and never a string near V8's limit.
export const SCAN_LIMITS: ScanLimits = { maxLineBytes: 16 * 1024 * 1024, blockBytes: 1024 * 1024 };

/** What `next()` found: a whole line, the end, a last line with no newline, or a line past the limit. */
export type LineStep = 'line' | 'end' | 'unfinished' | 'too-long';

/**
 * The lines of a source, read a block at a time: the reader holds one block,
 * grown only for a line longer than it, never past the longest line read.
 * A newline byte is never part of a multi-byte character, so lines decode alone.
 */
export class LineReader {
  /** After 'line': the line's bytes are view[from, to), without its newline. */
  view: Buffer;
  from = 0;
  to = 0;
  /** Whether the block the line is in is pure ASCII (then latin1 decodes it, faster and the same). */
  ascii = true;
  /** File offset where the line found by the last next() starts. */
  offset = 0;
  /** Bytes of the source; smaller than it said when it ended early (a file cut while read). */
  size: number;
  private block: Buffer;
  private blockPos = 0;
  private nextPos = 0;

  constructor(
    private readonly source: ByteSource,
    private readonly maxLineBytes: number,
    private readonly blockBytes: number,
  ) {
    this.size = source.size;
    this.block = Buffer.allocUnsafe(Math.max(1, Math.min(blockBytes, this.size)));
    this.view = this.block.subarray(0, 0);
  }

  next(): LineStep {
    const start = (this.offset = this.nextPos);
    if (start >= this.size) return 'end';
    let searched = start;
    let nl = this.view.indexOf(10, searched - this.blockPos);
    while (nl === -1) {
      searched = this.blockPos + this.view.length;
      if (searched - start > this.maxLineBytes) return this.allNul(start) ? 'unfinished' : 'too-long';
      if (!this.readMore()) return 'unfinished';
      nl = this.view.indexOf(10, searched - this.blockPos);
    }
    this.from = start - this.blockPos;
    if (nl - this.from > this.maxLineBytes) return 'too-long';
    this.to = nl;
    this.nextPos = this.blockPos + nl + 1;
    return 'line';
  }

  /** The line's text: latin1 in an ASCII block, else UTF-8 (invalid bytes become U+FFFD). */
  text(): string {
    return this.view.toString(this.ascii ? 'latin1' : 'utf8', this.from, this.to);
  }

  bytes(): Buffer {
    return this.view.subarray(this.from, this.to);
  }

  /** File offset just past the line's newline. */
  get end(): number {
    return this.nextPos;
  }

  /** Whether every byte from `from` to the end is NUL (a power cut pads a file with them). */
  allNul(from: number): boolean {
    const scratch = Buffer.allocUnsafe(Math.max(1, Math.min(this.blockBytes, this.size - from)));
    for (let pos = from; pos < this.size; ) {
      const n = this.source.read(scratch, 0, Math.min(scratch.length, this.size - pos), pos);
      if (n === 0) return true;
      for (let i = 0; i < n; i++) if (scratch[i] !== 0) return false;
      pos += n;
    }
    return true;
  }

  /** Keep the unread rest of the block, read more after it; false at the end of the source. */
  private readMore(): boolean {
    const start = this.nextPos;
    const keep = this.blockPos + this.view.length - start;
    if (start + keep >= this.size) return false;
    const at = start - this.blockPos;
    if (keep === this.block.length) {
      // A line longer than the block: grow it, never past the longest line read (and its newline).
      const grown = Buffer.allocUnsafe(Math.min(this.block.length * 2, this.maxLineBytes + 1, this.size - start));
      this.block.copy(grown, 0, at, at + keep);
      this.block = grown;
    } else if (keep > 0) {
      this.block.copy(this.block, 0, at, at + keep);
    }
    const n = this.source.read(this.block, keep, Math.min(this.block.length - keep, this.size - start - keep), start + keep);
    if (n === 0) this.size = start + keep;
    this.blockPos = start;
    this.view = this.block.subarray(0, keep + n);
    this.ascii = isAscii(this.view);
    return n > 0;
  }
}
