export type * from './almanac-dto';
