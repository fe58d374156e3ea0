// Writes the invented demo core into demo-sessions/: `node dist/demo/make-demo.js`.
// The site, the core and every count are made up.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { CORE_FILE, CORE_FORMAT, coreFileText, type CoreConfig } from '../core/core-file.js';
import { loadKeymap } from '../keymap/load-keymap.js';
import { bindingInSum, type Keymap } from '../keymap/keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { DEFAULT_RULES, NO_RULES, type RuleSet } from '../rules/rule-set.js';
import type { Spike } from '../stats/concentration.js';
import { FORMAT_VERSION, type EventPayload, type OpenEvent, type SessionEvent } from '../model/events.js';
import { applyEvent, initialState } from '../model/fold.js';
import type { LevelState } from '../model/level-state.js';
import { rulesSignal } from '../model/rules-signal.js';
import { pickWeighted, seededRandom } from './seeded-random.js';

interface DemoLevel {
  readonly file: string;
  readonly depth: number;
  readonly sum: number;
  readonly finished: boolean;
  readonly shares: Readonly<Record<string, number>>;
  readonly start: string;
  readonly rules?: RuleSet;
  /** Grains of one taxon gathered on some traverses (large grains drift to the edges of the cover slip). */
  readonly uneven?: { readonly taxon: string; readonly traverses: readonly number[]; readonly factor: number };
  /** Things an audit should find: a double press, an interruption, and corrections made days later. */
  readonly auditTrail?: boolean;
  /** A type the keymap does not have, added while counting at this pollen sum. */
  readonly added?: { readonly taxon: string; readonly group: 'trees' | 'shrubs' | 'herbs'; readonly atSum: number };
  /** The slide used up at the break between sittings: counting goes on on this one. */
  readonly secondSlide?: string;
  /** The flags that overrode core.json when the level was made (its own rules). */
  readonly overrides?: readonly string[];
}

// An invented marker batch; a real one comes with its own figures, entered by the analyst.
const SPIKE: Spike = { tablets: 1, perTablet: 12_500, perTabletSd: 420, volume: 1, mass: null, accumulationRate: 0.05 };

// Invented assemblages: an open birch-pine phase at depth, mixed oak forest above, clearance at the top.
const LEVELS: readonly DemoLevel[] = [
  { file: 'km1-012cm.jsonl', depth: 12, sum: 512, finished: true, start: '2026-10-05T08:40:00.000Z',
    shares: { Quercus: 9, Betula: 6, Alnus: 11, Pinus: 4, Corylus: 8, Calluna: 9, Poaceae: 24, Cyperaceae: 6, 'Plantago lanceolata': 8, Rumex: 4, Asteraceae: 3, Artemisia: 1, Pteridium: 5, Sphagnum: 3, 'Lycopodium (exotic marker)': 7, Indeterminable: 3, Charcoal: 4 } },
  { file: 'km1-036cm.jsonl', depth: 36, sum: 505, finished: true, start: '2026-10-06T09:05:00.000Z', auditTrail: true,
    shares: { Quercus: 18, Betula: 5, Alnus: 17, Ulmus: 2, Tilia: 3, Fraxinus: 3, Fagus: 1, Corylus: 16, Salix: 2, Calluna: 4, Hedera: 1, Poaceae: 12, Cyperaceae: 4, 'Plantago lanceolata': 3, Filipendula: 2, Pteridium: 3, Polypodium: 2, Nymphaea: 1, 'Lycopodium (exotic marker)': 8, 'Indet. corroded': 1.5, 'Indet. crumpled': 1, 'Indet. broken': 0.5 } },
  // A sparse level: its first slide was used up at the break, and the count went on on a second.
  { file: 'km1-060cm.jsonl', depth: 60, sum: 520, finished: true, start: '2026-10-07T08:30:00.000Z', secondSlide: 'KM1-060-B',
    shares: { Quercus: 22, Betula: 4, Alnus: 16, Ulmus: 7, Tilia: 6, Fraxinus: 3, Pinus: 3, Corylus: 22, Salix: 1, Hedera: 1, Poaceae: 6, Cyperaceae: 3, Filipendula: 1, Ranunculaceae: 1, Polypodium: 3, Nymphaea: 1, 'Lycopodium (exotic marker)': 9, Indeterminable: 2 } },
  // The half-counted level is counted to precision and coverage goals instead of a fixed sum.
  { file: 'km1-084cm.jsonl', depth: 84, sum: 236, finished: false, start: '2026-10-08T13:10:00.000Z',
    rules: { ...NO_RULES, precision: { halfWidth: 4, share: 10, taxa: null }, coverage: 0.98, markers: 40, minSum: 300 },
    overrides: ['precision', 'precision-share', 'coverage', 'markers', 'min-sum'],
    added: { taxon: 'Ilex aquifolium', group: 'shrubs', atSum: 150 },
    shares: { Quercus: 12, Betula: 12, Alnus: 6, Ulmus: 9, Pinus: 14, Corylus: 26, Salix: 3, Poaceae: 6, Cyperaceae: 3, Artemisia: 1, Filipendula: 2, Tilia: 0.6, Fraxinus: 0.4, Hedera: 0.3, Rumex: 0.4, Ranunculaceae: 0.3, Polypodium: 2, Pteridium: 1, 'Lycopodium (exotic marker)': 10, Indeterminable: 2 } },
  { file: 'km1-108cm.jsonl', depth: 108, sum: 501, finished: true, start: '2026-10-09T08:50:00.000Z', uneven: { taxon: 'Pinus', traverses: [1, 12], factor: 4 },
    shares: { Betula: 38, Pinus: 24, Salix: 6, Corylus: 3, Poaceae: 12, Cyperaceae: 8, Artemisia: 5, Amaranthaceae: 2, Rumex: 1, Sphagnum: 2, 'Lycopodium (exotic marker)': 12, 'Indet. corroded': 2, 'Indet. degraded': 1, 'Indet. concealed': 1 } },
  // Last in the list so the levels above keep their seeds. A slide mislabelled at the bench: pine, birch and steppe herbs between two levels of mixed oak forest. The core view flags it.
  { file: 'km1-048cm.jsonl', depth: 48, sum: 508, finished: true, start: '2026-10-10T09:00:00.000Z',
    shares: { Pinus: 44, Betula: 24, Artemisia: 9, Amaranthaceae: 5, Salix: 5, Cyperaceae: 5, Rumex: 2, Sphagnum: 2, 'Lycopodium (exotic marker)': 10, Indeterminable: 2 } },
];

function buildLevel(level: DemoLevel, keymap: Keymap, seed: number): string {
  const random = seededRandom(seed);
  const hex = (n: number) => Array.from({ length: n }, () => Math.floor(random() * 16).toString(16)).join('');
  const taxa = Object.entries(level.shares).filter(([, w]) => w > 0);
  const keyOf = new Map(Object.entries(keymap.keys).map(([k, b]) => [b.taxon, k]));
  const inSum = new Set(Object.values(keymap.keys).filter((b) => bindingInSum(keymap, b)).map((b) => b.taxon));
  let time = Date.parse(level.start);
  let seq = 0;
  let prev = '';
  const lines: string[] = [];
  let state: LevelState | null = null;
  const write = (payload: EventPayload, advanceMs = 0) => {
    time += advanceMs;
    const stamp = { seq: ++seq, at: new Date(time).toISOString() };
    const { line, hash } = encodeLine(payload, stamp, prev);
    prev = hash;
    lines.push(line);
    const event = { ...payload, ...stamp } as SessionEvent;
    state = state ? applyEvent(state, event) : initialState(event as OpenEvent, keymap);
    // The demo records the stop signal where a live count would have.
    if (payload.type === 'grain' || payload.type === 'undo' || payload.type === 'void' || payload.type === 'restore') {
      const signal = rulesSignal(state);
      if (signal) write(signal, 5);
    }
    return stamp.seq;
  };
  write({ type: 'open', format: FORMAT_VERSION, session: hex(32), level: `KM1-${level.depth}`, depth: level.depth, site: 'Kestrel Mere', core: 'KM-1', slide: `KM1-${String(level.depth).padStart(3, '0')}-A`, analyst: 'demo analyst', keymap, rules: level.rules ?? DEFAULT_RULES, spike: SPIKE, fromCore: { overrides: level.overrides ?? [] } });
  let sitting = 1;
  write({ type: 'sitting', sitting }, 50);
  let traverse = 1;
  let inTraverse = 0;
  let sum = 0;
  const traverseLength = () => 35 + Math.floor(random() * 30);
  let thisTraverse = traverseLength();
  const lastGrains: number[] = [];
  let doublePress = 0;
  const breakAt = level.finished ? Math.floor(level.sum * 0.55) : -1;
  while (sum < level.sum) {
    if (inTraverse >= thisTraverse) {
      traverse++;
      inTraverse = 0;
      thisTraverse = traverseLength();
      write({ type: 'traverse', traverse }, 20_000 + random() * 25_000);
    }
    if (sum === breakAt) {
      write({ type: 'close' }, 4_000);
      sitting++;
      write({ type: 'sitting', sitting }, 18 * 3600_000 + random() * 3600_000);
      if (level.secondSlide) {
        // No draw from the random stream here: the counts stay those of one slide; the traverses go on numbered.
        traverse++;
        write({ type: 'slide', slide: level.secondSlide, traverse }, 30_000);
      }
    }
    const u = level.uneven;
    const weights = taxa.map(([t, w]) => (u && t === u.taxon && u.traverses.includes(traverse) ? w * u.factor : w));
    const [taxon] = taxa[pickWeighted(random, weights)] as [string, number];
    const key = keyOf.get(taxon) as string;
    // The audit trail: an analyst called away for seven minutes in the middle of a traverse.
    const away = level.auditTrail && sum === 200 ? 7 * 60_000 : 0;
    const s = write({ type: 'grain', taxon, traverse, key }, away + 1_500 + random() * 5_000 + (random() < 0.03 ? 40_000 : 0));
    if (level.auditTrail && sum === 120) {
      // The same key twice in 60 ms: a double press that the audit flags and the analyst later voids.
      doublePress = write({ type: 'grain', taxon, traverse, key }, 60);
      lastGrains.push(s);
      if (inSum.has(taxon)) sum++;
      inTraverse++;
    }
    lastGrains.push(s);
    inTraverse++;
    if (inSum.has(taxon)) sum++;
    // A rare type's first grain gets a note with the stage position, so it can be found again.
    if (inSum.has(taxon) && (state as LevelState | null)?.firstSeen[taxon] === s && (level.shares[taxon] ?? 0) < 1) {
      const x = (5 + random() * 40).toFixed(1);
      const y = (80 + random() * 25).toFixed(1);
      write({ type: 'note', text: random() < 0.5 ? 'well preserved, photographed' : `cf. ${taxon}, check at 1000x`, grain: s, stage: { x: Number(x), y: Number(y) } }, 25_000);
    }
    if (level.added && sum === level.added.atSum) {
      const { taxon: name, group } = level.added;
      write({ type: 'taxon', taxon: name, group, key: 'A' }, 30_000);
      const g = write({ type: 'grain', taxon: name, traverse, key: 'A' }, 2_000);
      lastGrains.push(g);
      sum++;
      write({ type: 'note', text: 'not in the keymap; leaf-margin spines seen on a loose fragment nearby', grain: g, stage: { x: 21.7, y: 93.2 } }, 40_000);
    }
    if (random() < 0.012) {
      const of = lastGrains.pop() as number;
      write({ type: 'undo', of }, 900 + random() * 1_500);
      inTraverse--;
      if (inSum.has(taxon)) sum--;
    }
  }
  if (level.finished) write({ type: 'finish' }, 5_000);
  else write({ type: 'close' }, 5_000);
  if (level.auditTrail) {
    // Three days later, in the audit: corrections are new events; the grains stay in the file.
    write({ type: 'void', grain: doublePress, traverse: null, reason: 'double press: one grain, the key bounced' }, 3 * 24 * 3600_000);
    const slipped = write({ type: 'void', grain: null, traverse: 4, reason: 'stage slipped: traverse 4 went over part of traverse 3' }, 90_000);
    write({ type: 'restore', of: slipped, reason: 'checked the slide again: no overlap, traverse 4 stands' }, 26 * 3600_000);
  }
  return `${lines.join('\n')}\n`;
}

const out = resolve(process.argv[2] ?? 'demo-sessions');
mkdirSync(out, { recursive: true });
const { keymap } = loadKeymap('temperate-lowland');
// The demo core's core.json: every 12 cm planned from 12 to 108, five counted, one planned between each pair.
const core: CoreConfig = {
  format: CORE_FORMAT,
  site: 'Kestrel Mere',
  core: 'KM-1',
  keymap,
  rules: DEFAULT_RULES,
  markerBatch: { tablets: SPIKE.tablets, perTablet: SPIKE.perTablet, perTabletSd: SPIKE.perTabletSd },
  depths: [12, 24, 36, 48, 60, 72, 84, 96, 108],
  synonyms: { Gramineae: 'Poaceae', Compositae: 'Asteraceae' },
  summaryGroups: [
    { name: 'Mixed oak forest', taxa: ['Quercus', 'Ulmus', 'Tilia', 'Fraxinus'] },
    { name: 'Open ground', taxa: ['Poaceae', 'Artemisia', 'Plantago lanceolata', 'Rumex', 'Amaranthaceae'] },
  ],
};
writeFileSync(join(out, CORE_FILE), coreFileText(core));
process.stdout.write(`wrote ${join(out, CORE_FILE)}\n`);
LEVELS.forEach((level, i) => {
  writeFileSync(join(out, level.file), buildLevel(level, keymap, 1000 + i));
  process.stdout.write(`wrote ${join(out, level.file)}\n`);
});
