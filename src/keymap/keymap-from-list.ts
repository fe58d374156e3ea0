import { visible } from '../text/visible.js';
import { assignKeys, type Assigned } from './assign-keys.js';
import { emptyKeymapText, setGroup, setKey } from './edit-keymap-text.js';
import { BUILT_IN_ROLE, GROUPS, isBuiltInGroup, type GroupRole } from './groups.js';
import { DEFAULT_ACTIONS } from './keymap.js';
import type { ListEntry } from './list-file.js';
import { nearestName } from './nearest-name.js';
import { parseKeymap } from './parse-keymap.js';

export type FromListResult =
  | { ok: true; text: string; report: string[] }
  | { ok: false; message: string };

/**
 * A group as a lab's list writes it: "herb" or "Spores" is the built-in group
 * (its name in any case, or its start), not a group of its own that would
 * silently leave the pollen sum. A near miss ("tres") with no role given is
 * refused with the name meant.
 */
function builtInGroupOf(e: ListEntry, source: string): { ok: true; group: string } | { ok: false; message: string } {
  if (isBuiltInGroup(e.group) || e.role !== null) return { ok: true, group: e.group };
  const lower = e.group.toLowerCase();
  const same = GROUPS.find((g) => g === lower || (lower.length >= 3 && g.startsWith(lower)));
  if (same) return { ok: true, group: same };
  const near = nearestName(e.group, GROUPS);
  if (near) {
    return { ok: false, message: `${source}: line ${e.line}: group "${visible(e.group)}" is not a built-in group; did you mean "${near}"? For a group of your own, give its role in a third column (sum, outside, marker, indeterminable)` };
  }
  return { ok: true, group: e.group };
}

/** The keymap file for a taxon list, and a report of which taxon got which key and why. */
/** `source` names the keymap made; `listSource` the list, whose lines the messages name. */
export function keymapFromList(given: readonly ListEntry[], name: string, source: string, listSource = source): FromListResult {
  const entries: ListEntry[] = [];
  const readAs = new Map<string, string>();
  for (const e of given) {
    const g = builtInGroupOf(e, listSource);
    if (!g.ok) return g;
    if (g.group !== e.group) readAs.set(e.group, `group "${visible(e.group)}" read as the built-in group ${g.group}`);
    entries.push({ ...e, group: g.group });
  }
  const roles = new Map<string, { role: GroupRole; said: boolean }>();
  for (const e of entries) {
    const had = roles.get(e.group);
    if (e.role && had?.said && had.role !== e.role) {
      return { ok: false, message: `${listSource}: line ${e.line}: group "${visible(e.group)}" is given role ${e.role} here and ${had.role} before; keep one` };
    }
    if (!had || (e.role && !had.said)) {
      const role = e.role ?? (isBuiltInGroup(e.group) ? BUILT_IN_ROLE[e.group] : 'outside');
      roles.set(e.group, { role, said: e.role !== null });
    }
  }
  const reserved = new Set(Object.values(DEFAULT_ACTIONS).filter((k) => k.length === 1));
  const keys = assignKeys(entries.map((e) => e.taxon), reserved);
  if (!keys.ok) return { ok: false, message: `${source}: ${keys.message}` };
  let text = emptyKeymapText(name);
  const report: string[] = [...readAs.values()];
  for (const [group, { role, said }] of roles) {
    const builtIn = isBuiltInGroup(group);
    if (builtIn && role === BUILT_IN_ROLE[group]) continue;
    text = setGroup(text, group, role);
    report.push(`group ${group}: ${role}${said ? '' : ' (a group of your own with no role given: outside the sum; give a role in a third column to change it)'}`);
  }
  keys.assigned.forEach((a: Assigned, i) => {
    const e = entries[i] as ListEntry;
    text = setKey(text, a.key, { taxon: e.taxon, group: e.group });
    report.push(`${a.key}  ${visible(e.taxon)} (${visible(e.group)}): ${a.why}`);
  });
  const check = parseKeymap(text, source);
  if (!check.ok) return { ok: false, message: check.message };
  return { ok: true, text, report };
}
