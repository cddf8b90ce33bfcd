import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AnimalDetailDto, PhotoDto } from '@burrowline/shared';
import { loadConfig } from '../../packages/server/src/config/env';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimal } from '../support/herd';
import { binaryParser, testImage } from '../support/herd-files';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const uploadsDir = fs.mkdtempSync(path.join(os.tmpdir(), 'burrowline-photos-'));
const handle = testApp({ uploads: { ...loadConfig().uploads, dir: uploadsDir, photoMaxBytes: 300_000, photosPerAnimal: 4, photosPerUpload: 3 } });
let coop: TestCoop;
let member: Agent;
let doe: AnimalDetailDto;

beforeAll(async () => {
  coop = await createTestCoop();
  member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
  doe = await addAnimal(member, { tattoo: 'PH-1', name: 'Poppy' });
});
afterAll(async () => {
  await handle.close();
  fs.rmSync(uploadsDir, { recursive: true, force: true });
});

const upload = (agent: Agent, animalId: string, files: { body: Buffer; name: string; type: string }[], caption?: string) => {
  let req = agent.post(`/api/animals/${animalId}/photos`);
  if (caption !== undefined) req = req.field('caption', caption);
  for (const file of files) req = req.attach('photos', file.body, { filename: file.name, contentType: file.type });
  return req;
};

const storedFiles = (): string[] => fs.readdirSync(path.join(uploadsDir, coop.id)).sort();

describe('animal photos', () => {
  it('when a member uploads photos, then they are stored under server-made names outside the web root, re-encoded without metadata, with thumbnails', async () => {
    const jpeg = await testImage('jpeg', { width: 3000, height: 2000, artist: 'Marisol at 44.97N 93.26W' });
    const png = await testImage('png', { width: 400, height: 300 });
    const res = await upload(member, doe.id, [{ body: jpeg, name: '../../etc/passwd.jpg', type: 'image/jpeg' }, { body: png, name: 'hutch.png', type: 'image/png' }], 'Poppy at 12 weeks');
    expect(res.status).toBe(201);
    const photos = res.body.photos as PhotoDto[];
    expect(photos).toHaveLength(2);
    expect(photos[0]).toMatchObject({ subject: 'animal', animalId: doe.id, caption: 'Poppy at 12 weeks', contentType: 'image/jpeg', width: 2048, height: 1365 });
    expect(photos[1]).toMatchObject({ contentType: 'image/png', width: 400, height: 300 });
    expect(photos[0]!.url).toBe(`/api/photos/${photos[0]!.id}`);

    // On disk: the server's names only, nothing from the uploader's file name.
    const names = storedFiles();
    expect(names).toEqual([`${photos[0]!.id}-thumb.jpg`, `${photos[0]!.id}.jpg`, `${photos[1]!.id}-thumb.jpg`, `${photos[1]!.id}.png`].sort());
    // The default store is the repository's gitignored .data/uploads, outside the client's web root.
    const defaults = loadConfig({ ...process.env, UPLOADS_DIR: undefined }).uploads.dir;
    expect(defaults).toBe(path.resolve(import.meta.dirname, '../../.data/uploads'));
    expect(defaults.startsWith(path.resolve(import.meta.dirname, '../../packages/client'))).toBe(false);
    const stored = fs.readFileSync(path.join(uploadsDir, coop.id, `${photos[0]!.id}.jpg`));
    const meta = await sharp(stored).metadata();
    expect(meta.exif).toBeUndefined();
    expect(meta.width).toBe(2048);
    const thumb = await sharp(path.join(uploadsDir, coop.id, `${photos[0]!.id}-thumb.jpg`)).metadata();
    expect([thumb.width, thumb.height, thumb.format]).toEqual([480, 480, 'jpeg']);
    const rows = await asTenant(coop.id, (c) => c.query('SELECT storage_key, farm_id, uploaded_by FROM photos WHERE animal_id = $1 ORDER BY created_at, id', [doe.id]));
    expect(rows.rows).toHaveLength(2);
    expect(rows.rows.every((r) => r.farm_id === coop.farms[0]!.id && r.uploaded_by === coop.member.id)).toBe(true);

    // Served through the API with Content-Disposition and a server-made file name.
    const image = await member.get(photos[0]!.url).buffer(true).parse(binaryParser);
    expect(image.status).toBe(200);
    expect(image.headers['content-type']).toBe('image/jpeg');
    expect(image.headers['content-disposition']).toBe(`inline; filename="PH-1-photo-${photos[0]!.id.slice(0, 8)}.jpg"`);
    expect(image.headers['x-content-type-options']).toBe('nosniff');
    expect(image.headers['cache-control']).toBe('private, max-age=300');
    expect((image.body as Buffer).equals(stored)).toBe(true);
    const small = await member.get(photos[0]!.thumbnailUrl).buffer(true).parse(binaryParser);
    expect(small.headers['content-disposition']).toMatch(/-small\.jpg"$/);

    const list = await member.get(`/api/animals/${doe.id}/photos`).expect(200);
    expect(list.body.photos.map((p: PhotoDto) => p.id)).toEqual(photos.map((p) => p.id));
    expect(list.body).toMatchObject({ canChange: true, limits: { maxPhotos: 4, maxBytes: 300_000, perUpload: 3 } });
  });

  it('when a file lies about its type (text or a PDF named .jpg and sent as image/jpeg), then it is refused by its signature and nothing is stored', async () => {
    const before = storedFiles();
    const text = await upload(member, doe.id, [{ body: Buffer.from('this is not a photo at all'), name: 'doe.jpg', type: 'image/jpeg' }]);
    expect(text.status).toBe(415);
    expect(text.body.error).toMatchObject({ code: 'unsupported_file', message: 'The file is not a JPEG, PNG or WebP photo' });
    const pdf = await upload(member, doe.id, [{ body: Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj<<>>endobj\n'), name: 'doe.png', type: 'image/png' }]);
    expect(pdf.status).toBe(415);
    expect(pdf.body.error.message).toBe('The file is not a JPEG, PNG or WebP photo (its content is PDF)');
    // A real PNG header on a body that is not an image.
    const fake = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]), Buffer.alloc(64, 7)]);
    const broken = await upload(member, doe.id, [{ body: fake, name: 'doe.png', type: 'image/png' }]);
    expect(broken.status).toBe(415);
    expect(broken.body.error.message).toMatch(/could not be read as a photo/);
    // One bad file in an upload refuses the whole upload.
    const mixed = await upload(member, doe.id, [
      { body: await testImage('webp'), name: 'a.webp', type: 'image/webp' },
      { body: Buffer.from('GIF89a not really'), name: 'b.gif', type: 'image/gif' },
    ]);
    expect(mixed.status).toBe(415);
    expect(mixed.body.error.message).toMatch(/^File 2 is not a JPEG, PNG or WebP photo/);
    expect(storedFiles()).toEqual(before);
    const count = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM photos WHERE animal_id = $1', [doe.id]));
    expect(count.rows[0].n).toBe(2);
  });

  it('when an upload is too big or carries too many files, then it is refused with the limit', async () => {
    const huge = await sharp({ create: { width: 2000, height: 2000, channels: 3, background: '#777' } }).png({ compressionLevel: 0 }).toBuffer();
    expect(huge.length).toBeGreaterThan(300_000);
    const big = await upload(member, doe.id, [{ body: huge, name: 'big.png', type: 'image/png' }]);
    expect(big.status).toBe(413);
    expect(big.body.error).toMatchObject({ code: 'payload_too_large', message: 'The photo is too big: at most 293 kB each' });
    const small = await testImage('jpeg', { width: 100, height: 100 });
    const many = await upload(member, doe.id, Array.from({ length: 4 }, (_, i) => ({ body: small, name: `${i}.jpg`, type: 'image/jpeg' })));
    expect(many.status).toBe(413);
    expect(many.body.error.message).toBe('Too many files at once: at most 3 photos per upload');
  });

  it('when the animal already has its most photos, then more are refused with how many it may still take', async () => {
    const small = await testImage('jpeg', { width: 100, height: 100 });
    await upload(member, doe.id, [{ body: small, name: 'a.jpg', type: 'image/jpeg' }]).expect(201);
    const res = await upload(member, doe.id, [{ body: small, name: 'b.jpg', type: 'image/jpeg' }, { body: small, name: 'c.jpg', type: 'image/jpeg' }]);
    expect(res.status).toBe(400);
    expect(res.body.error.details.photos).toEqual(['An animal may have at most 4 photos; this one has 3, so add at most 1']);
  });

  it('when a member changes a caption, then the row and the gallery carry the new caption and the files stay', async () => {
    const uploaded = await upload(member, doe.id, [{ body: await testImage('jpeg'), name: 'cap.jpg', type: 'image/jpeg' }], 'Before');
    expect(uploaded.status).toBe(201);
    const photo = (uploaded.body.photos as PhotoDto[]).find((p) => p.caption === 'Before')!;
    const filesBefore = storedFiles().filter((name) => name.startsWith(photo.id));
    const res = await member.patch(`/api/photos/${photo.id}`).send({ caption: 'Poppy at twelve weeks' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: photo.id, caption: 'Poppy at twelve weeks' });
    const row = await asTenant(coop.id, (c) => c.query('SELECT caption FROM photos WHERE id = $1', [photo.id]));
    expect(row.rows).toEqual([{ caption: 'Poppy at twelve weeks' }]);
    const gallery = (await member.get(`/api/animals/${doe.id}/photos`).expect(200)).body.photos as PhotoDto[];
    expect(gallery.find((p) => p.id === photo.id)?.caption).toBe('Poppy at twelve weeks');
    expect(storedFiles().filter((name) => name.startsWith(photo.id))).toEqual(filesBefore);
    await member.delete(`/api/photos/${photo.id}`).expect(204);
  });

  it('when a photo is removed, then it is gone from the gallery and its files from the disk', async () => {
    const { body } = await member.get(`/api/animals/${doe.id}/photos`).expect(200);
    const photo = body.photos[0] as PhotoDto;
    await member.delete(`/api/photos/${photo.id}`).expect(204);
    await member.get(photo.url).expect(404);
    expect(storedFiles().some((name) => name.startsWith(photo.id))).toBe(false);
    const row = await asTenant(coop.id, (c) => c.query('SELECT deleted_at FROM photos WHERE id = $1', [photo.id]));
    expect(row.rows[0].deleted_at).not.toBeNull();
  });
});

describe('who sees an animal\'s photos', () => {
  it('when another farm of the co-op, or another co-op, asks for the photos of an animal it may not see, then there is nothing (404), and its pedigree card carries no photos', async () => {
    const { body } = await member.get(`/api/animals/${doe.id}/photos`).expect(200);
    const photo = body.photos[0] as PhotoDto;
    const neighbour = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
    await neighbour.get(`/api/animals/${doe.id}/photos`).expect(404);
    await neighbour.get(photo.url).expect(404);
    await neighbour.get(photo.thumbnailUrl).expect(404);
    await neighbour.delete(`/api/photos/${photo.id}`).expect(404);
    const card = await neighbour.get(`/api/pedigree-cards/${doe.id}`).expect(200);
    expect(JSON.stringify(card.body)).not.toMatch(/photo/i);
    const foreignCoop = await createTestCoop();
    const foreign = await signedInAgent(foreignCoop.member.email, TEST_PASSWORD, handle);
    await foreign.get(photo.url).expect(404);
    await foreign.get(`/api/animals/${doe.id}/photos`).expect(404);
    await signedInAgent(coop.member.email, TEST_PASSWORD, handle).then((a) => a.get(photo.url).expect(200));
  });

  it('when the apprentice of the farm looks, then they see the photos but may not add or remove them', async () => {
    const apprentice = await signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle);
    const list = await apprentice.get(`/api/animals/${doe.id}/photos`).expect(200);
    expect(list.body.canChange).toBe(false);
    await apprentice.get((list.body.photos[0] as PhotoDto).url).expect(200);
    const res = await upload(apprentice, doe.id, [{ body: await testImage('jpeg', { width: 50, height: 50 }), name: 'x.jpg', type: 'image/jpeg' }]);
    expect(res.status).toBe(403);
    await apprentice.delete(`/api/photos/${(list.body.photos[0] as PhotoDto).id}`).expect(403);
  });

  it('when the animal is lent to another farm, then the farm keeping it does not see the owner\'s photos, and only its owner changes them', async () => {
    const buck = await addAnimal(member, { tattoo: 'PH-L', sex: 'buck', name: 'Lent buck' });
    const { body } = await upload(member, buck.id, [{ body: await testImage('jpeg', { width: 80, height: 80 }), name: 'buck.jpg', type: 'image/jpeg' }]).expect(201);
    await member.post(`/api/animals/${buck.id}/custody-events`).send({ kind: 'lent', toFarmId: coop.farms[1]!.id, movedOn: '2024-06-01' }).expect(201);
    const borrower = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
    // Photos belong to the farm that took them, like notes and weigh-ins.
    await borrower.get(body.photos[0].url).expect(404);
    await borrower.patch(`/api/photos/${body.photos[0].id}`).send({ caption: 'Mine now' }).expect(404);
    const list = await borrower.get(`/api/animals/${buck.id}/photos`).expect(200);
    expect(list.body).toMatchObject({ photos: [], canChange: false });
    const owners = await member.get(`/api/animals/${buck.id}/photos`).expect(200);
    expect(owners.body).toMatchObject({ photos: [{ id: body.photos[0].id }], canChange: true });
  });
});

describe('farm profile photo', () => {
  it('when a member sets the farm photo, then every member of the co-op sees it, a new one replaces it, and other farms may not change it', async () => {
    const farmId = coop.farms[0]!.id;
    const first = await member.put(`/api/farms/${farmId}/photo`).attach('photo', await testImage('jpeg'), { filename: 'yard.jpg', contentType: 'image/jpeg' });
    expect(first.status).toBe(200);
    expect(first.body.photo).toMatchObject({ subject: 'farm', farmId, animalId: null });
    const neighbour = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
    const seen = await neighbour.get(`/api/farms/${farmId}/photo`).expect(200);
    expect(seen.body).toMatchObject({ photo: { id: first.body.photo.id }, canChange: false });
    await neighbour.get(first.body.photo.url).expect(200);
    const refused = await neighbour.put(`/api/farms/${farmId}/photo`).attach('photo', await testImage('png'), { filename: 'mine.png', contentType: 'image/png' });
    expect(refused.status).toBe(403);

    const second = await member.put(`/api/farms/${farmId}/photo`).attach('photo', await testImage('webp'), { filename: 'barn.webp', contentType: 'image/webp' });
    expect(second.status).toBe(200);
    await member.get(first.body.photo.url).expect(404);
    const live = await asTenant(coop.id, (c) => c.query(`SELECT id FROM photos WHERE farm_id = $1 AND subject = 'farm' AND deleted_at IS NULL`, [farmId]));
    expect(live.rows.map((r) => r.id)).toEqual([second.body.photo.id]);
    expect(storedFiles().some((name) => name.startsWith(first.body.photo.id))).toBe(false);

    const foreignCoop = await createTestCoop();
    const foreign = await signedInAgent(foreignCoop.member.email, TEST_PASSWORD, handle);
    await foreign.get(`/api/farms/${farmId}/photo`).expect(404);
    await foreign.get(second.body.photo.url).expect(404);
  });

  it('when a member removes the farm photo, then the farm has none, its row is kept as removed and its files are deleted', async () => {
    const farmId = coop.farms[0]!.id;
    const set = await member.put(`/api/farms/${farmId}/photo`).attach('photo', await testImage('jpeg'), { filename: 'gate.jpg', contentType: 'image/jpeg' });
    expect(set.status).toBe(200);
    const photoId = set.body.photo.id as string;
    expect(storedFiles().some((name) => name.startsWith(photoId))).toBe(true);

    await member.delete(`/api/farms/${farmId}/photo`).expect(204);
    expect((await member.get(`/api/farms/${farmId}/photo`).expect(200)).body.photo).toBeNull();
    await member.get(set.body.photo.url).expect(404);
    const rows = await asTenant(coop.id, (c) => c.query(`SELECT id, deleted_at IS NOT NULL AS removed FROM photos WHERE farm_id = $1 AND subject = 'farm' AND id = $2`, [farmId, photoId]));
    expect(rows.rows).toEqual([{ id: photoId, removed: true }]);
    await expect.poll(() => storedFiles().some((name) => name.startsWith(photoId))).toBe(false);
  });
});
