import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StudLoanDto, StudRequestInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { studShareKeys } from './stud-share-keys';

/** Asks the buck's farm for a loan or a visit; the client-chosen id makes a retry harmless. */
export function useRequestStud() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: StudRequestInput) => apiFetch<StudLoanDto>('/api/stud-share/loans', { method: 'POST', body }),
    onSuccess: (loan) => {
      queryClient.setQueryData(studShareKeys.loan(loan.id), loan);
      void queryClient.invalidateQueries({ queryKey: studShareKeys.loans() });
    },
  });
}
