import { describe, expect, it } from 'vitest';
import {
  asDyadicFraction, breedMakeup, breedMakeupAll, combineBreedMakeup, offspringBreedMakeup, offspringBreedMakeupMany, type BreedAnimal,
} from './breed-makeup';

// Breed arithmetic is common practice (each parent passes on half its make-up); no published table.
const animal = (id: string, sireId: string | null, damId: string | null, declaredBreed: string | null = null): BreedAnimal => ({
  id, sireId, damId, declaredBreed,
});

const herd: BreedAnimal[] = [
  animal('NZ-BUCK', null, null, 'New Zealand'),
  animal('NZ-DOE', null, null, 'New Zealand'),
  animal('CAL-DOE', null, null, 'Californian'),
  animal('BARN-DOE', null, null, null),
  animal('NZ-KIT', 'NZ-BUCK', 'NZ-DOE', 'Californian'), // declared breed ignored: parents are known
  animal('F1', 'NZ-BUCK', 'CAL-DOE'),
  animal('BACKCROSS', 'NZ-BUCK', 'F1'),
  animal('HALF-KNOWN', 'NZ-BUCK', null, 'New Zealand'),
  animal('BARN-CROSS', 'NZ-BUCK', 'BARN-DOE'),
  animal('THREE-WAY', 'F1', 'SF-OUTSIDE'),
  animal('PAPERS-CROSS', 'NZ-BUCK', 'SF-DOE'),
  animal('SF-DOE', null, null, 'Silver Fox'),
];

describe('breed make-up down the pedigree', () => {
  it('when an animal has no parents and a declared breed, then it is purebred of that breed', () => {
    expect(breedMakeup(herd, 'NZ-BUCK')).toEqual({ breeds: { 'New Zealand': 1 }, unknown: 0, purity: 'purebred' });
  });

  it('when both parents are the same breed, then the kit is purebred whatever was declared for it', () => {
    expect(breedMakeup(herd, 'NZ-KIT')).toEqual({ breeds: { 'New Zealand': 1 }, unknown: 0, purity: 'purebred' });
  });

  it('when two breeds are crossed, then the F1 is ½ / ½, a known cross', () => {
    expect(breedMakeup(herd, 'F1')).toEqual({ breeds: { Californian: 0.5, 'New Zealand': 0.5 }, unknown: 0, purity: 'known_cross' });
  });

  it('when the F1 is bred back to one parent breed, then the backcross is ¾ / ¼, largest first', () => {
    const makeup = breedMakeup(herd, 'BACKCROSS');
    expect(makeup).toEqual({ breeds: { 'New Zealand': 0.75, Californian: 0.25 }, unknown: 0, purity: 'known_cross' });
    expect(Object.keys(makeup.breeds)).toEqual(['New Zealand', 'Californian']);
  });

  it('when one parent is unknown, then half is unknown even with a declared breed (partly unknown)', () => {
    expect(breedMakeup(herd, 'HALF-KNOWN')).toEqual({ breeds: { 'New Zealand': 0.5 }, unknown: 0.5, purity: 'partly_unknown' });
  });

  it('when a parent was entered with no breed and no parents, then its half is unknown', () => {
    expect(breedMakeup(herd, 'BARN-DOE')).toEqual({ breeds: {}, unknown: 1, purity: 'unknown' });
    expect(breedMakeup(herd, 'BARN-CROSS')).toEqual({ breeds: { 'New Zealand': 0.5 }, unknown: 0.5, purity: 'partly_unknown' });
  });

  it('when a parent is an outside animal named but not listed, then it counts as unknown ancestry', () => {
    expect(breedMakeup(herd, 'THREE-WAY')).toEqual({ breeds: { Californian: 0.25, 'New Zealand': 0.25 }, unknown: 0.5, purity: 'partly_unknown' });
    expect(breedMakeup(herd, 'NOT-IN-HERD')).toEqual({ breeds: {}, unknown: 1, purity: 'unknown' });
  });

  it('when an outside animal is listed from its papers with a breed, then its breed passes down', () => {
    expect(breedMakeup(herd, 'PAPERS-CROSS')).toEqual({ breeds: { 'New Zealand': 0.5, 'Silver Fox': 0.5 }, unknown: 0, purity: 'known_cross' });
  });

  it('when the whole herd is computed at once, then each animal matches the single computation', () => {
    const all = breedMakeupAll(herd);
    expect([...all.keys()]).toEqual(herd.map((a) => a.id));
    for (const a of herd) expect(all.get(a.id)).toEqual(breedMakeup(herd, a.id));
  });

  it('when a trial mating is planned, then the litter is half of each parent, from the pedigree or from stored make-ups', () => {
    const litter = offspringBreedMakeup(herd, 'BACKCROSS', 'SF-DOE');
    expect(litter).toEqual({ breeds: { 'Silver Fox': 0.5, 'New Zealand': 0.375, Californian: 0.125 }, unknown: 0, purity: 'known_cross' });
    const all = breedMakeupAll(herd);
    expect(combineBreedMakeup(all.get('BACKCROSS')!, all.get('SF-DOE')!)).toEqual(litter);
    expect(combineBreedMakeup(all.get('NZ-BUCK')!, null)).toEqual({ breeds: { 'New Zealand': 0.5 }, unknown: 0.5, purity: 'partly_unknown' });
    expect(offspringBreedMakeup(herd, 'NZ-BUCK', 'NZ-DOE').purity).toBe('purebred');
    const many = offspringBreedMakeupMany(herd, 'SF-DOE', ['BACKCROSS', 'NZ-BUCK', 'STRANGER']);
    expect(many.get('BACKCROSS')).toEqual(litter);
    expect(many.get('NZ-BUCK')).toEqual({ breeds: { 'New Zealand': 0.5, 'Silver Fox': 0.5 }, unknown: 0, purity: 'known_cross' });
    expect(many.get('STRANGER')).toEqual({ breeds: { 'Silver Fox': 0.5 }, unknown: 0.5, purity: 'partly_unknown' });
  });

  it('when fractions are shown, then they turn back into k / 2^g', () => {
    expect(asDyadicFraction(0.375)).toEqual({ numerator: 3, denominator: 8 });
    expect(asDyadicFraction(1)).toEqual({ numerator: 1, denominator: 1 });
    expect(asDyadicFraction(0.5)).toEqual({ numerator: 1, denominator: 2 });
  });

  it('when a line is graded up to one breed for 40 generations, then the fractions stay exact dyadic values', () => {
    const rows: BreedAnimal[] = [animal('S0', null, null, 'Satin'), animal('R0', null, null, 'Rex')];
    let dam = 'R0';
    for (let g = 1; g <= 40; g++) {
      rows.push(animal(`S${g}`, null, null, 'Satin'), animal(`G${g}`, `S${g}`, dam));
      dam = `G${g}`;
    }
    const makeup = breedMakeup(rows, 'G40');
    expect(makeup.breeds.Rex).toBe(2 ** -40);
    expect(makeup.breeds.Satin).toBe(1 - 2 ** -40);
    expect(makeup.breeds.Satin! + makeup.breeds.Rex!).toBe(1);
  });
});
