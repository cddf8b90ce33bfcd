import { createContext, use } from 'react';
import { createMongoAbility } from '@casl/ability';
import { unpackRules } from '@casl/ability/extra';
import type { AppAbility, MeDto } from '@burrowline/shared';

/** The same rules the server enforces, rebuilt from /api/me; used only to shape what the UI offers. */
export function buildAbility(rules: MeDto['rules']): AppAbility {
  return createMongoAbility<AppAbility>(unpackRules(rules));
}

export const AbilityContext = createContext<AppAbility>(buildAbility([]));

export function useAbility(): AppAbility {
  return use(AbilityContext);
}
