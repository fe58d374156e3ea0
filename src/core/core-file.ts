import { findNodeAtLocation, parseTree, type Node } from 'jsonc-parser';
import { lineOf, parseStrictJson } from '../keymap/json-source.js';
import { hasMarkerKey, type Keymap } from '../keymap/keymap.js';
import { checkKeymapValue } from '../keymap/parse-keymap.js';
import { normalRules, type RuleSet } from '../rules/rule-set.js';
import { hasUnseen, visible } from '../text/visible.js';
import { describeIssue } from '../validation/describe-issue.js';
import { coreSchemaModule } from './deferred-core-schema.js';
import { nearestName } from './nearest-name.js';

/** The file that makes a folder a core. */
export const CORE_FILE = 'core.json';
export const CORE_FORMAT = 1;

/** The marker tablets of one batch: how many go into each sample, and the batch's count per tablet. */
export interface MarkerBatch {
  readonly tablets: number;
  readonly perTablet: number;
  readonly perTabletSd: number | null;
}

/** Taxa the analyst adds up for the overview and the export (e.g. "Arboreal pollen"). */
export interface SummaryGroup {
  readonly name: string;
  readonly taxa: readonly string[];
}

export interface CoreConfig {
  readonly format: number;
  readonly site: string;
  readonly core: string;
  readonly keymap: Keymap;
  readonly rules: RuleSet;
  readonly markerBatch: MarkerBatch | null;
  /** Planned depths, ascending; empty when none are planned. */
  readonly depths: readonly number[];
  /** Old or variant name → the name it is exported under. */
  readonly synonyms: Readonly<Record<string, string>>;
  readonly summaryGroups: readonly SummaryGroup[];
}

export type CoreResult = { ok: true; config: CoreConfig } | { ok: false; message: string };

/** The fields each object of core.json may hold, by its path ("" is the top). */
const FIELDS: Readonly<Record<string, readonly string[]>> = {
  '': ['format', 'site', 'core', 'keymap', 'rules', 'markerBatch', 'depths', 'synonyms', 'summaryGroups'],
  rules: ['targetSum', 'precision', 'coverage', 'plateau', 'markers', 'concError', 'mode', 'minSum'],
  'rules.precision': ['halfWidth', 'share', 'taxa'],
  markerBatch: ['tablets', 'perTablet', 'perTabletSd'],
  'summaryGroups.*': ['name', 'taxa'],
};

/** Names people write for a field, from the flags of exine count and plain words. */
const ALIASES: Readonly<Record<string, string>> = {
  target: 'targetSum',
  sum: 'targetSum',
  'min-sum': 'minSum',
  'conc-error': 'concError',
  'rule-mode': 'mode',
  batch: 'markerBatch',
  spike: 'markerBatch',
  'per-tablet': 'perTablet',
  'per-tablet-sd': 'perTabletSd',
  sd: 'perTabletSd',
  groups: 'summaryGroups',
  synonym: 'synonyms',
  depth: 'depths',
  planned: 'depths',
  width: 'halfWidth',
};

/** The line of the value at `path`, or of the nearest enclosing value that exists. */
function lineAt(text: string, root: Node | undefined, path: readonly (string | number)[]): number {
  if (!root) return 1;
  for (let n = path.length; n >= 0; n--) {
    const node = findNodeAtLocation(root, path.slice(0, n) as (string | number)[]);
    // A property's own line is where its name is, which is where a person looks.
    if (node) return lineOf(text, node.parent?.type === 'property' ? node.parent.offset : node.offset);
  }
  return 1;
}

/** The first field no object of core.json knows, with its path. */
function unknownField(value: unknown): { path: (string | number)[]; field: string; hint: string | null } | null {
  const walk = (v: unknown, path: (string | number)[], pattern: string): ReturnType<typeof unknownField> => {
    if (typeof v !== 'object' || v === null) return null;
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        const found = walk(v[i], [...path, i], `${pattern}${pattern ? '.' : ''}*`);
        if (found) return found;
      }
      return null;
    }
    const known = FIELDS[pattern];
    if (!known) return null;
    for (const [field, inner] of Object.entries(v)) {
      if (!known.includes(field)) return { path, field, hint: nearestName(field, known, ALIASES) };
      const found = walk(inner, [...path, field], `${pattern}${pattern ? '.' : ''}${field}`);
      if (found) return found;
    }
    return null;
  };
  return walk(value, [], '');
}

function cleanDepths(depths: readonly number[]): { ok: true; depths: number[] } | { ok: false; index: number; message: string } {
  const seen = new Map<number, number>();
  for (const [i, d] of depths.entries()) {
    const before = seen.get(d);
    if (before !== undefined) return { ok: false, index: i, message: `depth ${d} is planned twice (items ${before + 1} and ${i + 1}); keep one` };
    seen.set(d, i);
  }
  return { ok: true, depths: [...depths].sort((a, b) => a - b) };
}

/** Parse and check the text of a core.json. `source` names the file in every message. */
export function parseCoreFile(text: string, source: string): CoreResult {
  const fail = (line: number, message: string): CoreResult => ({ ok: false, message: `${source}: line ${line}: ${message}` });
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const json = parseStrictJson(body);
  if (!json.ok) return { ok: false, message: `${source}: ${json.message}` };
  const root = parseTree(body);
  const dup = json.duplicates[0];
  if (dup) return fail(dup.line, `field "${[...dup.path, dup.name].join('.')}" appears twice (lines ${dup.firstLine} and ${dup.line}); keep one`);
  if (typeof json.value !== 'object' || json.value === null || Array.isArray(json.value)) return fail(1, 'core.json holds one object: { "site": …, "core": …, "keymap": …, "rules": … }');

  const unknown = unknownField(json.value);
  if (unknown) {
    const where = [...unknown.path, unknown.field].join('.');
    const line = lineAt(body, root, [...unknown.path, unknown.field]);
    return fail(line, `"${visible(where)}" is not a field of core.json${unknown.hint ? ` (did you mean "${[...unknown.path, unknown.hint].join('.')}"?)` : ''}`);
  }
  const parsed = coreSchemaModule().coreShape.safeParse(json.value, { reportInput: true });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return fail(lineAt(body, root, (issue?.path ?? []) as (string | number)[]), describeIssue(issue));
  }
  const raw = parsed.data;
  for (const field of ['site', 'core'] as const) {
    if (hasUnseen(raw[field])) return fail(lineAt(body, root, [field]), `"${field}" has a control or invisible character ("${visible(raw[field])}"); type it plainly`);
  }
  // core.json holds a copy as exine writes it (groups as a list), checked as strictly as a person's file.
  const keymap = checkKeymapValue(raw.keymap, 'in core.json', true);
  if (!keymap.ok) return fail(lineAt(body, root, ['keymap']), keymap.message);

  const r = raw.rules;
  // A precision rule without named taxa holds every taxon of 5% or more, as on the command line.
  const rules: RuleSet = normalRules({
    ...r,
    precision: r.precision ? { halfWidth: r.precision.halfWidth, share: r.precision.taxa ? null : (r.precision.share ?? 5), taxa: r.precision.taxa ?? null } : null,
  });
  const ruleLine = (field: string) => lineAt(body, root, ['rules', field]);
  if (r.precision?.share != null && r.precision.taxa) return fail(ruleLine('precision'), '"rules.precision" gives "share" and "taxa"; keep one');
  const { mode: _m, minSum: _s, ...each } = rules;
  if (Object.values(each).every((v) => v === null)) return fail(lineAt(body, root, ['rules']), '"rules" holds no stop rule; give at least one of targetSum, precision, coverage, plateau, markers, concError');
  const taxa = new Set(Object.values(keymap.keymap.keys).map((b) => b.taxon));
  const stranger = rules.precision?.taxa?.find((t) => !taxa.has(t));
  if (stranger) return fail(ruleLine('precision'), `"rules.precision.taxa" names "${visible(stranger)}", which is not a taxon of the keymap`);
  if ((rules.markers !== null || rules.concError !== null) && !hasMarkerKey(keymap.keymap)) {
    return fail(ruleLine(rules.markers !== null ? 'markers' : 'concError'), `marker rules need a key for the markers group, and keymap "${keymap.keymap.name}" has none`);
  }
  if (rules.concError !== null && !raw.markerBatch) return fail(ruleLine('concError'), '"rules.concError" needs "markerBatch" (the tablets, and the count per tablet of their batch)');

  const depths = cleanDepths(raw.depths ?? []);
  if (!depths.ok) return fail(lineAt(body, root, ['depths', depths.index]), depths.message);

  const synonyms = raw.synonyms ?? {};
  for (const [from, to] of Object.entries(synonyms)) {
    const line = lineAt(body, root, ['synonyms', from]);
    if (hasUnseen(from) || hasUnseen(to)) return fail(line, `synonym "${visible(from)}" has a control or invisible character; type it plainly`);
    if (from === to) return fail(line, `synonym "${from}" names itself; leave it out`);
    if (synonyms[to] !== undefined) return fail(line, `synonym "${from}" → "${to}", but "${to}" is itself merged into "${synonyms[to]}"; point "${from}" at "${synonyms[to]}"`);
  }
  const groups = raw.summaryGroups ?? [];
  const groupNames = new Map<string, number>();
  for (const [i, g] of groups.entries()) {
    const line = lineAt(body, root, ['summaryGroups', i, 'name']);
    if (hasUnseen(g.name)) return fail(line, `summary group "${visible(g.name)}" has a control or invisible character; type it plainly`);
    const before = groupNames.get(g.name);
    if (before !== undefined) return fail(line, `summary group "${g.name}" is defined twice (items ${before + 1} and ${i + 1}); keep one`);
    groupNames.set(g.name, i);
    const twice = g.taxa.find((t, k) => g.taxa.indexOf(t) !== k);
    if (twice) return fail(line, `summary group "${g.name}" lists "${twice}" twice; keep one`);
  }
  const batch = raw.markerBatch;
  return {
    ok: true,
    config: {
      format: CORE_FORMAT,
      site: raw.site.trim(),
      core: raw.core.trim(),
      keymap: keymap.keymap,
      rules,
      markerBatch: batch ? { tablets: batch.tablets, perTablet: batch.perTablet, perTabletSd: batch.perTabletSd ?? null } : null,
      depths: depths.depths,
      synonyms,
      summaryGroups: groups.map((g) => ({ name: g.name.trim(), taxa: g.taxa.map((t) => t.trim()) })),
    },
  };
}

/** core.json as exine writes it: every field present, two-space indents, so it reads and edits by hand. */
export function coreFileText(config: CoreConfig): string {
  const { format, site, core, keymap, rules, markerBatch, depths, synonyms, summaryGroups } = config;
  return `${JSON.stringify({ format, site, core, keymap, rules, markerBatch, depths, synonyms, summaryGroups }, null, 2)}\n`;
}
