import { LocalDiskStorage } from './local-disk';
import type { FileStorage } from './storage';

export type { FileStorage } from './storage';

let current: FileStorage | null = null;

/** Chooses the store once per process (the local disk today; an object store can take its place). */
export function configureStorage(options: { dir: string }): void {
  current = new LocalDiskStorage(options.dir);
}

export function storage(): FileStorage {
  if (!current) throw new Error('The file storage is not configured yet');
  return current;
}
