// `npm run bench [name…]`: runs every scripts/bench/*.ts (or those whose name contains one of the
// given words) with `node --import tsx`, one after another, printing their output. Benchmarks print
// figures; they are not timed tests and do not fail on a slow machine.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');
const benchDir = path.join(root, 'scripts', 'bench');
const filters = process.argv.slice(2).filter((arg) => !arg.startsWith('--'));
// Flags (e.g. `npm run bench http -- --200k`) go to every benchmark run.
const flags = process.argv.slice(2).filter((arg) => arg.startsWith('--'));
const files = fs
  .readdirSync(benchDir)
  .filter((file) => file.endsWith('.ts'))
  .filter((file) => filters.length === 0 || filters.some((word) => file.includes(word)))
  .sort();

if (files.length === 0) {
  console.error(`no benchmarks in scripts/bench${filters.length ? ` matching ${filters.join(', ')}` : ''}`);
  process.exit(1);
}

const failed = [];
for (const file of files) {
  console.log(`\n=== ${file} ===`);
  const started = Date.now();
  const result = spawnSync(process.execPath, ['--import', 'tsx', path.join(benchDir, file), ...flags], { cwd: root, stdio: 'inherit' });
  if (result.status !== 0) failed.push(file);
  console.log(`--- ${file}: ${result.status === 0 ? 'done' : 'FAILED'} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}
if (failed.length > 0) {
  console.error(`\nfailed: ${failed.join(', ')}`);
  process.exit(1);
}
