export * from './mentorship-defaults';
export * from './mentorship-dto';
