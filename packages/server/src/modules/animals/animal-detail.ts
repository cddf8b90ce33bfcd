import { Op, type Transaction } from 'sequelize';
import { pedigreeCompleteness, type AnimalDetailDto } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { namesOf } from '../users/users.service';
import { AnimalNote } from './animal-note.model';
import { AnimalStatusEvent } from './animal-status-event.model';
import { query, selectAncestorIds, selectAnimalById, selectAnimals } from './animal-queries';
import { presentAnimal, presentCard, presentNote, standardBreedOf, type PresentContext } from './animals.presenter';
import { CustodyEvent } from './custody-event.model';
import { privateRecordFarmsOf } from './animal-facts.service';


export async function detailOf(tx: Transaction, actor: SessionUser, ctx: PresentContext, animalId: string): Promise<AnimalDetailDto> {
  const row = await selectAnimalById(tx, actor.coopId, animalId, { weightsSeenBy: actor.farmId });
  if (!row) throw AppError.notFound('That animal');
  const noteFarms = await privateRecordFarmsOf(actor, { id: animalId, owningFarmId: row.owning_farm_id }, 'AnimalNote', tx);
  const [statusEvents, custodyEvents, offspringRows, parentRows, ancestorIds, notes] = [
    await AnimalStatusEvent.findAll({ where: { animalId }, order: [['effectiveOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx }),
    await CustodyEvent.findAll({ where: { animalId }, order: [['movedOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx }),
    await selectAnimals(tx, actor.coopId, 'a.sire_id = $2 OR a.dam_id = $2', [animalId], { orderBy: 'a.birth_date DESC, a.tattoo' }),
    await selectAnimals(tx, actor.coopId, 'a.id = ANY($2::uuid[])', [[row.sire_id, row.dam_id].filter(Boolean)]),
    await selectAncestorIds(tx, actor.coopId, animalId, 4),
    await AnimalNote.findAll({ where: { animalId, farmId: { [Op.in]: noteFarms } }, order: [['notedOn', 'DESC'], ['createdAt', 'DESC']], transaction: tx }),
  ];
  const ancestry = await query<{ id: string; sire_id: string | null; dam_id: string | null }>(
    tx,
    'SELECT id, sire_id, dam_id FROM animals WHERE coop_id = $1 AND id = ANY($2::uuid[])',
    [actor.coopId, ancestorIds],
  );
  const names = await namesOf([...statusEvents.map((e) => e.recordedBy), ...notes.map((n) => n.enteredBy)], tx);
  const farm = (id: string | null) => (id ? { id, name: ctx.farms.get(id)?.name ?? 'A former member farm' } : null);
  const card = (id: string | null) => {
    const parent = parentRows.find((p) => p.id === id);
    return parent ? presentCard(parent, ctx) : null;
  };
  return {
    ...presentAnimal(row, ctx),
    breed: standardBreedOf(row, ctx),
    statusHistory: statusEvents.map((e) => ({
      id: e.id,
      kind: e.kind,
      value: e.value,
      cause: e.cause,
      effectiveOn: e.effectiveOn,
      farm: farm(e.farmId),
      recordedBy: e.recordedBy ? { id: e.recordedBy, name: names.get(e.recordedBy) ?? 'Someone' } : null,
    })),
    custodyHistory: custodyEvents.map((e) => ({
      id: e.id,
      kind: e.kind,
      fromFarm: farm(e.fromFarmId),
      toFarm: farm(e.toFarmId),
      owningFarm: farm(e.owningFarmId),
      keepingFarm: farm(e.keepingFarmId),
      movedOn: e.movedOn,
      tattooBefore: e.tattooBefore,
      tattooAfter: e.tattooAfter,
      note: e.note,
    })),
    offspring: offspringRows.map((o) => presentCard(o, ctx)),
    sire: card(row.sire_id),
    dam: card(row.dam_id),
    completeness: pedigreeCompleteness(
      ancestry.map((a) => ({ id: a.id, sireId: a.sire_id, damId: a.dam_id })),
      animalId,
      4,
    ),
    noteLog: notes.map((n) => presentNote(n, names)),
  };
}

