import { copyFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { readForAudit } from '../../src/audit/read-audit.js';
import { levelFacts } from '../../src/screens/count-view.js';
import { tempDir } from '../helpers/temp-dir.js';

describe('the audit counts types as the counting screen does', () => {
  it("the demo: new types are the screen's types found, markers and indeterminables are listed apart", () => {
    const path = join(tempDir(), 'demo.jsonl');
    copyFileSync(new URL('../../demo-sessions/km1-084cm.jsonl', import.meta.url), path);
    const { state, audit } = readForAudit(path, { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS });
    const screenTypes = levelFacts(state, 2).types;
    const newTypes = audit.traverses.flatMap((t) => t.newTypes);
    expect(new Set(newTypes)).toEqual(screenTypes);
    const others = audit.traverses.flatMap((t) => t.newOthers);
    expect(others).toContain('Lycopodium (exotic marker)');
    for (const t of others) expect(screenTypes.has(t)).toBe(false);
    const first = audit.traverses[0]!;
    expect(first.types).toBe(first.byTaxon.filter(([taxon]) => screenTypes.has(taxon)).length);
    expect(first.types).toBeLessThan(first.byTaxon.length);
  });
});
