import { isIsoDate } from '../herd/herd-dates';

/**
 * A litter's kit count is never typed in: it follows from the kindling (born alive) and every dated
 * change after it. Fostering moves kits between litters (possibly on another farm) without changing
 * their parentage, which stays with the litter they were born in.
 */

export const litterEventKinds = ['fostered_in', 'fostered_out', 'lost', 'culled', 'weaned'] as const;
export type LitterEventKind = (typeof litterEventKinds)[number];

interface EventBase {
  /** The stored event's id, echoed in issues so the screen can point at the row. */
  id?: string;
  on: string;
  count: number;
}

export type LitterEvent =
  | (EventBase & { kind: 'fostered_in' | 'fostered_out'; /** The other litter (this farm's or another's). */ otherLitterId: string })
  | (EventBase & { kind: 'lost'; cause: string })
  | (EventBase & { kind: 'culled'; reason?: string })
  | (EventBase & { kind: 'weaned' });

export interface LitterRecord {
  id?: string;
  kindledOn: string;
  bornAlive: number;
  bornDead: number;
  events: ReadonlyArray<LitterEvent>;
}

export type LitterIssueCode =
  | 'bad_date'
  | 'bad_count'
  | 'before_kindling'
  | 'in_future'
  | 'no_other_litter'
  | 'fostered_with_itself'
  | 'no_cause'
  | 'more_than_on_doe'
  | 'foster_mismatch';

export interface LitterIssue {
  code: LitterIssueCode;
  message: string;
  /** Index into `events` (null for the kindling's own counts). */
  eventIndex: number | null;
  eventId?: string;
  field?: 'bornAlive' | 'bornDead' | 'kindledOn' | 'on' | 'count' | 'otherLitterId' | 'cause';
}

export class LitterCountError extends Error {
  constructor(readonly issues: LitterIssue[]) {
    super(issues.map((issue) => issue.message).join('; '));
    this.name = 'LitterCountError';
  }
}

const adds = (kind: LitterEventKind) => kind === 'fostered_in';

const kindWords: Record<LitterEventKind, string> = {
  fostered_in: 'Fostered in',
  fostered_out: 'Fostered out',
  lost: 'Lost',
  culled: 'Culled',
  weaned: 'Weaned',
};

/** Events in the order they are applied: by date; on one day kits fostered in come before kits leaving. */
function ordered(events: ReadonlyArray<LitterEvent>): { event: LitterEvent; index: number }[] {
  return events
    .map((event, index) => ({ event, index }))
    .sort((a, b) => (a.event.on < b.event.on ? -1 : a.event.on > b.event.on ? 1 : 0)
      || Number(adds(b.event.kind)) - Number(adds(a.event.kind))
      || a.index - b.index);
}

interface Tally {
  fosteredIn: number;
  fosteredOut: number;
  lost: number;
  culled: number;
  weaned: number;
}

const emptyTally = (): Tally => ({ fosteredIn: 0, fosteredOut: 0, lost: 0, culled: 0, weaned: 0 });

function apply(tally: Tally, event: LitterEvent): void {
  switch (event.kind) {
    case 'fostered_in': tally.fosteredIn += event.count; break;
    case 'fostered_out': tally.fosteredOut += event.count; break;
    case 'lost': tally.lost += event.count; break;
    case 'culled': tally.culled += event.count; break;
    case 'weaned': tally.weaned += event.count; break;
  }
}

const onDoe = (bornAlive: number, t: Tally) => bornAlive + t.fosteredIn - t.fosteredOut - t.lost - t.culled - t.weaned;

const kits = (n: number) => (n === 1 ? '1 kit' : `${n} kits`);

/**
 * Every reason the litter's record cannot be true, each with a clear message: bad or negative counts,
 * events before the kindling or (given `today`) in the future, a fostering that names no other litter,
 * a loss without a cause, and more kits leaving than were with the doe at that date.
 */
export function validateLitter(litter: LitterRecord, today?: string): LitterIssue[] {
  const issues: LitterIssue[] = [];
  const whole = (n: number) => Number.isInteger(n) && n >= 0;
  if (!isIsoDate(litter.kindledOn)) {
    issues.push({ code: 'bad_date', field: 'kindledOn', eventIndex: null, message: 'The kindling date is not a YYYY-MM-DD date' });
    return issues;
  }
  if (today && litter.kindledOn > today) {
    issues.push({ code: 'in_future', field: 'kindledOn', eventIndex: null, message: `The kindling date ${litter.kindledOn} is in the future` });
  }
  if (!whole(litter.bornAlive)) {
    issues.push({ code: 'bad_count', field: 'bornAlive', eventIndex: null, message: 'Born alive must be a whole number, 0 or more' });
  }
  if (!whole(litter.bornDead)) {
    issues.push({ code: 'bad_count', field: 'bornDead', eventIndex: null, message: 'Born dead must be a whole number, 0 or more' });
  }
  litter.events.forEach((event, index) => {
    const at = { eventIndex: index, ...(event.id ? { eventId: event.id } : {}) };
    const what = kindWords[event.kind];
    if (!isIsoDate(event.on)) {
      issues.push({ ...at, code: 'bad_date', field: 'on', message: `${what}: the date is not a YYYY-MM-DD date` });
      return;
    }
    if (!Number.isInteger(event.count) || event.count < 1) {
      issues.push({ ...at, code: 'bad_count', field: 'count', message: `${what}: the number of kits must be a whole number, at least 1` });
    }
    if (event.on < litter.kindledOn) {
      issues.push({ ...at, code: 'before_kindling', field: 'on', message: `${what} on ${event.on}, before the kindling on ${litter.kindledOn}` });
    }
    if (today && event.on > today) {
      issues.push({ ...at, code: 'in_future', field: 'on', message: `${what} on ${event.on}, a date in the future` });
    }
    if (event.kind === 'fostered_in' || event.kind === 'fostered_out') {
      if (!event.otherLitterId) issues.push({ ...at, code: 'no_other_litter', field: 'otherLitterId', message: `${what}: name the other litter` });
      else if (litter.id && event.otherLitterId === litter.id) {
        issues.push({ ...at, code: 'fostered_with_itself', field: 'otherLitterId', message: `${what}: the other litter is this litter` });
      }
    }
    if (event.kind === 'lost' && !event.cause?.trim()) {
      issues.push({ ...at, code: 'no_cause', field: 'cause', message: 'Lost: say what happened (cause unknown is a cause)' });
    }
  });
  if (issues.length > 0) return issues;

  const tally = emptyTally();
  for (const { event, index } of ordered(litter.events)) {
    const before = onDoe(litter.bornAlive, tally);
    apply(tally, event);
    if (!adds(event.kind) && event.count > before) {
      const t = { ...tally };
      // the sum as it stood before this event
      if (event.kind === 'fostered_out') t.fosteredOut -= event.count;
      else if (event.kind === 'lost') t.lost -= event.count;
      else if (event.kind === 'culled') t.culled -= event.count;
      else t.weaned -= event.count;
      issues.push({
        code: 'more_than_on_doe', field: 'count', eventIndex: index, ...(event.id ? { eventId: event.id } : {}),
        message: `${kindWords[event.kind]} ${kits(event.count)} on ${event.on}, but only ${kits(before)} ${before === 1 ? 'was' : 'were'} with the doe `
          + `(born alive ${litter.bornAlive} + fostered in ${t.fosteredIn} − fostered out ${t.fosteredOut} − lost ${t.lost} − culled ${t.culled}`
          + ` − weaned ${t.weaned})`,
      });
      return issues;
    }
  }
  return issues;
}

function assertValid(litter: LitterRecord): void {
  const issues = validateLitter(litter);
  if (issues.length > 0) throw new LitterCountError(issues);
}

/** Kits with the doe at the end of `onDate` (default: after every event). Throws LitterCountError on an impossible record. */
export function kitCount(litter: LitterRecord, onDate?: string): number {
  assertValid(litter);
  if (onDate !== undefined && onDate < litter.kindledOn) return 0;
  const tally = emptyTally();
  for (const { event } of ordered(litter.events)) {
    if (onDate !== undefined && event.on > onDate) break;
    apply(tally, event);
  }
  return onDoe(litter.bornAlive, tally);
}

export interface LitterSummary {
  bornAlive: number;
  bornDead: number;
  totalBorn: number;
  fosteredIn: number;
  fosteredOut: number;
  lost: number;
  culled: number;
  weaned: number;
  /** Kits still with the doe. */
  onDoe: number;
  /** Kits this doe nursed: born alive + fostered in − fostered out. */
  raised: number;
  /**
   * Weaned ÷ raised, 0–1, once no kit is left with the doe; null before that or when she raised none.
   * Lost and culled kits count as not surviving.
   */
  survivalToWeaning: number | null;
  /** The last weaning date, null before any weaning. */
  weanedOn: string | null;
  lossesByCause: Record<string, number>;
}

/** The litter's figures from its kindling and events. Throws LitterCountError on an impossible record. */
export function litterSummary(litter: LitterRecord): LitterSummary {
  assertValid(litter);
  const tally = emptyTally();
  const lossesByCause: Record<string, number> = {};
  let weanedOn: string | null = null;
  for (const { event } of ordered(litter.events)) {
    apply(tally, event);
    if (event.kind === 'lost') {
      const cause = event.cause.trim().toLowerCase();
      lossesByCause[cause] = (lossesByCause[cause] ?? 0) + event.count;
    }
    if (event.kind === 'weaned') weanedOn = event.on;
  }
  const raised = litter.bornAlive + tally.fosteredIn - tally.fosteredOut;
  const left = onDoe(litter.bornAlive, tally);
  return {
    bornAlive: litter.bornAlive,
    bornDead: litter.bornDead,
    totalBorn: litter.bornAlive + litter.bornDead,
    ...tally,
    onDoe: left,
    raised,
    survivalToWeaning: left === 0 && raised > 0 ? tally.weaned / raised : null,
    weanedOn,
    lossesByCause,
  };
}

/**
 * Fosterings seen from both litters must agree: kits fostered out of A into B on a date are fostered in
 * to B from A on the same date, in the same number (each side that disagrees gets an issue). Only pairs where both litters are given are checked
 * (the other litter may be on a farm this one cannot see).
 */
export function checkFosterPairs(litters: ReadonlyArray<LitterRecord & { id: string }>): LitterIssue[] {
  const byId = new Map(litters.map((l) => [l.id, l]));
  const issues: LitterIssue[] = [];
  const sum = (litter: LitterRecord, kind: 'fostered_in' | 'fostered_out', other: string, on: string) =>
    litter.events.reduce((n, e) => (e.kind === kind && e.otherLitterId === other && e.on === on ? n + e.count : n), 0);
  for (const litter of litters) {
    litter.events.forEach((event, index) => {
      if (event.kind !== 'fostered_out' && event.kind !== 'fostered_in') return;
      const other = byId.get(event.otherLitterId);
      if (!other) return;
      const mirror = event.kind === 'fostered_out' ? 'fostered_in' : 'fostered_out';
      const here = sum(litter, event.kind, other.id, event.on);
      const there = sum(other, mirror, litter.id, event.on);
      if (here !== there) {
        const [verb, back] = event.kind === 'fostered_out' ? ['fostered out', 'fostered in from'] : ['fostered in', 'fostered out to'];
        issues.push({
          code: 'foster_mismatch', field: 'count', eventIndex: index, ...(event.id ? { eventId: event.id } : {}),
          message: `${kits(here)} ${verb} on ${event.on}, but the other litter records ${kits(there)} ${back} this one that day`,
        });
      }
    });
  }
  return issues;
}
