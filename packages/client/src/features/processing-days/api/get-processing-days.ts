import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BookingCandidatesDto, BookingListDto, ProcessingDayDto, ProcessingDayListDto, ProcessingDaySummaryDto, ProcessingSiteDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { processingDayKeys } from './keys';

const base = '/api/processing-days';

export const daysQueryOptions = (when: 'upcoming' | 'past') =>
  queryOptions({
    queryKey: processingDayKeys.list(when),
    queryFn: ({ signal }) => apiFetch<ProcessingDayListDto>(`${base}?when=${when}&pageSize=${when === 'upcoming' ? 50 : 12}`, { signal }),
  });

export const dayQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: processingDayKeys.detail(dayId), queryFn: ({ signal }) => apiFetch<ProcessingDayDto>(`${base}/${dayId}`, { signal }) });

export const bookingsQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: processingDayKeys.bookings(dayId), queryFn: ({ signal }) => apiFetch<BookingListDto>(`${base}/${dayId}/bookings`, { signal }) });

export const candidatesQueryOptions = (dayId: string, farmId: string) =>
  queryOptions({
    queryKey: processingDayKeys.candidates(dayId, farmId),
    queryFn: ({ signal }) => apiFetch<BookingCandidatesDto>(`${base}/${dayId}/candidates?farmId=${encodeURIComponent(farmId)}`, { signal }),
  });

export const summaryQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: processingDayKeys.summary(dayId), queryFn: ({ signal }) => apiFetch<ProcessingDaySummaryDto>(`${base}/${dayId}/summary`, { signal }) });

export const sitesQueryOptions = () => queryOptions({ queryKey: processingDayKeys.sites(), queryFn: ({ signal }) => apiFetch<ProcessingSiteDto[]>(`${base}/sites`, { signal }) });

/** The printable day sheet: bookings, roster, equipment, cautions; the yields on a second page after the day. */
export const daySheetUrl = (dayId: string) => `${base}/${dayId}/sheet.pdf`;

export const useDays = (when: 'upcoming' | 'past') => useQuery(daysQueryOptions(when));
export const useDay = (dayId: string) => useQuery(dayQueryOptions(dayId));
export const useBookings = (dayId: string) => useQuery(bookingsQueryOptions(dayId));
export const useCandidates = (dayId: string, farmId: string | null, enabled = true) =>
  useQuery({ ...candidatesQueryOptions(dayId, farmId ?? ''), enabled: enabled && Boolean(farmId) });
export const useDaySummary = (dayId: string) => useQuery(summaryQueryOptions(dayId));
export const useSites = () => useQuery(sitesQueryOptions());
