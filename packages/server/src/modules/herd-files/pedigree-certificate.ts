import PDFDocument from 'pdfkit';
import { pdfSafe } from '../../lib/pdf-text';
import type { AnimalDetailDto, BreedMakeupDto, PedigreeCardDto, PedigreeTreeDto } from '@burrowline/shared';

/** What the certificate shows; gathered by the service, drawn here. */
export interface CertificateData {
  animal: AnimalDetailDto;
  tree: PedigreeTreeDto;
  /** The farm issuing it (the animal's owner) and the co-op. */
  issuedBy: string;
  coopName: string;
  /** The issuing farm's today, YYYY-MM-DD. */
  issuedOn: string;
}

// Letter, landscape (points). Our own layout: the animal on the left, four generations to the right.
const PAGE = { width: 792, height: 612, margin: 36 };
const COLOURS = { moss: '#2F5D50', mossWash: '#E6EEEA', straw: '#E9C46A', clay: '#B5532F', bark: '#3B2F2A', grey: '#6B6460', line: '#9A938E' };
const GENERATIONS = 4;
const TREE = { left: 250, top: 96, bottom: 560, gap: 10 };
const PANEL = { left: PAGE.margin, width: 196 };

const printable = pdfSafe;

function percent(fraction: number): string {
  return `${(fraction * 100).toFixed(2).replace(/\.?0+$/, '')}%`;
}

export function breedLabel(makeup: BreedMakeupDto): string {
  if (makeup.purity === 'unknown' || makeup.breeds.length === 0) return 'Breed unknown';
  if (makeup.purity === 'purebred') return makeup.breeds[0]!.name;
  const parts = makeup.breeds.map((b) => `${b.name} ${percent(b.fraction)}`);
  if (makeup.unknown > 0) parts.push(`unknown ${percent(makeup.unknown)}`);
  return `Cross: ${parts.join(', ')}`;
}

export function formatDate(iso: string | null): string {
  if (!iso) return 'unknown';
  const [y, m, d] = iso.split('-').map(Number) as [number, number, number];
  const month = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'][m - 1];
  return `${month} ${d}, ${y}`;
}

function identity(card: PedigreeCardDto): string {
  return [card.tattoo, card.name].filter(Boolean).join('  ') || 'Name and tattoo unknown';
}

/** Draws the certificate and returns the PDF file. */
export function renderCertificate(data: CertificateData): Promise<Buffer> {
  const { animal, tree } = data;
  const doc = new PDFDocument({
    size: 'LETTER',
    layout: 'landscape',
    margin: 0,
    info: {
      Title: printable(`Pedigree of ${animal.name || animal.tattoo} (${animal.tattoo})`),
      Author: printable(data.issuedBy),
      Subject: 'Pedigree certificate',
      Creator: 'Burrowline',
    },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const text = (value: string, x: number, y: number, opts: { size: number; bold?: boolean; colour?: string; width: number; align?: 'left' | 'right' | 'center' }) => {
    doc
      .font(opts.bold ? 'Helvetica-Bold' : 'Helvetica')
      .fontSize(opts.size)
      .fillColor(opts.colour ?? COLOURS.bark)
      .text(printable(value), x, y, { width: opts.width, lineBreak: false, ellipsis: true, align: opts.align ?? 'left' });
  };

  // Header band
  doc.rect(0, 0, PAGE.width, 64).fill(COLOURS.moss);
  doc.rect(0, 64, PAGE.width, 4).fill(COLOURS.straw);
  text('Pedigree certificate', PAGE.margin, 18, { size: 22, bold: true, colour: '#FFFFFF', width: 380 });
  text(`${data.coopName}`, PAGE.margin, 44, { size: 9, colour: '#FFFFFF', width: 380 });
  text(`Issued by ${data.issuedBy}`, PAGE.width - PAGE.margin - 320, 20, { size: 11, bold: true, colour: '#FFFFFF', width: 320, align: 'right' });
  text(`on ${formatDate(data.issuedOn)} (${data.issuedOn})`, PAGE.width - PAGE.margin - 320, 38, { size: 9, colour: '#FFFFFF', width: 320, align: 'right' });

  // The animal
  let y = 92;
  const panelText = (label: string, value: string) => {
    text(label.toUpperCase(), PANEL.left, y, { size: 6.5, bold: true, colour: COLOURS.grey, width: PANEL.width });
    y += 9;
    doc.font('Helvetica').fontSize(9.5).fillColor(COLOURS.bark).text(printable(value), PANEL.left, y, { width: PANEL.width });
    y = doc.y + 7;
  };
  doc.roundedRect(PANEL.left - 8, 84, PANEL.width + 16, TREE.bottom - 84, 6).fill(COLOURS.mossWash);
  text(animal.name || 'Unnamed', PANEL.left, y, { size: 17, bold: true, width: PANEL.width });
  y += 22;
  text(`Ear tattoo ${animal.tattoo}`, PANEL.left, y, { size: 11, bold: true, colour: COLOURS.moss, width: PANEL.width });
  y += 22;
  panelText('Sex', animal.sex === 'buck' ? 'Buck' : 'Doe');
  panelText('Born', formatDate(animal.birthDate));
  panelText('Breed', breedLabel(animal.breedMakeup));
  panelText('Colour', animal.colour || 'not recorded');
  panelText('Registration', animal.registrationNumber || 'not registered');
  panelText('Coefficient of inbreeding (COI)', `${(animal.coi * 100).toFixed(2)} %`);
  panelText('Bred by', animal.breedingFarm?.name ?? (animal.breederName || 'not recorded'));
  panelText('Owner', animal.owningFarm?.name ?? data.issuedBy);
  const known = animal.completeness
    .slice(0, GENERATIONS)
    .map((f, i) => `${Math.round(f * 2 ** (i + 1))} of ${2 ** (i + 1)} ${['parents', 'grandparents', 'great-grandparents', 'great-great-grandparents'][i]}`);
  panelText('Ancestors on record', known.join('\n'));

  // The tree: generation g (1 = parents) has 2^g boxes in heap slots 2^g … 2^(g+1) − 1.
  const columnWidth = (PAGE.width - PAGE.margin - TREE.left - (GENERATIONS - 1) * TREE.gap) / GENERATIONS;
  const height = TREE.bottom - TREE.top;
  const boxes = new Map<number, { x: number; y: number; w: number; h: number }>();
  for (let g = 1; g <= GENERATIONS; g++) {
    const count = 2 ** g;
    const slotHeight = height / count;
    const boxHeight = Math.min(slotHeight - (g === GENERATIONS ? 2 : 6), 96);
    const x = TREE.left + (g - 1) * (columnWidth + TREE.gap);
    text(['Parents', 'Grandparents', 'Great-grandparents', 'Great-great-grandparents'][g - 1]!.toUpperCase(), x, TREE.top - 14, {
      size: 6.5, bold: true, colour: COLOURS.grey, width: columnWidth,
    });
    for (let i = 0; i < count; i++) {
      const slot = count + i;
      const top = TREE.top + i * slotHeight + (slotHeight - boxHeight) / 2;
      boxes.set(slot, { x, y: top, w: columnWidth, h: boxHeight });
    }
  }
  // Connectors first, so boxes sit on top of them.
  doc.lineWidth(0.6).strokeColor(COLOURS.line);
  // Behind an unknown ancestor there is nothing to show: no box, no line.
  const behindUnknown = (slot: number) => slot > 3 && !tree.slots[Math.floor(slot / 2)];
  for (const [slot, box] of boxes) {
    if (slot >= 2 ** GENERATIONS || !tree.slots[slot]) continue;
    const sire = boxes.get(2 * slot)!;
    const dam = boxes.get(2 * slot + 1)!;
    const fromX = box.x + box.w;
    const midX = fromX + TREE.gap / 2;
    doc.moveTo(fromX, box.y + box.h / 2).lineTo(midX, box.y + box.h / 2).stroke();
    doc.moveTo(midX, sire.y + sire.h / 2).lineTo(midX, dam.y + dam.h / 2).stroke();
    doc.moveTo(midX, sire.y + sire.h / 2).lineTo(sire.x, sire.y + sire.h / 2).stroke();
    doc.moveTo(midX, dam.y + dam.h / 2).lineTo(dam.x, dam.y + dam.h / 2).stroke();
  }
  for (const [slot, box] of boxes) {
    if (behindUnknown(slot)) continue;
    const generation = Math.floor(Math.log2(slot));
    const isSire = slot % 2 === 0;
    const id = tree.slots[slot] ?? null;
    const card = id ? tree.cards[id] : undefined;
    const size = [0, 9, 8, 7, 6.3][generation]!;
    const pad = generation === GENERATIONS ? 3 : 5;
    if (!card) {
      doc.roundedRect(box.x, box.y, box.w, box.h, 3).dash(2, { space: 2 }).lineWidth(0.6).strokeColor(COLOURS.line).stroke().undash();
      text(`${isSire ? 'Sire' : 'Dam'} unknown`, box.x + pad, box.y + box.h / 2 - size / 2, { size, colour: COLOURS.grey, width: box.w - 2 * pad });
      continue;
    }
    doc.roundedRect(box.x, box.y, box.w, box.h, 3).fillAndStroke('#FFFFFF', COLOURS.line);
    doc.rect(box.x, box.y, 3, box.h).fill(isSire ? COLOURS.moss : COLOURS.straw);
    const lines: { value: string; bold?: boolean }[] =
      generation === GENERATIONS
        ? [
            { value: identity(card), bold: true },
            { value: [breedLabel(card.breedMakeup), card.colour, card.registrationNumber ? `Reg. ${card.registrationNumber}` : ''].filter(Boolean).join(' · ') },
          ]
        : [
            { value: identity(card), bold: true },
            { value: breedLabel(card.breedMakeup) },
            { value: card.colour ? `Colour: ${card.colour}` : 'Colour not recorded' },
            { value: card.registrationNumber ? `Reg. ${card.registrationNumber}` : 'Not registered' },
            ...(generation <= 2 ? [{ value: `Born ${formatDate(card.birthDate)}` }, { value: `COI ${(card.coi * 100).toFixed(2)} %` }] : []),
          ];
    const lineHeight = size * 1.28;
    let lineY = box.y + Math.max(pad, (box.h - lines.length * lineHeight) / 2);
    for (const line of lines) {
      if (lineY + lineHeight > box.y + box.h + 1) break;
      text(line.value, box.x + pad + 3, lineY, { size, bold: line.bold, width: box.w - 2 * pad - 3 });
      lineY += lineHeight;
    }
  }
  text('SIRE', TREE.left, boxes.get(2)!.y - 9, { size: 6.5, bold: true, colour: COLOURS.moss, width: 60 });
  text('DAM', TREE.left, boxes.get(3)!.y - 9, { size: 6.5, bold: true, colour: COLOURS.moss, width: 60 });

  // Footer
  doc.moveTo(PAGE.margin, 574).lineTo(PAGE.width - PAGE.margin, 574).lineWidth(0.5).strokeColor(COLOURS.line).stroke();
  text(
    `From the herd records of ${data.issuedBy}, kept in Burrowline. The COI is computed over every ancestor the co-op has on record; ` +
      'unrecorded ancestors count as unrelated.',
    PAGE.margin,
    582,
    { size: 7, colour: COLOURS.grey, width: 470 },
  );
  text('Signed ______________________________', PAGE.width - PAGE.margin - 240, 582, { size: 8, width: 240, align: 'right' });

  doc.end();
  return done;
}
