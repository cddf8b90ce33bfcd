import {
  daysBetween, kitCount, litterSummary, LitterCountError, type AnimalRefDto, type FarmRefDto, type LitterDto, type LitterEventDto,
  type LitterListItemDto, type LitterRecord, type LitterSummary,
} from '@burrowline/shared';
import type { Litter } from './litter.model';
import type { LitterEvent } from './litter-event.model';

/** What of an entry the kit-count rules read (a model instance, or a plain row a list reads). */
export type CountedEvent = Pick<LitterEvent, 'id' | 'kind' | 'occurredOn' | 'kitCount' | 'cause' | 'otherLitterId' | 'reviewState' | 'deletedAt'>;

/** Events that count toward the kit count: accepted, and an apprentice's still waiting (shown as unverified); returned ones do not. */
export function countingEvents<E extends CountedEvent>(events: E[]): E[] {
  return events.filter((e) => e.reviewState !== 'returned' && !e.deletedAt);
}

/** The litter as the shared kit-count rules read it. */
export function recordOf(litter: Pick<Litter, 'id' | 'kindledOn' | 'bornAlive' | 'bornDead'>, events: CountedEvent[]): LitterRecord {
  return {
    id: litter.id,
    kindledOn: litter.kindledOn,
    bornAlive: litter.bornAlive,
    bornDead: litter.bornDead,
    events: countingEvents(events).map((e) => {
      const base = { id: e.id, on: e.occurredOn, count: e.kitCount };
      switch (e.kind) {
        case 'fostered_in':
        case 'fostered_out':
          return { ...base, kind: e.kind, otherLitterId: e.otherLitterId! };
        case 'lost':
          return { ...base, kind: 'lost' as const, cause: e.cause ?? 'unknown' };
        case 'culled':
          return { ...base, kind: 'culled' as const, ...(e.cause ? { reason: e.cause } : {}) };
        default:
          return { ...base, kind: 'weaned' as const };
      }
    }),
  };
}

/** The litter's figures; a record made impossible by a later correction still shows, clamped at zero. */
export function summaryOf(record: LitterRecord): LitterSummary {
  try {
    return litterSummary(record);
  } catch (error) {
    if (!(error instanceof LitterCountError)) throw error;
    const sum = (kind: string) => record.events.filter((e) => e.kind === kind).reduce((n, e) => n + e.count, 0);
    const t = { fosteredIn: sum('fostered_in'), fosteredOut: sum('fostered_out'), lost: sum('lost'), culled: sum('culled'), weaned: sum('weaned') };
    const raised = record.bornAlive + t.fosteredIn - t.fosteredOut;
    return {
      bornAlive: record.bornAlive, bornDead: record.bornDead, totalBorn: record.bornAlive + record.bornDead, ...t,
      onDoe: Math.max(0, raised - t.lost - t.culled - t.weaned), raised, survivalToWeaning: null,
      weanedOn: record.events.filter((e) => e.kind === 'weaned').at(-1)?.on ?? null, lossesByCause: {},
    };
  }
}

/** Kits with the doe after each dated change, from the kindling on. */
export function countHistoryOf(record: LitterRecord): { on: string; count: number }[] {
  const dates = [...new Set(record.events.map((e) => e.on))].sort();
  const history = [{ on: record.kindledOn, count: record.bornAlive }];
  for (const on of dates) {
    try {
      history.push({ on, count: kitCount(record, on) });
    } catch {
      break;
    }
  }
  return history;
}

export interface LitterPresentContext {
  animal: (id: string) => AnimalRefDto;
  farm: (id: string) => FarmRefDto;
  names: Map<string, string>;
  today: string;
  viewerFarmId: string | null;
  /** Other litters named by fosterings: farm, dam, kindling date. */
  litters: Map<string, Pick<Litter, 'id' | 'farmId' | 'damId' | 'kindledOn'>>;
}

export function presentEvent(e: LitterEvent, ctx: LitterPresentContext): LitterEventDto {
  const other = e.otherLitterId ? ctx.litters.get(e.otherLitterId) : undefined;
  return {
    id: e.id,
    kind: e.kind,
    on: e.occurredOn,
    count: e.kitCount,
    cause: e.cause,
    deathCause: e.deathCause ?? null,
    weaningWeightGrams: e.weaningWeightGrams ?? null,
    otherLitter: e.otherLitterId
      ? {
          id: e.otherLitterId,
          farm: other ? ctx.farm(other.farmId) : { id: '', name: 'Another farm' },
          dam: other ? ctx.animal(other.damId) : null,
          kindledOn: other?.kindledOn ?? null,
          isOwnFarm: other?.farmId === ctx.viewerFarmId,
        }
      : null,
    enteredBy: e.enteredBy ? { id: e.enteredBy, name: ctx.names.get(e.enteredBy) ?? 'Someone' } : null,
    fromOtherFarm: e.kind === 'fostered_in' && other !== undefined && other.farmId !== e.farmId,
    reviewState: e.reviewState,
    reviewComment: e.reviewComment,
    version: e.version,
  };
}

export function presentLitterListItem(
  litter: Pick<Litter, 'id' | 'farmId' | 'damId' | 'sireId' | 'serviceId' | 'kindledOn' | 'bornAlive' | 'bornDead'>,
  summary: LitterSummary,
  ctx: Pick<LitterPresentContext, 'animal' | 'today'>,
  serviceId = litter.serviceId,
): LitterListItemDto {
  return {
    id: litter.id,
    farmId: litter.farmId,
    dam: ctx.animal(litter.damId),
    sire: ctx.animal(litter.sireId),
    serviceId,
    kindledOn: litter.kindledOn,
    ageDays: daysBetween(litter.kindledOn, ctx.today),
    bornAlive: litter.bornAlive,
    bornDead: litter.bornDead,
    onDoe: summary.onDoe,
    weaned: summary.weaned,
    status: summary.onDoe > 0 ? 'nursing' : 'weaned',
  };
}

export function presentLitter(
  litter: Litter,
  parts: Pick<LitterDto, 'servicedOn' | 'tasks' | 'keepers' | 'fosteredInFrom' | 'housing'> & { events: LitterEvent[] },
  ctx: LitterPresentContext,
): LitterDto {
  const record = recordOf(litter, parts.events);
  const summary = summaryOf(record);
  return {
    ...presentLitterListItem(litter, summary, ctx),
    servicedOn: parts.servicedOn,
    notes: litter.notes,
    summary,
    countHistory: countHistoryOf(record),
    events: [...parts.events]
      .sort((a, b) => a.occurredOn.localeCompare(b.occurredOn) || a.createdAt.getTime() - b.createdAt.getTime())
      .map((e) => presentEvent(e, ctx)),
    tasks: parts.tasks,
    keepers: parts.keepers,
    fosteredInFrom: parts.fosteredInFrom,
    housing: parts.housing,
    pendingReview: parts.events.filter((e) => e.reviewState === 'pending').length,
    version: litter.version,
  };
}
