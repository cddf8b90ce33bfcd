import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatDayInWords, type HerdImportDto, type HerdImportRowDto } from '@burrowline/shared';
import { loadConfig } from '../../packages/server/src/config/env';
import { daysAgo, kindlingAs, serviceAs } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimal } from '../support/herd';
import { csv, HEADER, stagedPreview, stageFile, streamLines } from '../support/herd-files';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let member: Agent;

beforeAll(async () => {
  coop = await createTestCoop();
  member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
});
afterAll(async () => {
  await handle.close();
});

const farmA = () => coop.farms[0]!.id;

async function animalsOfFarm(coopId: string, farmId: string) {
  return asTenant(coopId, async (c) =>
    (await c.query('SELECT id, tattoo, name, sex, breed_id, birth_date::text AS born, sire_id, dam_id, colour, version FROM animals WHERE owning_farm_id = $1 ORDER BY tattoo', [farmId])).rows,
  );
}

function row(preview: HerdImportDto, line: number): HerdImportRowDto {
  const found = preview.rows.items.find((r) => r.line === line);
  if (!found) throw new Error(`no row on line ${line}`);
  return found;
}

async function freshMember() {
  const own = await createTestCoop();
  return { coop: own, agent: await signedInAgent(own.member.email, TEST_PASSWORD, handle) };
}

describe('herd import: a good file', () => {
  it('when a member uploads a valid CSV, then the preview lists every row to create with ids and nothing is written until confirm', async () => {
    const { coop: own, agent } = await freshMember();
    const file = csv(
      HEADER,
      'S1,Bramble,buck,New Zealand,2021-01-05,,',
      'D1,Clover,doe,Californian,2021-02-11,,',
      'B1,Rook,buck,cross,2022-03-01,S1,D1',
      'E1,Wren,doe,cross,2022-03-01,S1,D1',
      'X1,Tansy,doe,cross,2023-04-20,B1,E1',
    );
    const preview = await stagedPreview(agent, file, 'spring herd.csv');
    expect(preview.status).toBe('ready');
    expect(preview.fileName).toBe('spring herd.csv');
    expect(preview.checksum).toMatch(/^[0-9a-f]{64}$/);
    expect(preview.summary).toMatchObject({ rows: 5, create: 5, update: 0, unchanged: 0, withErrors: 0, withWarnings: 0 });
    expect(preview.canConfirm).toBe(true);
    expect(preview.rows.items.map((r) => [r.line, r.action, r.tattoo])).toEqual([
      [2, 'create', 'S1'], [3, 'create', 'D1'], [4, 'create', 'B1'], [5, 'create', 'E1'], [6, 'create', 'X1'],
    ]);
    // Staged, with its checksum; the herd is untouched.
    const staged = await asTenant(own.id, (c) => c.query('SELECT checksum, byte_size, status FROM herd_imports WHERE id = $1', [preview.id]));
    expect(staged.rows[0]).toMatchObject({ checksum: preview.checksum, byte_size: Buffer.byteLength(file), status: 'ready' });
    expect(await animalsOfFarm(own.id, own.farms[0]!.id)).toEqual([]);

    const res = await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('confirmed');
    expect(res.body.result).toMatchObject({ created: 5, updated: 0, weighIns: 0 });

    const animals = await animalsOfFarm(own.id, own.farms[0]!.id);
    expect(animals.map((a) => a.tattoo)).toEqual(['B1', 'D1', 'E1', 'S1', 'X1']);
    // The ids are the ones the preview gave.
    for (const r of preview.rows.items) expect(animals.find((a) => a.tattoo === r.tattoo)!.id).toBe(r.animalId);
    const byTattoo = Object.fromEntries(animals.map((a) => [a.tattoo, a]));
    expect(byTattoo.X1!.sire_id).toBe(byTattoo.B1!.id);
    expect(byTattoo.X1!.dam_id).toBe(byTattoo.E1!.id);

    // COI and breed make-up were recomputed with the import: X1 is the kit of full sibs.
    const figures = await asTenant(own.id, (c) =>
      c.query(
        `SELECT a.tattoo, i.coi, m.purity, m.breeds FROM animals a JOIN animal_inbreeding i ON i.animal_id = a.id
         JOIN animal_breed_makeups m ON m.animal_id = a.id WHERE a.owning_farm_id = $1`,
        [own.farms[0]!.id],
      ),
    );
    const x1 = figures.rows.find((f) => f.tattoo === 'X1')!;
    // Falconer & Mackay, Introduction to Quantitative Genetics: offspring of full sibs F = 1/4.
    expect(x1.coi).toBeCloseTo(0.25, 12);
    expect(x1.purity).toBe('known_cross');
    expect(Object.values(x1.breeds as Record<string, number>).sort()).toEqual([0.5, 0.5]);
    expect(figures.rows).toHaveLength(5);

    // The edit history says where each animal came from, and the audit log has the import.
    const history = await asTenant(own.id, (c) => c.query(`SELECT changes FROM record_changes WHERE record_id = $1`, [byTattoo.X1!.id]));
    expect(history.rows[0].changes.created[1]).toBe('imported from spring herd.csv, line 6');
    const audit = await asTenant(own.id, (c) => c.query(`SELECT details FROM audit_events WHERE action = 'herd.imported' AND subject_id = $1`, [preview.id]));
    expect(audit.rows[0].details).toMatchObject({ created: 5, checksum: preview.checksum });
  });

  it('when the file begins with a UTF-8 byte-order mark, then it reads the same as without one', async () => {
    const { agent } = await freshMember();
    const body = csv(HEADER, 'BM1,Éclair,doe,New Zealand,2022-06-01,,');
    const withBom = await stagedPreview(agent, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(body, 'utf8')]));
    const without = await stagedPreview(agent, body);
    expect(withBom.hadByteOrderMark).toBe(true);
    expect(without.hadByteOrderMark).toBe(false);
    expect(withBom.summary).toMatchObject({ rows: 1, create: 1, withErrors: 0 });
    expect(row(withBom, 2)).toMatchObject({ tattoo: 'BM1', name: 'Éclair', errors: [] });
    expect(row(without, 2)).toMatchObject({ tattoo: 'BM1', name: 'Éclair', errors: [] });
    expect(withBom.checksum).not.toBe(without.checksum);
  });

  it('when a quoted cell spans lines and blank lines separate rows, then each row is named by the line it starts on', async () => {
    const { agent } = await freshMember();
    const file = `${HEADER},notes\r\nML1,Aster,doe,Satin,2023-01-01,,,"Calm doe.\r\nGood mother."\r\n\r\nML2,Basil,buck,Satin,2023-01-01,,ZZ,\r\n`;
    const preview = await stagedPreview(agent, file);
    expect(preview.rows.items.map((r) => [r.line, r.tattoo])).toEqual([[2, 'ML1'], [5, 'ML2']]);
    expect(row(preview, 5).errors[0]!.message).toMatch(/No animal with tattoo ZZ/);
  });

  it('when extra columns are present, then colour, registration and a weight in the file\'s unit are mapped (in grams) and unknown columns listed as ignored', async () => {
    const { coop: own, agent } = await freshMember();
    const preview = await stagedPreview(
      agent,
      csv(`${HEADER},Colour,registration,weight_kg,weighed,favourite_treat,coi_percent`, 'W1,Marigold,doe,Californian,2022-01-10,,,Californian markings,R-2291,4.25,2024-03-01,dandelion,0.00'),
    );
    expect(preview.summary.columns.mapped).toEqual(expect.arrayContaining(['colour', 'registration', 'weight', 'weighed']));
    expect(preview.summary.columns.ignored).toEqual(['favourite_treat']);
    expect(preview.summary.columns.computed).toEqual(['coi_percent']);
    expect(preview.summary.weightColumn).toBe('weight_kg');
    expect(preview.summary.weighIns).toBe(1);
    await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() }).expect(200);
    const stored = await asTenant(own.id, (c) =>
      c.query(`SELECT a.colour, a.registration_number, w.total_grams, w.weighed_on::text AS weighed_on, w.review_state
               FROM animals a JOIN weigh_ins w ON w.animal_id = a.id WHERE a.tattoo = 'W1'`),
    );
    expect(stored.rows[0]).toEqual({ colour: 'Californian markings', registration_number: 'R-2291', total_grams: 4250, weighed_on: '2024-03-01', review_state: 'accepted' });
  });

  it('when a browser asks for progress, then the answer streams reading and checking progress and ends with the preview', async () => {
    const rows = Array.from({ length: 2500 }, (_, i) => `P${i},Kit ${i},${i % 2 ? 'buck' : 'doe'},Satin,2023-0${(i % 9) + 1}-1${i % 9},,`);
    const res = await stageFile(member, csv(HEADER, ...rows)).set('Accept', 'application/x-ndjson');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/x-ndjson/);
    const lines = streamLines(res.text);
    expect(lines[0]).toMatchObject({ type: 'progress', phase: 'reading', done: 2500, total: 2500 });
    const checking = lines.filter((l) => l.type === 'progress' && l.phase === 'checking');
    expect(checking.map((l) => (l as { done: number }).done)).toEqual([1000, 2000, 2500]);
    const last = lines[lines.length - 1]!;
    expect(last.type).toBe('result');
    if (last.type !== 'result') throw new Error('no result');
    expect(last.status).toBe(201);
    expect(last.body.summary).toMatchObject({ rows: 2500, create: 2500, withErrors: 0 });
    expect(last.body.rows.items).toHaveLength(100);
  });
});

describe('herd import: files refused as a whole', () => {
  const refusal = async (content: string | Buffer, fileName = 'herd.csv', agent = member) => {
    const res = await stageFile(agent, content, fileName);
    return { status: res.status, code: res.body.error?.code, message: String(res.body.error?.message ?? '') };
  };

  it('when the file is a spreadsheet workbook or a PDF named .csv, then it is refused as not CSV, saying what it is', async () => {
    const zip = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00]), Buffer.alloc(200, 1)]);
    const workbook = await refusal(zip, 'herd.csv');
    expect(workbook.status).toBe(415);
    expect(workbook.message).toMatch(/not a CSV file/);
    const pdf = await refusal(Buffer.from('%PDF-1.7\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n'), 'herd.csv');
    expect(pdf).toMatchObject({ status: 415, code: 'unsupported_file' });
    expect(pdf.message).toMatch(/PDF file, not a CSV file/);
  });

  it('when the file is not UTF-8 (Windows-1252) or is UTF-16, then the message says to save it as CSV UTF-8', async () => {
    const latin1 = Buffer.from(`${HEADER}\r\nL1,Ren\xe9e,doe,Satin,2023-01-01,,\r\n`, 'latin1');
    const res = await refusal(latin1);
    expect(res.status).toBe(415);
    expect(res.message).toMatch(/not UTF-8/);
    expect(res.message).toMatch(/CSV UTF-8/);
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(`${HEADER}\r\n`, 'utf16le')]);
    expect((await refusal(utf16)).message).toMatch(/UTF-16/);
  });

  it('when required columns are missing, then the message names each missing column', async () => {
    const res = await refusal(csv('tattoo,name,sex,born', 'M1,Moss,doe,2023-01-01'));
    expect(res.status).toBe(400);
    expect(res.message).toBe(
      'The file has no columns for breed, sire and dam. Its first line must name the columns tattoo,name,sex,breed,born,sire,dam. The first line has: tattoo, name, sex, born.',
    );
  });

  it('when a weight column does not say its unit, or the file has only its header, or is empty, then each is refused with its reason', async () => {
    expect((await refusal(csv(`${HEADER},weight`, 'A1,A,doe,Satin,2023-01-01,,,4'))).message).toMatch(/"weight" does not say its unit/);
    expect((await refusal(csv(HEADER))).message).toBe('The file names its columns but has no rows of animals');
    expect(await refusal(Buffer.alloc(0))).toMatchObject({ status: 400, message: 'The file is empty' });
  });

  it('when a quoted cell is never closed, then the file is refused as invalid CSV near that line', async () => {
    const res = await refusal(`${HEADER}\nQ1,Fine,doe,Satin,2023-01-01,,\nQ2,"Broken,doe,Satin,2023-01-01,,\n`);
    expect(res.status).toBe(400);
    expect(res.message).toMatch(/not valid CSV near line \d+: a quoted cell is never closed/);
  });

  it('when the file is bigger than the limit or has more rows than allowed, then it is refused with the limit, and nothing is staged', async () => {
    const small = testApp({ uploads: { ...loadConfig().uploads, importMaxBytes: 4096, importMaxRows: 50 } });
    try {
      const agent = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, small);
      const before = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM herd_imports WHERE farm_id = $1', [coop.farms[1]!.id]));
      const big = await stageFile(agent, csv(HEADER, ...Array.from({ length: 200 }, (_, i) => `B${i},Big ${i},doe,Satin,2023-01-01,,`)));
      expect(big.status).toBe(413);
      expect(big.body.error).toMatchObject({ code: 'payload_too_large', message: 'The spreadsheet is too big: at most 4 kB each' });
      const long = await stageFile(agent, csv(HEADER, ...Array.from({ length: 60 }, (_, i) => `R${i},,doe,Satin,2023-01-01,,`)));
      expect(long.status).toBe(413);
      expect(long.body.error.message).toBe('The file has 60 rows; import at most 50 at a time (split the file).');
      const after = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM herd_imports WHERE farm_id = $1', [coop.farms[1]!.id]));
      expect(after.rows[0].n).toBe(before.rows[0].n);
    } finally {
      await small.close();
    }
  });

  it('when an apprentice uploads a file, then it is refused (they read the herd but add no animals) and nothing is staged', async () => {
    const apprentice = await signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle);
    const staged = () => asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM herd_imports WHERE coop_id = $1', [coop.id])).rows[0].n as number);
    const before = await staged();
    const res = await stageFile(apprentice, csv(HEADER, 'AP1,,doe,Satin,2023-01-01,,'));
    expect(res.status).toBe(403);
    expect(await staged()).toBe(before);
  });
});

describe('herd import: rows checked against the herd and the rest of the file', () => {
  it('when rows are bad, then each is listed with its line number and reasons, nothing can be confirmed, and a fixed file imports', async () => {
    const { coop: own, agent } = await freshMember();
    const lines = [
      HEADER,
      'S1,Bramble,buck,New Zealand,2021-01-05,,', // 2 fine
      'D1,Clover,doe,Californian,2021-02-11,,', // 3 fine
      'K1,Kit one,doe,cross,2022-05-01,S1,D1', // 4 duplicate of line 5
      'K1,Kit dup,buck,cross,2022-05-01,S1,D1', // 5 duplicate of line 4
      'K2,Lost sire,doe,cross,2022-05-01,ZZ9,D1', // 6 unknown parent
      'K3,Swapped,doe,cross,2022-05-01,D1,S1', // 7 a doe as sire, a buck as dam
      'K4,Too early,doe,cross,2020-05-01,S1,D1', // 8 parents born after it
      'C1,Loop A,buck,New Zealand,5/3/2022,C2,', // 9 a spreadsheet date, and a cycle with line 10
      'C2,Loop B,buck,New Zealand,2022-01-01,C1,', // 10
      'K5,Odd breed,doe,Flemmish Giant,2022-05-01,,', // 11 unknown breed
      'K6,Odd sex,female,New Zealand,2022-05-01,,', // 12
      'K7,Young dam,doe,cross,2021-05-01,,D1', // 13 warning only: the dam was 79 days old
    ];
    const preview = await stagedPreview(agent, csv(...lines));
    expect(preview.summary).toMatchObject({ rows: 12, withErrors: 9, withWarnings: 1 });
    expect(preview.canConfirm).toBe(false);
    const errorsOf = (line: number) => row(preview, line).errors.map((e) => `${e.column}: ${e.message}`);
    expect(errorsOf(2)).toEqual([]);
    expect(errorsOf(4)).toEqual(['tattoo: Tattoo K1 is also on line 5; each animal once']);
    expect(errorsOf(5)).toEqual(['tattoo: Tattoo K1 is also on line 4; each animal once']);
    expect(errorsOf(6)).toEqual(['sire: No animal with tattoo ZZ9 in this file or in your herd (leave the sire blank if it is unknown)']);
    expect(errorsOf(7)).toEqual(['sire: Clover (D1) is a doe; a sire must be a buck', 'dam: Bramble (S1) is a buck; a dam must be a doe']);
    expect(errorsOf(8)).toEqual([
      'sire: Bramble (S1) was born on 2021-01-05, not before this animal (2020-05-01); a parent is born first',
      'dam: Clover (D1) was born on 2021-02-11, not before this animal (2020-05-01); a parent is born first',
    ]);
    expect(errorsOf(9)[0]).toMatch(/^born: "5\/3\/2022" is not a birth date: write it as YYYY-MM-DD/);
    expect(errorsOf(9)).toContain('null: Part of a cycle in the pedigree (C1 → C2 → C1, each arrow pointing to a parent): an animal cannot be its own ancestor');
    expect(errorsOf(10)).toContain('null: Part of a cycle in the pedigree (C1 → C2 → C1, each arrow pointing to a parent): an animal cannot be its own ancestor');
    expect(errorsOf(11)).toEqual(['breed: Unknown breed "Flemmish Giant" (did you mean Flemish Giant?): use a breed of the co-op\'s list, cross, or unknown']);
    expect(errorsOf(12)).toEqual(['sex: "female" is not a sex here: write doe or buck']);
    expect(row(preview, 13).errors).toEqual([]);
    expect(row(preview, 13).warnings[0]!.message).toMatch(/^Clover \(D1\) was 79 days old at this birth, younger than the usual first-breeding age/);

    // Only the rows with problems, on request.
    const problems = await agent.get(`/api/herd-imports/${preview.id}?show=problems`).expect(200);
    expect(problems.body.rows.items.map((r: HerdImportRowDto) => r.line)).toEqual([4, 5, 6, 7, 8, 9, 10, 11, 12, 13]);

    const refused = await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toBe('Some rows have errors: fix them in your spreadsheet and upload the file again');
    expect(await animalsOfFarm(own.id, own.farms[0]!.id)).toEqual([]);

    // The breeder fixes the file and uploads it again.
    const fixed = [
      HEADER,
      'S1,Bramble,buck,New Zealand,2021-01-05,,',
      'D1,Clover,doe,Californian,2021-02-11,,',
      'K1,Kit one,doe,cross,2022-05-01,S1,D1',
      'K8,Kit dup,buck,cross,2022-05-01,S1,D1',
      'K2,Lost sire,doe,cross,2022-05-01,,D1',
      'K3,Swapped,doe,cross,2022-05-01,S1,D1',
      'K4,Too early,doe,cross,2022-05-01,S1,D1',
      'C1,Loop A,buck,New Zealand,2022-03-05,,',
      'C2,Loop B,buck,New Zealand,2022-01-01,,',
      'K5,Odd breed,doe,Flemish Giant,2022-05-01,,',
      'K6,Odd sex,doe,New Zealand,2022-05-01,,',
      'K7,Young dam,doe,cross,2021-05-01,,D1',
    ];
    const again = await stagedPreview(agent, csv(...fixed));
    expect(again.summary).toMatchObject({ rows: 12, create: 12, withErrors: 0, withWarnings: 1 });
    await agent.post(`/api/herd-imports/${again.id}/confirmation`).send({ idempotencyKey: randomUUID() }).expect(200);
    expect(await animalsOfFarm(own.id, own.farms[0]!.id)).toHaveLength(12);
  });

  it('when a row adds a kit of a herd doe on a day that is not one of her kindlings, then that row is refused naming her litter; her kindling day imports', async () => {
    const { coop: own, agent } = await freshMember();
    const buck = await addAnimal(agent, { tattoo: 'S1', name: 'Bramble', sex: 'buck', birthDate: '2022-01-05' });
    const doe = await addAnimal(agent, { tattoo: 'D1', name: 'Clover', sex: 'doe', birthDate: '2022-02-11' });
    const service = await serviceAs(own.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(40) });
    await kindlingAs(own.member, { serviceId: service.id, kindledOn: daysAgo(9), bornAlive: 6, bornDead: 0 });
    const before = await animalsOfFarm(own.id, own.farms[0]!.id);

    const preview = await stagedPreview(agent, csv(HEADER, `K1,Early kit,doe,cross,${daysAgo(14)},S1,D1`, `K2,Her kit,doe,cross,${daysAgo(9)},S1,D1`));
    expect(preview.summary).toMatchObject({ rows: 2, withErrors: 1 });
    expect(row(preview, 2).errors).toEqual([{
      column: 'born',
      message: `Clover (D1)'s litter was kindled on ${formatDayInWords(daysAgo(9))}. A kit of hers is born on its litter's kindling day: use that date, or record the kindling of this litter first.`,
    }]);
    expect(row(preview, 3).errors).toEqual([]);
    const refused = await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() });
    expect(refused.status).toBe(400);
    expect(await animalsOfFarm(own.id, own.farms[0]!.id)).toEqual(before);

    const fixed = await stagedPreview(agent, csv(HEADER, `K1,Early kit,doe,cross,${daysAgo(9)},S1,D1`, `K2,Her kit,doe,cross,${daysAgo(9)},S1,D1`));
    expect(fixed.summary).toMatchObject({ rows: 2, create: 2, withErrors: 0 });
    await agent.post(`/api/herd-imports/${fixed.id}/confirmation`).send({ idempotencyKey: randomUUID() }).expect(200);
    const kits = (await animalsOfFarm(own.id, own.farms[0]!.id)).filter((a) => a.tattoo.startsWith('K'));
    expect(kits.map((k) => [k.tattoo, k.born, k.dam_id])).toEqual([['K1', daysAgo(9), doe.id], ['K2', daysAgo(9), doe.id]]);
  });

  it('when a row names an animal already in the herd, then what differs is an update (and a new weigh-in), a parent from the herd is found, and a different sex is an error', async () => {
    const { coop: own, agent } = await freshMember();
    const doe = await addAnimal(agent, { tattoo: 'H-7', name: 'Hazel', sex: 'doe', birthDate: '2022-02-02', colour: 'White' });
    const buck = await addAnimal(agent, { tattoo: 'H-9', name: 'Hob', sex: 'buck', birthDate: '2021-09-09' });
    const preview = await stagedPreview(
      agent,
      csv(
        `${HEADER},colour,weight_lb,weighed`,
        'h-7,Hazel,doe,unknown,2022-02-02,,,Broken chestnut,9.5,2024-05-01', // 2 update: colour, weight
        'H-9,Hob,doe,unknown,2021-09-09,,,,,', // 3 sex differs from the herd
        'N1,Nutmeg,doe,cross,2023-06-01,H-9,H-7,,,', // 4 parents from the herd
      ),
    );
    expect(row(preview, 2)).toMatchObject({ action: 'update', animalId: doe.id, errors: [] });
    expect(row(preview, 2).changes.map((c) => c.field)).toEqual(['colour', 'weight']);
    expect(row(preview, 2).changes[0]).toEqual({ field: 'colour', from: 'White', to: 'Broken chestnut' });
    expect(row(preview, 3).errors.map((e) => e.message)).toEqual([`Your herd records Hob (H-9) as a buck; change it on the animal's page if that is wrong`]);
    expect(row(preview, 4)).toMatchObject({ action: 'create', errors: [] });

    // Fixed: Hob stays a buck.
    const fixed = await stagedPreview(
      agent,
      csv(`${HEADER},colour,weight_lb,weighed`, 'h-7,Hazel,doe,unknown,2022-02-02,,,Broken chestnut,9.5,2024-05-01', 'N1,Nutmeg,doe,cross,2023-06-01,H-9,H-7,,,'),
    );
    expect(fixed.summary).toMatchObject({ create: 1, update: 1, withErrors: 0, weighIns: 1 });
    const confirmed = await agent.post(`/api/herd-imports/${fixed.id}/confirmation`).send({ idempotencyKey: randomUUID() });
    expect(confirmed.body.error?.message).toBeUndefined();
    const animals = await animalsOfFarm(own.id, own.farms[0]!.id);
    const hazel = animals.find((a) => a.tattoo === 'H-7')!;
    expect(hazel).toMatchObject({ colour: 'Broken chestnut', version: doe.version + 1 });
    const nutmeg = animals.find((a) => a.tattoo === 'N1')!;
    expect(nutmeg).toMatchObject({ sire_id: buck.id, dam_id: doe.id });
    const weight = await asTenant(own.id, (c) => c.query('SELECT total_grams FROM weigh_ins WHERE animal_id = $1', [doe.id]));
    expect(weight.rows[0].total_grams).toBe(Math.round(9.5 * 453.59237)); // NIST Handbook 44: 1 lb = 453.59237 g
    const history = await asTenant(own.id, (c) => c.query(`SELECT changes FROM record_changes WHERE record_id = $1 ORDER BY created_at DESC LIMIT 1`, [doe.id]));
    expect(history.rows[0].changes.colour).toEqual(['White', 'Broken chestnut']);
  });
});

describe('herd import: confirming', () => {
  it('when confirm is double-clicked (two requests with the same key at once), then the herd is imported once and both answers agree', async () => {
    const { coop: own, agent } = await freshMember();
    const preview = await stagedPreview(agent, csv(HEADER, 'DC1,One,doe,Satin,2023-01-01,,', 'DC2,Two,buck,Satin,2023-01-01,,'));
    const key = randomUUID();
    const [a, b] = await Promise.all([
      agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: key }),
      agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: key }),
    ]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(a.body.result).toEqual(b.body.result);
    expect(await animalsOfFarm(own.id, own.farms[0]!.id)).toHaveLength(2);
    // A retry later with the same key gets the same answer; another key is told it was already imported.
    const retry = await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: key });
    expect(retry.status).toBe(200);
    expect(retry.body.result.created).toBe(2);
    const other = await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() });
    expect(other.status).toBe(409);
    expect(other.body.error.message).toMatch(/^This file was already imported on \d{4}-\d{2}-\d{2}$/);
    expect(await animalsOfFarm(own.id, own.farms[0]!.id)).toHaveLength(2);
  });

  it('when the herd changed after the preview so the file would do something else, then nothing is imported, the answer is 409 and the preview is refreshed', async () => {
    const { coop: own, agent } = await freshMember();
    const preview = await stagedPreview(agent, csv(HEADER, 'ST1,Stale,doe,Satin,2023-01-01,,', 'ST2,Fresh,doe,Satin,2023-01-01,,'));
    await addAnimal(agent, { tattoo: 'ST1', name: 'Added meanwhile', sex: 'buck', birthDate: '2023-01-01' });
    const res = await agent.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/^Your herd changed since this file was checked/);
    expect((await animalsOfFarm(own.id, own.farms[0]!.id)).map((a) => a.tattoo)).toEqual(['ST1']);
    const refreshed = await agent.get(`/api/herd-imports/${preview.id}`).expect(200);
    expect(refreshed.body.canConfirm).toBe(false);
    expect(refreshed.body.rows.items[0].errors[0].message).toMatch(/as a buck/);
  });

  it('when another farm or another co-op asks for the preview or confirms it, then it is not there (404)', async () => {
    const preview = await stagedPreview(member, csv(HEADER, 'NF1,Private,doe,Satin,2023-01-01,,'));
    const neighbour = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
    await neighbour.get(`/api/herd-imports/${preview.id}`).expect(404);
    await neighbour.post(`/api/herd-imports/${preview.id}/confirmation`).send({ idempotencyKey: randomUUID() }).expect(404);
    const { agent: foreign } = await freshMember();
    await foreign.get(`/api/herd-imports/${preview.id}`).expect(404);
    const state = await asTenant(coop.id, (c) => c.query('SELECT status FROM herd_imports WHERE id = $1', [preview.id]));
    expect(state.rows[0].status).toBe('ready');
    expect((await animalsOfFarm(coop.id, farmA())).filter((a) => a.tattoo === 'NF1')).toEqual([]);
  });
});

describe('how many files a farm may keep staged', () => {
  it('when a farm already has ten files waiting, then another is refused with a clear 409 and nothing more is staged', async () => {
    const own = await createTestCoop();
    const agent = await signedInAgent(own.member.email, TEST_PASSWORD);
    const file = csv(HEADER, 'Q-1,Quill,doe,New Zealand,2024-01-10,,');
    for (let i = 0; i < 10; i += 1) expect((await stageFile(agent, file)).status).toBe(201);
    const refused = await stageFile(agent, file);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/10 spreadsheets are already waiting .* Import or discard one of them first/);
    const staged = await asTenant(own.id, (c) => c.query(`SELECT count(*)::int AS n FROM herd_imports WHERE farm_id = $1`, [own.farms[0]!.id]));
    expect(staged.rows[0].n).toBe(10);
  });
});
