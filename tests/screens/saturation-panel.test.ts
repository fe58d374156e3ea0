import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { legendFor, stepPoints } from '../../src/screens/saturation-panel.js';
import { braillePlot } from '../../src/text/braille-plot.js';

describe('the saturation plot of a long count', () => {
  it('property: the thinned step line draws the same dots as every point of it (fast-check)', () => {
    const steps = fc.array(fc.oneof({ weight: 5, arbitrary: fc.constant(0) }, fc.integer({ min: 1, max: 3 })), { minLength: 1, maxLength: 3000 });
    fc.assert(
      fc.property(steps, fc.integer({ min: 4, max: 70 }), fc.integer({ min: 2, max: 12 }), (rises, width, height) => {
        const observed = [0];
        for (const r of rises) observed.push((observed.at(-1) as number) + r);
        const grains = observed.length - 1;
        const yMax = Math.max(1, observed.at(-1) as number);
        const all = braillePlot(width, height, grains, yMax, [{ points: observed.map((s, n) => [n, s] as const), style: 'line' }]);
        const thin = stepPoints(observed, grains, width);
        expect(braillePlot(width, height, grains, yMax, [{ points: thin, style: 'line' }])).toEqual(all);
        expect(thin.length).toBeLessThanOrEqual(Math.min(observed.length, 4 * width));
      }),
      { numRuns: 400 },
    );
  });
});

describe('the curve legend', () => {
  it('is the longest that fits whole, never cut (the side panel is about 22 columns at 80)', () => {
    expect(legendFor(40)).toBe('⣀ types found · E(Sₙ) rarefied');
    expect(legendFor(22)).toBe('⣀ found · E(Sₙ)');
    expect(legendFor(10)).toBeNull();
    for (let w = 1; w <= 60; w++) {
      const l = legendFor(w);
      if (l !== null) expect([...l].length).toBeLessThanOrEqual(w);
    }
  });
});
