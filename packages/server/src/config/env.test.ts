import { describe, expect, it } from 'vitest';
import { loadConfig } from './env';

const base = { DATABASE_URL: 'postgres://app@127.0.0.1/burrowline', SESSION_SECRET: 'x'.repeat(32) };

describe('storage and live-event settings', () => {
  it('when nothing is said, then files stay on the local disk and live events in the process, as for one instance', () => {
    const config = loadConfig(base);
    expect(config.objectStore).toBeNull();
    expect(config.realtimeAcrossInstances).toBe(false);
  });

  it('when the S3 driver is chosen, then the bucket is required and the rest is read as given, path-style by default', () => {
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: 's3' })).toThrow(/S3_BUCKET: S3_BUCKET is required/);
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: 's3', S3_BUCKET: 'photos', S3_ACCESS_KEY_ID: 'key' })).toThrow(/S3_SECRET_ACCESS_KEY/);
    const config = loadConfig({
      ...base, STORAGE_DRIVER: 's3', S3_BUCKET: 'photos', S3_ENDPOINT: 'http://127.0.0.1:4510', S3_ACCESS_KEY_ID: 'key', S3_SECRET_ACCESS_KEY: 'secret', REALTIME_ACROSS_INSTANCES: 'true',
    });
    expect(config.objectStore).toEqual({
      endpoint: 'http://127.0.0.1:4510', region: 'us-east-1', bucket: 'photos', credentials: { accessKeyId: 'key', secretAccessKey: 'secret' }, forcePathStyle: true,
    });
    expect(config.realtimeAcrossInstances).toBe(true);
  });
});
