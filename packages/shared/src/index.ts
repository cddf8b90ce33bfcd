export * from './errors';
export * from './realtime';
export * from './dto';
export * from './units/units';
export * from './schemas/auth.schema';
export * from './schemas/farm.schema';
export * from './permissions/define-ability';
export type { RawRuleOf } from '@casl/ability';
export type { PackRule } from '@casl/ability/extra';
