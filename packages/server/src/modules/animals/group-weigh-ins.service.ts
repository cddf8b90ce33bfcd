import { Op, type Transaction } from 'sequelize';
import type { ReviewState } from '@burrowline/shared';
import { WeighIn } from './weigh-in.model';

/** A grow-out group's weigh-in as grow-out reads it (weigh-ins of groups live beside animals' in weigh_ins). */
export interface GroupWeighInRow {
  id: string;
  farmId: string;
  groupId: string;
  weighedOn: string;
  totalGrams: number;
  headCount: number;
  kitWeights: { label: string | null; grams: number }[] | null;
  note: string;
  enteredBy: string;
  reviewState: ReviewState;
  version: number;
}

const rowOf = (w: WeighIn): GroupWeighInRow => ({
  id: w.id, farmId: w.farmId, groupId: w.groupId!, weighedOn: w.weighedOn, totalGrams: w.totalGrams, headCount: w.headCount,
  kitWeights: w.kitWeights ?? null, note: w.note, enteredBy: w.enteredBy, reviewState: w.reviewState, version: w.version,
});

/** The weigh-ins of grow-out groups, oldest first; returned ones left out, pending ones kept unless `acceptedOnly`. */
export async function groupWeighInsOf(tx: Transaction, coopId: string, groupIds: string[], opts: { acceptedOnly?: boolean } = {}): Promise<GroupWeighInRow[]> {
  if (groupIds.length === 0) return [];
  const rows = await WeighIn.findAll({
    where: {
      coopId, groupId: { [Op.in]: [...new Set(groupIds)] },
      reviewState: opts.acceptedOnly ? 'accepted' : { [Op.ne]: 'returned' },
    },
    order: [['weighedOn', 'ASC'], ['createdAt', 'ASC']],
    transaction: tx,
    // Plain rows: a farm's years of group weigh-ins, read-only here.
    raw: true,
  });
  return rows.map(rowOf);
}

/** Accepted weigh-ins of grow-out groups, oldest first, with only their weights (years of a farm's groups, read-only). */
export async function acceptedGroupWeightsOf(
  tx: Transaction, coopId: string, groupIds: string[],
): Promise<{ groupId: string; weighedOn: string; totalGrams: number; headCount: number }[]> {
  if (groupIds.length === 0) return [];
  const rows = await WeighIn.findAll({
    where: { coopId, groupId: { [Op.in]: [...new Set(groupIds)] }, reviewState: 'accepted' },
    attributes: ['groupId', 'weighedOn', 'totalGrams', 'headCount'],
    order: [['weighedOn', 'ASC'], ['createdAt', 'ASC']],
    transaction: tx,
    raw: true,
  });
  return rows.map((w) => ({ groupId: w.groupId!, weighedOn: w.weighedOn, totalGrams: w.totalGrams, headCount: w.headCount }));
}

/** Writes a group weigh-in checked by grow-out; an apprentice's waits for review. */
export async function insertGroupWeighIn(
  tx: Transaction,
  row: { id?: string; coopId: string; farmId: string; groupId: string; weighedOn: string; totalGrams: number; headCount: number;
    kitWeights: { label: string | null; grams: number }[] | null; note: string; enteredBy: string; reviewState: ReviewState },
): Promise<GroupWeighInRow> {
  const created = await WeighIn.create(
    {
      ...(row.id ? { id: row.id } : {}),
      coopId: row.coopId, farmId: row.farmId, animalId: null, groupId: row.groupId, groupLabel: null,
      totalGrams: row.totalGrams, headCount: row.headCount, kitWeights: row.kitWeights, weighedOn: row.weighedOn,
      note: row.note, enteredBy: row.enteredBy, reviewState: row.reviewState,
    },
    { transaction: tx },
  );
  return rowOf(created);
}

/** A weigh-in by id whatever it weighs (for idempotent retries). */
export async function weighInOwnerOf(tx: Transaction, id: string): Promise<{ farmId: string; enteredBy: string; groupId: string | null } | null> {
  const w = await WeighIn.findOne({ where: { id }, paranoid: false, transaction: tx });
  return w ? { farmId: w.farmId, enteredBy: w.enteredBy, groupId: w.groupId ?? null } : null;
}
