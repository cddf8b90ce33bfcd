export * from './growout-dto';
