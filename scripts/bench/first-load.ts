// First-load JavaScript of the client: the entry script plus its modulepreloads, gzip-compressed.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';

const LIMIT_KB = 150;
const clientDir = path.resolve(import.meta.dirname, '../../packages/client');
const dist = path.join(clientDir, 'dist');
if (!fs.existsSync(path.join(dist, 'index.html'))) {
  execFileSync(process.execPath, [path.resolve(clientDir, '../../node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: clientDir, stdio: 'inherit' });
}
const html = fs.readFileSync(path.join(dist, 'index.html'), 'utf8');
const scripts = [...html.matchAll(/<script[^>]+src="([^"]+)"/g), ...html.matchAll(/<link[^>]+rel="modulepreload"[^>]+href="([^"]+)"/g)].map((m) => m[1]!);
const styles = [...html.matchAll(/<link[^>]+rel="stylesheet"[^>]+href="([^"]+)"/g)].map((m) => m[1]!);
const gz = (file: string) => gzipSync(fs.readFileSync(path.join(dist, file.replace(/^\//, '')))).length / 1024;

let jsTotal = 0;
console.log('first-load JavaScript (gzip):');
for (const file of scripts) {
  const kb = gz(file);
  jsTotal += kb;
  console.log(`  ${file.padEnd(40)} ${kb.toFixed(1).padStart(7)} kB`);
}
const cssTotal = styles.reduce((sum, file) => sum + gz(file), 0);
console.log(`  total JavaScript ${jsTotal.toFixed(1)} kB gzip (limit ${LIMIT_KB} kB) ${jsTotal <= LIMIT_KB ? 'ok' : 'OVER THE LIMIT'}`);
console.log(`  stylesheet ${cssTotal.toFixed(1)} kB gzip`);
