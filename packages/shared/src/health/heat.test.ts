import { describe, expect, it } from 'vitest';
import { HEAT_CAUTION, isHeatCaution, readingToCelsius } from './heat';
import { temperatureReadingCreateSchema } from '../schemas/health.schema';

describe('heat caution', () => {
  it('when a reading is typed in °F, then it is stored in °C to one decimal (NIST HB44: t°C = (t°F − 32) / 1.8)', () => {
    expect(readingToCelsius(85, 'F')).toBe(29.4);
    expect(readingToCelsius(32, 'F')).toBe(0);
    expect(readingToCelsius(-40, 'F')).toBe(-40);
    expect(readingToCelsius(98.6, 'F')).toBe(37);
    expect(readingToCelsius(29.44, 'C')).toBe(29.4);
  });

  it('when the barn reads 85 °F / 29.4 °C or more, then the caution applies (Texas Extension, TAMUK: heat stress above about 85 °F)', () => {
    expect(HEAT_CAUTION.celsius).toBe(29.4);
    expect(isHeatCaution(readingToCelsius(85, 'F'))).toBe(true);
    expect(isHeatCaution(readingToCelsius(84, 'F'))).toBe(false);
    expect(isHeatCaution(29.3)).toBe(false);
  });

  it('when a reading is outside −40…55 °C, then the schema refuses it in the unit it was typed in', () => {
    expect(temperatureReadingCreateSchema.safeParse({ value: 131, unit: 'F' }).success).toBe(true);
    expect(temperatureReadingCreateSchema.safeParse({ value: 132, unit: 'F' }).success).toBe(false);
    expect(temperatureReadingCreateSchema.safeParse({ value: -40, unit: 'C' }).success).toBe(true);
    expect(temperatureReadingCreateSchema.safeParse({ value: -40.1, unit: 'C' }).success).toBe(false);
  });
});
