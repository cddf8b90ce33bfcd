import { FileDown, FileText } from 'lucide-react';
import type { AnimalListQuery } from '@burrowline/shared';
import { buttonClasses } from '../../../components/ui/button-styles';
import { herdExportHref, pedigreeCertificateHref } from '../api/herd-file-links';

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
