import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import { Op, type Transaction } from 'sequelize';
import {
  defineAbilityFor, ErrorCode, RealtimeEvent, rooms, subjectOf, type AnimalPhotosDto, type FarmPhotoDto, type PhotoDto,
  type PhotoLimitsDto, type PhotoUpdateInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { port } from '../../lib/port';
import { logger } from '../../lib/logger';
import { publish } from '../../lib/realtime';
import { storage } from '../../lib/storage';
import { animalAccess, privateRecordFarmsOf, type AnimalAccess } from '../animals/animal-facts.service';
import { findFarmRef } from '../farms/farms.service';
import { findUser, namesOf } from '../users/users.service';
import { Photo } from './photo.model';
import { photoTypes, preparePhoto, type PreparedPhoto } from './photo-images';
import { presentPhoto } from './photos.presenter';
import { lockUntilCommit } from '../../db/advisory-lock';

export interface PhotoLimits {
  photoMaxBytes: number;
  photosPerAnimal: number;
  photosPerUpload: number;
}

export interface UploadedFile {
  buffer: Buffer;
}

function limitsDto(limits: PhotoLimits, maxPhotos = limits.photosPerAnimal): PhotoLimitsDto {
  return { maxPhotos, maxBytes: limits.photoMaxBytes, perUpload: Math.min(limits.photosPerUpload, maxPhotos), types: Object.keys(photoTypes) };
}

/**
 * The animal for a photo request. Its photos are farm-private (brief): a viewer who may not see the
 * animal's full record gets 404, as if there were no photos to speak of, and its pedigree card never
 * carries them. Changing them needs the owning farm (an apprentice or a borrower gets 403).
 */
async function animalFor(actor: SessionUser, animalId: string, tx: Transaction, change: boolean): Promise<AnimalAccess> {
  const access = await animalAccess(actor, animalId, tx);
  if (!access || !access.canRead) throw AppError.notFound('That animal');
  if (change && !access.canUpdate) throw new AppError(ErrorCode.forbidden, 403, "Only the animal's own farm adds or removes its photos");
  return access;
}

async function farmFor(actor: SessionUser, farmId: string, tx: Transaction, change: boolean): Promise<{ id: string; name: string }> {
  const farm = await findFarmRef(actor.coopId, farmId, tx);
  const ability = defineAbilityFor(actor);
  if (!farm || !ability.can('read', subjectOf('Farm', { id: farm.id, coopId: actor.coopId }))) throw AppError.notFound('That farm');
  if (change && !ability.can('update', subjectOf('Farm', { id: farm.id, coopId: actor.coopId }))) {
    throw new AppError(ErrorCode.forbidden, 403, "Only the farm's own members change its photo");
  }
  return farm;
}

async function present(photos: Photo[], tx: Transaction): Promise<PhotoDto[]> {
  const names = await namesOf(photos.map((p) => p.uploadedBy), tx);
  return photos.map((p) => presentPhoto(p, names));
}

function keysOf(coopId: string, photoId: string, prepared: PreparedPhoto) {
  return { storageKey: `${coopId}/${photoId}.${prepared.extension}`, thumbnailKey: `${coopId}/${photoId}-thumb.jpg` };
}

/** Stores the files first, then the rows in `work`; if `work` fails, the files are removed again. */
async function storeThen<T>(coopId: string, prepared: PreparedPhoto[], work: (ids: string[]) => Promise<T>): Promise<T> {
  const ids = prepared.map(() => randomUUID());
  const stored: string[] = [];
  try {
    for (const [i, photo] of prepared.entries()) {
      const keys = keysOf(coopId, ids[i]!, photo);
      await storage().put(keys.storageKey, photo.image, { contentType: photo.contentType });
      stored.push(keys.storageKey);
      await storage().put(keys.thumbnailKey, photo.thumbnail, { contentType: 'image/jpeg' });
      stored.push(keys.thumbnailKey);
    }
    return await work(ids);
  } catch (error) {
    await Promise.all(stored.map((key) => storage().delete(key).catch(() => undefined)));
    throw error;
  }
}

function removeFilesAfterCommit(tx: Transaction, photos: Photo[]) {
  tx.afterCommit(async () => {
    for (const photo of photos) {
      for (const key of [photo.storageKey, photo.thumbnailKey]) {
        await storage()
          .delete(key)
          .catch((error: unknown) => logger.warn('photo file not removed', { key, error: String(error) }));
      }
    }
  });
}

function announce(tx: Transaction, access: AnimalAccess) {
  tx.afterCommit(() => {
    for (const farmId of new Set([access.owningFarmId, access.keepingFarmId].filter((id): id is string => Boolean(id)))) {
      publish(rooms.farm(farmId), RealtimeEvent.herdChanged, { farmId, animalId: access.id });
    }
  });
}

async function prepareAll(files: UploadedFile[], limits: PhotoLimits): Promise<PreparedPhoto[]> {
  if (files.length === 0) throw AppError.validation({ photos: ['Choose a photo to upload'] }, 'Choose a photo to upload');
  if (files.length > limits.photosPerUpload) {
    throw new AppError(ErrorCode.payloadTooLarge, 413, `Too many files at once: at most ${limits.photosPerUpload} photos per upload`);
  }
  const prepared: PreparedPhoto[] = [];
  for (const [i, file] of files.entries()) prepared.push(await preparePhoto(file.buffer, files.length > 1 ? `File ${i + 1}` : 'The file'));
  return prepared;
}

/** An animal's photos the viewer's farm may see (its own, not a lender's or borrower's), oldest first. */
export async function listAnimalPhotos(actor: SessionUser, animalId: string, limits: PhotoLimits): Promise<AnimalPhotosDto> {
  return withTenant(actor, async (tx) => {
    const access = await animalFor(actor, animalId, tx, false);
    const farms = await privateRecordFarmsOf(actor, access, 'Photo', tx);
    const photos = await Photo.findAll({ where: { animalId, subject: 'animal', farmId: { [Op.in]: farms } }, order: [['createdAt', 'ASC'], ['id', 'ASC']], transaction: tx });
    return { photos: await present(photos, tx), canChange: access.canUpdate, limits: limitsDto(limits) };
  });
}

/** Refuses before the upload is read when the actor may not add photos to this animal. */
export async function assertCanAddAnimalPhotos(actor: SessionUser, animalId: string): Promise<void> {
  await withTenant(actor, (tx) => animalFor(actor, animalId, tx, true));
}

/**
 * Adds photos to an animal of the actor's farm: each checked by its signature and re-encoded with a
 * thumbnail, under server-made names, within the animal's photo limit (counted under a lock, so two
 * uploads at once cannot pass it together). All or nothing.
 */
export async function addAnimalPhotos(
  actor: SessionUser,
  animalId: string,
  input: { files: UploadedFile[]; caption: string },
  limits: PhotoLimits,
): Promise<PhotoDto[]> {
  const prepared = await prepareAll(input.files, limits);
  return storeThen(actor.coopId, prepared, (ids) =>
    withTenant(actor, async (tx) => {
      const access = await animalFor(actor, animalId, tx, true);
      await lockUntilCommit(tx, `photos:${animalId}`);
      const count = await Photo.count({ where: { animalId, subject: 'animal' }, transaction: tx });
      if (count + prepared.length > limits.photosPerAnimal) {
        const room = Math.max(0, limits.photosPerAnimal - count);
        throw AppError.validation(
          { photos: [`An animal may have at most ${limits.photosPerAnimal} photos; this one has ${count}, so add at most ${room}`] },
          `At most ${limits.photosPerAnimal} photos per animal`,
        );
      }
      // Photos of one upload keep the order they were sent in (the gallery sorts by upload time).
      const now = Date.now();
      const rows = await Photo.bulkCreate(
        prepared.map((photo, i) => ({
          id: ids[i]!,
          createdAt: new Date(now + i),
          coopId: actor.coopId,
          farmId: access.owningFarmId!,
          subject: 'animal' as const,
          animalId,
          ...keysOf(actor.coopId, ids[i]!, photo),
          contentType: photo.contentType,
          byteSize: photo.image.length,
          thumbnailByteSize: photo.thumbnail.length,
          width: photo.width,
          height: photo.height,
          checksum: photo.checksum,
          caption: input.caption,
          uploadedBy: actor.id,
        })),
        { transaction: tx },
      );
      announce(tx, access);
      return present(rows, tx);
    }),
  );
}

/**
 * Whether another module published this photo to the viewer (a buck card's photos to the co-op, a loan's
 * hand-over photo to the other farm). Stud Share reads photos, so it is plugged in at the composition root.
 */
/**
 * Whether the viewer may see a chat photo: who reads its thread, once it is in a live message; before that,
 * its uploader only. Co-op Chat reads photos, so its answer is plugged in at the composition root.
 */
export const chatPhotoReadable = port<(tx: Transaction, actor: SessionUser, photo: { threadId: string; messageId: string | null; uploadedBy: string | null }) => Promise<boolean>>(
  'chat photo readable', async () => false,
);

export const photoPublishedTo = port<(tx: Transaction, actor: SessionUser, photoId: string) => Promise<boolean>>('photo published', async () => false);

async function photoForViewer(actor: SessionUser, photoId: string, tx: Transaction, change: boolean): Promise<{ photo: Photo; access: AnimalAccess | null; label: string }> {
  const photo = await Photo.findOne({ where: { id: photoId, coopId: actor.coopId }, transaction: tx, lock: change ? tx.LOCK.UPDATE : undefined });
  if (!photo) throw AppError.notFound('That photo');
  if (photo.subject === 'animal') {
    // Only looked up where the usual rules refuse, so an ordinary photo costs nothing more.
    const refuse = async () => {
      if (!change && (await photoPublishedTo(tx, actor, photo.id))) return { photo, access: null, label: 'animal' };
      throw AppError.notFound('That photo');
    };
    const access = await animalAccess(actor, photo.animalId!, tx);
    // Someone who may not see the animal learns nothing about its photos, not even that they exist.
    if (!access || !access.canRead) return refuse();
    // Photos belong to the farm that took them: a borrower never opens the lender's, nor the other way round.
    if (!photo.farmId || !(await privateRecordFarmsOf(actor, access, 'Photo', tx)).includes(photo.farmId)) return refuse();
    if (change && !access.canUpdate) throw new AppError(ErrorCode.forbidden, 403, "Only the animal's own farm changes its photos");
    return { photo, access, label: access.tattoo ?? 'animal' };
  }
  if (photo.subject === 'chore') {
    // An apprentice's chore photo: hers, her mentor's and the admin's to see, like her chore log.
    const apprentice = photo.uploadedBy ? await findUser(photo.uploadedBy, tx) : null;
    const ability = defineAbilityFor(actor);
    const record = { coopId: photo.coopId, farmId: photo.farmId, authorId: photo.uploadedBy, mentorId: apprentice?.mentorId ?? null };
    if (!ability.can('read', subjectOf('ChoreLog', record))) throw AppError.notFound('That photo');
    if (change) throw new AppError(ErrorCode.forbidden, 403, 'A chore\'s photos stay as they were sent for review');
    return { photo, access: null, label: 'chore' };
  }
  if (photo.subject === 'chat') {
    // Who reads the thread sees its photos (Co-op Chat decides); anyone else learns nothing of them.
    const readable = await chatPhotoReadable(tx, actor, { threadId: photo.chatThreadId!, messageId: photo.chatMessageId, uploadedBy: photo.uploadedBy });
    if (!readable) throw AppError.notFound('That photo');
    if (change) throw new AppError(ErrorCode.forbidden, 403, 'A chat photo goes when its message is removed');
    return { photo, access: null, label: 'chat' };
  }
  await farmFor(actor, photo.farmId!, tx, change);
  return { photo, access: null, label: 'farm' };
}

/**
 * A photo's bytes (the image or its thumbnail) for a viewer who may see it, with a server-made file
 * name for `Content-Disposition`.
 */
export async function openPhoto(
  actor: SessionUser,
  photoId: string,
  variant: 'image' | 'thumbnail',
): Promise<{ body: Readable; byteSize: number; contentType: string; fileName: string }> {
  const { photo, label } = await withTenant(actor, (tx) => photoForViewer(actor, photoId, tx, false));
  const key = variant === 'image' ? photo.storageKey : photo.thumbnailKey;
  const file = await storage().get(key);
  if (!file) {
    logger.warn('photo file missing', { photoId, key });
    throw AppError.notFound('That photo');
  }
  const extension = variant === 'image' ? (photoTypes[photo.contentType] ?? 'jpg') : 'jpg';
  return {
    body: file.body,
    byteSize: file.byteSize,
    contentType: variant === 'image' ? photo.contentType : 'image/jpeg',
    fileName: `${label}-photo-${photo.id.slice(0, 8)}${variant === 'thumbnail' ? '-small' : ''}.${extension}`,
  };
}

/** Changes a photo's caption (the animal's or the farm's own members). */
export async function updatePhoto(actor: SessionUser, photoId: string, input: PhotoUpdateInput): Promise<PhotoDto> {
  return withTenant(actor, async (tx) => {
    const { photo, access } = await photoForViewer(actor, photoId, tx, true);
    photo.caption = input.caption;
    await photo.save({ transaction: tx });
    if (access) announce(tx, access);
    return (await present([photo], tx))[0]!;
  });
}

/** Removes a photo: its row is kept as removed, its files are deleted once that is committed. */
export async function removePhoto(actor: SessionUser, photoId: string): Promise<void> {
  await withTenant(actor, async (tx) => {
    const { photo, access } = await photoForViewer(actor, photoId, tx, true);
    await photo.destroy({ transaction: tx });
    removeFilesAfterCommit(tx, [photo]);
    if (access) announce(tx, access);
  });
}

/** A farm's profile photo (every member of the co-op sees farm profiles). */
export async function getFarmPhoto(actor: SessionUser, farmId: string, limits: PhotoLimits): Promise<FarmPhotoDto> {
  return withTenant(actor, async (tx) => {
    const farm = await farmFor(actor, farmId, tx, false);
    const photo = await Photo.findOne({ where: { farmId: farm.id, subject: 'farm' }, transaction: tx });
    const canChange = defineAbilityFor(actor).can('update', subjectOf('Farm', { id: farm.id, coopId: actor.coopId }));
    return { photo: photo ? (await present([photo], tx))[0]! : null, canChange, limits: limitsDto(limits, 1) };
  });
}

export async function assertCanChangeFarmPhoto(actor: SessionUser, farmId: string): Promise<void> {
  await withTenant(actor, (tx) => farmFor(actor, farmId, tx, true));
}

/** Sets the farm's one profile photo, replacing the one before (whose files are then deleted). */
export async function replaceFarmPhoto(actor: SessionUser, farmId: string, input: { files: UploadedFile[]; caption: string }, limits: PhotoLimits): Promise<FarmPhotoDto> {
  const prepared = await prepareAll(input.files, { ...limits, photosPerUpload: 1 });
  return storeThen(actor.coopId, prepared, (ids) =>
    withTenant(actor, async (tx) => {
      const farm = await farmFor(actor, farmId, tx, true);
      const before = await Photo.findAll({ where: { farmId: farm.id, subject: 'farm' }, transaction: tx, lock: tx.LOCK.UPDATE });
      for (const old of before) await old.destroy({ transaction: tx });
      removeFilesAfterCommit(tx, before);
      const photo = prepared[0]!;
      const row = await Photo.create(
        {
          id: ids[0]!,
          coopId: actor.coopId,
          farmId: farm.id,
          subject: 'farm',
          animalId: null,
          ...keysOf(actor.coopId, ids[0]!, photo),
          contentType: photo.contentType,
          byteSize: photo.image.length,
          thumbnailByteSize: photo.thumbnail.length,
          width: photo.width,
          height: photo.height,
          checksum: photo.checksum,
          caption: input.caption,
          uploadedBy: actor.id,
        },
        { transaction: tx },
      );
      tx.afterCommit(() => publish(rooms.coop(actor.coopId), RealtimeEvent.farmUpdated, { farmId: farm.id }));
      return { photo: (await present([row], tx))[0]!, canChange: true, limits: limitsDto(limits, 1) };
    }),
  );
}

/** Removes the farm's profile photo, if it has one. */
export async function removeFarmPhoto(actor: SessionUser, farmId: string): Promise<void> {
  await withTenant(actor, async (tx) => {
    const farm = await farmFor(actor, farmId, tx, true);
    const photos = await Photo.findAll({ where: { farmId: farm.id, subject: 'farm' }, transaction: tx, lock: tx.LOCK.UPDATE });
    for (const photo of photos) await photo.destroy({ transaction: tx });
    removeFilesAfterCommit(tx, photos);
    if (photos.length > 0) tx.afterCommit(() => publish(rooms.coop(actor.coopId), RealtimeEvent.farmUpdated, { farmId: farm.id }));
  });
}

/** The photos of chore entries, oldest first, by entry. */
export async function chorePhotoIdsOf(tx: Transaction, coopId: string, choreEntryIds: string[]): Promise<Map<string, string[]>> {
  const out = new Map<string, string[]>();
  if (choreEntryIds.length === 0) return out;
  const rows = await Photo.findAll({
    where: { coopId, subject: 'chore', choreEntryId: { [Op.in]: [...new Set(choreEntryIds)] } },
    attributes: ['id', 'choreEntryId'], order: [['createdAt', 'ASC'], ['id', 'ASC']], transaction: tx, raw: true,
  });
  for (const r of rows) out.set(r.choreEntryId!, [...(out.get(r.choreEntryId!) ?? []), r.id]);
  return out;
}

/**
 * Adds photos to an apprentice's chore entry: the same checks and re-encoding as an animal's; `entryOf`
 * (the mentorship module) says inside the transaction whose entry it is and refuses anyone else.
 */
export async function addChorePhotos(
  actor: SessionUser,
  entryOf: (tx: Transaction) => Promise<{ id: string; farmId: string }>,
  input: { files: UploadedFile[]; caption: string },
  limits: PhotoLimits,
): Promise<PhotoDto[]> {
  const prepared = await prepareAll(input.files, limits);
  return storeThen(actor.coopId, prepared, (ids) =>
    withTenant(actor, async (tx) => {
      const entry = await entryOf(tx);
      await lockUntilCommit(tx, `photos:${entry.id}`);
      const count = await Photo.count({ where: { choreEntryId: entry.id, subject: 'chore' }, transaction: tx });
      if (count + prepared.length > limits.photosPerUpload) {
        throw AppError.validation({ photos: [`A chore entry may have at most ${limits.photosPerUpload} photos`] }, `At most ${limits.photosPerUpload} photos per entry`);
      }
      const now = Date.now();
      const rows = await Photo.bulkCreate(
        prepared.map((photo, i) => ({
          id: ids[i]!, createdAt: new Date(now + i), coopId: actor.coopId, farmId: entry.farmId, subject: 'chore' as const, animalId: null,
          choreEntryId: entry.id, ...keysOf(actor.coopId, ids[i]!, photo), contentType: photo.contentType, byteSize: photo.image.length,
          thumbnailByteSize: photo.thumbnail.length, width: photo.width, height: photo.height, checksum: photo.checksum, caption: input.caption,
          uploadedBy: actor.id,
        })),
        { transaction: tx },
      );
      return present(rows, tx);
    }),
  );
}

/**
 * Photos shared in a chat thread, uploaded before the message that carries them: the same checks and
 * re-encoding as every photo; `threadOf` (Co-op Chat) refuses, inside the transaction, who may not write there.
 */
export async function addChatPhotos(
  actor: SessionUser,
  threadOf: (tx: Transaction) => Promise<{ id: string }>,
  input: { files: UploadedFile[] },
  limits: PhotoLimits,
): Promise<PhotoDto[]> {
  const prepared = await prepareAll(input.files, limits);
  return storeThen(actor.coopId, prepared, (ids) =>
    withTenant(actor, async (tx) => {
      const thread = await threadOf(tx);
      const now = Date.now();
      const rows = await Photo.bulkCreate(
        prepared.map((photo, i) => ({
          id: ids[i]!, createdAt: new Date(now + i), coopId: actor.coopId, farmId: actor.farmId, subject: 'chat' as const, animalId: null,
          chatThreadId: thread.id, ...keysOf(actor.coopId, ids[i]!, photo), contentType: photo.contentType, byteSize: photo.image.length,
          thumbnailByteSize: photo.thumbnail.length, width: photo.width, height: photo.height, checksum: photo.checksum, caption: '',
          uploadedBy: actor.id,
        })),
        { transaction: tx },
      );
      return present(rows, tx);
    }),
  );
}

/**
 * The photos a message is about to carry, locked: its author uploaded them to the thread and has not sent
 * them yet. Anything else (another thread's, another person's, one already sent) is refused.
 */
export async function unsentChatPhotosIn(
  tx: Transaction, actor: SessionUser, threadId: string, photoIds: string[],
): Promise<{ id: string; width: number; height: number }[]> {
  if (photoIds.length === 0) return [];
  const rows = await Photo.findAll({
    where: { id: { [Op.in]: photoIds }, coopId: actor.coopId, subject: 'chat', chatThreadId: threadId, uploadedBy: actor.id, chatMessageId: null },
    transaction: tx, lock: tx.LOCK.UPDATE,
  });
  if (rows.length !== photoIds.length) throw AppError.validation({ attachmentIds: ['Attach photos you uploaded to this thread and have not sent yet'] });
  const byId = new Map(rows.map((p) => [p.id, p]));
  return photoIds.map((id) => ({ id, width: byId.get(id)!.width, height: byId.get(id)!.height }));
}

/** Marks the photos (from `unsentChatPhotosIn`) as the message's. */
export async function attachChatPhotosIn(tx: Transaction, messageId: string, photoIds: string[]): Promise<void> {
  if (photoIds.length > 0) await Photo.update({ chatMessageId: messageId }, { where: { id: { [Op.in]: photoIds } }, transaction: tx });
}

/** A removed message's photos go too: rows kept as removed, files deleted once that is committed. */
export async function removeChatPhotosIn(tx: Transaction, coopId: string, messageId: string): Promise<void> {
  const photos = await Photo.findAll({ where: { coopId, subject: 'chat', chatMessageId: messageId }, transaction: tx, lock: tx.LOCK.UPDATE });
  for (const photo of photos) await photo.destroy({ transaction: tx });
  removeFilesAfterCommit(tx, photos);
}
