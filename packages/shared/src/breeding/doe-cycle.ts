import { addDays, daysBetween } from '../herd/herd-dates';
import { MEDIUM_BREED_FIRST_BREEDING_DAYS } from '../herd/first-breeding';
import type { CycleSettings } from './cycle-settings';

/**
 * Where a doe stands in her cycle on the farm's today, and the next job with its date: the doe board, the
 * herd list's column and her page all read it from here, so server and screen never disagree. Pure: the
 * facts are her latest service (with its latest palpation) and her latest litter with its kits still on
 * her; the days come from the farm's cycle settings.
 */

export const doeCycleStates = ['growing', 'open', 'serviced', 'palpated_positive', 'due', 'overdue', 'nursing', 'resting'] as const;
export type DoeCycleStateKind = (typeof doeCycleStates)[number];

export const doeNextActionKinds = ['first_service', 'breed', 'palpate', 'nest_box_in', 'kindle', 'check_doe', 'nest_box_out', 'breed_back', 'wean'] as const;
export type DoeNextActionKind = (typeof doeNextActionKinds)[number];

export const DOE_NEXT_ACTION_LABELS: Readonly<Record<DoeNextActionKind, string>> = Object.freeze({
  first_service: 'First service',
  breed: 'Breed',
  palpate: 'Palpate',
  nest_box_in: 'Nest box in',
  kindle: 'Kindling expected',
  check_doe: 'Check the doe',
  nest_box_out: 'Nest box out',
  breed_back: 'Breed back',
  wean: 'Wean',
});

export interface DoeCycleFacts {
  birthDate: string | null;
  /** Her first service is usual from this age (days); the medium-breed age when her breed is unknown. */
  firstBreedingDays?: number | null;
  /** Her latest service of this farm, whatever became of it. */
  service: {
    servicedOn: string;
    status: 'open' | 'kindled' | 'empty' | 'missed';
    closedOn: string | null;
    palpation: { palpatedOn: string; result: 'positive' | 'negative' } | null;
  } | null;
  /** Her latest litter of this farm: kits still with her and the day the last were weaned. */
  litter: { kindledOn: string; onDoe: number; weanedOn: string | null } | null;
}

export interface DoeNextAction {
  kind: DoeNextActionKind;
  label: string;
  on: string;
  /** Days past its date (0 when due today or later). */
  daysLate: number;
}

export interface DoeCycleState {
  state: DoeCycleStateKind;
  /** Day after the service, or the litter's age (null when neither applies). */
  day: number | null;
  /** Kits with her (nursing only). */
  kits: number | null;
  /** Days to the expected kindling (due only; 0 on the day, negative past it). */
  dueInDays: number | null;
  /** In words, e.g. "Serviced, day 9" or "Nursing 7 kits, day 12". */
  label: string;
  next: DoeNextAction | null;
}

interface Candidate {
  kind: DoeNextActionKind;
  on: string;
}

function action(c: Candidate, today: string): DoeNextAction {
  return { kind: c.kind, label: DOE_NEXT_ACTION_LABELS[c.kind], on: c.on, daysLate: Math.max(0, daysBetween(c.on, today)) };
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The next job of an open service. Jobs a later record proves done (a palpation, a kindling) stay next
 * until recorded, late if need be; the nest box leaves no record, so it is next only until its day passes.
 */
function serviceCandidate(servicedOn: string, palpated: boolean, today: string, s: CycleSettings): Candidate {
  const day = daysBetween(servicedOn, today);
  if (!palpated && day < s.nestBoxInDays) return { kind: 'palpate', on: addDays(servicedOn, s.palpationDays) };
  if (day <= s.nestBoxInDays) return { kind: 'nest_box_in', on: addDays(servicedOn, s.nestBoxInDays) };
  if (day < s.kindlingOverdueDays) return { kind: 'kindle', on: addDays(servicedOn, s.kindlingExpectedDays) };
  return { kind: 'check_doe', on: addDays(servicedOn, s.kindlingOverdueDays) };
}

function earliest(candidates: Candidate[]): Candidate {
  return candidates.reduce((a, b) => (b.on < a.on ? b : a));
}

export function doeCycleState(facts: DoeCycleFacts, today: string, settings: CycleSettings): DoeCycleState {
  const { service, litter } = facts;
  // A service older than her latest litter is that litter's (or a stale one): the litter tells more.
  const openService = service && service.status === 'open' && (!litter || service.servicedOn > litter.kindledOn) ? service : null;
  const bredAfterLitter = Boolean(litter && service && service.servicedOn > litter.kindledOn);

  if (litter && litter.onDoe > 0) {
    const day = daysBetween(litter.kindledOn, today);
    const candidates: Candidate[] = [{ kind: 'wean', on: addDays(litter.kindledOn, settings.weaningDays) }];
    const nestBoxOut = addDays(litter.kindledOn, settings.nestBoxOutDays);
    if (nestBoxOut >= today) candidates.push({ kind: 'nest_box_out', on: nestBoxOut });
    if (openService) candidates.push(serviceCandidate(openService.servicedOn, Boolean(openService.palpation), today, settings));
    else if (!bredAfterLitter && settings.breedBackDays < settings.weaningDays) {
      candidates.push({ kind: 'breed_back', on: addDays(litter.kindledOn, settings.breedBackDays) });
    }
    return {
      state: 'nursing', day, kits: litter.onDoe, dueInDays: null,
      label: `Nursing ${plural(litter.onDoe, 'kit', 'kits')}, day ${day}`,
      next: action(earliest(candidates), today),
    };
  }

  if (openService) {
    const day = daysBetween(openService.servicedOn, today);
    const next = action(serviceCandidate(openService.servicedOn, Boolean(openService.palpation), today, settings), today);
    if (day >= settings.kindlingOverdueDays) {
      return { state: 'overdue', day, kits: null, dueInDays: null, label: `Day ${day} after service, no kits recorded`, next };
    }
    if (day >= settings.nestBoxInDays) {
      const dueIn = settings.kindlingExpectedDays - day;
      const label = dueIn > 0 ? `Due in ${plural(dueIn, 'day', 'days')}` : dueIn === 0 ? 'Due today' : `Due, ${plural(-dueIn, 'day', 'days')} past the expected day`;
      return { state: 'due', day, kits: null, dueInDays: dueIn, label, next };
    }
    if (openService.palpation?.result === 'positive') {
      return { state: 'palpated_positive', day, kits: null, dueInDays: null, label: `Palpated positive, day ${day}`, next };
    }
    return { state: 'serviced', day, kits: null, dueInDays: null, label: `Serviced, day ${day}`, next };
  }

  // Neither nursing nor bred: resting after a weaning until the breed-back day, else open.
  const litterIsLatest = litter && !bredAfterLitter;
  const breedBack = litterIsLatest ? addDays(litter.kindledOn, settings.breedBackDays) : null;
  if (breedBack && litter!.weanedOn && breedBack > today) {
    return { state: 'resting', day: null, kits: null, dueInDays: null, label: 'Resting after weaning', next: action({ kind: 'breed', on: breedBack }, today) };
  }
  if (!service && !litter && facts.birthDate) {
    const firstService = addDays(facts.birthDate, facts.firstBreedingDays ?? MEDIUM_BREED_FIRST_BREEDING_DAYS.doe);
    if (firstService > today) {
      return { state: 'growing', day: null, kits: null, dueInDays: null, label: 'Growing, not yet bred', next: action({ kind: 'first_service', on: firstService }, today) };
    }
    return { state: 'open', day: null, kits: null, dueInDays: null, label: 'Open, not bred', next: action({ kind: 'first_service', on: firstService }, today) };
  }
  let breedOn = today;
  if (breedBack) breedOn = breedBack;
  else if (service?.status === 'empty' && service.closedOn) breedOn = addDays(service.closedOn, settings.rebreedAfterNegativeDays);
  else if (service?.closedOn) breedOn = service.closedOn;
  return { state: 'open', day: null, kits: null, dueInDays: null, label: 'Open, not bred', next: action({ kind: 'breed', on: breedOn }, today) };
}

/** The doe board's order "by what is due": the earliest next job first, does with none last. */
export function compareByDue(a: DoeCycleState, b: DoeCycleState): number {
  const x = a.next?.on ?? '9999-12-31';
  const y = b.next?.on ?? '9999-12-31';
  return x < y ? -1 : x > y ? 1 : 0;
}
