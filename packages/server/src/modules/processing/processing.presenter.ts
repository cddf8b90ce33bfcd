import type { AnimalRefDto, ProcessingMarkDto, ProcessingRecordDto } from '@burrowline/shared';
import type { ProcessingMark, ProcessingRecord } from './processing-record.model';

export interface ProcessingPresentContext {
  animalRef: (id: string) => AnimalRefDto;
  groupNames: Map<string, string>;
  names: Map<string, string>;
}

const person = (id: string | null, names: Map<string, string>) => (id ? { id, name: names.get(id) ?? 'Someone' } : null);
const group = (id: string | null, ctx: ProcessingPresentContext) => (id ? { id, name: ctx.groupNames.get(id) ?? 'A grow-out group' } : null);
const percent = (v: number | string | null) => (v === null ? null : Number(v));

export function presentProcessingRecord(r: ProcessingRecord, ctx: ProcessingPresentContext): ProcessingRecordDto {
  return {
    id: r.id,
    processedOn: r.processedOn,
    animal: r.animalId ? ctx.animalRef(r.animalId) : null,
    group: group(r.groupId, ctx),
    headCount: r.headCount,
    ageDays: r.ageDays,
    liveGrams: r.liveGrams,
    hotCarcassGrams: r.hotCarcassGrams,
    chilledCarcassGrams: r.chilledCarcassGrams,
    hotDressOutPercent: Number(r.hotDressOutPercent),
    chilledDressOutPercent: percent(r.chilledDressOutPercent),
    usdaClass: r.usdaClass,
    usdaClassReason: r.usdaClassReason,
    usdaClassNote: r.usdaClassNote,
    flags: r.flags,
    notes: r.notes,
    recordedBy: person(r.recordedBy, ctx.names),
  };
}

export function presentProcessingMark(m: ProcessingMark, ctx: ProcessingPresentContext, withdrawalEndsOn: string | null): ProcessingMarkDto {
  return {
    id: m.id,
    animal: m.animalId ? ctx.animalRef(m.animalId) : null,
    group: group(m.groupId, ctx),
    plannedOn: m.plannedOn,
    status: m.status,
    notes: m.notes,
    withdrawalEndsOn,
    markedBy: person(m.markedBy, ctx.names),
    version: m.version,
  };
}
