/** The groups a taxon can belong to, in the order tables and exports list them. */
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

export type Group = (typeof GROUPS)[number];

/** Terrestrial pollen: the usual pollen sum (common practice; conventions vary by study). */
export const DEFAULT_SUM: readonly Group[] = ['trees', 'shrubs', 'herbs'];

export function isGroup(value: string): value is Group {
  return (GROUPS as readonly string[]).includes(value);
}

export function groupRank(group: Group): number {
  return GROUPS.indexOf(group);
}

/** Groups whose first grain is a discovery worth a bell: pollen and spores, not markers, indeterminables or charcoal. */
export function isTypeGroup(group: Group): boolean {
  return group !== 'markers' && group !== 'indeterminable' && group !== 'other';
}
