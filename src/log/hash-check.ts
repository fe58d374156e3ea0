import { isUtf8 } from 'node:buffer';
import type { ByteSource } from '../io/byte-source.js';
import { lineHashes } from './line-codec.js';
import { LineReader, SCAN_LIMITS, type ScanLimits } from './line-reader.js';

/**
 * The number of the first whole line whose hash the reader would find wrong
 * (it has a hash field, and its text does not give that hash),
 * or 0 when there is none. The same test as scanLog's, line for line, without
 * the rest of its checks, so it can run beside a scan that takes the hashes
 * as claimed.
 */
export function firstBadHash(source: ByteSource, limits: ScanLimits = SCAN_LIMITS): number {
  const reader = new LineReader(source, limits.maxLineBytes, limits.blockBytes);
  for (let lineNo = 1; reader.next() === 'line'; lineNo++) {
    const bytes = reader.ascii ? undefined : reader.bytes();
    const utf8 = bytes === undefined || isUtf8(bytes);
    const hashes = lineHashes(reader.text(), utf8 ? bytes : undefined);
    if (hashes && hashes.claimed !== hashes.actual) return lineNo;
  }
  return 0;
}
