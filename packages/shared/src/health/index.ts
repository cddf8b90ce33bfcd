export * from './heat';
export type * from './health-dto';
