import { hasUnseen, visible } from '../text/visible.js';
import { isRole, ROLES, type GroupRole } from './groups.js';

export interface ListEntry {
  readonly taxon: string;
  readonly group: string;
  /** The role given for the group on this line, if any (a third column). */
  readonly role: GroupRole | null;
  readonly line: number;
}

export type ListResult = { ok: true; entries: ListEntry[] } | { ok: false; message: string };

/** One CSV record's fields (RFC 4180 quotes; the list is one record a line). */
function fields(line: string, sep: string): string[] | null {
  const out: string[] = [];
  let i = 0;
  while (i <= line.length) {
    if (line[i] === '"') {
      let value = '';
      i++;
      for (;;) {
        if (i >= line.length) return null;
        if (line[i] === '"') {
          if (line[i + 1] === '"') {
            value += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        value += line[i++];
      }
      out.push(value.trim());
      while (i < line.length && line[i] !== sep) if (line[i++] !== ' ') return null;
      i++;
    } else {
      const end = line.indexOf(sep, i);
      const stop = end < 0 ? line.length : end;
      out.push(line.slice(i, stop).trim());
      i = stop + 1;
    }
  }
  return out;
}

/**
 * A lab's taxon list: one `taxon, group` a line (an optional third field gives
 * the group's role), or a CSV whose header names the columns `taxon` and
 * `group` (and `role`) in any order, separated by commas, semicolons or tabs.
 * Blank lines and lines starting `#` are skipped.
 */
export function parseTaxonList(text: string, source: string): ListResult {
  const fail = (line: number, message: string): ListResult => ({ ok: false, message: `${source}: line ${line}: ${message}` });
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  let columns = { taxon: 0, group: 1, role: 2 as number | null };
  let first = true;
  // A spreadsheet may save with tabs, or with semicolons where the comma is the decimal mark.
  const firstLine = lines.find((l) => l.trim() && !l.trimStart().startsWith('#')) ?? '';
  const sep = firstLine.includes('\t') ? '\t' : firstLine.includes(';') && !firstLine.includes(',') ? ';' : ',';
  const entries: ListEntry[] = [];
  const seen = new Map<string, number>();
  for (let n = 1; n <= lines.length; n++) {
    const raw = lines[n - 1] as string;
    if (!raw.trim() || raw.trimStart().startsWith('#')) continue;
    const f = fields(raw, sep);
    if (!f) return fail(n, 'a quote is not closed');
    if (first) {
      first = false;
      const lower = f.map((x) => x.toLowerCase());
      if (lower.includes('taxon') || lower.includes('group')) {
        const taxon = lower.indexOf('taxon');
        const group = lower.indexOf('group');
        if (taxon < 0 || group < 0) return fail(n, `the header needs both columns "taxon" and "group" (it has ${f.map((x) => `"${visible(x)}"`).join(', ')})`);
        const role = lower.indexOf('role');
        columns = { taxon, group, role: role < 0 ? null : role };
        continue;
      }
    }
    const taxon = f[columns.taxon] ?? '';
    const group = f[columns.group] ?? '';
    const roleText = columns.role === null ? '' : (f[columns.role] ?? '');
    if (!taxon) return fail(n, 'no taxon name (write "taxon, group")');
    if (!group) return fail(n, `${visible(taxon)} has no group (write "${visible(taxon)}, group")`);
    if (hasUnseen(taxon) || hasUnseen(group)) return fail(n, 'holds a control or invisible character; type the names plainly');
    if (roleText && !isRole(roleText)) return fail(n, `role "${visible(roleText)}" is not one of ${ROLES.join(', ')}`);
    const key = taxon.normalize('NFC');
    const before = seen.get(key);
    if (before !== undefined) return fail(n, `${visible(taxon)} is listed twice (lines ${before} and ${n}); keep one`);
    seen.set(key, n);
    entries.push({ taxon, group, role: roleText ? (roleText as GroupRole) : null, line: n });
  }
  if (!entries.length) return { ok: false, message: `${source}: no taxa in the list (one "taxon, group" a line)` };
  return { ok: true, entries };
}
