import { Router, type Request, type Response } from 'express';
import { photoUpdateSchema, photoUploadFieldsSchema, uuidParamSchema } from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import { acceptUpload, uploadedFiles } from '../../http/uploads';
import {
  addAnimalPhotos, assertCanAddAnimalPhotos, assertCanChangeFarmPhoto, getFarmPhoto, listAnimalPhotos, openPhoto, removeFarmPhoto,
  removePhoto, replaceFarmPhoto, updatePhoto, type PhotoLimits,
} from './photos.service';

function limitsOf(config: Config): PhotoLimits {
  return { photoMaxBytes: config.uploads.photoMaxBytes, photosPerAnimal: config.uploads.photosPerAnimal, photosPerUpload: config.uploads.photosPerUpload };
}

const id = (value: unknown) => uuidParamSchema.parse(value);
/** A parameter of the path this router is mounted on (`mergeParams`). */
const mounted = (req: Request, name: string) => id((req.params as Record<string, string>)[name]);

/** /api/animals/:animalId/photos: an animal's gallery (its own farm only) and uploads to it. */
export function animalPhotoRoutes(config: Config): Router {
  const router = Router({ mergeParams: true });
  const limits = limitsOf(config);
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await listAnimalPhotos(actorOf(req), mounted(req, 'animalId'), limits));
  });
  router.post(
    '/',
    // Who may upload is settled before a byte of the file is read.
    async (req, _res, next) => {
      await assertCanAddAnimalPhotos(actorOf(req), mounted(req, 'animalId'));
      next();
    },
    acceptUpload({ field: 'photos', maxFiles: limits.photosPerUpload, maxBytes: limits.photoMaxBytes, noun: 'photo' }),
    async (req, res) => {
      const { caption } = photoUploadFieldsSchema.parse(req.body ?? {});
      const photos = await addAnimalPhotos(actorOf(req), mounted(req, 'animalId'), { files: uploadedFiles(req), caption }, limits);
      res.status(201).json({ photos });
    },
  );
  return router;
}

async function sendPhoto(res: Response, file: Awaited<ReturnType<typeof openPhoto>>) {
  res.status(200);
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Length', String(file.byteSize));
  // A server-made name (letters, digits, hyphens): nothing from the uploader reaches the header.
  res.setHeader('Content-Disposition', `inline; filename="${file.fileName}"`);
  // The viewer's own browser may keep it briefly; no shared cache may (it is behind a permission check).
  res.setHeader('Cache-Control', 'private, max-age=300');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  file.body.pipe(res);
  await new Promise<void>((resolve, reject) => {
    file.body.on('error', reject);
    res.on('finish', resolve);
    res.on('close', resolve);
  });
}

/** /api/photos/:photoId: one photo's image and thumbnail (checked against who may see it), caption, removal. */
export function photoRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/:photoId', async (req, res) => {
    await sendPhoto(res, await openPhoto(actorOf(req), id(req.params.photoId), 'image'));
  });
  router.get('/:photoId/thumbnail', async (req, res) => {
    await sendPhoto(res, await openPhoto(actorOf(req), id(req.params.photoId), 'thumbnail'));
  });
  router.patch('/:photoId', async (req, res) => {
    res.json(await updatePhoto(actorOf(req), id(req.params.photoId), photoUpdateSchema.parse(req.body)));
  });
  router.delete('/:photoId', async (req, res) => {
    await removePhoto(actorOf(req), id(req.params.photoId));
    res.status(204).end();
  });
  return router;
}

/** /api/farms/:farmId/photo: the farm profile's one photo. */
export function farmPhotoRoutes(config: Config): Router {
  const router = Router({ mergeParams: true });
  const limits = limitsOf(config);
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json(await getFarmPhoto(actorOf(req), mounted(req, 'farmId'), limits));
  });
  router.put(
    '/',
    async (req, _res, next) => {
      await assertCanChangeFarmPhoto(actorOf(req), mounted(req, 'farmId'));
      next();
    },
    acceptUpload({ field: 'photo', maxFiles: 1, maxBytes: limits.photoMaxBytes, noun: 'photo' }),
    async (req, res) => {
      const { caption } = photoUploadFieldsSchema.parse(req.body ?? {});
      res.json(await replaceFarmPhoto(actorOf(req), mounted(req, 'farmId'), { files: uploadedFiles(req), caption }, limits));
    },
  );
  router.delete('/', async (req, res) => {
    await removeFarmPhoto(actorOf(req), mounted(req, 'farmId'));
    res.status(204).end();
  });
  return router;
}
