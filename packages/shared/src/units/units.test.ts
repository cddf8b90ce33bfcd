import { describe, expect, it } from 'vitest';
import { formatTemperature, formatWeight, gramsToPoundsOunces } from './units';

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
