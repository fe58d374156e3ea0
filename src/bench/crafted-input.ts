import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../audit/level-audit.js';
import { plainReport } from '../audit/plain-report.js';
import { readForAudit } from '../audit/read-audit.js';
import { loadKeymap } from '../keymap/load-keymap.js';
import { parseKeymap } from '../keymap/parse-keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { FORMAT_VERSION, type EventPayload } from '../model/events.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';

/** A level of `traverses` traverses of five grains each: the shape that once made the audit cubic. */
function manyTraverses(traverses: number): string {
  const { keymap } = loadKeymap('temperate-lowland');
  const taxa = Object.entries(keymap.keys).filter(([, b]) => b.group === 'trees' || b.group === 'herbs').slice(0, 12);
  const payloads: EventPayload[] = [
    { type: 'open', format: FORMAT_VERSION, session: 'c'.repeat(32), level: 'bench', depth: 1, site: null, core: null, slide: null, analyst: null, keymap, rules: DEFAULT_RULES, spike: null },
    { type: 'sitting', sitting: 1 },
  ];
  for (let t = 1; t <= traverses; t++) {
    if (t > 1) payloads.push({ type: 'traverse', traverse: t });
    for (let i = 0; i < 5; i++) {
      const [key, b] = taxa[(t * 7 + i * 3) % taxa.length] as [string, { taxon: string }];
      payloads.push({ type: 'grain', taxon: b.taxon, traverse: t, key });
    }
  }
  payloads.push({ type: 'close' });
  let prev = '';
  const start = Date.parse('2026-11-02T09:00:00.000Z');
  return payloads.map((p, i) => {
    const { line, hash } = encodeLine(p, { seq: i + 1, at: new Date(start + i * 1000).toISOString() }, prev);
    prev = hash;
    return `${line}\n`;
  }).join('');
}

const seconds = (fn: () => void) => {
  const t0 = process.hrtime.bigint();
  fn();
  return Number(process.hrtime.bigint() - t0) / 1e9;
};

/** Crafted inputs that were once quadratic or cubic, each beside a bare read and JSON.parse of the same bytes. */
export function benchCraftedInput(): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-crafted-'));
  const lines = ['(g) crafted input: time per size beside a bare read + JSON.parse of the same file (goal: a flat ratio, linear or n log n)'];
  try {
    for (const n of [2000, 4000, 20000]) {
      const path = join(dir, `t${n}.jsonl`);
      writeFileSync(path, manyTraverses(n));
      const bare = seconds(() => readFileSync(path, 'utf8').trimEnd().split('\n').map((l) => JSON.parse(l)));
      const audit = seconds(() => {
        const r = readForAudit(path, { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS });
        plainReport('bench', r.state, r.audit, r.verdict);
      });
      lines.push(`    audit --plain, ${String(n).padStart(6)} traverses   ${audit.toFixed(2)} s   ${(audit / bare).toFixed(0)}x the bare parse`);
    }
    for (const n of [10_000, 100_000]) {
      const fields = Array.from({ length: n }, (_, i) => `"f${i}": ${i}`).join(',\n');
      const text = `{ "name": "wide", "keys": { "a": { "taxon": "Alnus", "group": "trees" } }, "notes": {\n${fields}\n} }`;
      const bare = seconds(() => JSON.parse(text));
      const keymap = seconds(() => parseKeymap(text, 'wide.json'));
      lines.push(`    keymap of ${String(n).padStart(7)} fields        ${keymap.toFixed(2)} s   ${(keymap / bare).toFixed(0)}x JSON.parse`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  return lines;
}
