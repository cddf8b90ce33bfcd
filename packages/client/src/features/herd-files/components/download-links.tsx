import { FileDown, FileText, QrCode } from 'lucide-react';
import type { AnimalListQuery } from '@burrowline/shared';
import { buttonClasses } from '../../../components/ui/button-styles';
import { herdExportHref, hutchCardsHref, pedigreeCertificateHref } from '../api/herd-file-links';

/** "Export CSV": the herd as the table shows it now (filters and sort), as a spreadsheet file. */
export function ExportCsvLink({ query }: { query: Partial<AnimalListQuery> }) {
  return (
    <a href={herdExportHref(query)} download className={buttonClasses('secondary')}>
      <FileDown className="size-5" aria-hidden="true" />
      Export CSV
    </a>
  );
}

/** "Pedigree PDF": the printable certificate, made on the server. */
export function PedigreePdfLink({ animalId }: { animalId: string }) {
  return (
    <a href={pedigreeCertificateHref(animalId)} download className={buttonClasses('secondary')}>
      <FileText className="size-5" aria-hidden="true" />
      Pedigree PDF
    </a>
  );
}

/** "Hutch card(s)": a printable sheet of cards to pin on the hutch, each with a QR code that opens the animal. */
export function HutchCardsLink({ animalIds, children }: { animalIds: string[] | 'breeding-does'; children: string }) {
  return (
    <a href={hutchCardsHref(animalIds)} target="_blank" rel="noopener" className={buttonClasses('secondary')}>
      <QrCode className="size-5" aria-hidden="true" />
      {children}
    </a>
  );
}
