import type { RawRuleOf } from '@casl/ability';
import type { PackRule } from '@casl/ability/extra';
import type { AppAbility, Role } from './permissions/define-ability';
import type { TemperatureUnit, WeightUnit } from './units/units';

/** What the API sends; never a model's raw JSON. */
export interface FarmDto {
  id: string;
  name: string;
  location: string;
  timeZone: string;
  weightUnit: WeightUnit;
  temperatureUnit: TemperatureUnit;
  breedsKept: string[];
  description: string;
  version: number;
  members: { id: string; name: string; role: Role }[];
  updatedAt: string;
}

export interface CoopDto {
  id: string;
  name: string;
  slug: string;
  currency: string;
  quarantineDays: number;
}

export interface MeDto {
  user: { id: string; email: string; name: string; role: Role; farmId: string | null; mentorId: string | null };
  coop: CoopDto;
  /** CASL rules, packed; the client rebuilds the same ability to shape menus and buttons. */
  rules: PackRule<RawRuleOf<AppAbility>>[];
}
