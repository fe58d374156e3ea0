/** What is wrong with the stored preferences object, in words naming the field, or null when it is good. */
export function storedPrefProblem(value: unknown): string | null {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return 'the file must hold one JSON object';
  const v = value as Record<string, unknown>;
  const has = (name: string) => Object.hasOwn(v, name);
  const shown = (x: unknown) => (typeof x === 'string' ? JSON.stringify(x.length > 20 ? `${x.slice(0, 20)}…` : x) : JSON.stringify(x) ?? String(x));
  const wholeIn = (x: unknown, lo: number, hi: number) => Number.isSafeInteger(x) && (x as number) >= lo && (x as number) <= hi;
  if (has('bell') && typeof v.bell !== 'boolean') return `"bell" must be true or false, not ${shown(v.bell)}`;
  if (has('rare') && !wholeIn(v.rare, 1, 100)) return `"rare" must be a whole number from 1 to 100, not ${shown(v.rare)}`;
  if (has('break') && v.break !== null && !wholeIn(v.break, 1, 600)) return `"break" must be a whole number from 1 to 600 or null, not ${shown(v.break)}`;
  if (has('keymap') && !(typeof v.keymap === 'string' && v.keymap.length > 0)) return `"keymap" must be a name or a path, not ${shown(v.keymap)}`;
  if (has('analyst') && v.analyst !== null && typeof v.analyst !== 'string') return `"analyst" must be a text or null, not ${shown(v.analyst)}`;
  return null;
}
