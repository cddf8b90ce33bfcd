import { z } from 'zod';
import { roles } from '../permissions/define-ability';
import { pageSchema, pageSizeSchema } from './application.schema';
import { emailSchema } from './auth.schema';
import { timeZoneSchema } from './farm.schema';
import { singleLine } from './text';

/**
 * The roles an admin may give. Making someone an apprentice needs a mentor, which belongs to
 * Mentorship, so it is not offered here.
 */
export const assignableRoles = ['member', 'admin'] as const;
export type AssignableRole = (typeof assignableRoles)[number];

const version = z.number({ message: 'Reload the page and try again' }).int().min(0);

export const memberRoleChangeSchema = z.strictObject({
  role: z.enum(assignableRoles, { message: 'Choose member or admin' }),
  version,
});
export type MemberRoleChangeInput = z.infer<typeof memberRoleChangeSchema>;

/** The reason stays in the audit log and is shown to other admins. */
export const memberDisableSchema = z.strictObject({
  reason: z.string().trim().min(5, 'Say why, in at least 5 characters').max(500, 'Keep the reason under 500 characters'),
  version,
});
export type MemberDisableInput = z.infer<typeof memberDisableSchema>;

export const memberEnableSchema = z.strictObject({ version });
export type MemberEnableInput = z.infer<typeof memberEnableSchema>;

export const newFarmSchema = z.strictObject({
  kind: z.literal('new'),
  name: singleLine('The farm name', 2, 80),
  location: singleLine('The location', 2, 120),
  timeZone: timeZoneSchema,
  breedsKept: z.array(singleLine('A breed name', 1, 60)).max(20, 'List at most 20 breeds'),
});

export const existingFarmSchema = z.strictObject({
  kind: z.literal('existing'),
  farmId: z.uuid({ message: 'Choose a farm' }),
});

/**
 * Inviting someone directly: the same set-password link an approved applicant gets. Their farm is
 * created (or they join the chosen farm, e.g. a partner on it) when they set their password.
 */
export const invitationSchema = z.strictObject({
  name: singleLine('The name', 2, 80),
  email: emailSchema,
  role: z.enum(assignableRoles, { message: 'Choose member or admin' }),
  farm: z.discriminatedUnion('kind', [newFarmSchema, existingFarmSchema], { message: 'Choose a new farm or an existing one' }),
});
export type InvitationInput = z.infer<typeof invitationSchema>;

export const auditCategories = ['all', 'applications', 'members', 'sign_in', 'coop'] as const;
export type AuditCategory = (typeof auditCategories)[number];

/** The audit log, newest first: by kind of event, by who did it, or about whom. */
export const auditEventQuerySchema = z.strictObject({
  category: z.enum(auditCategories, { message: 'Not a kind of event the log knows' }).default('all'),
  actorId: z.uuid({ message: 'Not a valid id' }).optional(),
  subjectId: z.uuid({ message: 'Not a valid id' }).optional(),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: pageSchema,
  pageSize: pageSizeSchema,
});
export type AuditEventQuery = z.infer<typeof auditEventQuerySchema>;

/**
 * active: can sign in; invited: invitation sent, no password yet; awaiting_password: admitted (an
 * approved application) but no password set yet; disabled: turned off by an admin.
 */
export const memberStatuses = ['active', 'invited', 'awaiting_password', 'disabled'] as const;
export type MemberStatus = (typeof memberStatuses)[number];

export const memberSortKeys = ['name', 'role', 'farm', 'status', 'lastSignInAt', 'joinedAt'] as const;
export type MemberSortKey = (typeof memberSortKeys)[number];

/** The roster's view (search, filters, sort, page), kept in the admin's address bar. */
export const memberListViewSchema = z.strictObject({
  q: z.string().trim().max(100).default(''),
  role: z.enum(['all', ...roles]).default('all'),
  status: z.enum(['all', ...memberStatuses]).default('all'),
  sort: z.enum(memberSortKeys).default('name'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: pageSchema,
  pageSize: pageSizeSchema,
});
export type MemberListView = z.infer<typeof memberListViewSchema>;
