import { createHash } from 'node:crypto';
import type { EventPayload, SessionEvent, Stamp } from '../session/events.js';

// Every line ends with this field; the hash covers the line's own bytes before it
// (closed with "}"), and those bytes include "prev", the previous line's hash.
const HASH_PREFIX = ',"hash":"';
const HASH_HEX = 64;
export const HASH_SUFFIX_BYTES = HASH_PREFIX.length + HASH_HEX + 2;

export function sha256Hex(data: string | Buffer, tail = ''): string {
  const h = createHash('sha256').update(data);
  if (tail) h.update(tail);
  return h.digest('hex');
}

/** Serialise one event as a session line (without the newline) and return its hash. */
export function encodeLine(payload: EventPayload, stamp: Stamp, prev: string): { line: string; hash: string } {
  const { type, ...fields } = payload;
  const body = JSON.stringify({ seq: stamp.seq, at: stamp.at, type, ...fields, prev });
  const hash = sha256Hex(body);
  return { line: `${body.slice(0, -1)}${HASH_PREFIX}${hash}"}`, hash };
}

/**
 * The hash a line claims and the hash of its bytes, or null when the line
 * does not end with a well-formed hash field.
 */
export function lineHashes(line: Buffer): { claimed: string; actual: string } | null {
  const n = line.length;
  if (n < HASH_SUFFIX_BYTES + 2) return null;
  const start = n - HASH_SUFFIX_BYTES;
  if (line.toString('latin1', start, start + HASH_PREFIX.length) !== HASH_PREFIX) return null;
  if (line[n - 1] !== 0x7d || line[n - 2] !== 0x22) return null;
  const claimed = line.toString('latin1', start + HASH_PREFIX.length, n - 2);
  if (!/^[0-9a-f]{64}$/.test(claimed)) return null;
  return { claimed, actual: sha256Hex(line.subarray(0, start), '}') };
}

export type { SessionEvent };
