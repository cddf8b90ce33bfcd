import { queryOptions, useQuery } from '@tanstack/react-query';
import type {
  ApprenticeDetailDto, ApprenticeSummaryDto, ChoreEntryDto, ChoreLogDto, MentorshipHomeDto, MentorshipSettingsDto, ReviewQueueDto,
} from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { mentorshipKeys } from './keys';

export type ChoreChoices = { animals: { id: string; label: string }[]; litters: { id: string; label: string }[]; groups: { id: string; label: string }[] };
export type ApprenticePage = ApprenticeDetailDto & { entries: ChoreEntryDto[] };

export const homeQueryOptions = () =>
  queryOptions({ queryKey: mentorshipKeys.home(), queryFn: ({ signal }) => apiFetch<MentorshipHomeDto>('/api/mentorship', { signal }) });
export const choicesQueryOptions = () =>
  queryOptions({ queryKey: mentorshipKeys.choices(), queryFn: ({ signal }) => apiFetch<ChoreChoices>('/api/mentorship/choices', { signal }) });
export const logQueryOptions = (state: string) =>
  queryOptions({ queryKey: mentorshipKeys.log(state), queryFn: ({ signal }) => apiFetch<ChoreLogDto>(`/api/mentorship/chores?state=${encodeURIComponent(state)}`, { signal }) });
export const queueQueryOptions = (apprenticeId: string, kind: string) =>
  queryOptions({
    queryKey: mentorshipKeys.queue(apprenticeId, kind),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams();
      if (apprenticeId) params.set('apprenticeId', apprenticeId);
      if (kind) params.set('kind', kind);
      return apiFetch<ReviewQueueDto>(`/api/mentorship/review${params.size ? `?${params}` : ''}`, { signal });
    },
  });
export const apprenticesQueryOptions = () =>
  queryOptions({ queryKey: mentorshipKeys.apprentices(), queryFn: ({ signal }) => apiFetch<{ items: ApprenticeSummaryDto[] }>('/api/mentorship/apprentices', { signal }) });
export const apprenticeQueryOptions = (id: string) =>
  queryOptions({ queryKey: mentorshipKeys.apprentice(id), queryFn: ({ signal }) => apiFetch<ApprenticePage>(`/api/mentorship/apprentices/${encodeURIComponent(id)}`, { signal }) });
export const settingsQueryOptions = () =>
  queryOptions({ queryKey: mentorshipKeys.settings(), queryFn: ({ signal }) => apiFetch<MentorshipSettingsDto>('/api/mentorship/settings', { signal }) });

export const useMentorshipHome = () => useQuery(homeQueryOptions());
export const useChoreChoices = () => useQuery(choicesQueryOptions());
export const useChoreLog = (state: string) => useQuery(logQueryOptions(state));
export const useReviewQueue = (apprenticeId: string, kind: string) => useQuery(queueQueryOptions(apprenticeId, kind));
export const useApprentices = () => useQuery(apprenticesQueryOptions());
export const useApprentice = (id: string) => useQuery(apprenticeQueryOptions(id));
export const useMentorshipSettings = () => useQuery(settingsQueryOptions());
