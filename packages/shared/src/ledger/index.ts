export * from './settle-up';
export * from './ledger-dto';
