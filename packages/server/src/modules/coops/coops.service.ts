import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
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
