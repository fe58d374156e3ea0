/**
 * Random-access bytes of a session file: a file read in blocks, or bytes
 * already in memory. The reader never needs the whole file at once.
 */
export interface ByteSource {
  /** Bytes the source holds (for a file, its size when it was opened). */
  readonly size: number;
  /** Copy up to `length` bytes at `position` into `into` at `offset`; the number copied, 0 at the end. */
  read(into: Buffer, offset: number, length: number, position: number): number;
}

export function bufferSource(bytes: Buffer): ByteSource {
  return {
    size: bytes.length,
    read: (into, offset, length, position) => bytes.copy(into, offset, position, Math.min(bytes.length, position + length)),
  };
}

/** A source that is an open file: another thread of this process can read it through `fd`. */
export interface FileSource extends ByteSource {
  readonly fd: number;
}
