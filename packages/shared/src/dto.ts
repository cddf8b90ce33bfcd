import type { RawRuleOf } from '@casl/ability';
import type { PackRule } from '@casl/ability/extra';
import type { AppAbility, Role } from './permissions/define-ability';
import type { ApplicationStatus, SharingOption } from './schemas/application.schema';
import type { MemberStatus } from './schemas/member.schema';
import type { TemperatureUnit, WeightUnit } from './units/units';

/** What the API sends; never a model's raw JSON. */
export interface FarmDto {
  id: string;
  name: string;
  location: string;
  timeZone: string;
  weightUnit: WeightUnit;
  temperatureUnit: TemperatureUnit;
  breedsKept: string[];
  description: string;
  /** Optional coordinates (WGS84 degrees) for distances between farms; both or neither. */
  latitude: number | null;
  longitude: number | null;
  /** Lets the co-op count the farm's litters in a sire's get's record (Stud Share). */
  sharesGetRecords: boolean;
  version: number;
  members: { id: string; name: string; role: Role }[];
  updatedAt: string;
}

export interface CoopDto {
  id: string;
  name: string;
  slug: string;
  currency: string;
  quarantineDays: number;
}

export interface MeDto {
  user: { id: string; email: string; name: string; role: Role; farmId: string | null; mentorId: string | null };
  coop: CoopDto;
  /** CASL rules, packed; the client rebuilds the same ability to shape menus and buttons. */
  rules: PackRule<RawRuleOf<AppAbility>>[];
}

/** The public face of a co-op on its application form. */
export interface PublicCoopDto {
  name: string;
  slug: string;
  rulesText: string;
}

/** What the co-op's own members and the admin's rules editor see of the co-op. */
export interface CoopSettingsDto extends CoopDto {
  rulesText: string;
  version: number;
  updatedAt: string;
}

/** What an applicant gets back (the same again for a repeated submit with the same idempotency key). */
export interface ApplicationReceiptDto {
  id: string;
  status: ApplicationStatus;
  email: string;
  farmName: string;
  coopName: string;
  submittedAt: string;
}

export interface PersonRefDto {
  id: string;
  name: string;
}

/** One row of the admin's queue. */
export interface ApplicationListItemDto {
  id: string;
  status: ApplicationStatus;
  applicantName: string;
  email: string;
  farmName: string;
  location: string;
  herdSize: number;
  diseaseLastYear: boolean;
  submittedAt: string;
  reviewedAt: string | null;
  /** Not yet opened by the admin asking. */
  isNew: boolean;
}

export interface ApplicationListDto {
  items: ApplicationListItemDto[];
  total: number;
  page: number;
  pageSize: number;
  /** Per status, for the filter's labels ("Pending (3)"); search does not narrow these. */
  counts: Record<ApplicationStatus, number>;
}

/** Everything the applicant wrote, and the decision once made. */
export interface ApplicationDto extends ApplicationListItemDto {
  phone: string;
  timeZone: string;
  breedsKept: string[];
  does: number;
  bucks: number;
  quarantinePractice: string;
  diseaseDetails: string;
  sharing: SharingOption[];
  sharingNotes: string;
  rulesTextAgreed: string;
  rulesAgreedAt: string;
  reviewedBy: PersonRefDto | null;
  /** The rejection reason or the withdrawal note. */
  decisionNote: string | null;
  member: PersonRefDto | null;
  farm: PersonRefDto | null;
  version: number;
}

/** One page of the co-op's roster. */
export interface MemberListDto {
  items: MemberDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface MemberDto {
  id: string;
  name: string;
  email: string;
  role: Role;
  status: MemberStatus;
  farm: PersonRefDto | null;
  mentor: PersonRefDto | null;
  disabledAt: string | null;
  disabledReason: string | null;
  /** A pending invitation: the farm they will get when they set their password. */
  invitation: { id: string; invitedAt: string; invitedBy: PersonRefDto | null; farmName: string } | null;
  joinedAt: string;
  lastSignInAt: string | null;
  version: number;
}

export interface AuditEventDto {
  id: string;
  action: string;
  actor: PersonRefDto | null;
  subjectType: string | null;
  subjectId: string | null;
  details: Record<string, unknown>;
  ip: string | null;
  createdAt: string;
}

export interface AuditEventListDto {
  items: AuditEventDto[];
  total: number;
  page: number;
  pageSize: number;
}
