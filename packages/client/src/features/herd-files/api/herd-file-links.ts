import type { AnimalListQuery } from '@burrowline/shared';

/** The CSV download of the herd with the Herd table's filters and sort (every page). */
export function herdExportHref(query: Partial<AnimalListQuery>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (key === 'page' || key === 'pageSize' || value === undefined || value === '') continue;
    params.set(key, String(value));
  }
  const search = params.toString();
  return `/api/herd-export${search ? `?${search}` : ''}`;
}

/** The printable pedigree certificate of an animal (a PDF made on the server). */
export function pedigreeCertificateHref(animalId: string): string {
  return `/api/pedigree-certificates/${encodeURIComponent(animalId)}`;
}

/** Printable hutch cards with a QR code each: of some animals, or of every breeding doe of the farm. */
export function hutchCardsHref(animalIds: string[] | 'breeding-does'): string {
  return animalIds === 'breeding-does' ? '/api/hutch-cards?does=breeding' : `/api/hutch-cards?animalIds=${animalIds.map(encodeURIComponent).join(',')}`;
}
