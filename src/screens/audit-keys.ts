import type { TraverseRow } from '../audit/level-audit.js';
import type { KeyPress } from '../input/key-press.js';
import { editLine } from '../input/line-edit.js';
import type { RestorePayload, SessionEvent, VoidPayload } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';

export type Focus = 'traverses' | 'grains';

/** A correction waiting for its reason. */
export interface Asking {
  readonly payload: Omit<VoidPayload, 'reason'> | Omit<RestorePayload, 'reason'>;
  readonly prompt: string;
}

/** Everything the audit screen shows besides the file itself: a plain value, changed key by key. */
export interface AuditUi {
  readonly selected: number;
  readonly focus: Focus;
  readonly grainIndex: number;
  readonly overview: boolean;
  readonly asking: Asking | null;
  /** The reason typed so far, while asking. */
  readonly reason: string;
  /** A correction with its reason, for the screen to record. */
  readonly pending: VoidPayload | RestorePayload | null;
  readonly message: string | null;
  readonly quit: boolean;
}

export const START_UI: AuditUi = { selected: 0, focus: 'traverses', grainIndex: 0, overview: false, asking: null, reason: '', pending: null, message: null, quit: false };

/**
 * A key while the reason is being typed: a one-line editor of our own, because
 * a reason and its Enter typed fast arrive as one chunk ("slipped\r"), which a
 * text-input component takes as text.
 */
function reasonKey(ui: AuditUi & { asking: Asking }, key: KeyPress): AuditUi {
  // Tab has no place in a one-line reason; Ctrl-C cancels the reason, not the audit.
  if (key.kind === 'tab') return ui;
  const next = editLine(ui.reason, key);
  if (next === 'cancel' || next === 'quit') return { ...ui, asking: null, reason: '', message: 'cancelled: nothing recorded' };
  if (next !== 'enter') return { ...ui, reason: next, message: key.kind === 'char' ? null : ui.message };
  const reason = ui.reason.trim();
  if (!reason) return { ...ui, message: 'a correction needs a reason; type one, or Esc to cancel' };
  return { ...ui, asking: null, reason: '', pending: { ...ui.asking.payload, reason } as VoidPayload | RestorePayload };
}

/** What the keys act on: the traverses and what counts now. */
export interface AuditView {
  readonly traverses: readonly TraverseRow[];
  readonly state: LevelState;
  /** What became of a grain ("undone", "VOIDED by #12", "double press?"), or "". */
  readonly statusOf: (e: SessionEvent) => string;
  /** Whether grain `seq` counts now (not undone, not voided). */
  readonly counts: (seq: number) => boolean;
}

/** The events listed under a traverse: its grains, undos, notes and the corrections aimed at it. */
export function eventsOf(t: TraverseRow | undefined): readonly SessionEvent[] {
  return t?.events ?? [];
}

/** The void standing on this one grain alone, if any. */
function singleVoidOf(state: LevelState, seq: number): number | null {
  for (const [v, grains] of Object.entries(state.voids)) if (grains.length === 1 && grains[0]?.seq === seq) return Number(v);
  return null;
}

const clamp = (v: number, max: number) => Math.max(0, Math.min(max, v));

/**
 * One key on the audit screen. Several keys can arrive before a render, so each
 * is applied to the result of the one before.
 */
export function auditKey(ui: AuditUi, key: KeyPress, view: AuditView): AuditUi {
  if (ui.asking) return reasonKey({ ...ui, asking: ui.asking }, key);
  const next = { ...ui, message: null };
  const traverse = view.traverses[clamp(ui.selected, view.traverses.length - 1)];
  const listed = eventsOf(traverse);
  const picked = listed[clamp(ui.grainIndex, listed.length - 1)];
  const grain = picked?.type === 'grain' ? picked : undefined;
  switch (key.kind) {
    case 'interrupt':
    case 'escape':
      return { ...next, quit: true };
    case 'tab':
    case 'left':
    case 'right':
      return { ...next, focus: ui.focus === 'traverses' ? 'grains' : 'traverses', grainIndex: 0 };
    case 'up':
    case 'down': {
      const step = key.kind === 'up' ? -1 : 1;
      return ui.focus === 'traverses'
        ? { ...next, selected: clamp(ui.selected + step, view.traverses.length - 1), grainIndex: 0 }
        : { ...next, grainIndex: clamp(ui.grainIndex + step, listed.length - 1) };
    }
    case 'char':
      break;
    default:
      return next;
  }
  switch (key.char) {
    case 'q':
      return { ...next, quit: true };
    case 'f':
      return { ...next, overview: !ui.overview };
    case 'v': {
      if (!traverse) return next;
      if (ui.focus === 'traverses') {
        if (traverse.voidedWhole) return { ...next, message: `traverse ${traverse.traverse} is voided already (r restores it)` };
        if (traverse.grains === 0) return { ...next, message: `traverse ${traverse.traverse} has no grain that counts` };
        return { ...next, asking: { payload: { type: 'void', grain: null, traverse: traverse.traverse }, prompt: `Void all ${traverse.grains} grains of traverse ${traverse.traverse}. Reason: ` } };
      }
      if (!grain) return { ...next, message: 'select a grain to void (or Tab back to the traverses to void a whole one)' };
      if (!view.counts(grain.seq)) return { ...next, message: `grain #${grain.seq} does not count now (${view.statusOf(grain)})` };
      return { ...next, asking: { payload: { type: 'void', grain: grain.seq, traverse: null }, prompt: `Void grain #${grain.seq} (${grain.taxon}). Reason: ` } };
    }
    case 'r': {
      if (!traverse) return next;
      const single = ui.focus === 'grains' && grain ? singleVoidOf(view.state, grain.seq) : null;
      if (single !== null && grain) return { ...next, asking: { payload: { type: 'restore', of: single }, prompt: `Restore grain #${grain.seq} (void #${single}). Reason: ` } };
      if (traverse.voidedWhole) {
        return { ...next, asking: { payload: { type: 'restore', of: traverse.voidedWhole.seq }, prompt: `Restore traverse ${traverse.traverse} (void #${traverse.voidedWhole.seq}). Reason: ` } };
      }
      return { ...next, message: 'nothing voided here to restore' };
    }
    default:
      return next;
  }
}
