import { literal, Op, type WhereOptions } from 'sequelize';
import type { Action, AppAbility, SubjectName } from '@burrowline/shared';

type Conditions = Record<string, unknown>;

/**
 * Turns the ability's rules for (action, subject) into a Sequelize `where`, so list queries return
 * exactly what `ability.can` allows row by row. Our rules use equality conditions only; anything
 * else is refused loudly rather than silently widened.
 */
export function accessibleWhere(ability: AppAbility, action: Action, subjectName: SubjectName): WhereOptions {
  const rules = ability.rulesFor(action, subjectName);
  const allowed: Conditions[] = [];
  const denied: Conditions[] = [];
  for (const rule of rules) {
    if (rule.fields) continue; // field-level rules do not decide which rows
    const conditions = (rule.conditions ?? {}) as Conditions;
    for (const value of Object.values(conditions)) {
      if (value !== null && typeof value === 'object') throw new Error(`accessibleWhere supports equality conditions only (${subjectName})`);
    }
    (rule.inverted ? denied : allowed).push(conditions);
    if (!rule.inverted && !rule.conditions) break; // unconditional permission: later rules cannot narrow further
  }
  if (allowed.length === 0) return { [Op.and]: [literal('FALSE')] }; // no permission: no rows
  const allow = allowed.some((c) => Object.keys(c).length === 0) ? {} : { [Op.or]: allowed };
  if (denied.length === 0) return allow;
  return { [Op.and]: [allow, ...denied.map((c) => ({ [Op.not]: c }))] };
}
