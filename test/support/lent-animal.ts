import { randomUUID } from 'node:crypto';
import { animalNoteCreateSchema, custodyMoveSchema, treatmentCreateSchema, weighInCreateSchema } from '@burrowline/shared';
import { loadConfig } from '../../packages/server/src/config/env';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { recordTreatment } from '../../packages/server/src/modules/almanac/treatments.service';
import { moveAnimal } from '../../packages/server/src/modules/animals/custody-moves.service';
import { createAnimalNote, createWeighIn } from '../../packages/server/src/modules/animals/weigh-ins.service';
import { addAnimalPhotos } from '../../packages/server/src/modules/photos/photos.service';
import type { TestCoop } from './factories';
import { actorOf, addAnimalAs } from './herd';
import { testImage } from './herd-files';

/** Where a lent buck stands: before the loan (at home), during it (kept by farm B), after its return. */
export type LoanStage = 'beforeLoan' | 'duringLoan' | 'afterLoan';

/** The private records one farm made of the buck: ids and texts that must never reach the other farm. */
export interface FarmRecords {
  noteId: string;
  weighInId: string;
  treatmentId: string;
  photoId?: string;
  /** Unique words in the farm's note body, weigh-in note, treatment notes and photo caption. */
  marker: string;
}

export interface LentBuck {
  animalId: string;
  /** Farm A, which owns the buck and lends it. */
  lender: FarmRecords;
  /** Farm B, which borrows it; it records only during the loan. */
  borrower: FarmRecords | null;
}

const photoLimits = () => {
  const { photoMaxBytes, photosPerAnimal, photosPerUpload } = loadConfig().uploads;
  return { photoMaxBytes, photosPerAnimal, photosPerUpload };
};

async function recordAs(person: TestCoop['member'], animalId: string, on: string, withPhoto: boolean): Promise<FarmRecords> {
  const actor = actorOf(person);
  const marker = `private-${randomUUID().slice(0, 8)}`;
  const note = await createAnimalNote(actor, animalId, animalNoteCreateSchema.parse({ body: `Paid 90 dollars; ${marker}`, notedOn: on }));
  const weighIn = await createWeighIn(actor, weighInCreateSchema.parse({ animalId, totalGrams: 4800, headCount: 1, weighedOn: on, note: marker }));
  const treatment = await recordTreatment(actor, treatmentCreateSchema.parse({
    animalId, startedOn: on, lastDoseOn: on, withdrawalDays: 0, treatment: `Ear mites ${marker}`, dose: '0.2 ml', route: 'topical', veterinarian: 'Dr. Alder', notes: marker,
  }));
  const photo = withPhoto
    ? (await addAnimalPhotos(actor, animalId, { files: [{ buffer: await testImage('jpeg', { width: 40, height: 40 }) }], caption: marker }, photoLimits()))[0]!
    : null;
  return { noteId: note.id, weighInId: weighIn.id, treatmentId: treatment.id, ...(photo ? { photoId: photo.id } : {}), marker };
}

/**
 * A buck of farm A with A's own notes field, note, weigh-in, treatment and photo; at `duringLoan` it is
 * lent to farm B, which records its own note, weigh-in and treatment; at `afterLoan` it is back home.
 */
export async function lentBuck(coop: TestCoop, stage: LoanStage): Promise<LentBuck> {
  connectDatabase(process.env.DATABASE_URL!);
  const lenderMarker = `owner-only-${randomUUID().slice(0, 8)}`;
  const buck = await addAnimalAs(coop.member, { sex: 'buck', name: 'Lent buck', birthDate: '2022-03-01', notes: `Bought for 120 dollars; ${lenderMarker}` });
  const lender = await recordAs(coop.member, buck.id, '2024-01-10', true);
  if (stage === 'beforeLoan') return { animalId: buck.id, lender: { ...lender, marker: `${lender.marker}|${lenderMarker}` }, borrower: null };
  await moveAnimal(actorOf(coop.member), buck.id, custodyMoveSchema.parse({ kind: 'lent', toFarmId: coop.farms[1]!.id, movedOn: '2024-02-01' }));
  const borrower = await recordAs(coop.otherFarmMember, buck.id, '2024-02-10', false);
  if (stage === 'afterLoan') await moveAnimal(actorOf(coop.member), buck.id, custodyMoveSchema.parse({ kind: 'returned', movedOn: '2024-03-01' }));
  return { animalId: buck.id, lender: { ...lender, marker: `${lender.marker}|${lenderMarker}` }, borrower };
}

/** Every id and text of `records` (markers are `|`-joined), to look for in an answer. */
export function tracesOf(records: FarmRecords | null): string[] {
  if (!records) return [];
  return [records.noteId, records.weighInId, records.treatmentId, ...(records.photoId ? [records.photoId] : []), ...records.marker.split('|')];
}

const loanStages: readonly string[] = ['beforeLoan', 'duringLoan', 'afterLoan'] satisfies LoanStage[];

/** The authorization matrix's target for a lent buck's rows: the buck, farm A's photo, and the records. */
export async function loanTarget(coop: TestCoop, target: string): Promise<{ animalId?: string; photoId?: string; loan?: LentBuck }> {
  if (!loanStages.includes(target)) return {};
  const loan = await lentBuck(coop, target as LoanStage);
  return { animalId: loan.animalId, photoId: loan.lender.photoId, loan };
}

/** What a persona of the matrix must never read of a lent buck: the other farm's records (farm A's people are A's). */
export function tracesHiddenFrom(loan: LentBuck, persona: string): string[] {
  if (persona === 'otherFarmMember') return tracesOf(loan.lender);
  if (persona === 'otherCoop' || persona === 'anonymous') return [...tracesOf(loan.lender), ...tracesOf(loan.borrower)];
  return tracesOf(loan.borrower);
}
