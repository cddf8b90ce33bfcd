import type { Transaction } from 'sequelize';
import { checkFosterPairs, checkKindlingDate, checkWeightForAge, daysBetween, hasBreedingErrors, validateLitter, type KitDeathCause, type LitterEventKind } from '@burrowline/shared';
import { ImportRefused, markServicesKindled } from '../almanac/almanac-import.service';
import { LitterEvent } from './litter-event.model';
import { Litter } from './litter.model';
import { recordOf } from './litters.presenter';

/**
 * Bulk loading of litters and their kit-count events (the demo co-op's history), inside the caller's
 * transaction, checked with the shared litter rules: a kindling within 40 days after its service and not
 * in the future, counts that never go below zero, fosterings that agree on both sides.
 */

export interface ImportedLitter {
  id: string;
  farmId: string;
  serviceId: string;
  servicedOn: string;
  damId: string;
  sireId: string;
  kindledOn: string;
  bornAlive: number;
  bornDead: number;
  notes?: string;
  recordedBy: string | null;
}

export interface ImportedLitterEvent {
  id: string;
  litterId: string;
  kind: LitterEventKind;
  on: string;
  count: number;
  cause?: string | null;
  /** Lost kits: why they died, from the shared list. */
  deathCause?: KitDeathCause | null;
  otherLitterId?: string | null;
  pairId?: string | null;
  enteredBy: string | null;
  reviewState?: 'accepted' | 'pending';
  /** A weaning: the total live weight of the kits weaned (grams), when weighed. */
  weaningWeightGrams?: number | null;
}

export async function importLitters(tx: Transaction, coopId: string, today: string, litters: ImportedLitter[], events: ImportedLitterEvent[]): Promise<void> {
  const problems: string[] = [];
  const toModel = (e: ImportedLitterEvent, farmId: string) =>
    LitterEvent.build({
      id: e.id, coopId, farmId, litterId: e.litterId, kind: e.kind, occurredOn: e.on, kitCount: e.count, cause: e.cause ?? null,
      deathCause: e.kind === 'lost' ? e.deathCause ?? null : null,
      otherLitterId: e.otherLitterId ?? null, pairId: e.pairId ?? null, enteredBy: e.enteredBy, reviewState: e.reviewState ?? 'accepted',
      weaningWeightGrams: e.kind === 'weaned' ? e.weaningWeightGrams ?? null : null,
    });
  const farmOf = new Map(litters.map((l) => [l.id, l.farmId]));
  const models = events.map((e) => toModel(e, farmOf.get(e.litterId)!));
  const records = litters.map((l) => ({ ...recordOf(l, models.filter((m) => m.litterId === l.id)), id: l.id }));
  for (const l of litters) {
    const checks = checkKindlingDate(l.servicedOn, l.kindledOn, today);
    if (hasBreedingErrors(checks)) problems.push(`litter ${l.id}: ${checks.map((c) => c.message).join(', ')}`);
  }
  for (const record of records) {
    for (const issue of validateLitter(record, today)) problems.push(`litter ${record.id}: ${issue.message}`);
  }
  for (const issue of checkFosterPairs(records)) problems.push(issue.message);
  const kindledOn = new Map(litters.map((l) => [l.id, l.kindledOn]));
  for (const e of events) {
    if (!e.weaningWeightGrams) continue;
    const check = e.kind === 'weaned' ? checkWeightForAge(e.weaningWeightGrams / e.count, daysBetween(kindledOn.get(e.litterId)!, e.on)) : null;
    if (e.kind !== 'weaned') problems.push(`litter ${e.litterId}: a litter weight goes with a weaning only`);
    else if (check?.level === 'error') problems.push(`litter ${e.litterId}: ${check.message}`);
  }
  if (problems.length > 0) throw new ImportRefused(problems);

  await Litter.bulkCreate(
    litters.map((l) => ({
      id: l.id, coopId, farmId: l.farmId, serviceId: l.serviceId, damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn,
      bornAlive: l.bornAlive, bornDead: l.bornDead, notes: l.notes ?? '', recordedBy: l.recordedBy,
    })),
    { transaction: tx },
  );
  await LitterEvent.bulkCreate(models.map((m) => m.get({ plain: true })), { transaction: tx });
  await markServicesKindled(tx, litters.map((l) => ({ serviceId: l.serviceId, litterId: l.id, kindledOn: l.kindledOn })));
}
