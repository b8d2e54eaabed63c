import { describe, expect, it } from 'vitest';
import { roundToStep } from '../../shared/engine/rounding';

describe('rounding to a protocol step', () => {
  it.each([
    [1.8181, 0.01, 1.82],
    [5.46, 0.1, 5.5],
    [1.005, 0.01, 1.01],
    [0.0706858, 0.000001, 0.070686],
    [42.41, 0.1, 42.4],
    [1800.4, 1, 1800],
    [7.3, 0.5, 7.5],
    [1234, 10, 1230],
  ])('rounds %f to the nearest %f as %f, halves away from zero', (value, step, expected) => {
    expect(roundToStep(value, step)).toBe(expected);
  });

  it('refuses a step that is not a positive number', () => {
    expect(() => roundToStep(1.5, 0)).toThrow(/rounding step must be a positive number/);
  });
});
