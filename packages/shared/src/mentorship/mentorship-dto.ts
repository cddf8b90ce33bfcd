import type { PersonRefDto } from '../dto';
import type { ReviewState } from '../herd/herd-enums';
import type { ChoreKind, ReviewItemKind, SkillState } from '../schemas/mentorship.schema';


export interface ChorePhotoDto {
  id: string;
  thumbnailUrl: string;
  url: string;
}

export interface ChoreEntryDto {
  id: string;
  farmId: string;
  apprentice: PersonRefDto;
  kind: string;
  kindLabel: string;
  doneOn: string;
  minutes: number;
  animal: { id: string; label: string } | null;
  litter: { id: string; label: string } | null;
  group: { id: string; label: string } | null;
  notes: string;
  /** The weight this chore recorded (in its weigh-in), counted once accepted. */
  weighing: { weighInId: string; totalGrams: number; headCount: number } | null;
  litterCount: { litterEventId: string; kind: 'lost' | 'culled' | 'weaned'; count: number } | null;
  /** The palpation this chore recorded on the doe's open service, counted once accepted. */
  palpation: { palpationId: string; serviceId: string; result: 'positive' | 'negative' | 'unsure' } | null;
  photos: ChorePhotoDto[];
  reviewState: ReviewState;
  reviewComment: string | null;
  reviewedBy: PersonRefDto | null;
  submittedAt: string;
  version: number;
}

export interface ChoreLogDto {
  items: ChoreEntryDto[];
  /** Minutes a week, the latest twelve weeks that have any (Monday of the week). */
  weeks: { weekOf: string; minutes: number }[];
  counts: { pending: number; returned: number; accepted: number };
}

/** One line of the mentor's queue, whatever record it is. */
export interface ReviewItemDto {
  kind: ReviewItemKind;
  id: string;
  apprentice: PersonRefDto;
  submittedAt: string;
  on: string;
  title: string;
  detail: string;
  version: number;
  /** The chore entry itself, or the one that carries the palpation. */
  chore: ChoreEntryDto | null;
}

export interface ReviewQueueDto {
  items: ReviewItemDto[];
  apprentices: PersonRefDto[];
  /** The admin sees every apprentice's queue but decides nothing. */
  canReview: boolean;
}

export interface SkillDto {
  key: string;
  name: string;
  area: string;
  signedOffMeans: string;
  dangerous: boolean;
}

export interface SkillProgressDto extends SkillDto {
  state: SkillState | 'not-started';
  on: string | null;
  comment: string;
  by: PersonRefDto | null;
  entryIds: string[];
  history: { state: SkillState; on: string; comment: string; by: PersonRefDto }[];
}

export interface ApprenticeSummaryDto {
  id: string;
  name: string;
  farm: { id: string; name: string } | null;
  mentor: PersonRefDto | null;
  waiting: number;
  returned: number;
  signedOff: number;
  skillCount: number;
  minutesLast28Days: number;
}

export interface ApprenticeDetailDto extends ApprenticeSummaryDto {
  skills: SkillProgressDto[];
  /** Hours by kind: minutes of accepted entries per kind and per week. */
  minutesByKind: { kind: string; label: string; minutes: number }[];
  weeks: { weekOf: string; minutes: number }[];
  canReview: boolean;
}

export interface MentorshipSettingsDto {
  choreKinds: ChoreKind[];
  skills: SkillDto[];
  requireDangerousSignOff: boolean;
  caution: string;
  version: number;
}

/** What the signed-in person needs to start: her role in mentorship, the kinds, her farm's today. */
export interface MentorshipHomeDto {
  role: 'apprentice' | 'mentor' | 'admin' | 'none';
  today: string | null;
  choreKinds: ChoreKind[];
  apprentices: ApprenticeSummaryDto[];
  waiting: number;
  returned: number;
}
