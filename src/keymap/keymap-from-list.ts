import { visible } from '../text/visible.js';
import { assignKeys, type Assigned } from './assign-keys.js';
import { emptyKeymapText, setGroup, setKey } from './edit-keymap-text.js';
import { BUILT_IN_ROLE, isBuiltInGroup, type GroupRole } from './groups.js';
import { DEFAULT_ACTIONS } from './keymap.js';
import type { ListEntry } from './list-file.js';
import { parseKeymap } from './parse-keymap.js';

export type FromListResult =
  | { ok: true; text: string; report: string[] }
  | { ok: false; message: string };

/** The keymap file for a taxon list, and a report of which taxon got which key and why. */
export function keymapFromList(entries: readonly ListEntry[], name: string, source: string): FromListResult {
  const roles = new Map<string, { role: GroupRole; said: boolean }>();
  for (const e of entries) {
    const had = roles.get(e.group);
    if (e.role && had?.said && had.role !== e.role) {
      return { ok: false, message: `${source}: line ${e.line}: group "${visible(e.group)}" is given role ${e.role} here and ${had.role} before; keep one` };
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
  const report: string[] = [];
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
