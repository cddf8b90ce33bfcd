import { z } from 'zod';
import { pageSchema, pageSizeSchema } from './application.schema';

/** The doe board sorts by what is due (the morning's round), by state, or by tattoo or name. */
export const doeBoardSortKeys = ['due', 'state', 'tattoo', 'name'] as const;
export type DoeBoardSortKey = (typeof doeBoardSortKeys)[number];

export const doeBoardQuerySchema = z.strictObject({
  sort: z.enum(doeBoardSortKeys, { message: 'Not a column the doe board sorts by' }).default('due'),
  dir: z.enum(['asc', 'desc'], { message: 'Choose asc or desc' }).default('asc'),
  page: pageSchema,
  /** A farm's does fit one page of 50 for most farms: the morning's round on one screen. */
  pageSize: pageSizeSchema.default(50),
});
export type DoeBoardQuery = z.infer<typeof doeBoardQuerySchema>;
