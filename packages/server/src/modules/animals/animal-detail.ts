import type { Transaction } from 'sequelize';
import { pedigreeCompleteness, type AnimalDetailDto } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { selectRows } from '../../db/prepared';
import type { AnimalNote } from './animal-note.model';
import type { AnimalStatusEvent } from './animal-status-event.model';
import { selectAncestry, selectAnimalById, selectAnimals, type AnimalRow } from './animal-queries';
import { presentAnimal, presentCard, presentNote, standardBreedOf, type PresentContext } from './animals.presenter';
import type { CustodyEvent } from './custody-event.model';
import { privateRecordFarmsGiven } from './animal-facts.service';


/** An animal's histories and notes, with who recorded them, in one statement (json per history). */
const historiesSql = `SELECT
  (SELECT coalesce(json_agg(json_build_object('id', e.id, 'kind', e.kind, 'value', e.value, 'cause', e.cause, 'effectiveOn', e.effective_on,
      'farmId', e.farm_id, 'recordedBy', e.recorded_by, 'recordedByName', u.name) ORDER BY e.effective_on, e.created_at), '[]')
   FROM animal_status_events e LEFT JOIN users u ON u.id = e.recorded_by WHERE e.coop_id = $1 AND e.animal_id = $2) AS status,
  (SELECT coalesce(json_agg(json_build_object('id', c.id, 'kind', c.kind, 'fromFarmId', c.from_farm_id, 'toFarmId', c.to_farm_id,
      'owningFarmId', c.owning_farm_id, 'keepingFarmId', c.keeping_farm_id, 'movedOn', c.moved_on, 'tattooBefore', c.tattoo_before,
      'tattooAfter', c.tattoo_after, 'note', c.note, 'notesTravel', c.notes_travel) ORDER BY c.moved_on, c.created_at), '[]')
   FROM animal_custody_events c WHERE c.coop_id = $1 AND c.animal_id = $2) AS custody,
  (SELECT coalesce(json_agg(json_build_object('id', n.id, 'animalId', n.animal_id, 'farmId', n.farm_id, 'body', n.body, 'notedOn', n.noted_on,
      'enteredBy', n.entered_by, 'enteredByName', u.name, 'reviewState', n.review_state, 'reviewComment', n.review_comment, 'version', n.version)
      ORDER BY n.noted_on DESC, n.created_at DESC), '[]')
   FROM animal_notes n LEFT JOIN users u ON u.id = n.entered_by WHERE n.coop_id = $1 AND n.animal_id = $2 AND n.deleted_at IS NULL) AS notes`;

interface Histories {
  status: (Pick<AnimalStatusEvent, 'id' | 'kind' | 'value' | 'cause' | 'effectiveOn' | 'farmId' | 'recordedBy'> & { recordedByName: string | null })[];
  custody: (Pick<CustodyEvent, 'id' | 'kind' | 'fromFarmId' | 'toFarmId' | 'owningFarmId' | 'keepingFarmId' | 'movedOn' | 'tattooBefore' | 'tattooAfter' | 'note'> & { notesTravel: boolean })[];
  notes: (Pick<AnimalNote, 'id' | 'animalId' | 'farmId' | 'body' | 'notedOn' | 'enteredBy' | 'reviewState' | 'reviewComment' | 'version'> & { enteredByName: string | null })[];
}

/**
 * One animal's full record: the animal, its histories with their authors, its parents and offspring, and
 * its ancestry for the completeness figure, in four statements whatever the record's length. `row` when
 * the caller already read the animal (as its viewer's weights see it).
 */
export async function detailOf(tx: Transaction, actor: SessionUser, ctx: PresentContext, animalId: string, row?: AnimalRow): Promise<AnimalDetailDto> {
  row ??= (await selectAnimalById(tx, actor.coopId, animalId, { weightsSeenBy: actor.farmId })) ?? undefined;
  if (!row) throw AppError.notFound('That animal');
  const [histories] = await selectRows<Histories>(tx, historiesSql, [actor.coopId, animalId]);
  const { status: statusEvents, custody: custodyEvents } = histories!;
  // The notes of farms whose records of it the viewer reads (RLS keeps the co-op; this keeps the farm).
  const noteFarms = new Set(privateRecordFarmsGiven(actor, { owningFarmId: row.owning_farm_id }, 'AnimalNote', custodyEvents));
  const notes = histories!.notes.filter((n) => noteFarms.has(n.farmId));
  const parentIds = [row.sire_id, row.dam_id].filter((id): id is string => Boolean(id));
  const relatives = await selectAnimals(tx, actor.coopId, 'a.sire_id = $2 OR a.dam_id = $2 OR a.id = ANY($3::uuid[])', [animalId, parentIds], { orderBy: 'a.birth_date DESC, a.tattoo' });
  const offspringRows = relatives.filter((r) => r.sire_id === animalId || r.dam_id === animalId);
  const parentRows = relatives.filter((r) => parentIds.includes(r.id));
  const ancestry = await selectAncestry(tx, actor.coopId, animalId, 4);
  const names = new Map<string, string>([
    ...statusEvents.filter((e) => e.recordedBy && e.recordedByName).map((e): [string, string] => [e.recordedBy!, e.recordedByName!]),
    ...notes.filter((n) => n.enteredByName).map((n): [string, string] => [n.enteredBy, n.enteredByName!]),
  ]);
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

