import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import type { HerdImportDto } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimal } from '../support/herd';
import { binaryParser, csv, HEADER, pdfText, stagedPreview } from '../support/herd-files';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let member: Agent;
let imported: HerdImportDto;

/**
 * An invented line of Satin and New Zealand stock, four generations deep behind TX-1 (Juniper),
 * whose parents are half sibs (both by Oakmoss): Juniper's COI is 1/8 (Falconer & Mackay: offspring
 * of half sibs F = 1/8).
 */
const pedigreeFile = csv(
  `${HEADER},colour,registration,weight_lb,weighed`,
  'GG1,Oakmoss,buck,Satin,2016-01-10,,,Copper,SAT-0101,,',
  'GG2,Fern,doe,Satin,2016-02-01,,,Copper,,,',
  'GG3,Birch,buck,New Zealand,2016-01-20,,,White,NZ-3003,,',
  'GG4,Sorrel,doe,New Zealand,2016-03-01,,,White,,,',
  'GP1,Thistle,buck,Satin,2017-01-05,GG1,GG2,Copper,,,',
  'GP2,Heather,doe,cross,2017-02-05,GG3,GG4,White,,,',
  'GP3,Sage,doe,cross,2017-02-07,GG1,GG4,Broken copper,,,',
  'P1,Bramble,buck,cross,2018-01-10,GP1,GP2,Copper,R-77,,',
  'P2,Clover,doe,cross,2018-01-12,GG1,GP3,Broken copper,,,',
  'TX-1,Juniper,doe,cross,2019-03-15,P1,P2,Broken copper,R-1001,9.25,2024-04-02',
  'BK-2,"=SUM(1,2)",buck,Satin,2019-03-15,P1,P2,Copper,,,',
);

beforeAll(async () => {
  coop = await createTestCoop();
  member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
  imported = await stagedPreview(member, pedigreeFile);
  const res = await member.post(`/api/herd-imports/${imported.id}/confirmation`).send({ idempotencyKey: randomUUID() });
  if (res.status !== 200) throw new Error(JSON.stringify(res.body));
});
afterAll(async () => {
  await handle.close();
});

const idOf = (tattoo: string) => imported.rows.items.find((r) => r.tattoo === tattoo)!.animalId;

describe('herd export (CSV)', () => {
  it('when a member exports the herd, then it downloads as CSV in the import format plus COI, breed make-up, age class and the last weight in the farm\'s units', async () => {
    const res = await member.get('/api/herd-export?status=all').buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="farm-a-[a-z0-9-]+-herd-\d{4}-\d{2}-\d{2}\.csv"$/);
    const body = res.body as Buffer;
    expect([...body.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const rows = parse(body, { bom: true, columns: true }) as Record<string, string>[];
    expect(Object.keys(rows[0]!)).toEqual([
      'tattoo', 'name', 'sex', 'breed', 'born', 'sire', 'dam', 'colour', 'registration', 'hutch', 'bred_by', 'weight_lb', 'weighed',
      'status', 'coi_percent', 'breed_makeup', 'age_class',
    ]);
    expect(rows).toHaveLength(11);
    const juniper = rows.find((r) => r.tattoo === 'TX-1')!;
    expect(juniper).toMatchObject({ name: 'Juniper', sex: 'doe', breed: 'cross', born: '2019-03-15', sire: 'P1', dam: 'P2', registration: 'R-1001', weighed: '2024-04-02', age_class: 'senior' });
    expect(juniper.weight_lb).toBe('9.25');
    // Falconer & Mackay: offspring of half sibs F = 1/8 = 12.5 %.
    expect(juniper.coi_percent).toBe('12.50');
    expect(juniper.breed_makeup).toBe('Satin 62.5%; New Zealand 37.5%');
    expect(juniper.bred_by).toBe(coop.farms[0]!.name);
    // A name a spreadsheet would run as a formula is made safe.
    expect(rows.find((r) => r.tattoo === 'BK-2')!.name).toBe("'=SUM(1,2)");
  });

  it('when the Herd table is filtered and sorted, then the export has exactly those rows in that order', async () => {
    const res = await member.get('/api/herd-export?sex=buck&sort=tattoo&dir=desc').buffer(true).parse(binaryParser);
    const rows = parse(res.body as Buffer, { bom: true, columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.tattoo)).toEqual(['P1', 'GP1', 'GG3', 'GG1', 'BK-2']);
    expect(res.headers['x-row-count']).toBe('5');
  });

  it('when a farm keeps kilograms, then the weight column is weight_kg', async () => {
    const kgCoop = await createTestCoop();
    await asTenant(kgCoop.id, (c) => c.query(`UPDATE farms SET weight_unit = 'kg_g' WHERE id = $1`, [kgCoop.farms[0]!.id]), { commit: true });
    const agent = await signedInAgent(kgCoop.member.email, TEST_PASSWORD, handle);
    const preview = await stagedPreview(agent, csv(`${HEADER},weight_g,weighed`, 'KG1,Dandelion,doe,Rex,2022-04-01,,,3875,2024-01-15'));
    await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() }).expect(200);
    const res = await agent.get('/api/herd-export').buffer(true).parse(binaryParser);
    const [row] = parse(res.body as Buffer, { bom: true, columns: true }) as Record<string, string>[];
    expect(row).toMatchObject({ tattoo: 'KG1', weight_kg: '3.875', weighed: '2024-01-15' });
  });

  it('when an exported file is imported again, then every row is recognised and nothing would change', async () => {
    const res = await member.get('/api/herd-export?status=all').buffer(true).parse(binaryParser);
    const again = await stagedPreview(member, res.body as Buffer, 'round-trip.csv');
    expect(again.summary).toMatchObject({ rows: 11, create: 0, update: 0, unchanged: 11, withErrors: 0 });
    expect(again.summary.columns.computed).toEqual(['status', 'coi_percent', 'breed_makeup', 'age_class']);
    expect(again.canConfirm).toBe(false);
  });

  it('when another farm\'s member exports, then only their own herd is in it', async () => {
    const neighbour = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
    await addAnimal(neighbour, { tattoo: 'NB-1', name: 'Neighbour doe' });
    const res = await neighbour.get('/api/herd-export').buffer(true).parse(binaryParser);
    const rows = parse(res.body as Buffer, { bom: true, columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.tattoo)).toEqual(['NB-1']);
  });
});

describe('herd export: text a spreadsheet would run', () => {
  it('when every text field of an animal starts like a formula, then every cell of the export is made safe in the same way', async () => {
    const hostileCoop = await createTestCoop();
    const admin = await signedInAgent(hostileCoop.admin.email, TEST_PASSWORD, handle);
    const breedName = '=HYPERLINK("http://evil.example","x")';
    const breed = await admin.post('/api/breeds').send({ name: breedName, sizeClass: 'medium', source: 'Invented for a test' });
    expect(breed.status).toBe(201);
    const owner = await signedInAgent(hostileCoop.member.email, TEST_PASSWORD, handle);
    const hostile = { name: '+SUM(1,2)', colour: '-2+3', registrationNumber: '@cmd', hutch: '=A1', breederName: '=bred("x")' };
    await addAnimal(owner, { tattoo: 'HX-1', breedId: breed.body.id, origin: 'arrived', arrivedOn: '2024-02-01', ...hostile });

    const res = await owner.get('/api/herd-export?status=all').buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    const rows = parse(res.body as Buffer, { bom: true, columns: true }) as Record<string, string>[];
    const row = rows.find((r) => r.tattoo === 'HX-1')!;
    expect(row).toMatchObject({
      name: "'+SUM(1,2)",
      breed: `'${breedName}`,
      colour: "'-2+3",
      registration: "'@cmd",
      hutch: "'=A1",
      bred_by: `'=bred("x")`,
      breed_makeup: `'${breedName} 100%`,
    });
    for (const r of rows) for (const [column, cell] of Object.entries(r)) expect(cell, column).not.toMatch(/^[=+\-@\t\r]/);
  });
});

describe('pedigree certificate (PDF)', () => {
  it('when a member downloads the pedigree of an animal, then the PDF holds its details, four generations with tattoo, name, breed, colour and registration, its COI, the breeding farm and the date', async () => {
    const res = await member.get(`/api/pedigree-certificates/${idOf('TX-1')}`).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe('attachment; filename="pedigree-TX-1-juniper.pdf"');
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const { pages, text } = await pdfText(pdf);
    expect(pages).toBe(1);
    expect(text).toContain('Pedigree certificate');
    expect(text).toContain('Juniper');
    expect(text).toContain('Ear tattoo TX-1');
    expect(text).toContain('Doe');
    expect(text).toContain('Mar 15, 2019');
    expect(text).toContain('R-1001');
    // Falconer & Mackay: offspring of half sibs F = 1/8.
    expect(text).toContain('12.50 %');
    expect(text).toContain(`Bred by ${coop.farms[0]!.name}`.replace('Bred by ', ''));
    expect(text).toMatch(new RegExp(`Issued by ${coop.farms[0]!.name}`));
    expect(text).toMatch(/on [A-Z][a-z]{2} \d{1,2}, \d{4} \(\d{4}-\d{2}-\d{2}\)/);
    // Parents, grandparents, great-grandparents: tattoo and name, breed, colour, registration where known.
    for (const ancestor of ['P1 Bramble', 'P2 Clover', 'GP1 Thistle', 'GP2 Heather', 'GG1 Oakmoss', 'GP3 Sage', 'GG3 Birch', 'GG4 Sorrel', 'GG2 Fern']) {
      expect(text).toContain(ancestor);
    }
    expect(text).toContain('Reg. R-77');
    expect(text).toContain('Reg. SAT-0101');
    expect(text).toContain('Colour: Broken copper');
    expect(text).toContain('Satin');
    expect(text).toContain('Cross: New Zealand 50%, Satin 50%');
    expect(text).toContain('Sire unknown');
    expect(text).toContain('GREAT-GREAT-GRANDPARENTS');
  });

  it('when someone may not see the animal (another farm of the co-op, another co-op), then the PDF is 404', async () => {
    const neighbour = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
    const refused = await neighbour.get(`/api/pedigree-certificates/${idOf('TX-1')}`);
    expect(refused.status).toBe(404);
    expect(refused.headers['content-type']).toMatch(/json/);
    const foreignCoop = await createTestCoop();
    const foreign = await signedInAgent(foreignCoop.member.email, TEST_PASSWORD, handle);
    expect((await foreign.get(`/api/pedigree-certificates/${idOf('TX-1')}`)).status).toBe(404);
    // The apprentice of the farm reads its herd, and its papers.
    const apprentice = await signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle);
    expect((await apprentice.get(`/api/pedigree-certificates/${idOf('TX-1')}`)).status).toBe(200);
  });
});
