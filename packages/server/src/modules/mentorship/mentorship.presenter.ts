import type { ChoreEntryDto, ChorePhotoDto } from '@burrowline/shared';
import type { ChoreRow } from './mentorship-queries';
import { kindLabel, type Settings } from './mentorship-settings';

export function presentChore(row: ChoreRow, settings: Settings, photos: Map<string, string[]>): ChoreEntryDto {
  const photoDtos: ChorePhotoDto[] = (photos.get(row.id) ?? []).map((id) => ({ id, url: `/api/photos/${id}`, thumbnailUrl: `/api/photos/${id}/thumbnail` }));
  return {
    id: row.id,
    farmId: row.farm_id,
    apprentice: { id: row.apprentice_id, name: row.apprentice_name },
    kind: row.kind,
    kindLabel: kindLabel(settings, row.kind),
    doneOn: row.done_on,
    minutes: row.minutes,
    animal: row.animal_id ? { id: row.animal_id, label: row.animal_label || 'Animal' } : null,
    litter: row.litter_id ? { id: row.litter_id, label: row.litter_label || 'Litter' } : null,
    group: row.group_id ? { id: row.group_id, label: row.group_label || 'Group' } : null,
    notes: row.notes,
    weighing: row.weigh_in_id && row.weigh_in_grams !== null ? { weighInId: row.weigh_in_id, totalGrams: row.weigh_in_grams, headCount: row.weigh_in_heads ?? 1 } : null,
    litterCount: row.litter_event_id && row.litter_event_kind ? { litterEventId: row.litter_event_id, kind: row.litter_event_kind, count: row.litter_event_count ?? 0 } : null,
    palpation: row.palpation_id && row.palpation_result && row.palpation_service_id
      ? { palpationId: row.palpation_id, serviceId: row.palpation_service_id, result: row.palpation_result }
      : null,
    photos: photoDtos,
    reviewState: row.review_state,
    reviewComment: row.review_comment,
    reviewedBy: row.reviewed_by ? { id: row.reviewed_by, name: row.reviewer_name ?? 'The mentor' } : null,
    submittedAt: new Date(row.submitted_at).toISOString(),
    version: row.version,
  };
}

/** Monday of the week of an ISO date. */
export function mondayOf(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  const back = (d.getUTCDay() + 6) % 7;
  d.setUTCDate(d.getUTCDate() - back);
  return d.toISOString().slice(0, 10);
}

/** Minutes per week, summed from (week, minutes) rows, latest twelve weeks that have any, oldest first. */
export function weeksOf(rows: { week_of: string; minutes: number }[]): { weekOf: string; minutes: number }[] {
  const byWeek = new Map<string, number>();
  for (const r of rows) byWeek.set(r.week_of, (byWeek.get(r.week_of) ?? 0) + r.minutes);
  return [...byWeek.entries()].sort(([a], [b]) => a.localeCompare(b)).slice(-12).map(([weekOf, minutes]) => ({ weekOf, minutes }));
}
