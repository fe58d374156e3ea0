import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { eventSchema, isPlainGrain, parseEventObject } from '../../src/log/event-schema.js';

const grainSchema = eventSchema.options.find((o) => o.shape.type.value === 'grain')!;

describe('event validation', () => {
  it('property: the direct grain check never accepts what the zod schema rejects (fast-check)', () => {
    const near = fc.record(
      {
        seq: fc.oneof(fc.integer({ min: -3, max: 1e6 }), fc.double(), fc.constant('3')),
        at: fc.oneof(
          fc.date({ min: new Date('1900-01-01'), max: new Date('2200-01-01'), noInvalidDate: true }).map((d) => d.toISOString()),
          fc.constantFrom('2026-02-29T10:00:00.000Z', '2024-02-29T10:00:00.000Z', '2026-13-01T00:00:00.000Z', '2026-11-01T08:00:00Z', '2026-11-01 08:00:00.000Z', '2026-11-01T24:00:00.000Z'),
          fc.string(),
        ),
        prev: fc.oneof(fc.string(), fc.constant(null)),
        type: fc.constantFrom('grain', 'undo'),
        taxon: fc.oneof(fc.string(), fc.constant(7)),
        traverse: fc.oneof(fc.integer({ min: -2, max: 50 }), fc.double(), fc.constant(null)),
        key: fc.oneof(fc.string(), fc.constant(undefined)),
      },
      { requiredKeys: ['type'] },
    );
    fc.assert(
      fc.property(near, (v) => {
        if (isPlainGrain(v as Record<string, unknown>)) expect(grainSchema.safeParse(v).success).toBe(true);
      }),
      { numRuns: 5000 },
    );
  });

  it('rejects an impossible date that only a calendar-aware check catches', () => {
    const line = { seq: 3, at: '2026-02-29T10:00:00.000Z', prev: 'x', type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' };
    expect(parseEventObject(line).ok).toBe(false);
    expect(parseEventObject({ ...line, at: '2024-02-29T10:00:00.000Z' }).ok).toBe(true);
  });

  it('accepts only the names of real rules in a rules-met line', () => {
    const line = { seq: 9, at: '2026-02-20T10:00:00.000Z', prev: 'x', type: 'rules-met', sum: 500, grains: 530, met: ['target', 'coverage'] };
    expect(parseEventObject(line).ok).toBe(true);
    expect(parseEventObject({ ...line, met: ['target', 'taget'] }).ok).toBe(false);
  });

  it('keeps unknown fields on the event it returns', () => {
    const line = { seq: 3, at: '2026-02-20T10:00:00.000Z', prev: 'x', type: 'undo', of: 2, reason: 'slipped' };
    const r = parseEventObject(line);
    expect(r.ok && (r.event as unknown as { reason: string }).reason).toBe('slipped');
  });
});

describe('rules and spike data in the file', () => {
  const stamp = { seq: 4, at: '2026-02-20T10:00:00.000Z', prev: 'x' };
  it('a format-1 rule set (the target alone) is still valid', () => {
    expect(parseEventObject({ ...stamp, type: 'rules', rules: { targetSum: 300 } }).ok).toBe(true);
  });

  it('a spike gives a volume or a mass, not both and not neither', () => {
    const spike = { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: null };
    expect(parseEventObject({ ...stamp, type: 'rules', rules: { targetSum: 300 }, spike }).ok).toBe(true);
    expect(parseEventObject({ ...stamp, type: 'rules', rules: { targetSum: 300 }, spike: { ...spike, mass: 2 } }).ok).toBe(false);
    expect(parseEventObject({ ...stamp, type: 'rules', rules: { targetSum: 300 }, spike: { ...spike, volume: null } }).ok).toBe(false);
  });

  it('rejects a rule value no flag could have written', () => {
    for (const rules of [{ coverage: 1.5 }, { mode: 'some' }, { plateau: 0 }, { precision: { halfWidth: -1 } }]) {
      expect(parseEventObject({ ...stamp, type: 'rules', rules }).ok, JSON.stringify(rules)).toBe(false);
    }
  });

  it('reads rules-met and rules-unmet events', () => {
    expect(parseEventObject({ ...stamp, type: 'rules-met', sum: 500, grains: 540, met: ['target'] }).ok).toBe(true);
    expect(parseEventObject({ ...stamp, type: 'rules-unmet', sum: 499, grains: 539 }).ok).toBe(true);
    expect(parseEventObject({ ...stamp, type: 'rules-met', sum: -1, grains: 540, met: [] }).ok).toBe(false);
  });
});


describe('a type added while counting', () => {
  const stamp = { seq: 5, at: '2026-02-20T10:00:00.000Z', prev: 'x', type: 'taxon', taxon: 'Ilex', group: 'shrubs' };
  it('takes one printable key, as a keymap does', () => {
    expect(parseEventObject({ ...stamp, key: 'A' }).ok).toBe(true);
    for (const key of [' ', 'AB', '\x7f', '\x85', '']) expect(parseEventObject({ ...stamp, key }).ok, JSON.stringify(key)).toBe(false);
  });
});
