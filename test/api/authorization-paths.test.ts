import { describe, expect, it } from 'vitest';
import { pathWithIds } from '../support/authorization-cells';

describe("the matrix's paths", () => {
  it('when every placeholder has an id, then each is filled in', () => {
    expect(pathWithIds('/api/farms/:farmId/photo', { farmId: 'f-1' })).toBe('/api/farms/f-1/photo');
  });

  it('when a placeholder has no id (a typo, or a target that makes none), then the cell fails instead of calling a path that 404s', () => {
    expect(() => pathWithIds('/api/processing-marks/:markID/cancellation', { markId: 'm-1' })).toThrow('/api/processing-marks/:markID/cancellation: the target makes no id for :markID');
    expect(() => pathWithIds('/api/farms/:farmId', { farmId: '' })).toThrow(/no id for :farmId/);
  });
});
