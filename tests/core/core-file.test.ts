import { describe, expect, it } from 'vitest';
import { coreFileText, parseCoreFile } from '../../src/core/core-file.js';
import { TINY_CORE } from '../helpers/core-json.js';

const text = (edit: (v: Record<string, any>) => void = () => {}) => {
  const value = JSON.parse(coreFileText(TINY_CORE));
  edit(value);
  return JSON.stringify(value, null, 2);
};

const message = (t: string) => {
  const r = parseCoreFile(t, 'core/core.json');
  if (r.ok) throw new Error('expected a refusal');
  expect(r.message.split('\n')).toHaveLength(1);
  return r.message;
};

describe('core.json', () => {
  it('reads back every field exine writes', () => {
    const r = parseCoreFile(coreFileText(TINY_CORE), 'core.json');
    expect(r).toEqual({ ok: true, config: TINY_CORE });
  });

  it('reads a minimal file: site, core, keymap, rules', () => {
    const r = parseCoreFile(text((v) => { delete v.format; delete v.markerBatch; delete v.depths; delete v.synonyms; delete v.summaryGroups; }), 'core.json');
    expect(r.ok && r.config).toMatchObject({ markerBatch: null, depths: [], synonyms: {}, summaryGroups: [] });
  });

  it('sorts planned depths, and fractional ones are fine', () => {
    const r = parseCoreFile(text((v) => { v.depths = [30, 4.5, 12]; }), 'core.json');
    expect(r.ok && r.config.depths).toEqual([4.5, 12, 30]);
  });

  it('reads precision rules and fills in the share', () => {
    const r = parseCoreFile(text((v) => { v.rules = { targetSum: 300, precision: { halfWidth: 3 }, mode: 'any' }; }), 'core.json');
    expect(r.ok && r.config.rules).toMatchObject({ targetSum: 300, precision: { halfWidth: 3, share: 5, taxa: null }, mode: 'any' });
  });

  it.each([
    ['a misspelt top field', (v: any) => { v.synonym = v.synonyms; delete v.synonyms; }, /line \d+: "synonym" is not a field of core.json \(did you mean "synonyms"\?\)/],
    ['a flag name for a rule', (v: any) => { v.rules.target = 300; }, /line \d+: "rules.target" is not a field of core.json \(did you mean "rules.targetSum"\?\)/],
    ['a wrong case', (v: any) => { v.markerBatch.PerTablet = 1; }, /"markerBatch.PerTablet" is not a field of core.json \(did you mean "markerBatch.perTablet"\?\)/],
    ['an unknown field with no near name', (v: any) => { v.colour = 'blue'; }, /"colour" is not a field of core.json$/],
    ['a field in a summary group', (v: any) => { v.summaryGroups[0].taxon = ['Alnus']; }, /"summaryGroups.0.taxon" is not a field of core.json \(did you mean "summaryGroups.0.taxa"\?\)/],
    ['no site', (v: any) => { delete v.site; }, /line 1: "site" is missing/],
    ['an empty core name', (v: any) => { v.core = ' '; }, /line 4: "core" must not be empty/],
    ['a target of 0', (v: any) => { v.rules.targetSum = 0; }, /"rules.targetSum" must be above 0/],
    ['a fractional target', (v: any) => { v.rules.targetSum = 2.5; }, /"rules.targetSum" must be a whole number, not the number 2.5/],
    ['coverage of 1', (v: any) => { v.rules.coverage = 1; }, /"rules.coverage" must be below 1, not 1/],
    ['a half-width over 50', (v: any) => { v.rules.precision = { halfWidth: 60 }; }, /"rules.precision.halfWidth" must be at most 50/],
    ['an unknown rule mode', (v: any) => { v.rules.mode = 'some'; }, /"rules.mode"/],
    ['no rule at all', (v: any) => { v.rules = { mode: 'all' }; }, /"rules" holds no stop rule/],
    ['precision taxa not in the keymap', (v: any) => { v.rules.precision = { halfWidth: 3, taxa: ['Quercus'] }; }, /names "Quercus", which is not a taxon of the keymap/],
    ['a concentration rule without a batch', (v: any) => { v.rules.concError = 0.1; v.markerBatch = null; }, /"rules.concError" needs "markerBatch"/],
    ['0 tablets', (v: any) => { v.markerBatch.tablets = 0; }, /"markerBatch.tablets" must be above 0/],
    ['a negative SD', (v: any) => { v.markerBatch.perTabletSd = -1; }, /"markerBatch.perTabletSd" must be at least 0/],
    ['a negative depth', (v: any) => { v.depths = [4, -2]; }, /"depths.1" must be at least 0/],
    ['a depth twice', (v: any) => { v.depths = [4, 8, 4]; }, /depth 4 is planned twice \(items 1 and 3\)/],
    ['a depth as text', (v: any) => { v.depths = ['4']; }, /"depths.0" must be a number, not the text "4"/],
    ['a synonym chain', (v: any) => { v.synonyms = { Gramineae: 'Poaceae', Poaceae: 'Grasses' }; }, /"Poaceae" is itself merged into "Grasses"/],
    ['a synonym of itself', (v: any) => { v.synonyms = { Poaceae: 'Poaceae' }; }, /synonym "Poaceae" names itself/],
    ['a summary group twice', (v: any) => { v.summaryGroups = [{ name: 'AP', taxa: ['Alnus'] }, { name: 'AP', taxa: ['Betula'] }]; }, /summary group "AP" is defined twice/],
    ['a summary group with no taxa', (v: any) => { v.summaryGroups = [{ name: 'AP', taxa: [] }]; }, /"summaryGroups.0.taxa" must not be empty/],
    ['a bad keymap', (v: any) => { v.keymap.keys.a.group = 'bushes'; }, /line 5: keymap in core.json: key "a" has unknown group "bushes"/],
    ['a control character in the site', (v: any) => { v.site = 'Test\u001b[2J'; }, /"site" has a control or invisible character/],
    ['a future format', (v: any) => { v.format = 2; }, /"format"/],
  ])('refuses %s in one line naming file, line and field', (_what, edit, expected) => {
    const m = message(text(edit));
    expect(m).toMatch(/^core\/core.json: line \d+: /);
    expect(m).toMatch(expected);
  });

  it('names the line the unknown field is on', () => {
    const t = text((v) => { v.rules.target = 300; });
    const line = t.split('\n').findIndex((l) => l.includes('"target"')) + 1;
    expect(message(t)).toMatch(new RegExp(`^core/core.json: line ${line}: "rules.target"`));
  });

  it('names both lines of a field given twice', () => {
    const t = text().replace('"site": "Test Mere",', '"site": "Test Mere",\n  "site": "Other",');
    expect(message(t)).toMatch(/line 4: field "site" appears twice \(lines 3 and 4\)/);
  });

  it('names the line of bad JSON', () => {
    expect(message(text().replace('"core": "TM-1",', '"core": "TM-1"'))).toMatch(/^core\/core.json: line 5: expected ","/);
  });

  it('refuses a file that is not one object', () => {
    expect(message('[1, 2]')).toMatch(/core.json holds one object/);
  });
});
