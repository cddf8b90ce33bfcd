import { describe, expect, it } from 'vitest';
import { formatDayInWords, kitBirthDateProblem } from './kit-birth';

describe('a kit\'s birth date against its dam\'s litters', () => {
  it('when the date is one of her kindlings, then it fits', () => {
    expect(kitBirthDateProblem('2026-03-06', { label: 'Clover (C-1)', kindledOn: ['2026-01-02', '2026-03-06'] })).toBeNull();
  });

  it('when she has no litter on the farm\'s record, then nothing is checked', () => {
    expect(kitBirthDateProblem('2026-03-01', { label: 'Clover', kindledOn: [] })).toBeNull();
  });

  it('when the kit is born five days before her kindling, then the message names her litter\'s date', () => {
    expect(kitBirthDateProblem('2026-03-01', { label: 'Clover (C-1)', kindledOn: ['2026-03-06'] })).toBe(
      "Clover (C-1)'s litter was kindled on Mar 6, 2026. A kit of hers is born on its litter's kindling day: use that date, or record the kindling of this litter first.",
    );
  });

  it('when she has many litters, then the three nearest to the date are named in date order', () => {
    const message = kitBirthDateProblem('2026-05-01', { label: 'Hazel', kindledOn: ['2025-01-10', '2025-11-02', '2026-01-15', '2026-04-20', '2026-07-01'] });
    expect(message).toBe(
      "Hazel's litters were kindled on Jan 15, 2026, Apr 20, 2026, Jul 1, 2026 (the nearest to this date). A kit of hers is born on its litter's kindling day: use that date, or record the kindling of this litter first.",
    );
  });

  it('when a day is written for a message, then it is the screens\' "Mon D, YYYY" whatever the server\'s zone', () => {
    expect(formatDayInWords('2026-12-31')).toBe('Dec 31, 2026');
    expect(formatDayInWords('2026-01-01')).toBe('Jan 1, 2026');
  });
});
