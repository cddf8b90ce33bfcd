import type { ApplicationDto, ApplicationListItemDto, ApplicationReceiptDto } from '@burrowline/shared';
import type { Application } from './application.model';

export function presentReceipt(application: Application, coopName: string): ApplicationReceiptDto {
  return {
    id: application.id,
    status: application.status,
    email: application.email,
    farmName: application.farmName,
    coopName,
    submittedAt: application.createdAt.toISOString(),
  };
}

export function presentListItem(application: Application, isNew: boolean): ApplicationListItemDto {
  return {
    id: application.id,
    status: application.status,
    applicantName: application.applicantName,
    email: application.email,
    farmName: application.farmName,
    location: application.location,
    herdSize: application.does + application.bucks,
    diseaseLastYear: application.diseaseLastYear,
    submittedAt: application.createdAt.toISOString(),
    reviewedAt: application.reviewedAt?.toISOString() ?? null,
    isNew,
  };
}

export function presentApplication(
  application: Application,
  opts: { isNew: boolean; names: Map<string, string>; farmName: string | null },
): ApplicationDto {
  const ref = (id: string | null, name: string | null | undefined) => (id ? { id, name: name ?? 'Former member' } : null);
  return {
    ...presentListItem(application, opts.isNew),
    phone: application.phone,
    timeZone: application.timeZone,
    breedsKept: application.breedsKept,
    does: application.does,
    bucks: application.bucks,
    quarantinePractice: application.quarantinePractice,
    diseaseDetails: application.diseaseDetails,
    sharing: application.sharing,
    sharingNotes: application.sharingNotes,
    rulesTextAgreed: application.rulesTextAgreed,
    rulesAgreedAt: application.rulesAgreedAt.toISOString(),
    reviewedBy: ref(application.reviewedByUserId, application.reviewedByUserId ? opts.names.get(application.reviewedByUserId) : null),
    decisionNote: application.decisionNote,
    member: ref(application.userId, application.userId ? opts.names.get(application.userId) : null),
    farm: ref(application.farmId, opts.farmName),
    version: application.version,
  };
}
