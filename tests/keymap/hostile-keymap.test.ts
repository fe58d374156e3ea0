import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadKeymap } from '../../src/keymap/load-keymap.js';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { parseEventObject } from '../../src/log/event-schema.js';
import { describeIssue } from '../../src/validation/describe-issue.js';
import { tempDir } from '../helpers/temp-dir.js';

const keymapWith = (keys: string) => `{ "name": "hostile", "keys": { ${keys} } }`;
const message = (text: string) => {
  const r = parseKeymap(text, 'h.json');
  if (r.ok) throw new Error('accepted');
  return r.message;
};

describe('a keymap from elsewhere that tries to hide or act', () => {
  it.each([
    ['a zero-width space', '\\u200b', '\\u{200b}'],
    ['a lone combining accent', '\\u0301', null],
    ['a byte-order mark', '\\ufeff', '\\u{feff}'],
    ['a right-to-left override', '\\u202e', '\\u{202e}'],
    ['a lone surrogate', '\\ud800', '\\u{d800}'],
    ['an escape character', '\\u001b', '\\u{1b}'],
  ])('refuses %s as a key, showing it as a visible escape', (_what, json, shown) => {
    const text = message(keymapWith(`"${json}": { "taxon": "Alnus", "group": "trees" }`));
    expect(text).toMatch(/must be a single character a person can see on the keyboard/);
    if (shown) expect(text).toContain(shown);
  });

  it('refuses control characters in taxon and keymap names (a title change, a clipboard write), showing them escaped', () => {
    expect(message(keymapWith('"a": { "taxon": "Alnus\\u001b]52;c;aGk=\\u0007", "group": "trees" }'))).toMatch(/key "a" has a taxon name with a control or invisible character \("Alnus\\u\{1b\}\]52;c;aGk=\\u\{7\}"\)/);
    expect(message('{ "name": "lab\\u009b2J", "keys": { "a": { "taxon": "Alnus", "group": "trees" } } }')).toMatch(/"name" has a control or invisible character \("lab\\u\{9b\}2J"\)/);
  });

  it('treats two taxon names that differ only in Unicode normalisation as one, and keeps the spelling typed', () => {
    const composed = 'Gal\u00e9opsis';
    const decomposed = 'Gale\u0301opsis';
    expect(message(keymapWith(`"g": { "taxon": "${composed}", "group": "herbs" }, "h": { "taxon": "${decomposed}", "group": "herbs" }`))).toMatch(/is on two keys, "g" and "h"/);
    const kept = parseKeymap(keymapWith(`"h": { "taxon": "${decomposed}", "group": "herbs" }`), 'h.json');
    expect(kept.ok && kept.keymap.keys.h?.taxon).toBe(decomposed);
  });

  it('refuses a "__proto__" binding instead of dropping it without a word, naming the line', () => {
    expect(message('{ "name": "x",\n  "keys": {\n "a": { "taxon": "Alnus", "group": "trees" },\n "__proto__": { "taxon": "Betula", "group": "trees" } } }')).toBe('keymap h.json: line 4: "__proto__" cannot be a name in a keymap');
  });

  it('refuses a keymap nested 10,000 deep in one line, with no stack trace', () => {
    const text = `{ "name": "deep", "keys": { "a": { "taxon": "Alnus", "group": "trees" } }, "x": ${'['.repeat(10_000)}${']'.repeat(10_000)} }`;
    expect(message(text)).toBe('keymap h.json: line 1: nested more than 64 levels deep (a keymap is three levels deep)');
  });

  it('reads a keymap with 100,000 fields in linear time (it took minutes when each field counted lines from the start)', () => {
    const fields = Array.from({ length: 100_000 }, (_, i) => `"f${i}": "outside"`).join(',\n');
    const r = parseKeymap(`{ "name": "wide", "keys": { "a": { "taxon": "Alnus", "group": "trees" } }, "groups": {\n${fields}\n} }`, 'wide.json');
    expect(r.ok).toBe(true);
  });

  it('refuses bytes that are not UTF-8, naming the line, instead of reading them as U+FFFD', () => {
    const path = join(tempDir(), 'latin1.json');
    writeFileSync(path, Buffer.concat([Buffer.from('{ "name": "old",\n "keys": {\n "g": { "taxon": "Gal'), Buffer.from([0xe9]), Buffer.from('opsis", "group": "herbs" } } }\n')]));
    expect(() => loadKeymap(path)).toThrow(/keymap .*latin1\.json: line 3 is not valid UTF-8; save the file as UTF-8/);
  });
});

describe('messages that say what is wrong', () => {
  const issueOf = (line: Record<string, unknown>) => {
    const r = parseEventObject({ seq: 3, at: '2026-11-02T09:00:00.000Z', prev: 'x', ...line });
    if (r.ok) throw new Error('accepted');
    return describeIssue(r.issue);
  };

  it('a number where a name belongs is not "missing"; 0 is not "empty"; a null is named', () => {
    expect(issueOf({ type: 'grain', taxon: 7, traverse: 1, key: 'a' })).toBe('"taxon" must be a string, not the number 7');
    expect(issueOf({ type: 'grain', taxon: 'Alnus', traverse: 0, key: 'a' })).toBe('"traverse" must be above 0, not 0');
    expect(issueOf({ type: 'grain', taxon: 'Alnus', traverse: null, key: 'a' })).toBe('"traverse" must be a number, not null');
    expect(issueOf({ type: 'grain', taxon: 'Alnus', key: 'a' })).toBe('"traverse" is missing');
  });
});
