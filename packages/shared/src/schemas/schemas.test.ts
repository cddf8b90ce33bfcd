import { describe, expect, it } from 'vitest';
import { farmProfileUpdateSchema, setPasswordSchema, signInSchema } from '../index';

const validProfile = {
  name: 'Juniper Hill', location: 'Tamsin County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F',
  breedsKept: ['Californian'], description: '', version: 3,
};

describe('shared input schemas', () => {
  it('when an e-mail has capitals and spaces, then sign-in normalises it', () => {
    expect(signInSchema.parse({ email: '  Marisol@Example.TEST ', password: 'x' }).email).toBe('marisol@example.test');
  });

  it('when an input carries a field the schema does not list, then it is refused (no mass assignment)', () => {
    const result = farmProfileUpdateSchema.safeParse({ ...validProfile, coopId: 'other' });
    expect(result.success).toBe(false);
  });

  it('when the time zone is not an IANA name, then the field error says what to enter', () => {
    const result = farmProfileUpdateSchema.safeParse({ ...validProfile, timeZone: 'Central' });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toMatch(/time zone such as/);
  });

  it('when a password is 7 characters or 129, then it is refused; 8 and 64 pass', () => {
    const token = 't'.repeat(43);
    expect(setPasswordSchema.safeParse({ token, password: 'a'.repeat(7) }).success).toBe(false);
    expect(setPasswordSchema.safeParse({ token, password: 'a'.repeat(8) }).success).toBe(true);
    expect(setPasswordSchema.safeParse({ token, password: 'a'.repeat(64) }).success).toBe(true);
    expect(setPasswordSchema.safeParse({ token, password: 'a'.repeat(129) }).success).toBe(false);
  });

  it('when a valid profile is given, then it parses unchanged', () => {
    expect(farmProfileUpdateSchema.parse(validProfile)).toEqual(validProfile);
  });
});
