export * from './adg';
export * from './gompertz';
export * from './projection';
export * from './plausibility';
export { studentTQuantile, studentTCdf } from './stats';
