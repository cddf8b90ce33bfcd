import type { Transaction } from 'sequelize';
import { defineAbilityFor, ErrorCode, type DoeCycleState, type AnimalDetailDto, type AnimalDto, type AnimalListDto, type AnimalListQuery } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { port } from '../../lib/port';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { presentContextFor } from './animal-context';
import { query, selectAnimalById, selectAnimalPage, selectHerdListPage, type HerdListRow } from './animal-queries';
import { herdPageSql } from './herd-page';
import { subjectOfRow } from './animal-access';
import { detailOf } from './animal-detail';
import { presentAnimal, presentListItem, type PresentContext } from './animals.presenter';

/* The herd as its own screens read it: the farm's list and one animal's full record. */

/** Where does stand in their cycle, which the Almanac reads (services, litters, the farm's settings): plugged in by the composition root. */
export const doeCycleFactsColumn = port<(farmParam: string) => string>('doe cycle facts column of the herd list');
export const doeCycleOfFacts = port<(facts: unknown, today: string) => DoeCycleState>('doe cycle of the herd list');

/**
 * The actor's own herd (the animals their farm owns or keeps), filtered, sorted and paged in SQL; `present`
 * turns each readable row of the page into what the caller answers.
 */
async function herdPage<Row extends HerdListRow, Item>(
  actor: SessionUser,
  q: AnimalListQuery,
  select: (tx: Transaction, pageSql: string, bind: unknown[], weightsSeenBy: string) => Promise<Row[]>,
  present: (row: Row, ctx: PresentContext) => Item,
): Promise<{ items: Item[]; total: number; page: number; pageSize: number }> {
  return withTenant(actor, async (tx) => {
    const farmId = actor.farmId;
    if (!farmId) return { items: [], total: 0, page: q.page, pageSize: q.pageSize };
    const ctx = await presentContextFor(actor, tx);
    const { pageSql, pageBind, countSql, countBind } = herdPageSql(q, actor.coopId, farmId, ctx.today);
    const rows = await select(tx, pageSql, pageBind, farmId);
    // Each row carries the count of all matching rows; a page past the end has none to carry it.
    const total = rows[0]?.total ?? (q.page === 1 ? 0 : (await query<{ total: number }>(tx, countSql, countBind))[0]!.total);
    // The SQL scope and the ability must agree row by row (architecture, "Permissions"); rows of the same
    // owning and keeping farm answer alike, so each pair is asked once.
    const readable = new Map<string, boolean>();
    const canRead = (row: Row) => {
      const pair = `${row.coop_id}/${row.owning_farm_id}/${row.keeping_farm_id}`;
      let can = readable.get(pair);
      if (can === undefined) readable.set(pair, (can = ctx.ability!.can('read', subjectOfRow(row))));
      return can;
    };
    const items = rows.filter(canRead).map((row) => present(row, ctx));
    return { items, total, page: q.page, pageSize: q.pageSize };
  });
}

/** The herd list: one page of the farm's animals, each with what the list shows. */
export function listHerd(actor: SessionUser, q: AnimalListQuery): Promise<AnimalListDto> {
  // The does this farm keeps carry where they stand in their cycle, read in the page's own statement.
  const select = (tx: Transaction, pageSql: string, bind: unknown[], farmId: string) => selectHerdListPage(tx, pageSql, bind, farmId, doeCycleFactsColumn('$2'));
  return herdPage(actor, q, select, (row, ctx) => presentListItem(row, ctx, row.cycle_facts ? doeCycleOfFacts(row.cycle_facts, ctx.today) : null));
}

/** Whole records of the herd list's animals, in its order (the export of the list). */
export function listHerdRecords(actor: SessionUser, q: AnimalListQuery): Promise<{ items: AnimalDto[]; total: number }> {
  return herdPage(actor, q, selectAnimalPage, presentAnimal);
}

/**
 * One animal's full record with its histories, for its own farm (and that farm's apprentices).
 * Another farm's animal answers 403: its pedigree card is open at /api/pedigree-cards/:id instead.
 */
/**
 * The animal as its pedigree certificate prints it, for a farm the caller already allowed to have the
 * certificate (the owner, or the farm that sold it through the Swap Board); never sent as a record.
 */
export async function animalForCertificate(actor: SessionUser, animalId: string): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const row = await selectAnimalById(tx, actor.coopId, animalId, { weightsSeenBy: actor.farmId });
    if (!row || row.is_outside) throw AppError.notFound('That animal');
    return detailOf(tx, actor, await presentContextFor(actor, tx), animalId, row);
  });
}

export async function getAnimal(actor: SessionUser, animalId: string): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const row = await selectAnimalById(tx, actor.coopId, animalId, { weightsSeenBy: actor.farmId });
    if (!row || row.is_outside) throw AppError.notFound('That animal');
    if (!defineAbilityFor(actor).can('read', subjectOfRow(row))) {
      throw new AppError(ErrorCode.forbidden, 403, "Only the animal's own farm sees its full record; its pedigree card is open to the co-op");
    }
    return detailOf(tx, actor, await presentContextFor(actor, tx), animalId, row);
  });
}

