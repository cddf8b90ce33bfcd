import { z } from 'zod';
import { calendarDateSchema } from './animal.schema';
import { multiLine, recordId, singleLine } from './text';

/**
 * Inputs of the Ledger. Money is in integer cents of the co-op's currency. A transfer's id is chosen by
 * the caller and derived from its source ("loan:<id>:fee"), so a retried post is answered with the
 * original instead of a second transfer.
 */

export const transferKinds = ['stud_fee', 'processing_fee', 'shared_cost', 'sale', 'dues', 'payment', 'settlement', 'correction'] as const;
export type TransferKind = (typeof transferKinds)[number];

export const transferStatuses = ['pending', 'posted', 'voided'] as const;
export type TransferStatus = (typeof transferStatuses)[number];

/** The co-op's own accounts; each farm has one account of kind `farm`. */
export const coopAccountKinds = ['coop_dues', 'coop_processing', 'coop_card_clearing', 'coop_cash'] as const;
export type CoopAccountKind = (typeof coopAccountKinds)[number];
export type AccountKind = 'farm' | CoopAccountKind;

export const paymentMethods = ['cash', 'cheque', 'bank_transfer', 'card'] as const;
export type PaymentMethod = (typeof paymentMethods)[number];

/** The largest single amount: a million in the co-op's currency keeps every sum far inside a bigint. */
export const MAX_TRANSFER_CENTS = 100_000_000;

export const transferIdSchema = z
  .string({ message: 'Give the transfer an id' })
  .min(1, 'Give the transfer an id')
  .max(120, 'Keep the transfer id under 120 characters')
  .regex(/^[A-Za-z0-9][A-Za-z0-9:_.-]*$/, 'Use letters, digits and : _ . - in a transfer id');

export const centsSchema = z
  .number({ message: 'Enter the amount' })
  .int('Give the amount in whole cents')
  .positive('The amount must be above zero')
  .max(MAX_TRANSFER_CENTS, 'That amount is too large for one transfer');

/** An account named by the farm it belongs to or the co-op account's kind. */
export const accountRefSchema = z.union([
  z.strictObject({ farmId: recordId('The farm') }),
  z.strictObject({ coop: z.enum(coopAccountKinds, { message: 'Choose a co-op account' }) }),
]);
export type AccountRef = z.infer<typeof accountRefSchema>;

export const transferCreateSchema = z
  .strictObject({
    id: transferIdSchema,
    kind: z.enum(transferKinds.filter((k) => k !== 'correction') as [TransferKind, ...TransferKind[]], { message: 'Choose the kind of transfer' }),
    /** Charged: its balance goes down (it owes). */
    debit: accountRefSchema,
    /** Credited: its balance goes up (it is owed). */
    credit: accountRefSchema,
    amountCents: centsSchema,
    /** A pending transfer shows as expected until it is posted or voided. */
    pending: z.boolean().default(false),
    sourceType: z.string().trim().max(40).regex(/^[a-z_]*$/, 'Use lower-case letters and _ in the source type').default(''),
    sourceId: z.string().trim().max(120).default(''),
    memo: multiLine(300).default(''),
    bookedOn: calendarDateSchema.optional(),
  })
  .refine((v) => JSON.stringify(v.debit) !== JSON.stringify(v.credit), { path: ['credit'], message: 'A transfer moves money between two different accounts' });
export type TransferCreateInput = z.infer<typeof transferCreateSchema>;
export type TransferCreateBody = z.input<typeof transferCreateSchema>;

export const correctionCreateSchema = z.strictObject({
  id: transferIdSchema,
  /** Part of the original; the whole of what is left uncorrected when left out. */
  amountCents: centsSchema.optional(),
  reason: singleLine('The reason', 3, 300),
});
export type CorrectionCreateInput = z.infer<typeof correctionCreateSchema>;

export const paymentCreateSchema = z
  .strictObject({
    id: transferIdSchema,
    /** Who receives it: another farm, or the co-op (its cash account). */
    toFarmId: recordId('The farm paid').nullable(),
    amountCents: centsSchema,
    method: z.enum(['cash', 'cheque', 'bank_transfer'], { message: 'Choose how it was paid' }),
    paidOn: calendarDateSchema,
    memo: multiLine(300).default(''),
    /** A payment of a year's dues. */
    duesYear: z.number().int().min(2000).max(2100).optional(),
  });
export type PaymentCreateInput = z.infer<typeof paymentCreateSchema>;

const period = {
  from: calendarDateSchema.optional(),
  to: calendarDateSchema.optional(),
};

export const transferListQuerySchema = z.strictObject({
  ...period,
  kind: z.enum(transferKinds).optional(),
  status: z.enum(transferStatuses).optional(),
  /** The other farm of the transfers (farm accounts only), or `coop` for the co-op's accounts. */
  counterparty: z.union([z.uuid(), z.literal('coop')]).optional(),
  /** An admin reads any farm's account; a member always their own. */
  farmId: z.uuid().optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type TransferListQuery = z.infer<typeof transferListQuerySchema>;

export const statementQuerySchema = z
  .strictObject({
    from: calendarDateSchema,
    to: calendarDateSchema,
    farmId: z.uuid().optional(),
    /** The co-op's own books (admin). */
    coop: z.enum(['true']).optional(),
    format: z.enum(['json', 'csv', 'pdf']).default('json'),
  })
  .refine((v) => v.from <= v.to, { path: ['to'], message: 'The period ends before it starts' });
export type StatementQuery = z.infer<typeof statementQuerySchema>;

export const duesSetSchema = z.strictObject({
  amountCents: centsSchema,
  dueOn: calendarDateSchema,
  /** How many days before the due date the reminder goes out. */
  reminderDaysBefore: z.number().int().min(0, 'Zero or more days').max(90, 'At most 90 days').default(14),
});
export type DuesSetInput = z.infer<typeof duesSetSchema>;

export const cardCheckoutCreateSchema = z.strictObject({
  /** Chosen by the client once per attempt: a double click or a retry answers the same checkout. */
  idempotencyKey: z.uuid({ message: 'Send an idempotency key' }),
  purpose: z.enum(['dues', 'balance']),
  duesYear: z.number().int().min(2000).max(2100).optional(),
});
export type CardCheckoutCreateInput = z.infer<typeof cardCheckoutCreateSchema>;

export const yearParamSchema = z.coerce.number().int().min(2000, 'Choose a year from 2000').max(2100, 'Choose a year up to 2100');

/** The Ledger screen's transfer filters as they sit in the address (a stale value falls back to its default). */
export const ledgerViewSchema = z.object({
  kind: z.enum(['all', ...transferKinds]).default('all'),
  /** A farm id, `coop`, or `all`. */
  counterparty: z.string().regex(/^(all|coop|[0-9a-f-]{36})$/).default('all'),
  from: z.string().regex(/^(\d{4}-\d{2}-\d{2})?$/).default(''),
  to: z.string().regex(/^(\d{4}-\d{2}-\d{2})?$/).default(''),
  page: z.coerce.number().int().min(1).default(1),
});
export type LedgerView = z.infer<typeof ledgerViewSchema>;
