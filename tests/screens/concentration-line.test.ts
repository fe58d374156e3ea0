import { describe, expect, it } from 'vitest';
import { concentrationLine } from '../../src/screens/rules-panel.js';
import { concentration } from '../../src/stats/concentration.js';

const SPIKE = { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: null };

describe('the concentration line on the counting screen', () => {
  it('says the relative error is undefined (not ±0%) while no pollen is counted', () => {
    expect(concentrationLine(concentration(0, 12, SPIKE))).toBe('conc 0/cm³ ± –');
  });

  it('gives the relative error once pollen and markers are counted (FIELD.md worked example: 400 grains, 80 markers → ±13%)', () => {
    expect(concentrationLine(concentration(400, 80, SPIKE))).toBe('conc 200k/cm³ ±13%');
  });
});
