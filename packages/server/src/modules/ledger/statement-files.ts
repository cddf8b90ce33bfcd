import PDFDocument from 'pdfkit';
import type { StatementDto } from '@burrowline/shared';
import { csvFile } from '../../lib/csv-file';
import { pdfSafe } from '../../lib/pdf-text';

const KIND_LABELS: Record<string, string> = {
  stud_fee: 'Stud fee', processing_fee: 'Processing fee', shared_cost: 'Shared cost', sale: 'Sale', dues: 'Dues',
  payment: 'Payment', settlement: 'Settlement', correction: 'Correction',
};

export const kindLabel = (kind: string) => KIND_LABELS[kind] ?? kind;

/** Amounts in the CSV are numbers of the currency (-12.5), so a spreadsheet sums them; a number cell carries no formula. */
const decimal = (cents: number): number => cents / 100;

export function statementCsv(s: StatementDto): string {
  const rows: (string | number | null)[][] = [
    ['Statement', s.title],
    ['Period', `${s.from} to ${s.to}`],
    ['Currency', s.currency],
    [],
    ['date', 'transfer', 'kind', 'counterparty', 'memo', 'amount', 'balance'],
    [s.from, '', '', '', 'Opening balance', null, decimal(s.openingBalanceCents)],
    ...s.lines.map((l) => [l.bookedOn, l.transferId, kindLabel(l.kind), l.counterparty, l.memo, decimal(l.amountCents), decimal(l.runningBalanceCents)]),
    [s.to, '', '', '', 'Closing balance', null, decimal(s.closingBalanceCents)],
  ];
  return csvFile(rows);
}

const COLOURS = { moss: '#2F5D50', straw: '#E9C46A', bark: '#3B2F2A', grey: '#6B6460', wash: '#F3EFE6' };

/** The statement as a printable PDF (Letter, portrait), drawn with the same library as the pedigree certificate. */
export function statementPdf(s: StatementDto, money: (cents: number) => string): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'LETTER', margin: 40, info: { Title: pdfSafe(`Statement: ${s.title}`), Creator: 'Burrowline' } });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const columns = [
    { label: 'Date', width: 62, align: 'left' as const },
    { label: 'Kind', width: 78, align: 'left' as const },
    { label: 'Counterparty', width: 110, align: 'left' as const },
    { label: 'Memo', width: 126, align: 'left' as const },
    { label: 'Amount', width: 78, align: 'right' as const },
    { label: 'Balance', width: 78, align: 'right' as const },
  ];
  const row = (cells: string[], y: number, bold = false) => {
    let x = 40;
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8.5).fillColor(COLOURS.bark);
    cells.forEach((cell, i) => {
      const c = columns[i]!;
      doc.text(pdfSafe(cell), x, y, { width: c.width - 6, align: c.align, lineBreak: false, ellipsis: true });
      x += c.width;
    });
  };

  doc.rect(0, 0, doc.page.width, 70).fill(COLOURS.moss);
  doc.rect(0, 70, doc.page.width, 4).fill(COLOURS.straw);
  doc.font('Helvetica-Bold').fontSize(20).fillColor('#FFFFFF').text(pdfSafe('Ledger statement'), 40, 18);
  doc.font('Helvetica').fontSize(10).fillColor('#FFFFFF').text(pdfSafe(`${s.title}, ${s.from} to ${s.to} (${s.currency})`), 40, 44);

  let y = 92;
  doc.font('Helvetica-Bold').fontSize(11).fillColor(COLOURS.bark).text(pdfSafe(`Opening balance ${money(s.openingBalanceCents)}`), 40, y);
  doc.text(pdfSafe(`Closing balance ${money(s.closingBalanceCents)}`), 300, y, { width: 272, align: 'right' });
  y += 24;
  const header = () => {
    doc.rect(36, y - 3, doc.page.width - 72, 15).fill(COLOURS.wash);
    row(columns.map((c) => c.label), y, true);
    y += 16;
  };
  header();
  for (const line of s.lines) {
    if (y > doc.page.height - 60) {
      doc.addPage();
      y = 40;
      header();
    }
    row([line.bookedOn, kindLabel(line.kind), line.counterparty, line.memo, money(line.amountCents), money(line.runningBalanceCents)], y);
    y += 14;
  }
  if (s.lines.length === 0) {
    doc.font('Helvetica').fontSize(9).fillColor(COLOURS.grey).text('No transfers were posted in this period.', 40, y);
    y += 14;
  }
  doc.font('Helvetica').fontSize(7.5).fillColor(COLOURS.grey)
    .text('Positive amounts are owed to this account, negative ones are owed by it. Pending transfers are not included until they are posted.', 40, y + 10, { width: doc.page.width - 80 });
  doc.end();
  return done;
}
