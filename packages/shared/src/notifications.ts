import { z } from 'zod';
import { pageSchema, pageSizeSchema } from './schemas/application.schema';

/** How a person wants to hear of one kind of notification by e-mail (the bell always shows it). */
export const notificationDeliveries = ['immediately', 'digest', 'never'] as const;
export type NotificationDelivery = (typeof notificationDeliveries)[number];

interface KindInfo {
  /** What the person is told about, as the preferences screen lists it. */
  label: string;
  area: 'Stud Share' | 'Processing Days' | 'Co-op Chat' | 'Swap Board' | 'Mentorship';
  defaultDelivery: NotificationDelivery;
}

/**
 * Every kind of notification the product sends. Requests and answers that someone waits on default to an
 * e-mail at once; news that can wait defaults to the morning e-mail.
 */
export const notificationKinds = {
  'stud.requested': { label: 'Someone asks for one of your bucks', area: 'Stud Share', defaultDelivery: 'immediately' },
  'stud.answered': { label: 'Your request for a buck is answered', area: 'Stud Share', defaultDelivery: 'immediately' },
  'stud.dates-proposed': { label: 'Other dates are proposed for a loan', area: 'Stud Share', defaultDelivery: 'immediately' },
  'stud.cancelled': { label: 'A loan or request is cancelled', area: 'Stud Share', defaultDelivery: 'immediately' },
  'stud.handed-over': { label: 'A buck is handed over', area: 'Stud Share', defaultDelivery: 'digest' },
  'stud.returned': { label: 'A buck is returned', area: 'Stud Share', defaultDelivery: 'digest' },
  'stud.return-overdue': { label: 'A buck\'s return is overdue', area: 'Stud Share', defaultDelivery: 'immediately' },
  'day.scheduled': { label: 'A processing day is scheduled', area: 'Processing Days', defaultDelivery: 'digest' },
  'day.place-offered': { label: 'A place opens for you on a processing day', area: 'Processing Days', defaultDelivery: 'immediately' },
  'day.booking-changed': { label: 'Your booking for a processing day changes', area: 'Processing Days', defaultDelivery: 'immediately' },
  'day.reminder': { label: 'Reminders before a processing day', area: 'Processing Days', defaultDelivery: 'immediately' },
  'day.changed': { label: 'A processing day you booked changes', area: 'Processing Days', defaultDelivery: 'immediately' },
  'chat.mention': { label: 'Someone mentions you in Co-op Chat', area: 'Co-op Chat', defaultDelivery: 'digest' },
  'swap.offer': { label: 'An offer on one of your listings', area: 'Swap Board', defaultDelivery: 'immediately' },
  'swap.answered': { label: 'Your offer is answered', area: 'Swap Board', defaultDelivery: 'immediately' },
  'mentor.entry-submitted': { label: 'Your apprentice logs work for review', area: 'Mentorship', defaultDelivery: 'digest' },
  'mentor.entry-reviewed': { label: 'Your mentor reviews your work', area: 'Mentorship', defaultDelivery: 'digest' },
  'mentor.skill-signed-off': { label: 'A skill is signed off', area: 'Mentorship', defaultDelivery: 'immediately' },
} as const satisfies Record<string, KindInfo>;

export type NotificationKind = keyof typeof notificationKinds;
export const notificationKindNames = Object.keys(notificationKinds) as [NotificationKind, ...NotificationKind[]];

export const notificationListQuerySchema = z.strictObject({
  page: pageSchema,
  pageSize: pageSizeSchema,
  unread: z.enum(['true']).optional(),
});
export type NotificationListQuery = z.infer<typeof notificationListQuerySchema>;

export const notificationPreferencesSchema = z.strictObject({
  preferences: z
    .array(z.strictObject({
      kind: z.enum(notificationKindNames, { error: 'That kind of notification does not exist' }),
      delivery: z.enum(notificationDeliveries, { error: 'Choose at once, the morning e-mail, or never' }),
    }))
    .min(1, 'Choose at least one preference')
    .max(notificationKindNames.length),
});
export type NotificationPreferencesInput = z.infer<typeof notificationPreferencesSchema>;

export interface NotificationDto {
  id: string;
  kind: NotificationKind;
  title: string;
  body: string | null;
  /** A path inside the app, always starting with "/". */
  link: string;
  createdAt: string;
  readAt: string | null;
}

export interface NotificationListDto {
  items: NotificationDto[];
  total: number;
  page: number;
  pageSize: number;
  unread: number;
}

export interface NotificationPreferenceDto {
  kind: NotificationKind;
  label: string;
  area: string;
  delivery: NotificationDelivery;
  defaultDelivery: NotificationDelivery;
}

export interface NotificationPreferencesDto {
  preferences: NotificationPreferenceDto[];
  /** The morning e-mail carries the "digest" ones; when it is off they wait in the bell only. */
  morningEmailOn: boolean;
}
