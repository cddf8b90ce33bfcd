import {
  defineAbilityFor, ErrorCode, type AnimalDetailDto, type AnimalListDto, type AnimalListQuery, type Lifecycle,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { presentContextFor } from './animal-context';
import { selectAnimalById, selectAnimals } from './animal-queries';
import { subjectOfRow } from './animal-access';
import { detailOf } from './animal-detail';
import { presentAnimal } from './animals.presenter';

/* The herd as its own screens read it: the farm's list and one animal's full record. */

const lifecycleOrder: Record<Lifecycle, number> = { kit: 0, junior: 1, breeding: 2, retired: 3 };
const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** The actor's own herd (the animals their farm owns or keeps), filtered, sorted and paged. */
export async function listHerd(actor: SessionUser, q: AnimalListQuery): Promise<AnimalListDto> {
  return withTenant(actor, async (tx) => {
    const farmId = actor.farmId;
    if (!farmId) return { items: [], total: 0, page: q.page, pageSize: q.pageSize };
    const ability = defineAbilityFor(actor);
    const ctx = await presentContextFor(actor, tx);
    const bind: unknown[] = [farmId];
    const where = ['NOT a.is_outside', '(a.owning_farm_id = $2 OR a.keeping_farm_id = $2)'];
    const param = (value: unknown) => {
      bind.push(value);
      return `$${bind.length + 1}`;
    };
    if (q.status === 'current') where.push(`a.disposition = 'on_farm'`);
    else if (q.status === 'gone') where.push(`a.disposition <> 'on_farm'`);
    else if (q.status !== 'all') where.push(`a.disposition = 'on_farm' AND a.lifecycle = ${param(q.status)}`);
    if (q.sex) where.push(`a.sex = ${param(q.sex)}`);
    if (q.purity) where.push(`m.purity = ${param(q.purity)}`);
    if (q.breedId) where.push(`(m.breeds -> ${param(q.breedId)}::text) IS NOT NULL`);
    if (q.search) {
      const p = param(`%${q.search.replace(/[\\%_]/g, '\\$&')}%`);
      where.push(`(a.name ILIKE ${p} OR a.tattoo ILIKE ${p} OR a.hutch ILIKE ${p} OR a.colour ILIKE ${p} OR a.registration_number ILIKE ${p})`);
    }
    const rows = (await selectAnimals(tx, actor.coopId, where.join(' AND '), bind, { weightsSeenBy: farmId }))
      // The SQL scope and the ability must agree row by row (architecture, "Permissions").
      .filter((row) => ability.can('read', subjectOfRow(row)));
    let items = rows.map((row) => presentAnimal(row, ctx));
    if (q.ageClass) items = items.filter((a) => a.ageClass === q.ageClass);

    const breedKey = (a: (typeof items)[number]) => a.breedMakeup.breeds[0]?.name ?? '\uffff';
    const compare: Record<AnimalListQuery['sort'], (a: (typeof items)[number], b: (typeof items)[number]) => number> = {
      tattoo: (a, b) => collator.compare(a.tattoo ?? '', b.tattoo ?? ''),
      name: (a, b) => collator.compare(a.name, b.name),
      sex: (a, b) => a.sex.localeCompare(b.sex),
      breed: (a, b) => collator.compare(breedKey(a), breedKey(b)),
      birthDate: (a, b) => (a.birthDate ?? '').localeCompare(b.birthDate ?? ''),
      lifecycle: (a, b) => lifecycleOrder[a.lifecycle] - lifecycleOrder[b.lifecycle],
      hutch: (a, b) => collator.compare(a.hutch, b.hutch),
      coi: (a, b) => a.coi - b.coi,
    };
    const direction = q.dir === 'desc' ? -1 : 1;
    items.sort((a, b) => direction * compare[q.sort](a, b) || collator.compare(a.tattoo ?? '', b.tattoo ?? ''));
    const start = (q.page - 1) * q.pageSize;
    return { items: items.slice(start, start + q.pageSize), total: items.length, page: q.page, pageSize: q.pageSize };
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

