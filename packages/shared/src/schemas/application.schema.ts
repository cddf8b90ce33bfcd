import { z } from 'zod';
import { emailSchema } from './auth.schema';
import { singleLine } from './text';
import { timeZoneSchema } from './farm.schema';

export const applicationStatuses = ['pending', 'approved', 'rejected', 'withdrawn'] as const;
export type ApplicationStatus = (typeof applicationStatuses)[number];

/** What a new member hopes to share with the co-op. */
export const sharingOptions = ['bucks', 'processing_days', 'trades'] as const;
export type SharingOption = (typeof sharingOptions)[number];

const herdCount = (what: string, max: number) =>
  z
    .number({ message: `Enter the number of ${what} (0 if none)` })
    .int(`Enter a whole number of ${what}`)
    .min(0, `Enter the number of ${what} (0 if none)`)
    .max(max, `That is more ${what} than a member farm keeps; check the number`);

/**
 * The public application form (`/apply/:coopSlug`). It asks what a co-op admin needs to decide on a
 * new member who will bring animals, and with them disease risk. The idempotency key is generated
 * by the form once, so a double submit or a retry returns the first application instead of a second.
 */
export const applicationSchema = z
  .strictObject({
    idempotencyKey: z.uuid({ message: 'Reload the form and send it again' }),
    applicantName: singleLine('Your name', 2, 80),
    email: emailSchema,
    phone: z
      .string()
      .trim()
      .max(30, 'Keep the phone number under 30 characters')
      .regex(/^[0-9+().\-\s]*$/, 'Use digits, spaces and + ( ) - only'),
    farmName: singleLine('The farm name', 2, 80),
    location: singleLine('The location', 2, 120),
    timeZone: timeZoneSchema,
    breedsKept: z.array(singleLine('A breed name', 1, 60)).max(20, 'List at most 20 breeds'),
    does: herdCount('does', 2000),
    bucks: herdCount('bucks', 500),
    quarantinePractice: z
      .string()
      .trim()
      .min(10, 'Say how you keep new or returning animals apart before they join the herd')
      .max(2000, 'Keep this under 2,000 characters'),
    diseaseLastYear: z.enum(['yes', 'no'], { message: 'Say whether your herd had disease in the last year' }),
    diseaseDetails: z.string().trim().max(2000, 'Keep this under 2,000 characters'),
    sharing: z.array(z.enum(sharingOptions)).max(sharingOptions.length),
    sharingNotes: z.string().trim().max(1000, 'Keep this under 1,000 characters'),
    agreeToRules: z.literal(true, { message: "Agree to the co-op's rules to send your application" }),
  })
  .superRefine((value, ctx) => {
    if (value.diseaseLastYear === 'yes' && value.diseaseDetails.length < 5) {
      ctx.addIssue({ code: 'custom', path: ['diseaseDetails'], message: 'Say what it was and how it was dealt with' });
    }
  });
export type ApplicationInput = z.infer<typeof applicationSchema>;

export const applicationSortKeys = ['createdAt', 'applicantName', 'farmName', 'herdSize', 'status'] as const;
export type ApplicationSortKey = (typeof applicationSortKeys)[number];
export const pageSizes = [10, 20, 50] as const;

const pageSchema = z.coerce.number().int().min(1, 'Pages start at 1').max(100_000).default(1);
export const pageSizeSchema = z.coerce
  .number()
  .int()
  .refine((n) => (pageSizes as readonly number[]).includes(n), 'Choose 10, 20 or 50 rows a page')
  .default(20);
export { pageSchema };

/** The admin's queue: filter, search, sort and page (the client keeps the same values in its URL). */
export const applicationListQuerySchema = z.strictObject({
  status: z.enum([...applicationStatuses, 'all'], { message: 'Choose pending, approved, rejected, withdrawn or all' }).default('pending'),
  q: z.string().trim().max(100, 'Keep the search under 100 characters').default(''),
  sort: z.enum(applicationSortKeys, { message: 'Not a column the queue sorts by' }).default('createdAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: pageSchema,
  pageSize: pageSizeSchema,
});
export type ApplicationListQuery = z.infer<typeof applicationListQuerySchema>;

/** The admin may adjust the farm's name at approval (e.g. it clashes with a farm already in the co-op). */
export const applicationApprovalSchema = z.strictObject({
  farmName: singleLine('The farm name', 2, 80).optional(),
});
export type ApplicationApprovalInput = z.infer<typeof applicationApprovalSchema>;

/** The reason is e-mailed to the applicant, so it is required and written for them. */
export const applicationRejectionSchema = z.strictObject({
  reason: z
    .string()
    .trim()
    .min(10, 'Give the applicant a reason of at least 10 characters')
    .max(2000, 'Keep the reason under 2,000 characters'),
});
export type ApplicationRejectionInput = z.infer<typeof applicationRejectionSchema>;

/** Recorded when the applicant tells the co-op they no longer want to join; not e-mailed. */
export const applicationWithdrawalSchema = z.strictObject({
  note: z.string().trim().max(1000, 'Keep the note under 1,000 characters').optional(),
});
export type ApplicationWithdrawalInput = z.infer<typeof applicationWithdrawalSchema>;
