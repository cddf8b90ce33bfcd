import { createRequire } from 'node:module';
import path from 'node:path';
import sharp from 'sharp';
import type supertest from 'supertest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import type { HerdImportDto, HerdImportStreamLine } from '@burrowline/shared';
import type { Agent } from './test-app';

/** The minimum header of the herd spreadsheet format. */
export const HEADER = 'tattoo,name,sex,breed,born,sire,dam';

/** A CSV from lines (each a string or its cells), CRLF-separated like a spreadsheet's export. */
export function csv(...lines: (string | string[])[]): string {
  return lines.map((line) => (Array.isArray(line) ? line.join(',') : line)).join('\r\n') + '\r\n';
}

/** A tiny seeded generator (LCG), so a generated herd is the same on every run. */
function seeded(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}

/**
 * An invented herd of `count` animals as a CSV: 30 founders of two catalogue breeds with unknown
 * parents, then generations of offspring whose parents are rows earlier in the file, each parent at
 * least 200 days older than its kit (past the first-breeding age, so no row has a warning). Every
 * tenth row carries a weight in pounds. Tattoos start with `prefix`.
 */
export function generatedHerdCsv(count: number, prefix = 'G'): string {
  const random = seeded(count * 7919 + prefix.length);
  const start = '2014-01-01';
  const span = 3600; // days, about ten years, ending before today
  const bucks: { tattoo: string; day: number }[] = [];
  const does: { tattoo: string; day: number }[] = [];
  const lines: string[] = [`${HEADER},colour,weight_lb`];
  const colours = ['White', 'Broken black', 'Chestnut', 'Californian markings', 'Blue'];
  for (let i = 0; i < count; i++) {
    const tattoo = `${prefix}${String(i + 1).padStart(5, '0')}`;
    const sex = random() < 0.5 ? 'buck' : 'doe';
    const founder = i < 30;
    const day = founder ? i : 230 + Math.floor((i / count) * (span - 230));
    let sire = '';
    let dam = '';
    let breed = i % 2 === 0 ? 'New Zealand' : 'Californian';
    if (!founder) {
      const eligible = (list: { tattoo: string; day: number }[]) => {
        let n = 0;
        while (n < list.length && list[n]!.day <= day - 200) n++;
        return n;
      };
      const b = eligible(bucks);
      const d = eligible(does);
      // Keep to the most recent breeders mostly, as a herd does.
      sire = bucks[Math.max(0, b - 1 - Math.floor(random() * Math.min(b, 40)))]!.tattoo;
      dam = does[Math.max(0, d - 1 - Math.floor(random() * Math.min(d, 120)))]!.tattoo;
      breed = 'cross';
    }
    (sex === 'buck' ? bucks : does).push({ tattoo, day });
    const weight = i % 10 === 0 ? (8 + random() * 3).toFixed(2) : '';
    lines.push([tattoo, `Kit ${i + 1}`, sex, breed, addDays(start, day), sire, dam, colours[i % colours.length]!, weight].join(','));
  }
  return lines.join('\n') + '\n';
}

/** Posts a file to the staging route as a browser form would. */
export function stageFile(agent: Agent, content: string | Buffer, fileName = 'herd.csv', contentType = 'text/csv') {
  return agent.post('/api/herd-imports').attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), { filename: fileName, contentType });
}

/** Stages a file that must be accepted; returns the preview. */
export async function stagedPreview(agent: Agent, content: string | Buffer, fileName = 'herd.csv'): Promise<HerdImportDto> {
  const res = await stageFile(agent, content, fileName);
  if (res.status !== 201) throw new Error(`staging failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as HerdImportDto;
}

/** The lines of a streamed (NDJSON) staging answer. */
export function streamLines(text: string): HerdImportStreamLine[] {
  return text
    .split('\n')
    .filter(Boolean)
    .map((line) => JSON.parse(line) as HerdImportStreamLine);
}

/** A real image made on the spot (so no binary test files live in the repository). */
export async function testImage(format: 'png' | 'jpeg' | 'webp', opts: { width?: number; height?: number; artist?: string } = {}): Promise<Buffer> {
  const width = opts.width ?? 640;
  const height = opts.height ?? 480;
  const mark = `<svg width="${width}" height="${height}"><rect x="${width / 8}" y="${height / 8}" width="${width / 2}" height="${height / 3}" fill="#E9C46A"/></svg>`;
  let image = sharp({ create: { width, height, channels: 3, background: { r: 47, g: 93, b: 80 } } }).composite([{ input: Buffer.from(mark) }]);
  if (opts.artist) image = image.withExif({ IFD0: { Artist: opts.artist, Copyright: opts.artist } });
  return image.toFormat(format).toBuffer();
}

/** Every text item of a PDF's pages, joined by spaces, as a PDF parsing library reads it. */
export async function pdfText(pdf: Buffer): Promise<{ pages: number; text: string }> {
  const standardFontDataUrl = `${path.join(path.dirname(createRequire(import.meta.url).resolve('pdfjs-dist/package.json')), 'standard_fonts')}/`;
  const document = await getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, isEvalSupported: false, standardFontDataUrl }).promise;
  const parts: string[] = [];
  for (let n = 1; n <= document.numPages; n++) {
    const page = await document.getPage(n);
    const content = await page.getTextContent();
    for (const item of content.items) if ('str' in item) parts.push(item.str);
  }
  const pages = document.numPages;
  await document.destroy();
  return { pages, text: parts.join(' ').replace(/\s+/g, ' ') };
}

type Parser = Extract<Parameters<supertest.Test['parse']>[0], (res: never, callback: never) => void>;

/** Supertest buffers a binary answer (a PDF, a photo, a CSV with its byte-order mark) with this parser. */
export const binaryParser = ((res: NodeJS.ReadableStream, callback: (error: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => callback(null, Buffer.concat(chunks)));
  res.on('error', (error: Error) => callback(error, Buffer.alloc(0)));
}) as unknown as Parser;
