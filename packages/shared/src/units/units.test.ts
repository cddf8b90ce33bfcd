import { describe, expect, it } from 'vitest';
import { formatTemperature, formatWeight, gramsToPoundsOunces, weightInputToGrams } from './units';

describe('unit formatting', () => {
  it('when grams are shown in pounds and ounces, then the ounces carry over at 16', () => {
    expect(gramsToPoundsOunces(453.59237 * 5)).toEqual({ pounds: 5, ounces: 0 });
    expect(gramsToPoundsOunces(453.59237 * 4 + 28.349523125 * 15.96)).toEqual({ pounds: 5, ounces: 0 });
    expect(formatWeight(2270, 'lb_oz')).toBe('5 lb 0.1 oz');
  });

  it('when grams are shown metric, then small weights stay in grams', () => {
    expect(formatWeight(64, 'kg_g')).toBe('64 g');
    expect(formatWeight(2270, 'kg_g')).toBe('2.27 kg');
  });

  it('when a stored Celsius reading is shown, then it follows the farm\'s unit', () => {
    expect(formatTemperature(29.4, 'C')).toBe('29.4 °C');
    expect(formatTemperature(29.4, 'F')).toBe('84.9 °F');
  });
});

describe('typed weights to grams', () => {
  it('when 5 lb 0 oz is typed, then it is 2,268 g (NIST Handbook 44: 1 lb = 453.59237 g)', () => {
    expect(weightInputToGrams('5', '', 'lb_oz')).toBe(2268);
    // NIST Handbook 44: 1 oz = 28.349523125 g, so 8 oz = 226.796 g
    expect(weightInputToGrams('', '8', 'lb_oz')).toBe(227);
    expect(weightInputToGrams('2', '270', 'kg_g')).toBe(2270);
    expect(weightInputToGrams('1,5', '', 'kg_g')).toBe(1500);
  });
  it('when nothing, a negative or text is typed, then there is no weight', () => {
    expect(weightInputToGrams('', '', 'lb_oz')).toBeNull();
    expect(weightInputToGrams('-1', '', 'kg_g')).toBeNull();
    expect(weightInputToGrams('abc', '', 'kg_g')).toBeNull();
  });
});
