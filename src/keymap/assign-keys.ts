/*
 * The key rule of `exine keys from-list`, meant to be predicted by a person:
 * 1. the taxon's initial (a–z, accents dropped), when free;
 * 2. else its second letter, when free;
 * 3. else the next free key after the initial: the letters after it in the
 *    alphabet (going round from z to a), then the digits 1–9 and 0, then
 *    ; , . / ' [ ] -, then the capitals A–Z.
 * Taxa are taken in the list's order; action keys are never taken.
 */

const LETTERS = [...'abcdefghijklmnopqrstuvwxyz'];
const AFTER_LETTERS = [...'1234567890', ...";,./'[]-", ...'ABCDEFGHIJKLMNOPQRSTUVWXYZ'];

export interface Assigned {
  readonly taxon: string;
  readonly key: string;
  readonly why: string;
}

export type AssignResult = { ok: true; assigned: Assigned[] } | { ok: false; taxon: string; message: string };

/** The letters of a name, lower case, accents dropped ("Æsculus" → "aesculus"). */
function lettersOf(name: string): string[] {
  return [...name.normalize('NFD').replace(/æ/gi, 'ae').replace(/œ/gi, 'oe').toLowerCase()].filter((c) => c >= 'a' && c <= 'z');
}

/** The keys rule 3 tries for a taxon with this initial, in order. */
export function candidatesAfter(initial: string | undefined): string[] {
  const start = initial === undefined ? 0 : LETTERS.indexOf(initial) + 1;
  return [...LETTERS.slice(start), ...LETTERS.slice(0, start), ...AFTER_LETTERS];
}

/** Keys for the taxa, in order, by the rule above; `reserved` holds the action keys (and any key already taken). */
export function assignKeys(taxa: readonly string[], reserved: ReadonlySet<string>): AssignResult {
  const holder = new Map<string, string>();
  const taken = (k: string) => reserved.has(k) || holder.has(k);
  const whose = (k: string) => (reserved.has(k) ? 'an action' : `${holder.get(k)}`);
  const assigned: Assigned[] = [];
  for (const taxon of taxa) {
    const [first, second] = lettersOf(taxon);
    let key: string | undefined;
    let why: string;
    if (first !== undefined && !taken(first)) {
      key = first;
      why = 'initial';
    } else if (second !== undefined && !taken(second)) {
      key = second;
      why = `second letter (${first} is ${whose(first as string)}'s)`;
    } else {
      key = candidatesAfter(first).find((k) => !taken(k));
      const busy = [first, second].filter((k): k is string => k !== undefined).map((k) => `${k} is ${whose(k)}'s`);
      why = first === undefined ? 'next free key (no letter in the name)' : `next free key after ${first} (${busy.join(', ')})`;
    }
    if (key === undefined) return { ok: false, taxon, message: `no free key left for ${taxon}: a keymap holds at most ${LETTERS.length + AFTER_LETTERS.length} taxa from a list` };
    holder.set(key, taxon);
    assigned.push({ taxon, key, why: why.replace(/an action's/g, 'an action key') });
  }
  return { ok: true, assigned };
}
