import { describe, expect, it } from 'vitest';
import { themeFor } from '../../src/screens/theme.js';

describe('the theme', () => {
  it('turns colour off when NO_COLOR is set to a non-empty value (no-color.org), not when empty', () => {
    expect(Object.values(themeFor({ NO_COLOR: '1' })).every((v) => v === undefined || v === false)).toBe(true);
    expect(themeFor({ NO_COLOR: '' }).accent).toBeDefined();
    expect(themeFor({}).accent).toBeDefined();
  });
});
