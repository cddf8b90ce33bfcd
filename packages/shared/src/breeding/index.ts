export * from './cycle-settings';
export * from './plan';
export * from './litter-count';
export * from './validate';
export * from './doe-cycle';
export * from './breeding-record';
