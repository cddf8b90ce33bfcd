import type { NotificationDto, NotificationKind } from '@burrowline/shared';

export interface NotificationRow {
  id: string;
  kind: string;
  title: string;
  body: string | null;
  link: string;
  created_at: Date;
  read_at: Date | null;
}

export function presentNotification(row: NotificationRow): NotificationDto {
  return {
    id: row.id,
    kind: row.kind as NotificationKind,
    title: row.title,
    body: row.body,
    link: row.link,
    createdAt: row.created_at.toISOString(),
    readAt: row.read_at ? row.read_at.toISOString() : null,
  };
}
