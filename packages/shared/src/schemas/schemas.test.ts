import { describe, expect, it } from 'vitest';
import { calendarDateSchema, farmProfileUpdateSchema, serviceCreateSchema, setPasswordSchema, signInSchema } from '../index';
import { multiLine, singleLine } from './text';

const validProfile = {
  name: 'Juniper Hill', location: 'Tamsin County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F',
  breedsKept: ['Californian'], description: '', version: 3,
};

describe('shared input schemas', () => {
  it('when no doe or buck is chosen, then the message asks for the choice, not for an id', () => {
    const result = serviceCreateSchema.safeParse({ doeId: '', servicedOn: '2026-11-02' });
    expect(result.success).toBe(false);
    const messages = Object.fromEntries(result.error!.issues.map((i) => [i.path.join('.'), i.message]));
    expect(messages).toMatchObject({ doeId: 'Choose the doe', buckId: 'Choose the buck' });
  });

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

  it('when a one-line field holds CR, LF, a tab or NUL, then it is refused; a note keeps its line breaks but not NUL', () => {
    const name = singleLine('The name', 0, 60);
    for (const bad of ['Fern\r\nBcc: x', 'Fern\nHill', 'Fern\u0000', 'Fern\tHill', 'Fern\u007f']) {
      expect(name.safeParse(bad).success, JSON.stringify(bad)).toBe(false);
    }
    expect(name.parse(' Fern Hill ')).toBe('Fern Hill');
    const note = multiLine(500);
    expect(note.parse('Line one\nLine two\twith a tab')).toBe('Line one\nLine two\twith a tab');
    expect(note.safeParse('Ends here\u0000').success).toBe(false);
    expect(farmProfileUpdateSchema.safeParse({ ...validProfile, name: 'Juniper\nHill' }).success).toBe(false);
    expect(farmProfileUpdateSchema.safeParse({ ...validProfile, location: 'Tamsin\u0000County' }).success).toBe(false);
  });

  it('when a date is before 1990 or after 2100, then it is refused with the range in the message', () => {
    for (const date of ['1900-01-01', '1989-12-31', '2101-01-01', '9999-12-01']) {
      const result = calendarDateSchema.safeParse(date);
      expect(result.success, date).toBe(false);
      expect(result.error?.issues.map((i) => i.message), date).toEqual(['Enter a date from 1990-01-01 to 2100-12-31']);
    }
    expect(calendarDateSchema.parse('1990-01-01')).toBe('1990-01-01');
    expect(calendarDateSchema.parse('2100-12-31')).toBe('2100-12-31');
    expect(calendarDateSchema.safeParse('2024-02-30').error?.issues.map((i) => i.message)).toEqual(['Enter a date as YYYY-MM-DD']);
  });
});
