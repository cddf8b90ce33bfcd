import { createRequire } from 'node:module';
import path from 'node:path';
import sharp from 'sharp';
import type supertest from 'supertest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import type { HerdImportDto, HerdImportStreamLine } from '@burrowline/shared';
import type { Agent } from './test-app';

export { csv, generatedHerdCsv, HEADER } from './herd-csv';

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

/** The text of every QR code drawn as an image on a PDF's pages, in page order (decoded as a phone's camera would). */
export async function pdfQrCodes(pdf: Buffer): Promise<string[]> {
  const { OPS } = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const jsQR = (await import('jsqr')).default;
  const standardFontDataUrl = `${path.join(path.dirname(createRequire(import.meta.url).resolve('pdfjs-dist/package.json')), 'standard_fonts')}/`;
  const document = await getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, isEvalSupported: false, standardFontDataUrl }).promise;
  const found: string[] = [];
  for (let n = 1; n <= document.numPages; n++) {
    const page = await document.getPage(n);
    const operators = await page.getOperatorList();
    for (let i = 0; i < operators.fnArray.length; i++) {
      if (operators.fnArray[i] !== OPS.paintImageXObject) continue;
      const name = operators.argsArray[i][0] as string;
      const image = await new Promise<{ width: number; height: number; data: Uint8ClampedArray }>((resolve) => page.objs.get(name, resolve));
      // pdf.js hands RGB (3 bytes a pixel) or RGBA; the decoder wants RGBA.
      const pixels = image.width * image.height;
      const rgba = image.data.length === pixels * 4 ? image.data : new Uint8ClampedArray(pixels * 4).map((_, k) => (k % 4 === 3 ? 255 : image.data[Math.floor(k / 4) * 3 + (k % 4)]!));
      const code = jsQR(rgba, image.width, image.height);
      if (code) found.push(code.data);
    }
  }
  await document.destroy();
  return found;
}
