import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { assertStorageKey, type FileStorage } from './storage';

/**
 * Files on the server's own disk under one folder outside the web root (`UPLOADS_DIR`). Writes go to
 * a temporary name first and are renamed into place, so a crash never leaves half a file under a key.
 */
export class LocalDiskStorage implements FileStorage {
  constructor(private readonly root: string) {}

  private pathOf(key: string): string {
    assertStorageKey(key);
    const full = path.resolve(this.root, key);
    if (!full.startsWith(path.resolve(this.root) + path.sep)) throw new Error(`Storage key escapes the store: ${key}`);
    return full;
  }

  async put(key: string, body: Buffer): Promise<void> {
    const target = this.pathOf(key);
    await fs.promises.mkdir(path.dirname(target), { recursive: true, mode: 0o700 });
    const temporary = `${target}.${randomUUID()}.part`;
    await fs.promises.writeFile(temporary, body, { mode: 0o600, flag: 'wx' });
    await fs.promises.rename(temporary, target);
  }

  async get(key: string) {
    const target = this.pathOf(key);
    try {
      const stat = await fs.promises.stat(target);
      return { body: fs.createReadStream(target), byteSize: stat.size };
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await fs.promises.rm(this.pathOf(key), { force: true });
  }
}
