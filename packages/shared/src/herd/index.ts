export * from './herd-enums';
export * from './herd-dates';
export * from './age-class';
export * from './breed-standard';
export * from './first-breeding';
export type * from './herd-dto';
export * from './kit-birth';
