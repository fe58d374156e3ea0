import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { render } from 'ink-testing-library';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { fileAuditSource } from '../../src/audit/read-audit.js';
import { AuditScreen } from '../../src/screens/audit-screen.js';
import { resumeLevel } from '../../src/session/session-files.js';
import { countScreen } from '../helpers/count-screen.js';
import { grain, openPayload, sessionText, TINY_KEYMAP } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

// A clipboard write (OSC 52), a title change and a clear screen, hidden in names of a level from elsewhere.
const OSC52 = '\x1b]52;c;aGVsbG8=\x07';
const HOSTILE = `Alnus${OSC52}`;
const SITE = 'Mere\x1b]0;owned\x07\x1b[2J';

function hostileLevel(): string {
  const keymap = { ...TINY_KEYMAP, keys: { ...TINY_KEYMAP.keys, a: { taxon: HOSTILE, group: 'trees' as const } } };
  const path = join(tempDir(), 'foreign.jsonl');
  writeFileSync(path, sessionText([openPayload(keymap, { site: SITE }), { type: 'sitting', sitting: 1 }, grain(HOSTILE, 1, 'a'), { type: 'note', text: 'see \x1b[31mred\x1b[0m', grain: 3, stage: null }, { type: 'close' }]));
  return path;
}

const acts = (frame: string) => /\x1b\]|\x1b\[2J|\x07/.test(frame);

describe('a level from elsewhere with control characters in its names', () => {
  it('is read, and the counting screen shows them as visible escapes, never as terminal commands', async () => {
    const path = hostileLevel();
    const s = await countScreen({ ...resumeLevel(path), path });
    await s.type('a');
    await expect.poll(() => s.session.getSnapshot().state.grains).toBe(2);
    const frame = s.frame();
    expect(frame).toContain('Alnus\\u{1b}]52;c;');
    expect(frame).toContain('Mere\\u{1b}]0;owned');
    expect(s.frames.some(acts)).toBe(false);
    s.unmount();
  });

  it('the audit screen shows them escaped too', async () => {
    const ui = render(<AuditScreen source={fileAuditSource(hostileLevel(), { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS })} columns={100} rows={30} pollMs={50} />);
    await expect.poll(() => ui.lastFrame() ?? '').toMatch(/Alnus\\u\{1b\}/);
    expect(ui.frames.some(acts)).toBe(false);
    ui.unmount();
  });
});
