import type { BadgeTone } from '../../components/ui/badge';
import type { BookingStatus, WaterSupply } from '@burrowline/shared';

export const bookingStatusLabels: Record<BookingStatus, string> = {
  booked: 'Booked',
  waitlisted: 'Waiting list',
  offered: 'Place offered',
  cancelled: 'Cancelled',
};

export const bookingStatusTone: Record<BookingStatus, BadgeTone> = { booked: 'moss', waitlisted: 'straw', offered: 'clay', cancelled: 'neutral' };

export const waterLabels: Record<WaterSupply, string> = {
  potable_mains: 'Drinking water, mains',
  potable_well: 'Drinking water, well',
  carried_in: 'Carried in',
  none: 'No water on site',
};

export const headText = (n: number) => `${n} head`;

/** "08:30" stays as the host farm's clock; the day page says whose clock it is. */
export const startTimeText = (time: string) => time;

/** Hot dress-out 0–1 as "55.2 %". */
export const dressOutText = (x: number | null) => (x === null ? '—' : `${(Math.round(x * 1000) / 10).toFixed(1)} %`);
