/**
 * The file name of the level at `depth` in a core: the core's name in lower-case
 * letters and digits, the depth with at least three whole digits, and "cm", so a
 * folder listing sorts by depth and a person finds a level by hand:
 * core "KM-1" at 112 → km1-112cm.jsonl; at 4 → km1-004cm.jsonl; at 112.5 → km1-112.5cm.jsonl.
 */
export function levelFileName(core: string, depth: number): string {
  return `${coreSlug(core)}-${depthText(depth)}cm.jsonl`;
}

export function coreSlug(core: string): string {
  const slug = core
    .normalize('NFKD')
    .replace(/\p{M}/gu, '')
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '');
  return slug || 'core';
}

/** 4 → "004", 112.5 → "112.5": the number as written, whole part padded. */
export function depthText(depth: number): string {
  const [whole = '0', fraction] = String(depth).split('.');
  return fraction === undefined ? whole.padStart(3, '0') : `${whole.padStart(3, '0')}.${fraction}`;
}

/** The depth a derived file name gives (km1-112.5cm.jsonl → 112.5), for a file that cannot be read; else null. */
export function depthFromFileName(file: string): number | null {
  const m = /-(\d+(?:\.\d+)?)cm\.jsonl$/.exec(file);
  return m ? Number(m[1]) : null;
}
