import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import {
  addDays, animalCreateSchema, checkKindlingDate, checkWeightForAge, daysBetween, ErrorCode, KIT_DEATH_CAUSE_LABELS, planFromKindling, RealtimeEvent, rooms, validateLitter,
  type EntryReviewInput, type FosterCandidateDto, type FosteringCreateInput, type KeeperCreateInput, type KindlingCreateInput,
  type LitterDto, type LitterEventCreateInput, type LitterIssue, type LitterListDto, type LitterListQuery, type LitterRecord,
} from '@burrowline/shared';
import { selectPrepared } from '../../db/prepared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { addMessage, ensureCan, farmOf, refuseOrConfirm, type FieldMessages } from '../farms/farm-access';
import { announceAlmanac } from '../almanac/almanac-events.service';
import { farmClockOf } from '../farms/farm-clock';
import { presentAnimalRef } from '../animals/animal-facts.service';
import { serviceDatesOf, serviceForKindling, settleServiceOnKindling } from '../almanac/breeding.service';
import { settingsOf } from '../almanac/cycle-settings.service';
import { presentContextOf, presentTasks, tasksOf } from '../almanac/tasks.service';
import { insertPlannedTasks, markTasksDone, skipTasks } from '../almanac/task-writer.service';
import { animalFactsOf, animalsBornOf } from '../animals/animal-facts.service';
import { createAnimal } from '../animals/animal-edits.service';
import { breedMapOf } from '../breeds/breeds.service';
import { farmDirectoryOf } from '../farms/farms.service';
import { animalRefColumnsSql, animalRefJoinSql, animalRefOf, type AnimalRefRow } from '../../lib/animal-ref';
import { recordChanges } from '../audit/audit.service';
import { currentHousingOfLitter } from './housing.service';
import { LitterEvent } from './litter-event.model';
import { Litter } from './litter.model';
import { countingEvents, presentLitter, presentLitterListItem, recordOf, summaryOf, type CountedEvent, type LitterPresentContext } from './litters.presenter';
import { mentorIdOf } from '../users/users.service';

/** Fostering is done between litters of about the same age: kindled within this many days of each other (common practice). */
const FOSTER_AGE_GAP_DAYS = 7;

function announceLitter(tx: Transaction, changes: { farmId: string; litterId: string }[]): void {
  tx.afterCommit(() => {
    for (const { farmId, litterId } of changes) publish(rooms.farm(farmId), RealtimeEvent.litterChanged, { farmId, litterId });
  });
  announceAlmanac(tx, changes.map((c) => c.farmId));
}

function issuesToMessages(issues: LitterIssue[], fieldFor: (issue: LitterIssue) => string): FieldMessages {
  const messages: FieldMessages = {};
  for (const issue of issues) addMessage(messages, fieldFor(issue), issue.message);
  return messages;
}

/** A litter of the actor's farm; another farm's (or co-op's) does not exist for them (404). */
async function litterFor(tx: Transaction, actor: SessionUser, litterId: string, lock = false): Promise<Litter> {
  const litter = await Litter.findOne({ where: { id: litterId, coopId: actor.coopId }, transaction: tx, lock: lock ? tx.LOCK.UPDATE : undefined });
  if (!litter || litter.farmId !== actor.farmId) throw AppError.notFound('That litter');
  ensureCan(actor, 'read', 'Litter', { farmId: litter.farmId }, 'That litter');
  return litter;
}

async function eventsOf(tx: Transaction, litterIds: string[]): Promise<LitterEvent[]> {
  if (litterIds.length === 0) return [];
  return LitterEvent.findAll({ where: { litterId: { [Op.in]: litterIds } }, order: [['occurredOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx });
}

async function presentContextForLitters(
  tx: Transaction,
  actor: SessionUser,
  today: string,
  litters: Pick<Litter, 'id' | 'farmId' | 'damId' | 'sireId' | 'kindledOn'>[],
  events: LitterEvent[],
): Promise<LitterPresentContext> {
  const otherIds = events.map((e) => e.otherLitterId).filter((id): id is string => Boolean(id));
  const others = otherIds.length === 0
    ? []
    : await Litter.findAll({ where: { id: { [Op.in]: otherIds } }, attributes: ['id', 'farmId', 'damId', 'kindledOn'], transaction: tx });
  const ctx = await presentContextOf(tx, actor.coopId, today, {
    animalIds: [...litters.flatMap((l) => [l.damId, l.sireId]), ...others.map((o) => o.damId)],
    userIds: events.map((e) => e.enteredBy),
  });
  return {
    animal: (id) => presentAnimalRef(id, ctx),
    farm: (id) => ({ id, name: ctx.farms.get(id)?.name ?? 'A former member farm' }),
    names: ctx.names,
    today,
    viewerFarmId: actor.farmId,
    litters: new Map([...litters, ...others].map((l) => [l.id, l])),
  };
}

async function litterDetail(tx: Transaction, actor: SessionUser, litter: Litter): Promise<LitterDto> {
  const clock = await farmClockOf(tx, actor.coopId, litter.farmId);
  const events = await eventsOf(tx, [litter.id]);
  const ctx = await presentContextForLitters(tx, actor, clock.today, [litter], events);
  const fromIds = [...new Set(countingEvents(events).filter((e) => e.kind === 'fostered_in').map((e) => e.otherLitterId!))];
  const fromLitters = await Litter.findAll({ where: { id: { [Op.in]: fromIds } }, transaction: tx });
  const born = await animalsBornOf(tx, actor.coopId, [litter, ...fromLitters].map((l) => ({ sireId: l.sireId, damId: l.damId, birthDate: l.kindledOn })));
  const keepers = born
    .map((a) => {
      const birthLitter = [litter, ...fromLitters].find((l) => l.sireId === a.sireId && l.damId === a.damId && l.kindledOn === a.birthDate)!;
      return { animal: a, birthLitter };
    })
    // Kits born here wherever they are now; fostered-in kits when this farm keeps them.
    .filter(({ animal, birthLitter }) => birthLitter.id === litter.id || animal.owningFarmId === litter.farmId || animal.keepingFarmId === litter.farmId)
    .map(({ animal, birthLitter }) => ({
      id: animal.id,
      name: animal.name,
      tattoo: animal.tattoo,
      sex: animal.sex,
      farm: animal.keepingFarmId ? ctx.farm(animal.keepingFarmId) : null,
      bornInLitterId: birthLitter.id,
      birthDate: animal.birthDate,
    }));
  const tasks = await tasksOf(tx, { litterId: litter.id });
  const servicedOn = (await serviceDatesOf(tx, [litter.serviceId])).get(litter.serviceId) ?? litter.kindledOn;
  return presentLitter(
    litter,
    {
      servicedOn,
      events,
      tasks: await presentTasks(tx, actor.coopId, tasks, clock.today),
      keepers,
      fosteredInFrom: fromLitters.map((l) => ({ id: l.id, farm: ctx.farm(l.farmId), dam: ctx.animal(l.damId), kindledOn: l.kindledOn })),
      housing: await currentHousingOfLitter(tx, litter.id),
    },
    { ...ctx, litters: new Map([...ctx.litters, ...fromLitters.map((l) => [l.id, l] as const)]) },
  );
}

/**
 * When no kit is left with the doe, her litter's remaining jobs change: a weaning ticks the weaning task
 * (the grow-out weigh-ins stay planned: they weigh the weaned kits); when the kits were all lost, culled
 * or fostered away, nest box out, weigh-ins and weaning are skipped with the reason. The breed-back stays.
 */
async function settleEmptiedLitter(tx: Transaction, litter: Litter, record: LitterRecord, on: string, byWeaning: boolean, actorId: string): Promise<void> {
  if (summaryOf(record).onDoe > 0) return;
  const open = (await tasksOf(tx, { litterId: litter.id })).filter((t) => (t.state === 'open' || t.state === 'moved') && t.kind !== 'breed_back');
  if (byWeaning || summaryOf(record).weaned > 0) {
    await markTasksDone(tx, open.filter((t) => t.kind === 'weaning').map((t) => t.id), on, actorId);
    return;
  }
  await skipTasks(tx, open.map((t) => ({ id: t.id, reason: `No kits left with the doe from ${on}` })));
}

/**
 * Records a kindling from one of the farm's services: born alive and born dead are the litter's start,
 * sire and dam come from the service. Refused, nothing written, for a kindling before its service or more
 * than 40 days after, a date in the farm's future, or negative counts; outside the kindling window it
 * asks for confirmation. Closes the service (its kindling task done, the overdue alert skipped) and
 * plans nest box out, weigh-ins, weaning and breeding back from the real kindling date.
 */
export async function recordKindling(actor: SessionUser, input: KindlingCreateInput): Promise<LitterDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'Litter', { farmId }, 'That farm', 'Only members of the farm record kindlings; record kit counts on the litter');
  return withTenant(actor, async (tx) => {
    if (input.id) {
      const existing = await Litter.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.farmId === farmId && !existing.deletedAt) return litterDetail(tx, actor, existing);
      if (existing) throw AppError.idTaken();
    }
    const service = await serviceForKindling(tx, actor, input.serviceId);
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const { settings } = await settingsOf(tx, farmId);
    const checks = checkKindlingDate(service.servicedOn, input.kindledOn, clock.today, settings);
    const errors: FieldMessages = {};
    const warnings: FieldMessages = {};
    for (const c of checks) addMessage(c.level === 'error' ? errors : warnings, c.field, c.message);
    const issues = validateLitter({ kindledOn: input.kindledOn, bornAlive: input.bornAlive, bornDead: input.bornDead, events: [] }, clock.today);
    for (const issue of issues) if (!errors[issue.field ?? 'kindledOn']) addMessage(errors, issue.field ?? 'kindledOn', issue.message);
    refuseOrConfirm(errors, warnings, input.confirm);

    const litter = await Litter.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId,
        farmId,
        serviceId: service.id,
        damId: service.doeId,
        sireId: service.buckId,
        kindledOn: input.kindledOn,
        bornAlive: input.bornAlive,
        bornDead: input.bornDead,
        notes: input.notes,
        recordedBy: actor.id,
      },
      { transaction: tx },
    );
    await settleServiceOnKindling(tx, actor, service.id, litter.id, input.kindledOn);
    await insertPlannedTasks(tx, { coopId: actor.coopId, farmId, sourceId: litter.id, litterId: litter.id, animalId: service.doeId }, planFromKindling(input.kindledOn, settings));
    if (input.bornAlive === 0) await settleEmptiedLitter(tx, litter, recordOf(litter, []), input.kindledOn, false, actor.id);
    await recordChanges({ coopId: actor.coopId, tableName: 'litters', recordId: litter.id, actorUserId: actor.id, changes: { created: [null, `${input.bornAlive} alive, ${input.bornDead} dead`] } }, tx);
    announceLitter(tx, [{ farmId, litterId: litter.id }]);
    return litterDetail(tx, actor, litter);
  });
}

/**
 * A litter weight at weaning, per kit, against the usual weight for the kits' age and the dam's breed
 * size (growth/plausibility.ts): impossible weights are refused, unusual ones ask for confirmation.
 */
async function checkWeaningWeight(
  tx: Transaction, actor: SessionUser, litter: Litter, on: string, kits: number, grams: number, confirm: boolean | undefined,
): Promise<void> {
  const dam = (await animalFactsOf(tx, actor.coopId, [litter.damId])).get(litter.damId);
  const breed = dam?.breedId ? (await breedMapOf(actor.coopId, tx)).get(dam.breedId) : undefined;
  const ageDays = daysBetween(litter.kindledOn, on);
  const check = checkWeightForAge(grams / kits, ageDays, breed?.sizeClass ?? 'medium');
  if (!check) return;
  const message = `${check.message} (${grams} g for ${kits === 1 ? '1 kit' : `${kits} kits`})`;
  const errors: FieldMessages = check.level === 'error' ? { weaningWeightGrams: [message] } : {};
  const warnings: FieldMessages = check.level === 'warning' ? { weaningWeightGrams: [message] } : {};
  refuseOrConfirm(errors, warnings, confirm);
}

/** A loss's words: the breeder's own, else the chosen cause's label (a loss always says what happened). */
function lossWords(input: LitterEventCreateInput): string | null {
  const words = input.cause?.trim();
  if (words) return words;
  return input.kind === 'lost' && input.deathCause ? KIT_DEATH_CAUSE_LABELS[input.deathCause] : null;
}

/**
 * A dated change of the kit count with no other litter: lost (with a cause), culled, weaned. Refused,
 * nothing written, when more kits would leave than were with the doe on that date (born alive + fostered
 * in − fostered out − lost − culled − weaned), or for a date before the kindling or in the future. An
 * apprentice's entry waits for the mentor's review (and counts, marked unverified, until then).
 */
export async function recordLitterEvent(actor: SessionUser, litterId: string, input: LitterEventCreateInput): Promise<LitterDto> {
  farmOf(actor);
  return withTenant(actor, (tx) => recordLitterEventIn(tx, actor, litterId, input));
}

/** The same event inside the caller's transaction (an apprentice's chore entry carries one); the same checks. */
export async function recordLitterEventIn(tx: Transaction, actor: SessionUser, litterId: string, input: LitterEventCreateInput): Promise<LitterDto> {
  farmOf(actor);
  {
    const litter = await litterFor(tx, actor, litterId, true);
    ensureCan(actor, 'create', 'LitterEvent', { farmId: litter.farmId, enteredBy: actor.id }, 'That litter');
    if (input.id) {
      const existing = await LitterEvent.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.litterId === litter.id && existing.enteredBy === actor.id) return litterDetail(tx, actor, litter);
      if (existing) throw AppError.idTaken();
    }
    const clock = await farmClockOf(tx, actor.coopId, litter.farmId);
    const events = await eventsOf(tx, [litter.id]);
    const weaningWeightGrams = input.kind === 'weaned' ? input.weaningWeightGrams ?? null : null;
    const pending = LitterEvent.build({
      id: input.id ?? randomUUID(), coopId: actor.coopId, farmId: litter.farmId, litterId: litter.id, kind: input.kind, occurredOn: input.on,
      kitCount: input.count, cause: lossWords(input), deathCause: input.kind === 'lost' ? input.deathCause ?? 'other' : null,
      otherLitterId: null, pairId: null, enteredBy: actor.id,
      weaningWeightGrams, reviewState: actor.role === 'apprentice' ? 'pending' : 'accepted',
    });
    const record = recordOf(litter, [...events, pending]);
    const issues = validateLitter(record, clock.today);
    if (issues.length > 0) throw AppError.validation(issuesToMessages(issues, (i) => (i.field === 'on' ? 'on' : i.field === 'cause' ? 'cause' : 'count')));
    if (weaningWeightGrams !== null) await checkWeaningWeight(tx, actor, litter, input.on, input.count, weaningWeightGrams, input.confirm);
    await pending.save({ transaction: tx });
    if (pending.reviewState === 'accepted') await settleEmptiedLitter(tx, litter, record, input.on, input.kind === 'weaned', actor.id);
    announceLitter(tx, [{ farmId: litter.farmId, litterId: litter.id }]);
    return litterDetail(tx, actor, litter);
  }
}

/**
 * Kits fostered between this litter and another (of this farm, or of another farm of the co-op): one
 * event on each litter, sharing a pair id, checked against both litters' counts. Only the giving farm
 * records a fostering between farms; the other farm sees the kits arrive. Parentage never changes: a
 * fostered kit kept later is still its birth litter's offspring.
 */
export async function recordFostering(actor: SessionUser, litterId: string, input: FosteringCreateInput): Promise<LitterDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => {
    const here = await litterFor(tx, actor, litterId);
    ensureCan(actor, 'update', 'Litter', { farmId: here.farmId }, 'That litter', 'Only members of the farm record fosterings');
    const clock = await farmClockOf(tx, actor.coopId, here.farmId);
    const errors: FieldMessages = {};
    const other = await Litter.findOne({ where: { id: input.otherLitterId, coopId: actor.coopId }, transaction: tx });
    if (!other) addMessage(errors, 'otherLitterId', "That litter is not in the co-op's records: choose one from the list");
    else if (other.id === here.id) addMessage(errors, 'otherLitterId', 'The other litter is this litter');
    else if (other.farmId !== here.farmId && input.direction === 'in') {
      addMessage(errors, 'direction', "Kits from another farm's litter are recorded by that farm, as fostered out; they then show here");
    } else if (input.on < other.kindledOn) addMessage(errors, 'on', `The other litter was kindled on ${other.kindledOn}, after that date`);
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);

    // Both litters locked in a fixed order, so two fosterings at once cannot both spend the same kits.
    const [first, second] = [here, other!].sort((a, b) => a.id.localeCompare(b.id));
    await Litter.findAll({ where: { id: { [Op.in]: [first!.id, second!.id] } }, transaction: tx, lock: tx.LOCK.UPDATE, order: [['id', 'ASC']] });
    const giving = input.direction === 'out' ? here : other!;
    const receiving = input.direction === 'out' ? other! : here;
    const pairId = randomUUID();
    const build = (litter: Litter, kind: 'fostered_in' | 'fostered_out', otherId: string, id?: string) =>
      LitterEvent.build({
        ...(id ? { id } : { id: randomUUID() }),
        coopId: actor.coopId, farmId: litter.farmId, litterId: litter.id, kind, occurredOn: input.on, kitCount: input.count,
        cause: null, otherLitterId: otherId, pairId, enteredBy: actor.id, reviewState: 'accepted',
      });
    const out = build(giving, 'fostered_out', receiving.id, input.direction === 'out' ? input.id : undefined);
    const into = build(receiving, 'fostered_in', giving.id, input.direction === 'in' ? input.id : undefined);
    const events = await eventsOf(tx, [giving.id, receiving.id]);
    const givingRecord = recordOf(giving, [...events.filter((e) => e.litterId === giving.id), out]);
    const receivingRecord = recordOf(receiving, [...events.filter((e) => e.litterId === receiving.id), into]);
    const ownSide = input.direction === 'out' ? givingRecord : receivingRecord;
    const otherSide = input.direction === 'out' ? receivingRecord : givingRecord;
    const fieldOf = (i: LitterIssue) => (i.field === 'on' ? 'on' : 'count');
    const ownIssues = validateLitter(ownSide, clock.today);
    if (ownIssues.length > 0) throw AppError.validation(issuesToMessages(ownIssues, fieldOf));
    const otherIssues = validateLitter(otherSide, clock.today);
    if (otherIssues.length > 0) {
      // The other farm's counts are its own: say what is wrong without showing them.
      if (other!.farmId !== here.farmId) throw AppError.validation({ count: ["The other litter's record cannot take that fostering on that date"] });
      throw AppError.validation(issuesToMessages(otherIssues, (i) => `otherLitter.${fieldOf(i)}`));
    }
    await out.save({ transaction: tx });
    await into.save({ transaction: tx });
    await settleEmptiedLitter(tx, giving, givingRecord, input.on, false, actor.id);
    await recordChanges({ coopId: actor.coopId, tableName: 'litters', recordId: here.id, actorUserId: actor.id, changes: { fostering: [null, `${input.count} ${input.direction} on ${input.on}`] } }, tx);
    announceLitter(tx, [{ farmId: giving.farmId, litterId: giving.id }, { farmId: receiving.farmId, litterId: receiving.id }]);
    return litterDetail(tx, actor, here);
  });
}

/** A member accepts an apprentice's litter count, or returns it with a comment (then it no longer counts). */
export async function reviewLitterEvent(actor: SessionUser, eventId: string, input: EntryReviewInput): Promise<LitterDto> {
  farmOf(actor);
  return withTenant(actor, (tx) => reviewLitterEventIn(tx, actor, eventId, input));
}

/** The same review inside the caller's transaction (the mentor's queue decides many at once). */
export async function reviewLitterEventIn(tx: Transaction, actor: SessionUser, eventId: string, input: EntryReviewInput): Promise<LitterDto> {
  farmOf(actor);
  {
    const event = await LitterEvent.findOne({ where: { id: eventId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!event || event.farmId !== actor.farmId) throw AppError.notFound('That entry');
    const mentorId = await mentorIdOf(event.enteredBy, tx);
    ensureCan(actor, 'review', 'LitterEvent', { farmId: event.farmId, enteredBy: event.enteredBy, mentorId }, 'That entry', "Only her mentor reviews an apprentice's entries");
    if (event.version !== input.version) throw AppError.staleVersion();
    if (event.reviewState !== 'pending') throw new AppError(ErrorCode.conflict, 409, 'That entry was already reviewed');
    if (event.enteredBy === actor.id) throw new AppError(ErrorCode.forbidden, 403, 'Someone else reviews your own entries');
    event.set({ reviewState: input.decision, reviewedBy: actor.id, reviewedAt: new Date(), reviewComment: input.comment ?? null });
    await event.save({ transaction: tx });
    await recordChanges({ coopId: actor.coopId, tableName: 'litter_events', recordId: event.id, actorUserId: actor.id, changes: { reviewState: ['pending', input.decision] } }, tx);
    const litter = await Litter.findByPk(event.litterId, { transaction: tx, lock: tx.LOCK.UPDATE });
    if (input.decision === 'accepted') {
      const record = recordOf(litter!, await eventsOf(tx, [litter!.id]));
      await settleEmptiedLitter(tx, litter!, record, event.occurredOn, event.kind === 'weaned', actor.id);
    }
    announceLitter(tx, [{ farmId: litter!.farmId, litterId: litter!.id }]);
    return litterDetail(tx, actor, litter!);
  }
}

export async function getLitter(actor: SessionUser, litterId: string): Promise<LitterDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => litterDetail(tx, actor, await litterFor(tx, actor, litterId)));
}

const litterOrder: Record<LitterListQuery['sort'], string[]> = {
  kindledOn: ['kindled_on', 'created_at', 'id'],
  bornAlive: ['born_alive', 'kindled_on', 'created_at', 'id'],
};

type LitterListRow = Pick<Litter, 'id' | 'farmId' | 'serviceId' | 'damId' | 'sireId' | 'kindledOn' | 'bornAlive' | 'bornDead'>
  & AnimalRefRow<'dam'> & AnimalRefRow<'sire'> & { events: CountedEvent[] };
type LitterCounts = LitterListDto['counts'];

/**
 * The farm's litters (of one dam) counted by state, and one page of them in the chosen order with what the
 * page presents: its dams and sires, and each litter's entries that count toward its kits (the summary's
 * figures), in one statement. The state comes from the kits each litter keeps on its doe (kept by the
 * database as its entries change), so the count reads the litters alone and the page is taken by the index
 * of its sort. With no row on the page the counts come alone.
 */
function litterPageSql(q: LitterListQuery): string {
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  const order = litterOrder[q.sort].map((column) => `l.${column} ${dir}`).join(', ');
  const status = q.status === 'all' ? '' : q.status === 'nursing' ? 'AND l.kits_on_doe > 0' : 'AND l.kits_on_doe <= 0';
  const farmLitters = `l.farm_id = $1 AND l.deleted_at IS NULL AND ($2::uuid IS NULL OR l.dam_id = $2)`;
  return `WITH counts AS (
      SELECT count(*) FILTER (WHERE l.kits_on_doe > 0)::int AS nursing, count(*) FILTER (WHERE l.kits_on_doe <= 0)::int AS weaned,
        count(*)::int AS "all"
      FROM litters l WHERE ${farmLitters}
    ), page AS MATERIALIZED (
      SELECT l.id, l.farm_id, l.service_id, l.dam_id, l.sire_id, l.kindled_on, l.born_alive, l.born_dead, row_number() OVER (ORDER BY ${order}) AS position
      FROM litters l WHERE ${farmLitters} ${status}
      ORDER BY ${order} LIMIT $3::bigint OFFSET $4::bigint
    )
    SELECT counts.nursing, counts.weaned, counts."all", p.id, p.farm_id AS "farmId", p.service_id AS "serviceId", p.dam_id AS "damId",
      p.sire_id AS "sireId", p.kindled_on::text AS "kindledOn", p.born_alive AS "bornAlive", p.born_dead AS "bornDead",
      ${animalRefColumnsSql('dam', 'dam')}, ${animalRefColumnsSql('sire', 'sire')},
      (SELECT COALESCE(json_agg(json_build_object(
          'id', e.id, 'kind', e.kind, 'occurredOn', e.occurred_on, 'kitCount', e.kit_count, 'cause', e.cause,
          'otherLitterId', e.other_litter_id, 'reviewState', e.review_state, 'deletedAt', NULL
        ) ORDER BY e.occurred_on, e.created_at), '[]')
        FROM litter_events e WHERE e.litter_id = p.id AND e.deleted_at IS NULL AND e.review_state <> 'returned') AS events
    FROM counts LEFT JOIN page p ON true
    ${animalRefJoinSql('dam', 'p.dam_id')}
    ${animalRefJoinSql('sire', 'p.sire_id')}
    ORDER BY p.position`;
}

/** The farm's litters, filtered, sorted and paged in SQL, with the kits still on the doe and each state's count. */
export async function listLitters(actor: SessionUser, q: LitterListQuery): Promise<LitterListDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Litter', { farmId }, 'Those litters');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const farms = await farmDirectoryOf(actor.coopId, tx);
    const rows = await selectPrepared<LitterCounts & { [K in keyof LitterListRow]: LitterListRow[K] | null }>(
      tx, litterPageSql(q), [farmId, q.damId ?? null, q.pageSize, (q.page - 1) * q.pageSize], { onlyStatement: true },
    );
    const { nursing, weaned, all } = rows[0]!;
    const counts = { nursing, weaned, all };
    const litters = rows.filter((r): r is typeof r & LitterListRow => r.id !== null);
    const items = litters.map((l) => {
      const refs = new Map([[l.damId, animalRefOf(l.damId, l, 'dam', farms)], [l.sireId, animalRefOf(l.sireId, l, 'sire', farms)]]);
      const ctx = { animal: (id: string) => refs.get(id)!, today: clock.today };
      return presentLitterListItem(l, summaryOf(recordOf(l, l.events)), ctx);
    });
    return { items, total: counts[q.status], page: q.page, pageSize: q.pageSize, counts };
  });
}

/**
 * Litters kits could be fostered to or from: nursing, kindled within a week of this one, on this farm or
 * another of the co-op. Another farm's litter shows only its farm, its dam's pedigree-card name and its
 * kindling date, never its counts.
 */
export async function fosterCandidates(actor: SessionUser, litterId: string): Promise<{ candidates: FosterCandidateDto[] }> {
  farmOf(actor);
  return withTenant(actor, async (tx) => {
    const here = await litterFor(tx, actor, litterId);
    ensureCan(actor, 'update', 'Litter', { farmId: here.farmId }, 'That litter', 'Only members of the farm record fosterings');
    const clock = await farmClockOf(tx, actor.coopId, here.farmId);
    const near = await Litter.findAll({
      where: {
        coopId: actor.coopId,
        id: { [Op.ne]: here.id },
        kindledOn: { [Op.between]: [addDays(here.kindledOn, -FOSTER_AGE_GAP_DAYS), addDays(here.kindledOn, FOSTER_AGE_GAP_DAYS)] },
      },
      order: [['kindledOn', 'ASC']],
      transaction: tx,
    });
    const events = await eventsOf(tx, near.map((l) => l.id));
    const ctx = await presentContextForLitters(tx, actor, clock.today, near, []);
    const candidates = near
      .map((l) => ({ litter: l, onDoe: summaryOf(recordOf(l, events.filter((e) => e.litterId === l.id))).onDoe }))
      .filter(({ onDoe }) => onDoe > 0)
      .map(({ litter, onDoe }) => {
        const own = litter.farmId === here.farmId;
        return { id: litter.id, farm: ctx.farm(litter.farmId), isOwnFarm: own, dam: ctx.animal(litter.damId), kindledOn: litter.kindledOn, onDoe: own ? onDoe : null };
      })
      .sort((a, b) => Number(b.isOwnFarm) - Number(a.isOwnFarm) || a.kindledOn.localeCompare(b.kindledOn));
    return { candidates };
  });
}

/**
 * A kit picked to keep gets its own animal record with its tattoo, through the Herd: sire, dam and birth
 * date come from the litter it was born in (this one, or one that fostered it in), never from the doe
 * that raised it.
 */
export async function addKeeper(actor: SessionUser, litterId: string, input: KeeperCreateInput): Promise<LitterDto> {
  farmOf(actor);
  const birth = await withTenant(actor, async (tx) => {
    const here = await litterFor(tx, actor, litterId);
    ensureCan(actor, 'update', 'Litter', { farmId: here.farmId }, 'That litter', 'Only members of the farm add animals');
    if (!input.bornInLitterId || input.bornInLitterId === here.id) return here;
    const fosteredFrom = countingEvents(await eventsOf(tx, [here.id])).filter((e) => e.kind === 'fostered_in').map((e) => e.otherLitterId);
    if (!fosteredFrom.includes(input.bornInLitterId)) throw AppError.validation({ bornInLitterId: ['No kits of that litter were fostered into this one'] });
    return (await Litter.findByPk(input.bornInLitterId, { transaction: tx }))!;
  });
  await createAnimal(
    actor,
    animalCreateSchema.parse({
      ...(input.id ? { id: input.id } : {}),
      tattoo: input.tattoo,
      name: input.name,
      sex: input.sex,
      colour: input.colour,
      birthDate: birth.kindledOn,
      sireId: birth.sireId,
      damId: birth.damId,
      origin: 'born_here',
      // The parents' ages were checked when the service was saved.
      confirm: true,
    }),
  );
  return withTenant(actor, async (tx) => {
    const litter = await litterFor(tx, actor, litterId);
    announceLitter(tx, [{ farmId: litter.farmId, litterId: litter.id }]);
    return litterDetail(tx, actor, litter);
  });
}

// ---------------------------------------------------------------------------------------------
// For performance, inside the caller's transaction
// ---------------------------------------------------------------------------------------------

/** A litter as the performance tables read it: its parents, its kit-count record and its weaning weight. */
export interface LitterPerformanceFacts {
  id: string;
  farmId: string;
  serviceId: string;
  damId: string;
  sireId: string;
  kindledOn: string;
  record: LitterRecord;
  /**
   * Total live weight of the kits weaned: the sum over its weanings, when every weaning was weighed;
   * null when none (or only some) were.
   */
  weaningWeightGrams: number | null;
  /** The date of the last weaning, null before any. */
  weanedOn: string | null;
}

/** Every litter of a farm with its counting events: two queries, whatever the number of litters. */
export async function litterFactsOfFarm(tx: Transaction, coopId: string, farmId: string): Promise<LitterPerformanceFacts[]> {
  // Plain rows (raw): a farm's five years are thousands of rows, and nothing here is saved back.
  // Only the columns used (no timestamps to parse).
  const litters = await Litter.findAll({
    where: { coopId, farmId }, attributes: ['id', 'farmId', 'serviceId', 'damId', 'sireId', 'kindledOn', 'bornAlive', 'bornDead'],
    order: [['kindledOn', 'ASC'], ['createdAt', 'ASC']], raw: true, transaction: tx,
  });
  const events = litters.length === 0 ? [] : await LitterEvent.findAll({
    where: { coopId, farmId }, attributes: ['id', 'litterId', 'kind', 'occurredOn', 'kitCount', 'cause', 'otherLitterId', 'reviewState', 'weaningWeightGrams'],
    order: [['occurredOn', 'ASC'], ['createdAt', 'ASC']], raw: true, transaction: tx,
  });
  return litterPerformanceFactsOf(litters, events);
}

/** A litter row and an event row with the columns the performance facts read (deleted ones left out). */
export type LitterFactsRow = Pick<Litter, 'id' | 'farmId' | 'serviceId' | 'damId' | 'sireId' | 'kindledOn' | 'bornAlive' | 'bornDead'>;
export type LitterEventFactsRow = Pick<LitterEvent, 'id' | 'litterId' | 'kind' | 'occurredOn' | 'kitCount' | 'cause' | 'otherLitterId' | 'reviewState' | 'weaningWeightGrams'>;

/**
 * The performance facts of litters from their rows and their events' rows (each in date order), for a
 * caller that reads them in a statement of its own (the performance tables read all their sources in one).
 */
export function litterPerformanceFactsOf(litters: LitterFactsRow[], events: LitterEventFactsRow[]): LitterPerformanceFacts[] {
  const byLitter = new Map<string, LitterEvent[]>();
  for (const e of events as LitterEvent[]) {
    const list = byLitter.get(e.litterId);
    if (list) list.push(e);
    else byLitter.set(e.litterId, [e]);
  }
  return litters.map((litter) => {
    const own = byLitter.get(litter.id) ?? [];
    const weanings = countingEvents(own).filter((e) => e.kind === 'weaned');
    const weighed = weanings.length > 0 && weanings.every((e) => e.weaningWeightGrams !== null && e.weaningWeightGrams !== undefined);
    return {
      id: litter.id,
      farmId: litter.farmId,
      serviceId: litter.serviceId,
      damId: litter.damId,
      sireId: litter.sireId,
      kindledOn: litter.kindledOn,
      record: recordOf(litter, own),
      weaningWeightGrams: weighed ? weanings.reduce((n, e) => n + e.weaningWeightGrams!, 0) : null,
      weanedOn: weanings.at(-1)?.occurredOn ?? null,
    };
  });
}
