import type { EventType } from './events.js';

/**
 * What each kind of event is to the story of a level. The fold, `verify` and the
 * audit all read this one table, so they agree on which events are counting, which
 * are corrections made later, and whether the last sitting closed.
 */
export type EventRole =
  /** Line 1: the level is created. */
  | 'header'
  /** A sitting starts (creation or a resume). */
  | 'sitting'
  /** Done at the eyepiece, inside a sitting. */
  | 'counting'
  /** A sitting ends cleanly. */
  | 'closing'
  /** Made later in the audit, outside any sitting; counting time does not include it. */
  | 'correction'
  /** The stop rules' verdict, staged right behind the event that brought it: it takes that event's part. */
  | 'verdict';

export const EVENT_ROLES: { readonly [K in EventType]: EventRole } = {
  open: 'header',
  sitting: 'sitting',
  grain: 'counting',
  undo: 'counting',
  traverse: 'counting',
  'traverse-undo': 'counting',
  reopen: 'counting',
  note: 'counting',
  taxon: 'counting',
  rules: 'counting',
  repair: 'counting',
  slide: 'counting',
  close: 'closing',
  finish: 'closing',
  void: 'correction',
  restore: 'correction',
  'rules-met': 'verdict',
  'rules-unmet': 'verdict',
};

export const roleOf = (type: EventType): EventRole => EVENT_ROLES[type];

/**
 * Whether the last sitting is closed after an event of this kind: a close or finish
 * closes it, counting or a new sitting opens it, and a correction or a verdict
 * leaves it as it was (a correction after a clean quit is no unclean sitting).
 */
export function closedAfter(closedBefore: boolean, type: EventType): boolean {
  switch (roleOf(type)) {
    case 'closing':
      return true;
    case 'correction':
    case 'verdict':
      return closedBefore;
    default:
      return false;
  }
}

/** Is this event part of a correction (the correction itself, or the verdict it brought)? */
export function correctingAfter(correctingBefore: boolean, type: EventType): boolean {
  const role = roleOf(type);
  return role === 'correction' || (role === 'verdict' && correctingBefore);
}
