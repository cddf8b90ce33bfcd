/**
 * The time zone a new farm starts with when its profile names none. Every clock reads the farm record;
 * only a farm the directory lacks (someone of no farm, a removed farm) falls back to this.
 */
export const DEFAULT_FARM_TIME_ZONE = 'America/Chicago';
