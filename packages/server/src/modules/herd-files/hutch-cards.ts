import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import { pdfSafe as printable } from '../../lib/pdf-text';
import { breedLabel, formatDate } from './pedigree-certificate';
import type { BreedMakeupDto } from '@burrowline/shared';

export interface HutchCard {
  name: string;
  tattoo: string | null;
  sex: 'doe' | 'buck';
  birthDate: string | null;
  breedMakeup: BreedMakeupDto;
  /** The next open Almanac tasks: the dates of her current cycle. */
  next: { title: string; dueOn: string }[];
  /** Where the QR code leads: the animal in the product. */
  url: string;
}

// Letter, portrait: four cards a page (two by two), cut along the light lines.
const PAGE = { width: 612, height: 792, margin: 30 };
const CARD = { width: (612 - 2 * 30 - 12) / 2, height: (792 - 2 * 30 - 12) / 2 };
const QR_SIZE = 96;
const COLOURS = { bark: '#3B2F2A', grey: '#6B6460', line: '#C9C3BC', moss: '#2F5D50' };

/** Printable hutch cards (PDF), each with a QR code that opens the animal on a phone. */
export async function renderHutchCards(cards: HutchCard[], farmName: string): Promise<Buffer> {
  const codes = await Promise.all(cards.map((card) => QRCode.toBuffer(card.url, { type: 'png', margin: 1, width: 240, errorCorrectionLevel: 'M' })));
  const doc = new PDFDocument({ size: 'LETTER', margin: 0, info: { Title: printable(`Hutch cards of ${farmName}`), Creator: 'Burrowline' } });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  cards.forEach((card, index) => {
    const slot = index % 4;
    if (index > 0 && slot === 0) doc.addPage();
    const x = PAGE.margin + (slot % 2) * (CARD.width + 12);
    const y = PAGE.margin + Math.floor(slot / 2) * (CARD.height + 12);
    doc.roundedRect(x, y, CARD.width, CARD.height, 10).lineWidth(0.8).strokeColor(COLOURS.line).dash(4, { space: 3 }).stroke().undash();
    const inner = { x: x + 14, y: y + 14, width: CARD.width - 28 };
    doc.image(codes[index]!, inner.x + inner.width - QR_SIZE, inner.y, { width: QR_SIZE, height: QR_SIZE });
    const textWidth = inner.width - QR_SIZE - 10;
    doc.font('Helvetica-Bold').fontSize(18).fillColor(COLOURS.bark).text(printable(card.name || card.tattoo || 'Unnamed'), inner.x, inner.y, { width: textWidth });
    doc.font('Helvetica').fontSize(11).fillColor(COLOURS.grey)
      .text(printable(`${card.tattoo ? `Tattoo ${card.tattoo}` : 'No tattoo'} · ${card.sex === 'doe' ? 'Doe' : 'Buck'}`), { width: textWidth })
      .text(printable(breedLabel(card.breedMakeup)), { width: textWidth })
      .text(`Born ${formatDate(card.birthDate)}`, { width: textWidth });
    let lineY = inner.y + QR_SIZE + 14;
    doc.font('Helvetica-Bold').fontSize(11).fillColor(COLOURS.moss).text('Next in the Almanac', inner.x, lineY, { width: inner.width });
    lineY += 16;
    doc.font('Helvetica').fontSize(11).fillColor(COLOURS.bark);
    if (card.next.length === 0) {
      doc.text('Nothing planned', inner.x, lineY, { width: inner.width });
      lineY += 16;
    }
    for (const task of card.next) {
      doc.text(printable(`${formatDate(task.dueOn)}: ${task.title}`), inner.x, lineY, { width: inner.width });
      lineY += 16;
    }
    lineY += 8;
    doc.font('Helvetica-Bold').fontSize(11).fillColor(COLOURS.moss).text('Notes', inner.x, lineY);
    for (let ruled = lineY + 26; ruled < y + CARD.height - 14; ruled += 22) {
      doc.moveTo(inner.x, ruled).lineTo(inner.x + inner.width, ruled).lineWidth(0.5).strokeColor(COLOURS.line).stroke();
    }
  });
  if (cards.length === 0) doc.font('Helvetica').fontSize(14).text('No animals chosen.', PAGE.margin, PAGE.margin);
  doc.end();
  return done;
}
