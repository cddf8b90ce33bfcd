import { defineAbilityFor, ErrorCode, type AnimalDetailDto, type AnimalListDto, type AnimalListQuery } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { presentContextFor } from './animal-context';
import { query, selectAnimalById, selectAnimalPage } from './animal-queries';
import { herdPageSql } from './herd-page';
import { subjectOfRow } from './animal-access';
import { detailOf } from './animal-detail';
import { presentAnimal } from './animals.presenter';

/* The herd as its own screens read it: the farm's list and one animal's full record. */

/** The actor's own herd (the animals their farm owns or keeps), filtered, sorted and paged in SQL. */
export async function listHerd(actor: SessionUser, q: AnimalListQuery): Promise<AnimalListDto> {
  return withTenant(actor, async (tx) => {
    const farmId = actor.farmId;
    if (!farmId) return { items: [], total: 0, page: q.page, pageSize: q.pageSize };
    const ability = defineAbilityFor(actor);
    const ctx = await presentContextFor(actor, tx);
    const { pageSql, pageBind, countSql, countBind } = herdPageSql(q, actor.coopId, farmId, ctx.today);
    const rows = await selectAnimalPage(tx, pageSql, pageBind, farmId);
    const offset = (q.page - 1) * q.pageSize;
    // A short page that is not past the end tells the total without counting.
    const total = rows.length < q.pageSize && (rows.length > 0 || offset === 0)
      ? offset + rows.length
      : (await query<{ total: number }>(tx, countSql, countBind))[0]!.total;
    // The SQL scope and the ability must agree row by row (architecture, "Permissions").
    const items = rows.filter((row) => ability.can('read', subjectOfRow(row))).map((row) => presentAnimal(row, ctx));
    return { items, total, page: q.page, pageSize: q.pageSize };
  });
}

/**
 * One animal's full record with its histories, for its own farm (and that farm's apprentices).
 * Another farm's animal answers 403: its pedigree card is open at /api/pedigree-cards/:id instead.
 */
export async function getAnimal(actor: SessionUser, animalId: string): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const row = await selectAnimalById(tx, actor.coopId, animalId);
    if (!row || row.is_outside) throw AppError.notFound('That animal');
    if (!defineAbilityFor(actor).can('read', subjectOfRow(row))) {
      throw new AppError(ErrorCode.forbidden, 403, "Only the animal's own farm sees its full record; its pedigree card is open to the co-op");
    }
    return detailOf(tx, actor, await presentContextFor(actor, tx), animalId);
  });
}

