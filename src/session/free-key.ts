import type { Keymap } from '../keymap/keymap.js';

// Keys a new type may take, in order: capitals first (the bundled letter keymap leaves them free), then digits and signs.
const CANDIDATES = [...'ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789!"#$%&\'()*/:;<>@[]^_`{|}~'];

/** The first key bound to neither a taxon nor an action, or null when none is left. */
export function nextFreeKey(keymap: Keymap): string | null {
  const used = new Set([...Object.keys(keymap.keys), ...Object.values(keymap.actions).filter((k): k is string => k !== null)]);
  return CANDIDATES.find((k) => !used.has(k)) ?? null;
}
