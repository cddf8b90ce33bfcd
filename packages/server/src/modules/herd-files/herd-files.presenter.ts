import type { HerdImportDto, HerdImportRowDto, HerdImportRowsQuery } from '@burrowline/shared';
import type { HerdImport } from './herd-import.model';

const filters: Record<HerdImportRowsQuery['show'], (row: HerdImportRowDto) => boolean> = {
  all: () => true,
  problems: (row) => row.errors.length > 0 || row.warnings.length > 0,
  errors: (row) => row.errors.length > 0,
  create: (row) => row.action === 'create' && row.errors.length === 0,
  update: (row) => row.action === 'update' && row.errors.length === 0,
  unchanged: (row) => row.action === 'unchanged' && row.errors.length === 0,
};

export function presentHerdImport(row: HerdImport, query: HerdImportRowsQuery, names: Map<string, string>): HerdImportDto {
  const matching = row.rows.filter(filters[query.show]);
  const start = (query.page - 1) * query.pageSize;
  const summary = row.summary;
  return {
    id: row.id,
    fileName: row.fileName,
    byteSize: row.byteSize,
    checksum: row.checksum,
    hadByteOrderMark: row.hadBom,
    status: row.status,
    createdAt: row.createdAt.toISOString(),
    summary,
    canConfirm: row.status === 'ready' && summary.withErrors === 0 && summary.create + summary.update > 0,
    rows: { items: matching.slice(start, start + query.pageSize), total: matching.length, page: query.page, pageSize: query.pageSize, show: query.show },
    result:
      row.status === 'confirmed' && row.result && row.confirmedAt
        ? {
            ...row.result,
            confirmedAt: row.confirmedAt.toISOString(),
            confirmedBy: row.confirmedBy ? { id: row.confirmedBy, name: names.get(row.confirmedBy) ?? 'Someone' } : null,
          }
        : null,
  };
}
