import { describe, expect, it } from 'vitest';
import { formatTemperature, formatWeight, gramsToPoundsOunces, gramsToWeightInput, toFixedHalfUp, weightInputToGrams } from './units';

describe('unit formatting', () => {
  it('when grams are shown in pounds and ounces, then the ounces carry over at 16', () => {
    expect(gramsToPoundsOunces(453.59237 * 5)).toEqual({ pounds: 5, ounces: 0 });
    expect(gramsToPoundsOunces(453.59237 * 4 + 28.349523125 * 15.96)).toEqual({ pounds: 5, ounces: 0 });
    expect(formatWeight(2270, 'lb_oz')).toBe('5 lb 0.1 oz');
  });

  it('when a weight is 10 lb or more, then ounces are whole (NIST HB44: 1 lb = 453.59237 g, 1 oz = 28.349523125 g)', () => {
    // Nine 50 lb sacks stored as 9 × 22,680 g = 204,120 g = 7,200.1 oz.
    expect(formatWeight(204_120, 'lb_oz')).toBe('450 lb 0 oz');
    // 4,536 g = 160.003 oz, just over 10 lb; 4,535 g = 159.97 oz rounds to 9 lb 16.0 oz → carried to 10 lb 0 oz.
    expect(formatWeight(4536, 'lb_oz')).toBe('10 lb 0 oz');
    expect(formatWeight(4535, 'lb_oz')).toBe('10 lb 0 oz');
    // 12 lb 7.6 oz = 5,658.6 g shows as 12 lb 8 oz.
    expect(formatWeight(5659, 'lb_oz')).toBe('12 lb 8 oz');
  });

  it('when grams are shown metric, then small weights stay in grams', () => {
    expect(formatWeight(64, 'kg_g')).toBe('64 g');
    expect(formatWeight(2270, 'kg_g')).toBe('2.27 kg');
  });

  it('when a weight is exactly half-way between two hundredths of a kilogram, then it rounds up, computed on whole grams', () => {
    // 1.015 and 2.275 are stored as 1.01499… and 2.27499… in binary, which toFixed(2) rounds down.
    expect(formatWeight(1015, 'kg_g')).toBe('1.02 kg');
    expect(formatWeight(2275, 'kg_g')).toBe('2.28 kg');
    expect(formatWeight(1005, 'kg_g')).toBe('1.01 kg');
    expect(formatWeight(1004.6, 'kg_g')).toBe('1.01 kg');
    expect(formatWeight(99_995, 'kg_g')).toBe('100.00 kg');
    expect(formatWeight(999.6, 'kg_g')).toBe('1.00 kg');
    for (let grams = 1000; grams < 20_000; grams += 1) {
      const hundredths = Math.floor((grams + 5) / 10);
      expect(formatWeight(grams, 'kg_g')).toBe(`${Math.floor(hundredths / 100)}.${String(hundredths % 100).padStart(2, '0')} kg`);
    }
  });

  it('when a decimal is shown to a fixed count of places, then halves round away from zero as written', () => {
    expect(toFixedHalfUp(1.015, 2)).toBe('1.02');
    expect(toFixedHalfUp(2.275, 2)).toBe('2.28');
    expect(toFixedHalfUp(0.15, 1)).toBe('0.2');
    expect(toFixedHalfUp(-0.15, 1)).toBe('-0.2');
    expect(toFixedHalfUp(-0.01, 1)).toBe('0.0');
    expect(toFixedHalfUp(1e-9, 2)).toBe('0.00');
    expect(formatTemperature(20.05, 'C')).toBe('20.1 °C');
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

describe('a stored weight back in a correction form', () => {
  it('when any whole-gram weight up to 100 kg is put back in the form, then the form gives the same grams in both units', () => {
    for (let grams = 1; grams <= 100_000; grams += 7) {
      for (const unit of ['lb_oz', 'kg_g'] as const) {
        const { major, minor } = gramsToWeightInput(grams, unit);
        expect(weightInputToGrams(major, minor, unit)).toBe(grams);
      }
    }
  });

  it('when a 50 lb bag stored as 22,680 g is put back, then it reads 50 lb with the ounces empty (NIST HB44: 1 lb = 453.59237 g, 50 lb = 22,679.6 g)', () => {
    expect(gramsToWeightInput(22_680, 'lb_oz')).toEqual({ major: '50', minor: '' });
    expect(gramsToWeightInput(22_680, 'kg_g')).toEqual({ major: '22', minor: '680' });
    // 5 lb 2.3 oz = 2,332.98 g; 2,333 g needs the tenth of an ounce to come back to the gram.
    expect(gramsToWeightInput(2333, 'lb_oz')).toEqual({ major: '5', minor: '2.3' });
  });
});
