import { describe, expect, it } from 'vitest';
import { celsiusToFahrenheit, fahrenheitToCelsius, GRAMS_PER_OUNCE, GRAMS_PER_POUND, gramsToPounds, poundsToGrams } from '@burrowline/shared';

describe('units against published definitions', () => {
  it('NIST Handbook 44, App. C: 1 lb = 0.45359237 kg exactly', () => {
    expect(GRAMS_PER_POUND).toBe(453.59237);
    expect(poundsToGrams(1)).toBe(453.59237);
    expect(gramsToPounds(453.59237)).toBe(1);
  });

  it('NIST Handbook 44: 1 oz = 28.349523125 g (1/16 lb)', () => {
    expect(GRAMS_PER_OUNCE).toBeCloseTo(28.349523125, 12);
  });

  it('Definition °C = (°F − 32) × 5/9; USDA FSIS cooking temperature 160 °F ≈ 71 °C', () => {
    expect(fahrenheitToCelsius(32)).toBe(0);
    expect(fahrenheitToCelsius(212)).toBe(100);
    expect(Math.round(fahrenheitToCelsius(160))).toBe(71);
    expect(celsiusToFahrenheit(4.4)).toBeCloseTo(39.92, 2); // USDA FSIS: chill to 40 °F / 4.4 °C
  });

  it('Oregon State Ext. Bulletin 745: a 5 lb fryer is about 2,268 g (our default target 2,270 g, common practice)', () => {
    expect(Math.round(poundsToGrams(5))).toBe(2268);
  });
});
