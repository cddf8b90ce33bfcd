export type * from './almanac-dto';
export type * from './doe-board-dto';
