export * from './feed-conversion';
export * from './allocation';
export * from './feed-cost';
export * from './dress-out';
export * from './usda-class';
export * from './performance';
export * from './suggestions';
export * from './comparison';
