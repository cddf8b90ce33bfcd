import type { Transaction } from 'sequelize';
import { dangerousSkillCaution, defaultChoreKinds, defaultSkills, type ChoreKind, type MentorshipSettingsDto, type SkillDto } from '@burrowline/shared';
import { onceInTransaction } from '../../db/transaction-memo';
import { select, type SkillRow } from './mentorship-queries';

export interface Settings {
  choreKinds: ChoreKind[];
  skills: SkillDto[];
  requireDangerousSignOff: boolean;
  version: number;
}

/** The co-op's chore kinds, checklist and roster rule; the defaults until the admin first saves them. */
export function settingsOf(tx: Transaction, coopId: string): Promise<Settings> {
  return onceInTransaction(tx, `mentorship-settings:${coopId}`, async () => {
    // One statement for both: every Mentorship page reads them.
    const [both] = await select<{ settings: { chore_kinds: ChoreKind[]; require_dangerous_sign_off: boolean; version: number } | null; skills: SkillRow[] }>(
      tx,
      `SELECT (SELECT to_jsonb(ms) FROM (SELECT chore_kinds, require_dangerous_sign_off, version FROM mentorship_settings WHERE coop_id = $1) ms) AS settings,
              coalesce((SELECT jsonb_agg(to_jsonb(s) ORDER BY s.position, s.key)
                          FROM (SELECT key, name, area, signed_off_means, dangerous, position, retired_at FROM skills WHERE coop_id = $1) s), '[]'::jsonb) AS skills`,
      [coopId],
    );
    const row = both?.settings ?? undefined;
    const skills = both?.skills ?? [];
    return {
      choreKinds: row?.chore_kinds ?? defaultChoreKinds,
      skills: skills.length > 0
        ? skills.filter((s) => !s.retired_at).map((s) => ({ key: s.key, name: s.name, area: s.area, signedOffMeans: s.signed_off_means, dangerous: s.dangerous }))
        : defaultSkills.map((s) => ({ ...s })),
      requireDangerousSignOff: row?.require_dangerous_sign_off ?? true,
      version: row?.version ?? 0,
    };
  });
}

export function presentSettings(s: Settings): MentorshipSettingsDto {
  return { choreKinds: s.choreKinds, skills: s.skills, requireDangerousSignOff: s.requireDangerousSignOff, caution: dangerousSkillCaution, version: s.version };
}

export function kindLabel(settings: Settings, kind: string): string {
  return settings.choreKinds.find((k) => k.key === kind)?.label ?? kind.replace(/-/g, ' ');
}
