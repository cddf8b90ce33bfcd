import { LocalDiskStorage } from './local-disk';
import { S3ObjectStore, type ObjectStoreOptions } from './s3-object-store';
import type { FileStorage } from './storage';

export type { FileStorage } from './storage';
export type { ObjectStoreOptions } from './s3-object-store';

let current: FileStorage | null = null;

/**
 * Chooses the store once per process: the local disk for one instance, an S3-compatible object store when
 * several instances must all reach every file.
 */
export function configureStorage(options: { dir: string; objectStore?: ObjectStoreOptions | null }): void {
  if (current instanceof S3ObjectStore) current.close();
  current = options.objectStore ? new S3ObjectStore(options.objectStore) : new LocalDiskStorage(options.dir);
}

export function storage(): FileStorage {
  if (!current) throw new Error('The file storage is not configured yet');
  return current;
}
