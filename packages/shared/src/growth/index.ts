export * from './adg';
export * from './gompertz';
export * from './projection';
export * from './plausibility';
export * from './weigh-in-schedule';
export { studentTQuantile, studentTCdf } from './stats';
export * from './weighing-checks';
