import type { Readable } from 'node:stream';

/**
 * Where uploaded files live. Keys are made by the server (never from a client's file name); the
 * interface is what an S3-compatible object store offers too (put, get as a stream, delete), so a
 * driver for one can replace the local disk without touching the modules that store files.
 */
export interface FileStorage {
  put(key: string, body: Buffer, meta: { contentType: string }): Promise<void>;
  /** The stored bytes as a stream with their size, or null when there is no such file. */
  get(key: string): Promise<{ body: Readable; byteSize: number } | null>;
  /** Removes the file; removing a missing file is not an error. */
  delete(key: string): Promise<void>;
}

/** `<uuid>/<uuid>[-thumb].<ext>`: the only keys we make, so nothing can name a path outside the store. */
export const STORAGE_KEY = /^[0-9a-f-]{36}\/[0-9a-f-]{36}(-thumb)?\.(jpg|png|webp)$/;

export function assertStorageKey(key: string): void {
  if (!STORAGE_KEY.test(key)) throw new Error(`Not a storage key: ${key}`);
}
