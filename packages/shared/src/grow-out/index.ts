export * from './grow-out-dto';
