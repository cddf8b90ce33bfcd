import PDFDocument from 'pdfkit';
import type { BookingDto, ProcessingDayDto, ProcessingDaySummaryDto } from '@burrowline/shared';
import { pdfSafe } from '../../lib/pdf-text';

/** What the printable day sheet shows; gathered by the service, drawn here. */
export interface DaySheetData {
  day: ProcessingDayDto;
  bookings: BookingDto[];
  /** The yields page, after the day (or once yields are recorded). */
  summary: ProcessingDaySummaryDto | null;
  coopName: string;
}

const COLOURS = { moss: '#2F5D50', straw: '#E9C46A', bark: '#3B2F2A', grey: '#6B6460', clay: '#B5532F' };
const MARGIN = 40;

const kg = (grams: number) => `${(grams / 1000).toFixed(2)} kg`;

/** Letter, portrait: bookings, roster, equipment and the cautions; a second page of yields after the day. */
export function daySheetPdf(data: DaySheetData): Promise<Buffer> {
  const { day } = data;
  const doc = new PDFDocument({ size: 'LETTER', margin: MARGIN, info: { Title: pdfSafe(`Processing day ${day.date}`), Creator: 'Burrowline' } });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const width = doc.page.width - 2 * MARGIN;
  const heading = (text: string) => {
    doc.moveDown(0.6).font('Helvetica-Bold').fontSize(12).fillColor(COLOURS.moss).text(pdfSafe(text), MARGIN, undefined, { width });
    doc.moveDown(0.2).font('Helvetica').fontSize(9.5).fillColor(COLOURS.bark);
  };
  const line = (text: string, opts: { bold?: boolean; colour?: string } = {}) => {
    doc.font(opts.bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(9.5).fillColor(opts.colour ?? COLOURS.bark).text(pdfSafe(text), MARGIN, undefined, { width });
  };

  doc.rect(0, 0, doc.page.width, 70).fill(COLOURS.moss);
  doc.rect(0, 70, doc.page.width, 4).fill(COLOURS.straw);
  doc.font('Helvetica-Bold').fontSize(20).fillColor('#FFFFFF').text(pdfSafe(`Processing day ${day.date}`), MARGIN, 16);
  doc.font('Helvetica').fontSize(10).fillColor('#FFFFFF').text(pdfSafe(`${data.coopName} · starts ${day.startTime} at ${day.site.name}, hosted by ${day.hostFarmName}`), MARGIN, 44);
  doc.y = 88;
  line(`Address: ${day.site.address}`);
  line(`Capacity ${day.capacity.capacityHead} head: ${day.capacity.bookedHead} booked, ${day.capacity.offeredHead} offered, ${day.capacity.waitlistedHead} waitlisted, ${day.capacity.freeHead} free. Chill capacity ${day.capacity.chillCapacityHead} head.`);
  if (day.notes) line(`Notes: ${day.notes}`);

  heading('Cautions');
  for (const c of day.cautions) {
    line(c.title, { bold: true, colour: COLOURS.clay });
    line(`${c.text} (${c.source})`);
  }
  line('Local codes and licensed practice come first.', { colour: COLOURS.grey });

  heading('Bookings');
  const live = data.bookings.filter((b) => b.status !== 'cancelled');
  if (live.length === 0) line('No bookings yet.');
  for (const b of live) {
    const status = b.status === 'waitlisted' ? ` (waitlist ${b.waitlistPosition})` : b.status === 'offered' ? ' (offered, awaiting confirmation)' : '';
    line(`${b.farmName}: ${b.head} head${status}${b.headBrought !== null ? `, ${b.headBrought} brought` : ''}`, { bold: true });
    line(`   ${b.lines.map((l) => `${l.label} (${l.head})`).join('; ')}`);
  }

  heading('Roster');
  for (const s of day.stations) {
    const names = s.places.map((p) => p.userName ?? '____________');
    line(`${s.name} (${s.filled} of ${s.places.length}): ${names.join(', ')}`);
  }

  heading('Equipment');
  if (day.equipment.length === 0) line('Nothing listed.');
  for (const e of day.equipment) line(`[ ] ${e.name}${e.broughtByFarmName ? ` - brought by ${e.broughtByFarmName}` : ' - nobody yet'}`);

  const summary = data.summary;
  if (summary && (summary.status === 'closed' || summary.headProcessed > 0)) {
    doc.addPage();
    doc.font('Helvetica-Bold').fontSize(16).fillColor(COLOURS.moss).text(pdfSafe(`Yields of ${day.date}`), MARGIN, MARGIN);
    line(`${summary.headProcessed} head processed.`);
    heading('Per farm');
    for (const f of summary.farms) {
      const dress = f.dressOut === null ? 'no weights' : `dress-out ${(f.dressOut * 100).toFixed(1)}%`;
      line(`${f.farmName}: ${f.headProcessed} head of ${f.headBrought} brought; live ${kg(f.liveGrams)}, hot carcass ${kg(f.hotCarcassGrams)}, ${dress}; trimmed ${f.trimmedHead}, condemned ${f.condemnedHead}`);
    }
    heading('Per breed or cross');
    for (const b of summary.byBreed) line(`${b.label}: ${b.headProcessed} head, dress-out ${b.dressOut === null ? '-' : `${(b.dressOut * 100).toFixed(1)}%`}`);
    if (summary.outcomes.length > 0) {
      heading('Trimmed and condemned');
      for (const o of summary.outcomes) line(`${o.farmName}: ${o.head} ${o.outcome} - ${o.reason}`);
    }
  }
  doc.end();
  return done;
}
