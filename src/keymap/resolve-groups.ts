import { hasUnseen, visible } from '../text/visible.js';
import {
  BUILT_IN_ROLE,
  DEFAULT_SUM,
  GROUPS,
  ROLES,
  isBuiltInGroup,
  isRole,
  orderGroups,
  type BuiltInGroup,
  type GroupDef,
  type GroupRole,
} from './groups.js';
import { hint } from './nearest-name.js';

export type GroupsResult = { ok: true; groups: GroupDef[] } | { ok: false; message: string };

const MAX_GROUP_NAME = 40;

/** A copy in a session file writes its groups as a list, whole and in order. */
function fromCopy(list: readonly unknown[]): GroupsResult {
  const groups: GroupDef[] = [];
  for (const g of list) {
    const def = g as { name?: unknown; role?: unknown } | null;
    if (typeof def?.name !== 'string' || typeof def.role !== 'string' || !isRole(def.role)) {
      return { ok: false, message: '"groups" holds an entry that is not {name, role}' };
    }
    if (!groups.some((x) => x.name === def.name)) groups.push({ name: def.name, role: def.role });
  }
  return { ok: true, groups };
}

/**
 * The keymap's groups with their roles, from "groups" (name → role) and the
 * older "sum" (the groups in the pollen sum). `strict` for a file a person
 * made: markers or indeterminables inside the sum are refused.
 */
export function resolveGroups(given: unknown, sum: readonly string[] | undefined, strict: boolean): GroupsResult {
  const fail = (message: string): GroupsResult => ({ ok: false, message });
  // A copy (in a session file or core.json) writes the list; a person writes name → role (parseKeymap holds to that).
  if (Array.isArray(given)) {
    const copy = fromCopy(given);
    return copy.ok ? judged(copy.groups, strict) : copy;
  }
  const roles: Record<BuiltInGroup, GroupRole> = { ...BUILT_IN_ROLE };
  const own: GroupDef[] = [];
  const stated = new Map<string, GroupRole>();
  if (given !== undefined) {
    if (given === null || typeof given !== 'object') return fail('"groups" must be an object of group name → role (sum, outside, marker, indeterminable)');
    for (const [rawName, role] of Object.entries(given as Record<string, unknown>)) {
      const name = rawName.trim();
      if (!name) return fail('"groups" has a group with an empty name');
      if (hasUnseen(name) || name.includes(',')) return fail(`group "${visible(name)}" has a comma or an invisible character in its name; type the name plainly`);
      if ([...name].length > MAX_GROUP_NAME) return fail(`group "${name}" has a name longer than ${MAX_GROUP_NAME} characters`);
      if (typeof role !== 'string' || !isRole(role)) {
        return fail(`group "${name}" has role ${JSON.stringify(role)} (expected one of ${ROLES.join(', ')})${typeof role === 'string' ? hint(role, ROLES) : ''}`);
      }
      stated.set(name, role);
      if (isBuiltInGroup(name)) roles[name] = role;
      else own.push({ name, role });
    }
  }
  if (sum !== undefined) {
    const known = [...GROUPS, ...own.map((g) => g.name)];
    const inSum = new Set<string>();
    for (const name of sum) {
      if (!known.includes(name)) return fail(`"sum" lists unknown group "${name}" (expected one of ${known.join(', ')})${hint(name, known)}`);
      const said = stated.get(name);
      if (said === 'marker' || said === 'indeterminable') return fail(`"sum" lists group "${name}", which holds ${said === 'marker' ? 'exotic markers' : 'indeterminable grains'} (role ${said}): those are never in the pollen sum; take it out of "sum"`);
      if (said !== undefined && said !== 'sum') return fail(`"sum" lists group "${name}", which "groups" gives the role ${said}; keep one`);
      inSum.add(name);
    }
    if (inSum.size === 0) return fail('"sum" is empty; list the groups of the pollen sum');
    for (const name of GROUPS) {
      if (stated.has(name)) {
        if (stated.get(name) === 'sum' && !inSum.has(name)) return fail(`group "${name}" has the role sum in "groups" but "sum" leaves it out; keep one`);
        continue;
      }
      if (inSum.has(name)) roles[name] = 'sum';
      else if (roles[name] === 'sum') roles[name] = 'outside';
    }
    for (const g of own) if (inSum.has(g.name)) (g as { role: GroupRole }).role = 'sum';
  }
  return judged(orderGroups(roles, own), strict);
}

/** Markers or indeterminables inside the sum are refused (in a person's keymap); some group must be in the sum. */
function judged(groups: GroupDef[], strict: boolean): GroupsResult {
  const fail = (message: string): GroupsResult => ({ ok: false, message });
  const wrong = groups.find((g) => g.role === 'sum' && (BUILT_IN_ROLE[g.name as BuiltInGroup] === 'marker' || BUILT_IN_ROLE[g.name as BuiltInGroup] === 'indeterminable'));
  if (wrong && strict) {
    const what = wrong.name === 'markers' ? 'exotic marker grains' : 'indeterminable grains';
    return fail(`"${wrong.name}" are ${what} and cannot be in the pollen sum; take "${wrong.name}" out of "sum"`);
  }
  if (!groups.some((g) => g.role === 'sum')) return fail(`no group is in the pollen sum; give at least one group the role sum (default ${DEFAULT_SUM.join(', ')})`);
  return { ok: true, groups };
}
