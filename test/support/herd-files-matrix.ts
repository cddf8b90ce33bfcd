import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';
import { loadConfig } from '../../packages/server/src/config/env';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { stageHerdImport } from '../../packages/server/src/modules/herd-files/herd-files.service';
import { addAnimalPhotos } from '../../packages/server/src/modules/photos/photos.service';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { actorOf, addAnimalAs, nextTattoo } from './herd';
import { csv, HEADER, testImage } from './herd-files';

/** Objects of the herd-files rows, made fresh for every cell. */
export interface HerdFilesIds {
  animalId?: string;
  photoId?: string;
  importId?: string;
}

const limits = () => {
  const { photoMaxBytes, photosPerAnimal, photosPerUpload } = loadConfig().uploads;
  return { photoMaxBytes, photosPerAnimal, photosPerUpload };
};

export async function herdFilesTarget(coop: TestCoop, target: string): Promise<HerdFilesIds> {
  connectDatabase(process.env.DATABASE_URL!);
  switch (target) {
    case 'photoA': {
      const animal = await addAnimalAs(coop.member, { name: 'Matrix photo doe' });
      const [photo] = await addAnimalPhotos(actorOf(coop.member), animal.id, { files: [{ buffer: await testImage('jpeg', { width: 64, height: 48 }) }], caption: 'Matrix' }, limits());
      return { animalId: animal.id, photoId: photo!.id };
    }
    case 'importA': {
      const preview = await stageHerdImport(
        actorOf(coop.member),
        { fileName: 'matrix.csv', content: Buffer.from(csv(HEADER, `${nextTattoo('IM')},Matrix import,doe,Satin,2023-01-01,,`)) },
        // Every cell stages a file on one farm: far more than a farm may keep waiting, which has its own test.
        { maxRows: 100, maxWaiting: 10_000 },
      );
      return { importId: preview.id };
    }
    default:
      return {};
  }
}

/** Sends a cell's request: uploads go as multipart form data, the rest as JSON. */
export async function herdFilesSend(request: supertest.Test, body: string | undefined, json: object | undefined): Promise<supertest.Response> {
  switch (body) {
    case 'photoUpload':
      return request.attach('photos', await testImage('png', { width: 32, height: 32 }), { filename: 'matrix.png', contentType: 'image/png' });
    case 'farmPhotoUpload':
      return request.attach('photo', await testImage('jpeg', { width: 32, height: 32 }), { filename: 'matrix.jpg', contentType: 'image/jpeg' });
    case 'csvUpload':
      return request.attach('file', Buffer.from(csv(HEADER, `${nextTattoo('MX')},Matrix row,buck,Satin,2023-02-01,,`)), { filename: 'matrix.csv', contentType: 'text/csv' });
    case 'importConfirmation':
      return request.send({ idempotencyKey: randomUUID() });
    case 'photoCaption':
      return request.send({ caption: `Checked ${Date.now()}` });
    default:
      return request.send(json);
  }
}

/** What a refused herd-files call must leave as it was: photos, staged and confirmed imports. */
export async function herdFilesStateOf(coopId: string, ids: HerdFilesIds) {
  return asTenant(coopId, async (c) => ({
    photos: (await c.query(`SELECT count(*) FILTER (WHERE deleted_at IS NULL)::int AS live, count(*)::int AS n FROM photos WHERE coop_id = $1`, [coopId])).rows[0],
    imports: (await c.query(`SELECT count(*)::int AS n, count(*) FILTER (WHERE status = 'confirmed')::int AS confirmed FROM herd_imports WHERE coop_id = $1`, [coopId])).rows[0],
    photo: ids.photoId ? ((await c.query('SELECT caption, deleted_at FROM photos WHERE id = $1', [ids.photoId])).rows[0] ?? null) : null,
  }));
}
