import { describe, expect, it } from 'vitest';
import { GRAMS_PER_POUND } from '../units/units';
import { fromSpreadsheetSafe, headerProblem, mapImportHeader, spreadsheetSafe } from './csv-columns';
import { checkImportRows, lifecycleByAge, type HerdRecordForImport, type ImportCheckContext } from './import-check';

const breeds = [
  { id: 'b-nz', name: 'New Zealand', firstBreedingDays: { doe: { min: 137 }, buck: { min: 167 } } },
  { id: 'b-ch', name: "Champagne d'Argent", firstBreedingDays: { doe: { min: 137 }, buck: { min: 167 } } },
];
let ids = 0;
const ctx = (herd: HerdRecordForImport[] = []): ImportCheckContext => ({
  today: '2025-05-01', farmName: 'Hazelrun Rabbitry', weightUnit: 'lb_oz', herd, breeds, idFor: (line) => `new-${line}-${++ids}`,
});
const record = (fields: Partial<HerdRecordForImport>): HerdRecordForImport => ({
  id: 'r-1', tattoo: 'HR-1', name: 'Willow', sex: 'doe', birthDate: '2023-01-01', breedId: 'b-nz', colour: '', registrationNumber: null, hutch: '',
  notes: '', sireId: null, damId: null, sireTattoo: null, damTattoo: null, onFarmHere: true, ownedHere: true, disposition: 'on_farm', version: 3,
  latestWeight: null, ...fields,
});
const file = (header: string, ...lines: string[]) => {
  const cells = header.split(',');
  return { mapping: mapImportHeader(cells), records: lines.map((l, i) => ({ line: i + 2, cells: l.split(',') })) };
};

describe('herd spreadsheet header', () => {
  it('when columns are spelled as spreadsheets spell them, then they map (case, spaces, US colour, a weight unit in brackets)', () => {
    const m = mapImportHeader([' Tattoo', 'NAME', 'sex', 'Breed', 'born', 'sire', 'dam', 'Color', 'Weight (lb)', 'Registration Number', 'notes about it']);
    expect(m.missing).toEqual([]);
    expect(m.index).toMatchObject({ tattoo: 0, colour: 7, weight: 8, registration: 9 });
    expect(m.weightColumn).toBe('weight_lb');
    expect(m.ignored).toEqual(['notes about it']);
  });

  it('when required columns are missing or a weight has no unit, then the problem names them', () => {
    const header = ['tattoo', 'sex', 'weight'];
    expect(headerProblem(mapImportHeader(header), header)).toMatch(/^The file has no columns for name, breed, born, sire and dam\./);
    const full = ['tattoo', 'name', 'sex', 'breed', 'born', 'sire', 'dam', 'weight'];
    expect(headerProblem(mapImportHeader(full), full)).toBe('The column "weight" does not say its unit. Name it weight_lb, weight_oz, weight_kg or weight_g.');
    const two = [...full.slice(0, 7), 'weight_kg', 'weight_lb'];
    expect(headerProblem(mapImportHeader(two), two)).toBe('Give weights in one column only (found weight_kg and weight_lb).');
  });

  it('when a cell would run as a spreadsheet formula, then the export makes it safe and the import reads it back (OWASP, CSV injection)', () => {
    for (const value of ['=1+1', '+SUM(A1)', '-2', '@cmd', 'Plain', "O'Neil"]) expect(fromSpreadsheetSafe(spreadsheetSafe(value))).toBe(value);
    expect(spreadsheetSafe('=HYPERLINK("x")')).toBe('\'=HYPERLINK("x")');
  });
});

describe('herd spreadsheet rows', () => {
  it('when a breed is written without its accent or apostrophe, then it is still found; a typo gets a suggestion', () => {
    const { mapping, records } = file('tattoo,name,sex,breed,born,sire,dam', 'A1,,doe,champagne dargent,2024-01-01,,', 'A2,,doe,New Zeland,2024-01-01,,');
    const result = checkImportRows(records, mapping, ctx());
    expect(result.plan.creates[0]).toMatchObject({ tattoo: 'A1', breedId: 'b-ch' });
    expect(result.rows[1]!.errors[0]!.message).toMatch(/did you mean New Zealand\?/);
  });

  it('when a weight is given in pounds, then it is planned in grams (NIST Handbook 44: 1 lb = 453.59237 g) dated today unless a date is given', () => {
    const { mapping, records } = file('tattoo,name,sex,breed,born,sire,dam,weight_lb', 'W1,,doe,New Zealand,2024-01-01,,,9.5');
    const result = checkImportRows(records, mapping, ctx());
    expect(result.plan.weighIns).toEqual([{ animalId: result.plan.creates[0]!.id, line: 2, grams: Math.round(9.5 * GRAMS_PER_POUND), weighedOn: '2025-05-01' }]);
  });

  it('when a row matches an animal that left the herd (same tattoo, sex and birth date), then it is left as it is', () => {
    const { mapping, records } = file('tattoo,name,sex,breed,born,sire,dam', 'HR-1,Willow,doe,New Zealand,2023-01-01,,');
    const result = checkImportRows(records, mapping, ctx([record({ onFarmHere: false, disposition: 'sold' })]));
    expect(result.rows[0]).toMatchObject({ action: 'unchanged', animalId: 'r-1' });
    expect(result.rows[0]!.warnings[0]!.message).toBe('Already in your records as sold; left as it is');
    expect(result.plan).toEqual({ creates: [], updates: [], weighIns: [] });
  });

  it('when a herd animal\'s row fills its unknown sire from the file, then that is an update from its version', () => {
    const { mapping, records } = file('tattoo,name,sex,breed,born,sire,dam', 'S9,Sire,buck,New Zealand,2021-01-01,,', 'HR-1,Willow,doe,unknown,2023-01-01,S9,');
    const result = checkImportRows(records, mapping, ctx([record({})]));
    expect(result.rows[1]).toMatchObject({ action: 'update', changes: [{ field: 'sire', from: 'unknown', to: 'S9' }] });
    expect(result.plan.updates).toEqual([{ animalId: 'r-1', version: 3, line: 3, changes: { sireId: result.plan.creates[0]!.id } }]);
  });

  it('when a row gives a herd doe as dam with a birth date off her kindlings, then the born cell is an error naming them; a dam of the same file is not checked', () => {
    const { mapping, records } = file('tattoo,name,sex,breed,born,sire,dam', 'K1,,doe,New Zealand,2025-03-05,,HR-1', 'K2,,doe,New Zealand,2025-03-10,,HR-1', 'D2,,doe,New Zealand,2023-01-01,,', 'K3,,doe,New Zealand,2025-03-05,,D2');
    const result = checkImportRows(records, mapping, { ...ctx([record({})]), kindlingDaysByDam: new Map([['r-1', ['2025-03-10']]]) });
    expect(result.rows[0]!.errors).toEqual([{
      column: 'born',
      message: "Willow (HR-1)'s litter was kindled on Mar 10, 2025. A kit of hers is born on its litter's kindling day: use that date, or record the kindling of this litter first.",
    }]);
    expect(result.rows[1]!.errors).toEqual([]);
    expect(result.rows[3]!.errors).toEqual([]);
    expect(result.plan.creates.map((c) => c.tattoo)).toEqual(['K2', 'D2', 'K3']);
  });

  it('when an animal is recorded, then its stage follows its age: kit to 8 weeks, junior to its breed\'s first-breeding age, then breeding', () => {
    // Kits wean at 4–8 weeks (Texas Extension); first breeding of medium breeds: does 137, bucks 167 days (Rabbit Production, 9th ed.).
    expect(lifecycleByAge('doe', '2025-03-10', '2025-05-01', null)).toBe('kit');
    expect(lifecycleByAge('doe', '2025-01-01', '2025-05-01', null)).toBe('junior');
    expect(lifecycleByAge('doe', '2024-12-01', '2025-05-01', null)).toBe('breeding');
    expect(lifecycleByAge('buck', '2024-12-01', '2025-05-01', null)).toBe('junior');
  });
});
