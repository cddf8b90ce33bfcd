import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { StudLoanDto, StudLoanListDto, StudLoanListQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { searchOf, studShareKeys } from './stud-share-keys';

export type LoanListQuery = Partial<Omit<StudLoanListQuery, 'open'>> & { open?: boolean };

export const loansQueryOptions = (query: LoanListQuery) =>
  queryOptions({
    queryKey: studShareKeys.loanList(query),
    queryFn: ({ signal }) => apiFetch<StudLoanListDto>(`/api/stud-share/loans${searchOf(query)}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const loanQueryOptions = (loanId: string) =>
  queryOptions({
    queryKey: studShareKeys.loan(loanId),
    queryFn: ({ signal }) => apiFetch<StudLoanDto>(`/api/stud-share/loans/${encodeURIComponent(loanId)}`, { signal }),
  });

export const useLoans = (query: LoanListQuery, enabled = true) => useQuery({ ...loansQueryOptions(query), enabled });
export const useLoan = (loanId: string) => useQuery(loanQueryOptions(loanId));
