import PDFDocument from 'pdfkit';
import { pdfSafe } from '../../lib/pdf-text';

export interface RecordOfSkillsData {
  apprentice: string;
  farm: string;
  mentor: string;
  printedOn: string;
  signedOff: { name: string; area: string; on: string; by: string; comment: string; dangerous: boolean }[];
  practising: { name: string; since: string }[];
  minutesByKind: { label: string; minutes: number }[];
  caution: string;
}

const hours = (minutes: number) => `${(minutes / 60).toFixed(1)} h`;

/** The apprentice's record of skills as a PDF she keeps: what was signed off, when and by whom, and her hours. */
export function renderRecordOfSkills(data: RecordOfSkillsData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4', margin: 50,
    info: { Title: pdfSafe(`Record of skills: ${data.apprentice}`), Author: pdfSafe(data.mentor), Subject: 'Record of skills', Creator: 'Burrowline' },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const text = (value: string, size = 10, bold = false) => doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(size).fillColor('#2f2a24').text(pdfSafe(value));

  text('Record of skills', 20, true);
  doc.moveDown(0.3);
  text(`Apprentice: ${data.apprentice}`, 11);
  text(`Farm: ${data.farm}`, 11);
  text(`Mentor: ${data.mentor}`, 11);
  text(`Printed on ${data.printedOn}`, 9);
  doc.moveDown();

  text('Skills signed off', 14, true);
  doc.moveDown(0.3);
  if (data.signedOff.length === 0) text('None yet.');
  for (const s of data.signedOff) {
    text(`${s.name} (${s.area}): signed off on ${s.on} by ${s.by}`, 10, true);
    if (s.comment) text(s.comment, 9);
    if (s.dangerous) text(data.caution, 8);
    doc.moveDown(0.3);
  }
  doc.moveDown();
  text('Practising', 14, true);
  doc.moveDown(0.3);
  if (data.practising.length === 0) text('None.');
  for (const p of data.practising) text(`${p.name}, since ${p.since}`);
  doc.moveDown();
  text('Hours logged by kind (accepted entries)', 14, true);
  doc.moveDown(0.3);
  if (data.minutesByKind.length === 0) text('No accepted entries yet.');
  for (const k of data.minutesByKind) text(`${k.label}: ${hours(k.minutes)}`);
  const total = data.minutesByKind.reduce((n, k) => n + k.minutes, 0);
  if (total > 0) text(`In all: ${hours(total)}`, 10, true);
  doc.end();
  return done;
}
