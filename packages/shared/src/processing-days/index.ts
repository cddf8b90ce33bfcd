export * from './processing-days-dto';
export * from './cautions';
