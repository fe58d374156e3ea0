/** The built-in groups, in the order tables and exports list them. */
export const GROUPS = [
  'trees',
  'shrubs',
  'herbs',
  'spores',
  'aquatics',
  'markers',
  'indeterminable',
  'other',
] as const;

export type BuiltInGroup = (typeof GROUPS)[number];

/** A group's name: a built-in one or one the keymap defines. */
export type Group = string;

/**
 * What a group's grains are for. `sum`: in the pollen sum; `outside`: a percent
 * of the sum plus the group; `marker`: exotic marker grains (concentration);
 * `indeterminable`: grains that cannot be named (reported, never in the sum).
 */
export const ROLES = ['sum', 'outside', 'marker', 'indeterminable'] as const;
export type GroupRole = (typeof ROLES)[number];

export interface GroupDef {
  readonly name: Group;
  readonly role: GroupRole;
}

/** Terrestrial pollen: the usual pollen sum (common practice; conventions vary by study). */
export const DEFAULT_SUM: readonly BuiltInGroup[] = ['trees', 'shrubs', 'herbs'];

/** The role a built-in group has when the keymap says nothing of it. */
export const BUILT_IN_ROLE: Readonly<Record<BuiltInGroup, GroupRole>> = {
  trees: 'sum',
  shrubs: 'sum',
  herbs: 'sum',
  spores: 'outside',
  aquatics: 'outside',
  markers: 'marker',
  indeterminable: 'indeterminable',
  other: 'outside',
};

/** A group of the keymap's own is listed after this built-in group, by its role. */
const PLACE_AFTER: Readonly<Record<GroupRole, BuiltInGroup>> = {
  sum: 'herbs',
  outside: 'aquatics',
  marker: 'markers',
  indeterminable: 'indeterminable',
};

export function isBuiltInGroup(value: string): value is BuiltInGroup {
  return (GROUPS as readonly string[]).includes(value);
}

export function isRole(value: string): value is GroupRole {
  return (ROLES as readonly string[]).includes(value);
}

/**
 * Every group of a keymap in table order: the built-in ones (with the roles
 * given), each followed by the keymap's own groups of the role placed there,
 * in the order the file lists them.
 */
export function orderGroups(builtInRoles: Readonly<Record<BuiltInGroup, GroupRole>>, own: readonly GroupDef[]): GroupDef[] {
  const out: GroupDef[] = [];
  for (const name of GROUPS) {
    out.push({ name, role: builtInRoles[name] });
    for (const g of own) if (PLACE_AFTER[g.role] === name) out.push(g);
  }
  return out;
}

/** The built-in groups with their usual roles: what a keymap without "groups" or "sum" has. */
export const DEFAULT_GROUPS: readonly GroupDef[] = orderGroups(BUILT_IN_ROLE, []);

/** Roles whose first grain is a discovery worth a bell: pollen and spore types, not markers or indeterminables. */
export function isTypeRole(role: GroupRole): boolean {
  return role === 'sum' || role === 'outside';
}
