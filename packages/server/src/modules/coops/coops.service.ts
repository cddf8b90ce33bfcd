import { randomUUID } from 'node:crypto';
import { ForbiddenError } from '@casl/ability';
import { QueryTypes, type Transaction } from 'sequelize';
import { defineAbilityFor, subjectOf, type CoopRulesUpdateInput, type CoopSettingsDto } from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordAudit, recordChanges } from '../audit/audit.service';
import { Cooperative } from './coop.model';

export interface NewCooperative {
  name: string;
  slug: string;
  currency?: string;
  quarantineDays?: number;
  rulesText?: string;
}

/**
 * Creates a co-op (a new tenant) and runs `setup` inside the same transaction, with the new co-op
 * as the tenant, so a co-op never exists half made.
 */
export async function createCooperative<T>(input: NewCooperative, setup: (coop: Cooperative, tx: Transaction) => Promise<T>): Promise<T> {
  const id = randomUUID();
  return withTenant({ coopId: id }, async (tx) => {
    const coop = await Cooperative.create({ id, ...input }, { transaction: tx });
    return setup(coop, tx);
  });
}

/** The public directory entry for the application form (`/apply/:coopSlug`), outside row-level security. */
export async function findPublicCoop(slug: string): Promise<{ id: string; name: string; slug: string; rulesText: string } | null> {
  const [row] = await database().query<{ id: string; name: string; slug: string; rules_text: string }>(
    'SELECT * FROM public_coop_by_slug($1)',
    { bind: [slug], type: QueryTypes.SELECT },
  );
  return row ? { id: row.id, name: row.name, slug: row.slug, rulesText: row.rules_text } : null;
}

/** The actor's own co-op, read inside their tenant transaction. */
export async function getCoop(coopId: string, tx: Transaction): Promise<Cooperative | null> {
  return Cooperative.findByPk(coopId, { transaction: tx });
}

function presentCoopSettings(coop: Cooperative): CoopSettingsDto {
  return {
    id: coop.id,
    name: coop.name,
    slug: coop.slug,
    currency: coop.currency,
    quarantineDays: coop.quarantineDays,
    rulesText: coop.rulesText,
    version: coop.version,
    updatedAt: coop.updatedAt.toISOString(),
  };
}

/** The actor's co-op with its rules, for every member (the rules are everyone's to read). */
export async function getCoopSettings(actor: SessionUser): Promise<CoopSettingsDto> {
  return withTenant(actor, async (tx) => {
    const coop = await getCoop(actor.coopId, tx);
    if (!coop || !defineAbilityFor(actor).can('read', subjectOf('Coop', { id: coop.id }))) throw AppError.notFound('Your co-op');
    return presentCoopSettings(coop);
  });
}

/**
 * The admin edits the co-op's rules (what every applicant agrees to). Made from a known version, so
 * two admins editing at once cannot overwrite each other; kept in the record's history and the audit log.
 */
export async function updateCoopRules(actor: SessionUser, input: CoopRulesUpdateInput, ctx: { ip: string | null }): Promise<CoopSettingsDto> {
  return withTenant(actor, async (tx) => {
    const coop = await Cooperative.findByPk(actor.coopId, { transaction: tx, lock: tx.LOCK.UPDATE });
    if (!coop) throw AppError.notFound('Your co-op');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('update', subjectOf('Coop', { id: coop.id }));
    if (coop.version !== input.version) throw AppError.staleVersion();
    if (coop.rulesText !== input.rulesText) {
      const before = coop.rulesText;
      coop.rulesText = input.rulesText;
      await coop.save({ transaction: tx });
      await recordChanges({ coopId: coop.id, tableName: 'cooperatives', recordId: coop.id, actorUserId: actor.id, changes: { rulesText: [before, input.rulesText] } }, tx);
      await recordAudit(
        { coopId: coop.id, actorUserId: actor.id, action: 'coop.rules_updated', subjectType: 'Coop', subjectId: coop.id, details: { characters: input.rulesText.length }, ip: ctx.ip },
        tx,
      );
    }
    return presentCoopSettings(coop);
  });
}
