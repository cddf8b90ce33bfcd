import type { HerdImportRowsQuery } from '@burrowline/shared';
import { herdKeys } from '../../herd';

export const herdFileKeys = {
  import: (importId: string, query: HerdImportRowsQuery) => [...herdKeys.all, 'imports', importId, query] as const,
  imports: (importId: string) => [...herdKeys.all, 'imports', importId] as const,
};
