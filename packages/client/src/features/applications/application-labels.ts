import type { ApplicationStatus, SharingOption } from '@burrowline/shared';
import type { BadgeTone } from '../../components/ui/badge';

export const statusLabels: Record<ApplicationStatus, string> = {
  pending: 'Waiting',
  approved: 'Approved',
  rejected: 'Not admitted',
  withdrawn: 'Withdrawn',
};

export const statusTones: Record<ApplicationStatus, BadgeTone> = {
  pending: 'straw',
  approved: 'moss',
  rejected: 'clay',
  withdrawn: 'neutral',
};

export const sharingLabels: Record<SharingOption, string> = {
  bucks: 'Lending or borrowing stud bucks',
  processing_days: 'Shared processing days',
  trades: 'Trading breeding stock',
};
