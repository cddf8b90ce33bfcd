import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AcceptManyInput, ApprenticeDetailDto, ChoreEntryDto, ChoreEntryInput, ChoreResubmitInput, MentorshipSettingsDto, MentorshipSettingsInput, ReviewDecisionInput,
  ReviewItemKind, SkillMarkInput,
} from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { uploadForm } from '../../../lib/upload';
import { mentorshipKeys } from './keys';

function useMentorshipMutation<TBody, TResult>(send: (body: TBody) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: send, onSuccess: () => void queryClient.invalidateQueries({ queryKey: mentorshipKeys.all }) });
}

/** Logs the chore, then sends its photos (if any) to the entry. */
export const useLogChore = () =>
  useMentorshipMutation(async (body: ChoreEntryInput & { photos?: File[] }) => {
    const { photos, ...entry } = body;
    const created = await apiFetch<ChoreEntryDto>('/api/mentorship/chores', { method: 'POST', body: entry });
    if (photos && photos.length > 0) {
      const form = new FormData();
      for (const photo of photos) form.append('photos', photo);
      await uploadForm(`/api/mentorship/chores/${created.id}/photos`, form);
    }
    return created;
  });

export const useResubmitChore = (choreId: string) =>
  useMentorshipMutation((body: ChoreResubmitInput) => apiFetch<ChoreEntryDto>(`/api/mentorship/chores/${encodeURIComponent(choreId)}`, { method: 'PUT', body }));

export const useDecide = (kind: ReviewItemKind, id: string) =>
  useMentorshipMutation((body: ReviewDecisionInput) => apiFetch(`/api/mentorship/review/${kind}/${encodeURIComponent(id)}`, { method: 'POST', body }));

export const useAcceptMany = () =>
  useMentorshipMutation((body: AcceptManyInput) => apiFetch<{ accepted: number }>('/api/mentorship/review/accept-many', { method: 'POST', body }));

export const useMarkSkill = (apprenticeId: string, skillKey: string) =>
  useMentorshipMutation((body: SkillMarkInput) =>
    apiFetch<ApprenticeDetailDto>(`/api/mentorship/apprentices/${encodeURIComponent(apprenticeId)}/skills/${encodeURIComponent(skillKey)}`, { method: 'PUT', body }));

export const useSaveMentorshipSettings = () =>
  useMentorshipMutation((body: MentorshipSettingsInput) => apiFetch<MentorshipSettingsDto>('/api/mentorship/settings', { method: 'PUT', body }));
