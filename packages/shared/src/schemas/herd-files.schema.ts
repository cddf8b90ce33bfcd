import { z } from 'zod';
import { importRowFilters } from '../herd-files/herd-files-dto';
import { animalListQuerySchema } from './animal.schema';

/** GET /api/herd-imports/:importId: a page of the staged rows, all or only some. */
export const herdImportRowsQuerySchema = z.strictObject({
  show: z.enum(importRowFilters).default('all'),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});
export type HerdImportRowsQuery = z.infer<typeof herdImportRowsQuerySchema>;

/** POST /api/herd-imports/:importId/confirmation: one key per preview, so a double click imports once. */
export const herdImportConfirmSchema = z.strictObject({
  idempotencyKey: z.uuid({ message: 'The idempotency key is not a valid id' }),
});
export type HerdImportConfirmInput = z.infer<typeof herdImportConfirmSchema>;

/** GET /api/herd-export: the Herd table's filters and sort (every page of it). */
export const herdExportQuerySchema = animalListQuerySchema.omit({ page: true, pageSize: true });
export type HerdExportQuery = z.infer<typeof herdExportQuerySchema>;

/** A photo's caption (the file itself is sent as multipart form data). */
export const photoCaptionSchema = z
  .string()
  .trim()
  .max(200, 'Keep the caption under 200 characters')
  // eslint-disable-next-line no-control-regex
  .refine((value) => !/[\u0000-\u001f\u007f]/.test(value), 'Keep the caption on one line');

export const photoUploadFieldsSchema = z.strictObject({
  caption: photoCaptionSchema.default(''),
});

export const photoUpdateSchema = z.strictObject({
  caption: photoCaptionSchema,
});
export type PhotoUpdateInput = z.infer<typeof photoUpdateSchema>;
