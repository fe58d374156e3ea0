import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { startInPty } from '../helpers/pty.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const DOWN = '\x1b[B';

// A correction made in the audit after a clean quit, which takes the stop rules back,
// once made the next sitting say the last one "was not closed cleanly" while verify said it was.
describe('a correction that changes the rule verdict, through the real program', () => {
  it('leaves count, verify and the audit agreeing that the last sitting closed cleanly', async () => {
    const dir = tempDir();
    const count = startInPty(['count', 'l.jsonl', '--target', '3'], dir);
    await count.ready(/Pollen sum 0 \/ 3/);
    count.type('qqq');
    await count.waitFor(/STOP RULES MET at pollen sum 3/);
    count.type('\x03');
    expect(await count.exited()).toBe(0);

    const audit = startInPty(['audit', 'l.jsonl'], dir);
    await audit.ready(/traverse/i);
    audit.type(`\t${DOWN}vdouble press\r`);
    await audit.waitFor(/recorded: void of grain #4/);
    audit.type('q');
    expect(await audit.exited()).toBe(0);
    const types = scanLog(readFileSync(join(dir, 'l.jsonl'))).events.map((e) => e.type);
    expect(types.slice(-3)).toEqual(['close', 'void', 'rules-unmet']);

    const verify = await runExine(['verify', 'l.jsonl'], dir);
    expect(verify.code).toBe(0);
    expect(verify.stdout).not.toMatch(/not closed cleanly/);
    expect((await runExine(['audit', 'l.jsonl', '--plain'], dir)).stdout).not.toMatch(/not closed cleanly/);

    const again = startInPty(['count', 'l.jsonl'], dir);
    await again.ready(/Pollen sum 2 \/ 3/);
    expect(again.output()).not.toMatch(/not closed cleanly/);
    again.type('\x03');
    expect(await again.exited()).toBe(0);
  });
});
