import { describe, expect, it } from 'vitest';
import { greatCircleKm } from './distance';

const dms = (d: number, m: number, s: number, sign = 1) => sign * (d + m / 60 + s / 3600);

describe('greatCircleKm', () => {
  it('when given Land\'s End and John o\' Groats, then it answers the published 968.9 km', () => {
    // Movable Type Scripts, "Calculate distance, bearing and more between Latitude/Longitude points"
    // (haversine, R = 6371 km): 50°03′59″N 005°42′53″W to 58°38′38″N 003°04′12″W is 968.9 km.
    const landsEnd = { latitude: dms(50, 3, 59), longitude: dms(5, 42, 53, -1) };
    const johnOGroats = { latitude: dms(58, 38, 38), longitude: dms(3, 4, 12, -1) };
    expect(greatCircleKm(landsEnd, johnOGroats)).toBeCloseTo(968.9, 1);
  });

  it('when both points are the same, then the distance is zero, and it is the same both ways', () => {
    const a = { latitude: 44.97, longitude: -93.26 };
    const b = { latitude: 45.56, longitude: -94.16 };
    expect(greatCircleKm(a, a)).toBe(0);
    expect(greatCircleKm(a, b)).toBeCloseTo(greatCircleKm(b, a), 9);
  });
});
