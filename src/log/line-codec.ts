import { hash } from 'node:crypto';
import type { EventPayload, SessionEvent, Stamp } from '../model/events.js';

// Every line ends with this field; the hash covers the line's own bytes before it,
// and those bytes include "prev", the previous line's hash.
const HASH_PREFIX = ',"hash":"';
const HASH_HEX = 64;
export const HASH_SUFFIX_BYTES = HASH_PREFIX.length + HASH_HEX + 2;

/** One-shot SHA-256 (crypto.hash): about 3x faster per line than a Hash object, which matters at resume. */
export function sha256Hex(data: string | Buffer): string {
  return hash('sha256', data, 'hex');
}

/** Serialise one event as a session line (without the newline) and return its hash. */
export function encodeLine(payload: EventPayload, stamp: Stamp, prev: string): { line: string; hash: string } {
  const { type, ...fields } = payload;
  const head = JSON.stringify({ seq: stamp.seq, at: stamp.at, type, ...fields, prev }).slice(0, -1);
  const digest = sha256Hex(head);
  return { line: `${head}${HASH_PREFIX}${digest}"}`, hash: digest };
}

/**
 * The hash a line claims and the hash of its bytes, or null when the line does
 * not end with a hash field. Takes the line as decoded text: a line of valid
 * UTF-8 encodes back to exactly the bytes written, and invalid bytes (decoded
 * as U+FFFD) can only make the hash fail, never pass. `bytes`, when given, are the line's
 * own bytes, known to be valid UTF-8: hashing them spares encoding the text again.
 * With `claimedOnly`, the claimed hash stands for both, not computed: for a
 * reader whose every hash is checked elsewhere.
 */
export function lineHashes(line: string, bytes?: Buffer, claimedOnly = false): { claimed: string; actual: string } | null {
  const n = line.length;
  if (n < HASH_SUFFIX_BYTES + 2) return null;
  const start = n - HASH_SUFFIX_BYTES;
  if (!line.startsWith(HASH_PREFIX, start) || !line.endsWith('"}')) return null;
  // A claimed value that is not hex simply fails to match the computed one.
  // The suffix is ASCII, so it is as many bytes as characters.
  const claimed = line.slice(start + HASH_PREFIX.length, n - 2);
  if (claimedOnly) return { claimed, actual: claimed };
  const head = bytes ? bytes.subarray(0, bytes.length - HASH_SUFFIX_BYTES) : line.slice(0, start);
  return { claimed, actual: sha256Hex(head) };
}
