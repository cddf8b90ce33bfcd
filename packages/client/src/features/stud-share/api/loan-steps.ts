import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StudCustodyStepInput, StudLoanDto, StudProposeInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { uploadAnimalPhotos } from '../../photos';
import { studShareKeys } from './stud-share-keys';

/** One step of a loan: the answer is the loan as it now stands, put straight into the cache. */
function useLoanStep<TBody>(loanId: string, path: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: TBody) => apiFetch<StudLoanDto>(`/api/stud-share/loans/${encodeURIComponent(loanId)}/${path}`, { method: 'POST', body }),
    onSuccess: (loan) => {
      queryClient.setQueryData(studShareKeys.loan(loan.id), loan);
      void queryClient.invalidateQueries({ queryKey: studShareKeys.all });
    },
  });
}

type Versioned = { version: number; reason?: string };

export const useAcceptRequest = (loanId: string) => useLoanStep<Versioned>(loanId, 'accept');
export const useDeclineRequest = (loanId: string) => useLoanStep<{ version: number; reason: string }>(loanId, 'decline');
export const useProposeDates = (loanId: string) => useLoanStep<StudProposeInput>(loanId, 'propose');
export const useAnswerProposal = (loanId: string) => useLoanStep<{ version: number; accept: boolean; reason?: string }>(loanId, 'proposal-answer');
export const useCancelRequest = (loanId: string) => useLoanStep<Versioned>(loanId, 'cancel');
export const useConfirmHandOver = (loanId: string) => useLoanStep<Versioned>(loanId, 'hand-over/confirm');
export const useConfirmReturn = (loanId: string) => useLoanStep<Versioned>(loanId, 'return/confirm');
export const useRecordServiceVisit = (loanId: string) => useLoanStep<Versioned>(loanId, 'service');

/**
 * A hand-over or a return with an optional photo of him: the photo goes through the animal's photo
 * pipeline first, and its id travels with the step.
 */
export function useRecordCustodyStep(loanId: string, step: 'hand-over' | 'return', buckId: string, photo: () => File | null) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: StudCustodyStepInput) => {
      const file = photo();
      const photoId = file ? ((await uploadAnimalPhotos(buckId, { files: [file], caption: step === 'hand-over' ? 'At the hand-over' : 'At his return' })).photos[0]?.id ?? null) : body.photoId;
      return apiFetch<StudLoanDto>(`/api/stud-share/loans/${encodeURIComponent(loanId)}/${step}`, { method: 'POST', body: { ...body, photoId } });
    },
    onSuccess: (loan) => {
      queryClient.setQueryData(studShareKeys.loan(loan.id), loan);
      void queryClient.invalidateQueries({ queryKey: studShareKeys.all });
    },
  });
}
