// The local stand-in for an S3-compatible object store (npm's s3rver, maintained fork), on its own port and data
// folder, with the app's bucket made at start: `node scripts/lib/fake-s3.mjs --port 4510 --dir .data/s3 --bucket burrowline`.
// It accepts the fixed key pair S3RVER / S3RVER (see fakeS3Env in bootstrap.mjs) and checks request signatures.
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import S3rver from '@20minutes/s3rver';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '4510' },
    dir: { type: 'string', default: '.data/s3' },
    bucket: { type: 'string', default: 'burrowline' },
    silent: { type: 'boolean', default: false },
  },
});
const directory = path.resolve(values.dir);
fs.mkdirSync(directory, { recursive: true });
const server = new S3rver({
  address: '127.0.0.1',
  port: Number(values.port),
  directory,
  silent: values.silent,
  // Path-style addresses only (http://host:port/bucket/key), as the app's client sends them.
  vhostBuckets: false,
  configureBuckets: [{ name: values.bucket }],
});
await server.run();
if (!values.silent) console.log(`fake S3 on http://127.0.0.1:${values.port}, bucket ${values.bucket}, files in ${directory}`);
const stop = () => server.close(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
