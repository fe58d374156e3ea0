import { randomBytes } from 'node:crypto';
import * as fs from 'node:fs';
import { dirname } from 'node:path';
import { ExineError } from '../errors.js';
import { plainIoError } from '../io/describe-io-error.js';
import { fsyncDir } from '../io/fsync-dir.js';
import type { EventPayload, SessionEvent } from '../model/events.js';
import { checkEventContent } from './check-event.js';
import { encodeLine } from './line-codec.js';
import { SCAN_LIMITS } from './scan-log.js';
import { recordUnconfirmed } from './unconfirmed.js';
import type { SessionLock } from './session-lock.js';

/** The file operations the writer uses; tests swap in ones that fail like a full disk. */
export interface WriterFs {
  writeSync(fd: number, buffer: Buffer, offset: number, length: number): number;
  fsyncSync(fd: number): void;
  ftruncateSync(fd: number, len: number): void;
}

export const nodeWriterFs: WriterFs = {
  writeSync: (fd, buffer, offset, length) => fs.writeSync(fd, buffer, offset, length),
  fsyncSync: (fd) => fs.fsyncSync(fd),
  ftruncateSync: (fd, len) => fs.ftruncateSync(fd, len),
};

export type Clock = () => Date;

export interface WriterOptions {
  readonly ops?: WriterFs;
  readonly clock?: Clock;
}

/** Why an event was not recorded. The session's state must not move. */
export class AppendError extends ExineError {
  constructor(
    message: string,
    readonly readOnlyNow: boolean,
  ) {
    super(message);
  }
}

/**
 * Appends events to one session file: one write of the whole line, then fsync,
 * and only then does the caller see the event. Holds the file's lock.
 */
export class SessionWriter {
  private readOnlyReason: string | null = null;
  private closed = false;
  /** False while line 1 is written under its temporary name: a failure then leaves no level at all. */
  private inPlace = true;

  private constructor(
    readonly path: string,
    private readonly fd: number,
    private size: number,
    private seq: number,
    private lastHash: string,
    private readonly lock: SessionLock,
    private readonly ops: WriterFs,
    private readonly clock: Clock,
  ) {}

  /**
   * Create a new session file (never an existing one) and write its first line.
   * Line 1 is written and synced under a name of its own, then linked into place:
   * the level exists whole or not at all, whenever the process is stopped.
   */
  static create(path: string, open: EventPayload, lock: SessionLock, options: WriterOptions = {}): { writer: SessionWriter; event: SessionEvent } {
    const temp = `${path}.new-${randomBytes(6).toString('hex')}`;
    let fd: number;
    try {
      fd = fs.openSync(temp, 'wx');
    } catch (error) {
      throw new ExineError(`cannot create ${path}: ${describe(error)}`);
    }
    const writer = new SessionWriter(path, fd, 0, 0, '', lock, options.ops ?? nodeWriterFs, options.clock ?? (() => new Date()));
    writer.inPlace = false;
    let linked = false;
    try {
      const event = writer.append(open);
      try {
        fs.linkSync(temp, path);
      } catch (error) {
        const code = (error as NodeJS.ErrnoException).code;
        throw new ExineError(code === 'EEXIST' ? `${path} already exists` : `cannot create ${path}: ${describe(error)}`);
      }
      linked = true;
      writer.inPlace = true;
      fsyncDir(dirname(path));
      return { writer, event };
    } catch (error) {
      writer.close();
      throw error;
    } finally {
      fs.rmSync(temp, { force: true });
      if (!linked) fsyncDir(dirname(path));
    }
  }

  /** Continue an existing, verified session file whose valid content is `size` bytes. */
  static resume(path: string, size: number, lastSeq: number, lastHash: string, lock: SessionLock, options: WriterOptions = {}): SessionWriter {
    const fd = fs.openSync(path, 'a');
    return new SessionWriter(path, fd, size, lastSeq, lastHash, lock, options.ops ?? nodeWriterFs, options.clock ?? (() => new Date()));
  }

  get readOnly(): string | null {
    return this.readOnlyReason;
  }

  get lastSeq(): number {
    return this.seq;
  }

  /** Append one event durably and return it as written. Throws AppendError and records nothing on failure. */
  append(payload: EventPayload): SessionEvent {
    return this.appendAll([payload])[0] as SessionEvent;
  }

  /**
   * Append several events with one write and one fsync (a burst of keys): all of
   * them are on disk when this returns, or, on failure, none is recorded.
   */
  appendAll(payloads: readonly EventPayload[]): SessionEvent[] {
    if (this.closed) throw new AppendError('the session is closed', true);
    if (this.readOnlyReason) throw new AppendError(`the session is read-only: ${this.readOnlyReason}`, true);
    const at = this.clock().toISOString();
    const events: SessionEvent[] = [];
    const lines: string[] = [];
    let hash = this.lastHash;
    for (const payload of payloads) {
      const stamp = { seq: this.seq + events.length + 1, at };
      const encoded = encodeLine(payload, stamp, hash);
      // The reader's own check, before anything is written: a line exine writes is a line exine can read.
      const check = checkEventContent(JSON.parse(encoded.line) as Record<string, unknown>, stamp.seq);
      if (!check.ok) {
        throw new AppendError(`not recorded: the ${payload.type} event would not read back (line ${stamp.seq} ${check.message}); nothing was written`, false);
      }
      if (Buffer.byteLength(encoded.line) > SCAN_LIMITS.maxLineBytes) {
        throw new AppendError(`not recorded: the ${payload.type} event would be a line longer than the reader reads (${SCAN_LIMITS.maxLineBytes} bytes); nothing was written`, false);
      }
      hash = encoded.hash;
      lines.push(`${encoded.line}\n`);
      events.push({ ...payload, ...stamp } as SessionEvent);
    }
    const bytes = Buffer.from(lines.length === 1 ? (lines[0] as string) : lines.join(''), 'utf8');
    let written = 0;
    try {
      while (written < bytes.length) written += this.ops.writeSync(this.fd, bytes, written, bytes.length - written);
    } catch (error) {
      this.cutBack();
      const what = payloads.length === 1 ? 'nothing was counted' : `none of those ${payloads.length} keys was counted`;
      throw new AppendError(`not recorded: writing ${this.path} failed (${describe(error)}); ${what}`, this.readOnlyReason !== null);
    }
    try {
      this.ops.fsyncSync(this.fd);
    } catch (error) {
      // A failed fsync is never retried: the kernel may have dropped the data it reported on.
      this.readOnlyReason = `syncing ${this.path} to disk failed (${describe(error)})`;
      const after = this.disown(events, error);
      throw new AppendError(`not confirmed on disk: ${this.readOnlyReason}; ${after}; the session is now read-only`, true);
    }
    this.size += bytes.length;
    this.seq += events.length;
    this.lastHash = hash;
    return events;
  }

  /**
   * The lines of a write whose sync failed were never shown as counted: cut them
   * back, and leave a marker so the next sitting checks that the cut held, or asks
   * the analyst about the lines that stayed.
   */
  private disown(events: readonly SessionEvent[], error: unknown): string {
    let cut = true;
    try {
      this.ops.ftruncateSync(this.fd, this.size);
    } catch {
      cut = false;
    }
    if (!this.inPlace) return 'the level was not created';
    const marked = recordUnconfirmed(this.path, {
      afterBytes: this.size,
      fromSeq: events[0]?.seq ?? this.seq + 1,
      toSeq: events.at(-1)?.seq ?? this.seq,
      at: new Date().toISOString(),
      reason: describe(error),
    });
    if (cut) return 'those keys were cut back from the file and counted nothing';
    return marked ? 'those keys could not be cut back: the next sitting names them and asks whether to keep them' : 'those keys could not be cut back, and no note of them could be written: check the last lines with exine audit';
  }

  private cutBack(): void {
    try {
      this.ops.ftruncateSync(this.fd, this.size);
    } catch (error) {
      this.readOnlyReason = `a failed write could not be cut back (${describe(error)})`;
    }
  }

  /** Close the file and release the lock. Safe to call twice. */
  close(): void {
    if (this.closed) return;
    this.closed = true;
    try {
      fs.closeSync(this.fd);
    } finally {
      this.lock.release();
    }
  }
}

function describe(error: unknown): string {
  const e = error as NodeJS.ErrnoException;
  return plainIoError(error) ?? e.code ?? e.message ?? String(error);
}
