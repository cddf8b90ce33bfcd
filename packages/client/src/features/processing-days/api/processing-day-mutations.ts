import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  BookingCancelInput, BookingChangeInput, BookingCreateInput, BookingDto, CheckInInput, DayCloseInput, DayYieldCreateInput,
  ProcessingDayCreateInput, ProcessingDayDto, ProcessingDaySummaryDto, ProcessingDayUpdateInput, ProcessingRecordDto,
  ProcessingSiteCreateInput, ProcessingSiteDto, ProcessingSiteUpdateInput,
} from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { ledgerKeys } from '../../ledger';
import { processingKeys } from '../../processing';
import { processingDayKeys } from './keys';

const base = '/api/processing-days';

/** Every change refreshes the days (capacity, roster) and the Ledger (a booking's fee is a pending transfer). */
function useDayMutation<TBody, TResult>(send: (body: TBody) => Promise<TResult>, alsoRecords = false) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: processingDayKeys.all }),
        queryClient.invalidateQueries({ queryKey: ledgerKeys.all }),
        ...(alsoRecords ? [queryClient.invalidateQueries({ queryKey: processingKeys.all })] : []),
      ]);
    },
  });
}

export const useCreateSite = () => useDayMutation((body: ProcessingSiteCreateInput) => apiFetch<ProcessingSiteDto>(`${base}/sites`, { method: 'POST', body }));
export const useUpdateSite = () =>
  useDayMutation(({ siteId, ...body }: ProcessingSiteUpdateInput & { siteId: string }) => apiFetch<ProcessingSiteDto>(`${base}/sites/${siteId}`, { method: 'PATCH', body }));

export const useScheduleDay = () => useDayMutation((body: ProcessingDayCreateInput) => apiFetch<ProcessingDayDto>(base, { method: 'POST', body }));
export const useUpdateDay = (dayId: string) => useDayMutation((body: ProcessingDayUpdateInput) => apiFetch<ProcessingDayDto>(`${base}/${dayId}`, { method: 'PATCH', body }));

export const useBook = (dayId: string) => useDayMutation((body: BookingCreateInput) => apiFetch<BookingDto>(`${base}/${dayId}/bookings`, { method: 'POST', body }));
export const useChangeBooking = (dayId: string) =>
  useDayMutation(({ bookingId, ...body }: BookingChangeInput & { bookingId: string }) => apiFetch<BookingDto>(`${base}/${dayId}/bookings/${bookingId}`, { method: 'PATCH', body }));
export const useCancelBooking = (dayId: string) =>
  useDayMutation(({ bookingId, ...body }: BookingCancelInput & { bookingId: string }) => apiFetch<BookingDto>(`${base}/${dayId}/bookings/${bookingId}/cancel`, { method: 'POST', body }));
export const useConfirmBooking = (dayId: string) =>
  useDayMutation(({ bookingId, version }: { bookingId: string; version: number }) =>
    apiFetch<BookingDto>(`${base}/${dayId}/bookings/${bookingId}/confirm`, { method: 'POST', body: { version } }));
export const useCheckIn = (dayId: string) =>
  useDayMutation(({ bookingId, ...body }: CheckInInput & { bookingId: string }) => apiFetch<BookingDto>(`${base}/${dayId}/bookings/${bookingId}/check-in`, { method: 'POST', body }));

/** A place at a station for oneself; the admin or the host may name someone else. */
export const useRosterSignUp = (dayId: string) =>
  useDayMutation(({ stationId, userId }: { stationId: string; userId?: string }) =>
    apiFetch<ProcessingDayDto>(`${base}/${dayId}/stations/${stationId}/sign-up`, { method: 'POST', body: userId ? { userId } : {} }));
export const useRosterLeave = (dayId: string) =>
  useDayMutation(({ stationId, userId }: { stationId: string; userId?: string }) =>
    apiFetch<ProcessingDayDto>(`${base}/${dayId}/stations/${stationId}/leave`, { method: 'POST', body: userId ? { userId } : {} }));
export const useClaimEquipment = (dayId: string) =>
  useDayMutation(({ itemId, farmId }: { itemId: string; farmId: string }) => apiFetch<ProcessingDayDto>(`${base}/${dayId}/equipment/${itemId}/claim`, { method: 'POST', body: { farmId } }));
export const useReleaseEquipment = (dayId: string) =>
  useDayMutation((itemId: string) => apiFetch<ProcessingDayDto>(`${base}/${dayId}/equipment/${itemId}/release`, { method: 'POST', body: {} }));

export const useRecordYield = (dayId: string) =>
  useDayMutation((body: DayYieldCreateInput) => apiFetch<ProcessingRecordDto>(`${base}/${dayId}/yields`, { method: 'POST', body }), true);
export const useCloseDay = (dayId: string) => useDayMutation((body: DayCloseInput) => apiFetch<ProcessingDaySummaryDto>(`${base}/${dayId}/close`, { method: 'POST', body }), true);
