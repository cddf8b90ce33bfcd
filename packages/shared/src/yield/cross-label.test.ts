import { describe, expect, it } from 'vitest';
import { crossLabel } from './cross-label';

describe('crossLabel', () => {
  it('when both parents are of one breed, then the litter is purebred of that breed', () => {
    expect(crossLabel('New Zealand', 'new zealand')).toEqual({ key: 'pure:new zealand', label: 'New Zealand', kind: 'purebred' });
  });
  it('when the parents differ, then the cross is named sire first', () => {
    expect(crossLabel('Californian', 'New Zealand')).toMatchObject({ label: 'Californian × New Zealand', kind: 'cross' });
    expect(crossLabel('New Zealand', 'Californian').key).not.toBe(crossLabel('Californian', 'New Zealand').key);
  });
  it('when a parent has no known breed, then the litter is of unknown ancestry', () => {
    expect(crossLabel(null, 'Californian')).toMatchObject({ key: 'unknown', kind: 'unknown' });
    expect(crossLabel('Californian', '  ')).toMatchObject({ key: 'unknown', kind: 'unknown' });
  });
});
