import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import {
  checkRoundWeight, daysBetween, expectedBandForAge, RealtimeEvent, rooms,
  type ReviewState, type SizeClass, type WeighingRoundCandidateDto, type WeighingRoundCandidatesDto, type WeighingRoundCreateInput,
  type WeighingRoundDto, type WeighingRoundSetQuery,
} from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { animalFactsOf, animalLabel, farmGrowingAnimalsOf, type AnimalFacts } from '../animals/animal-facts.service';
import { attachWeighInsToRound, insertRoundWeighIns, latestWeightsOf, roundWeighInsOf } from '../animals/weigh-ins.service';
import { breedMapOf } from '../breeds/breeds.service';
import { addMessage, ensureCan, farmOf, refuseOrConfirm, type FieldMessages } from '../farms/farm-access';
import { farmTodayOf } from '../farms/farm-clock';
import { kitsInGroupsByLitter } from '../grow-out/grow-out-facts.service';
import { groupsToWeigh, weighGroupIn } from '../grow-out/grow-out.service';
import { litterFactsOf, type LitterFacts } from '../litters/litter-facts.service';
import { namesOf } from '../users/users.service';

/*
 * A weighing round: a breeder weighs one head after another on a phone and saves the whole round at
 * once, in one transaction. Animals get their own weigh-ins; the kits of a grow-out group or of a litter
 * become one weigh-in of that group or litter, kit by kit.
 */

const sexWords = { doe: 'doe', buck: 'buck', unknown: 'sex not known' } as const;

/** A short name for a phone's big heading: the name, else the tattoo (the tattoo goes in the line below). */
const shortName = (a: Pick<AnimalFacts, 'name' | 'tattoo'> | undefined) => a?.name || a?.tattoo || 'Unnamed';

function farmFor(actor: SessionUser): string {
  const farmId = farmOf(actor, 'Only a member of a farm weighs animals');
  ensureCan(actor, 'create', 'WeighIn', { farmId, enteredBy: actor.id }, 'That farm', 'You may not record weights here');
  return farmId;
}

async function sizeClassOf(tx: Transaction, coopId: string, animal: AnimalFacts | undefined): Promise<SizeClass> {
  if (!animal?.breedId) return 'medium';
  return (await breedMapOf(coopId, tx)).get(animal.breedId)?.sizeClass ?? 'medium';
}

/** Kits of a litter not yet taken into a grow-out group (those are weighed with their group). */
async function littersToWeigh(tx: Transaction, coopId: string, farmId: string, litterIds: string[]): Promise<Map<string, LitterFacts & { heads: number }>> {
  const facts = await litterFactsOf(tx, coopId, litterIds);
  const inGroups = await kitsInGroupsByLitter(tx, coopId, farmId);
  const result = new Map<string, LitterFacts & { heads: number }>();
  for (const l of facts.values()) {
    if (l.farmId !== farmId) continue;
    const taken = (inGroups.get(l.id) ?? []).reduce((n, g) => n + g.heads, 0);
    result.set(l.id, { ...l, heads: Math.max(l.alive - taken, 0) });
  }
  return result;
}

function animalCandidate(a: AnimalFacts, today: string, sizeClass: SizeClass, last: { gramsPerHead: number; weighedOn: string } | undefined): WeighingRoundCandidateDto {
  const ageDays = a.birthDate ? daysBetween(a.birthDate, today) : null;
  return {
    kind: 'animal', id: a.id, kitNumber: null, kitCount: null,
    label: shortName(a),
    detail: [a.name && a.tattoo ? a.tattoo : null, sexWords[a.sex], a.breedName].filter(Boolean).join(' · '),
    sex: a.sex, ageDays, sizeClass,
    last: last ? { ...last, ageDays: a.birthDate && last.weighedOn >= a.birthDate ? daysBetween(a.birthDate, last.weighedOn) : null } : null,
    band: expectedBandForAge(ageDays, sizeClass),
  };
}

function kitCandidates(
  kind: 'group' | 'litter', id: string, label: string, heads: number, birthDate: string, today: string, sizeClass: SizeClass,
  last: { gramsPerHead: number; weighedOn: string } | null | undefined,
): WeighingRoundCandidateDto[] {
  const ageDays = daysBetween(birthDate, today);
  return Array.from({ length: heads }, (_, i) => ({
    kind, id, kitNumber: i + 1, kitCount: heads, label: `${label}, kit ${i + 1} of ${heads}`, detail: label,
    sex: null, ageDays, sizeClass,
    last: last ? { ...last, ageDays: last.weighedOn >= birthDate ? daysBetween(birthDate, last.weighedOn) : null } : null,
    band: expectedBandForAge(ageDays, sizeClass),
  }));
}

async function litterTitle(tx: Transaction, coopId: string, l: LitterFacts): Promise<{ title: string; sizeClass: SizeClass }> {
  const dam = (await animalFactsOf(tx, coopId, [l.damId])).get(l.damId);
  return { title: `${shortName(dam)}'s litter of ${l.kindledOn}`, sizeClass: await sizeClassOf(tx, coopId, dam) };
}

/** The heads a round weighs, in order, each with its last weight and the usual band for its age. */
export async function roundCandidates(actor: SessionUser, q: WeighingRoundSetQuery): Promise<WeighingRoundCandidatesDto> {
  const farmId = farmFor(actor);
  return withTenant(actor, async (tx) => {
    const today = await farmTodayOf(tx, actor.coopId, farmId);
    const coopId = actor.coopId;
    if (q.set === 'group') {
      const [group] = await groupsToWeigh(tx, coopId, farmId, today, [q.groupId]);
      if (!group) throw AppError.notFound('That group');
      if (group.status === 'closed') throw AppError.conflict(`${group.name} is closed`);
      return { title: group.name, today, candidates: kitCandidates('group', group.id, group.name, group.heads, group.birthDate, today, group.sizeClass, group.last) };
    }
    if (q.set === 'litter') {
      const litter = (await littersToWeigh(tx, coopId, farmId, [q.litterId])).get(q.litterId);
      if (!litter) throw AppError.notFound('That litter');
      const { title, sizeClass } = await litterTitle(tx, coopId, litter);
      const last = (await latestWeightsOf(tx, coopId, farmId, 'litter_id', [litter.id])).get(litter.id);
      return { title, today, candidates: kitCandidates('litter', litter.id, title, litter.heads, litter.kindledOn, today, sizeClass, last) };
    }
    const breeds = await breedMapOf(coopId, tx);
    const sizeOf = (a: AnimalFacts): SizeClass => (a.breedId ? breeds.get(a.breedId)?.sizeClass : undefined) ?? 'medium';
    if (q.set === 'animals') {
      const facts = await animalFactsOf(tx, coopId, q.animalIds);
      const errors: FieldMessages = {};
      const animals = q.animalIds.map((id) => facts.get(id)).filter((a): a is AnimalFacts => Boolean(a));
      if (animals.length !== new Set(q.animalIds).size || animals.some((a) => a.isOutside || a.keepingFarmId !== farmId || a.disposition !== 'on_farm')) {
        addMessage(errors, 'animalIds', 'Choose animals your farm keeps');
        throw AppError.validation(errors);
      }
      const lasts = await latestWeightsOf(tx, coopId, farmId, 'animal_id', animals.map((a) => a.id));
      return { title: animals.length === 1 ? shortName(animals[0]) : `${animals.length} animals`, today, candidates: animals.map((a) => animalCandidate(a, today, sizeOf(a), lasts.get(a.id))) };
    }
    const young = await farmGrowingAnimalsOf(tx, coopId, farmId);
    const lasts = await latestWeightsOf(tx, coopId, farmId, 'animal_id', young.map((a) => a.id));
    const groups = await groupsToWeigh(tx, coopId, farmId, today);
    return {
      title: 'Every growing animal',
      today,
      candidates: [
        ...young.map((a) => animalCandidate(a, today, sizeOf(a), lasts.get(a.id))),
        ...groups.flatMap((g) => kitCandidates('group', g.id, g.name, g.heads, g.birthDate, today, g.sizeClass, g.last)),
      ],
    };
  });
}

interface RoundRow { id: string; farm_id: string; entered_by: string; weighed_on: string }

async function presentRound(tx: Transaction, round: RoundRow): Promise<WeighingRoundDto> {
  const weighIns = await roundWeighInsOf(tx, round.id);
  const names = await namesOf([round.entered_by], tx);
  const state: ReviewState = weighIns.some((w) => w.reviewState === 'pending') ? 'pending' : 'accepted';
  return {
    id: round.id, weighedOn: round.weighed_on, enteredBy: { id: round.entered_by, name: names.get(round.entered_by) ?? 'Someone' }, reviewState: state,
    weighIns: weighIns.map((w) => ({
      id: w.id, kind: w.animalId ? 'animal' : w.groupId ? 'group' : 'litter', subjectId: (w.animalId ?? w.groupId ?? w.litterId)!, totalGrams: w.totalGrams, headCount: w.headCount,
    })),
  };
}

/**
 * Saves a whole round in one transaction. The round's id is its idempotency key: the same round again
 * (a retry after a lost answer, a double tap) answers what the first save wrote; someone else's id is a
 * 409. Refused with nothing written: an animal the farm does not keep, a group or litter not the farm's,
 * more kits than it has, a date in the future or before birth, a weight impossible for the age (400). A
 * weight outside the usual band for the age or a tenth below the last weigh-in asks for confirmation
 * (422, each such entry named) until that entry is confirmed. An apprentice's weights wait for review.
 */
export async function saveRound(actor: SessionUser, input: WeighingRoundCreateInput): Promise<{ round: WeighingRoundDto; created: boolean }> {
  const farmId = farmFor(actor);
  return withTenant(actor, async (tx) => {
    const coopId = actor.coopId;
    // Claims the id first: a second save of the same round waits here for the first to commit, then finds it.
    const claimed = await database().query<RoundRow>(
      `INSERT INTO weighing_rounds (id, coop_id, farm_id, weighed_on, entered_by) VALUES ($1, $2, $3, $4, $5)
       ON CONFLICT (id) DO NOTHING RETURNING id, farm_id, entered_by, weighed_on::text AS weighed_on`,
      { bind: [input.id, coopId, farmId, input.weighedOn, actor.id], type: QueryTypes.SELECT, transaction: tx },
    );
    if (claimed.length === 0) {
      const [existing] = await database().query<RoundRow>(
        `SELECT id, farm_id, entered_by, weighed_on::text AS weighed_on FROM weighing_rounds WHERE id = $1`,
        { bind: [input.id], type: QueryTypes.SELECT, transaction: tx },
      );
      if (!existing || existing.farm_id !== farmId || existing.entered_by !== actor.id) throw AppError.idTaken();
      return { round: await presentRound(tx, existing), created: false };
    }
    await writeRound(tx, actor, farmId, input);
    tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.herdChanged, { farmId, animalId: null }));
    return { round: await presentRound(tx, claimed[0]!), created: true };
  });
}

async function writeRound(tx: Transaction, actor: SessionUser, farmId: string, input: WeighingRoundCreateInput): Promise<void> {
  const coopId = actor.coopId;
  const today = await farmTodayOf(tx, coopId, farmId);
  const errors: FieldMessages = {};
  const warnings: FieldMessages = {};
  if (input.weighedOn > today) addMessage(errors, 'weighedOn', `${input.weighedOn} is in the future (today is ${today})`);

  const ids = (key: 'animalId' | 'groupId' | 'litterId') => [...new Set(input.entries.map((e) => e[key]).filter((v): v is string => Boolean(v)))];
  const animals = await animalFactsOf(tx, coopId, ids('animalId'));
  const groups = new Map((await groupsToWeigh(tx, coopId, farmId, input.weighedOn, ids('groupId'))).map((g) => [g.id, g]));
  const litters = await littersToWeigh(tx, coopId, farmId, ids('litterId'));
  const breeds = await breedMapOf(coopId, tx);
  const animalLasts = await latestWeightsOf(tx, coopId, farmId, 'animal_id', ids('animalId'));
  const litterLasts = await latestWeightsOf(tx, coopId, farmId, 'litter_id', ids('litterId'));
  const litterSizes = new Map<string, SizeClass>();
  for (const l of litters.values()) litterSizes.set(l.id, (await litterTitle(tx, coopId, l)).sizeClass);

  const kitsOf = new Map<string, number[]>();
  const seenAnimals = new Set<string>();
  input.entries.forEach((e, i) => {
    const field = `entries.${i}`;
    let birthDate: string | null = null;
    let sizeClass: SizeClass;
    let last: { gramsPerHead: number; weighedOn: string } | null | undefined;
    if (e.animalId) {
      const a = animals.get(e.animalId);
      if (!a || a.isOutside || a.keepingFarmId !== farmId || a.disposition !== 'on_farm') return addMessage(errors, `${field}.animalId`, 'Choose an animal your farm keeps');
      if (seenAnimals.has(a.id)) return addMessage(errors, `${field}.animalId`, `${animalLabel(a)} is weighed twice in this round`);
      seenAnimals.add(a.id);
      birthDate = a.birthDate;
      sizeClass = (a.breedId ? breeds.get(a.breedId)?.sizeClass : undefined) ?? 'medium';
      last = animalLasts.get(a.id);
    } else if (e.groupId) {
      const g = groups.get(e.groupId);
      if (!g || g.status === 'closed') return addMessage(errors, `${field}.groupId`, 'Choose a growing group of your farm');
      const kits = [...(kitsOf.get(`g:${g.id}`) ?? []), e.grams];
      kitsOf.set(`g:${g.id}`, kits);
      if (kits.length > g.heads) return addMessage(errors, `${field}.groupId`, `${g.name} has ${g.heads} head${g.heads === 1 ? '' : 's'}; this is kit ${kits.length}`);
      birthDate = g.birthDate;
      sizeClass = g.sizeClass;
      last = g.last;
    } else {
      const l = litters.get(e.litterId!);
      if (!l) return addMessage(errors, `${field}.litterId`, 'Choose a litter of your farm');
      const kits = [...(kitsOf.get(`l:${l.id}`) ?? []), e.grams];
      kitsOf.set(`l:${l.id}`, kits);
      if (kits.length > l.heads) return addMessage(errors, `${field}.litterId`, `The litter has ${l.heads} kit${l.heads === 1 ? '' : 's'} to weigh; this is kit ${kits.length}`);
      birthDate = l.kindledOn;
      sizeClass = litterSizes.get(l.id) ?? 'medium';
      last = litterLasts.get(l.id);
    }
    if (birthDate && input.weighedOn < birthDate) return addMessage(errors, `${field}.grams`, `That is before it was born (${birthDate})`);
    const ageOn = (date: string) => (birthDate && date >= birthDate ? daysBetween(birthDate, date) : null);
    // A kit is not told apart from its litter-mates, so only an animal's own last weight can show a drop.
    const own = e.animalId && last ? { ...last, ageDays: ageOn(last.weighedOn) } : null;
    const check = checkRoundWeight({ gramsPerHead: e.grams, ageDays: ageOn(input.weighedOn), sizeClass, weighedOn: input.weighedOn, last: own });
    if (check?.level === 'error') addMessage(errors, `${field}.grams`, check.message);
    else if (check && !e.confirmed) addMessage(warnings, `${field}.grams`, check.message);
  });
  refuseOrConfirm(errors, warnings, false);

  const reviewState: ReviewState = actor.role === 'apprentice' ? 'pending' : 'accepted';
  const base = { coopId, farmId, roundId: input.id, weighedOn: input.weighedOn, enteredBy: actor.id, reviewState };
  await insertRoundWeighIns(tx, [
    ...input.entries.filter((e) => e.animalId).map((e) => ({ ...base, animalId: e.animalId!, litterId: null, groupLabel: null, totalGrams: e.grams, headCount: 1, kitWeights: null })),
    ...[...litters.values()].filter((l) => kitsOf.has(`l:${l.id}`)).map((l) => {
      const kits = kitsOf.get(`l:${l.id}`)!;
      return {
        ...base, animalId: null, litterId: l.id, groupLabel: `Litter of ${l.kindledOn}`,
        totalGrams: kits.reduce((n, g) => n + g, 0), headCount: kits.length, kitWeights: kits.map((grams) => ({ label: null, grams })),
      };
    }),
  ]);
  // Grow-out writes its own weigh-ins (its checks, and the Almanac's weigh-in tasks it completes).
  const groupWeighInIds: string[] = [];
  for (const g of groups.values()) {
    const kits = kitsOf.get(`g:${g.id}`);
    if (!kits) continue;
    const id = randomUUID();
    groupWeighInIds.push(id);
    await weighGroupIn(tx, actor, g.id, { id, weighedOn: input.weighedOn, kits: kits.map((grams) => ({ label: '', grams })), note: '' });
  }
  await attachWeighInsToRound(tx, groupWeighInIds, input.id);
}
