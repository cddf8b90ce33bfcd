import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { Op, type Transaction } from 'sequelize';
import {
  animalListQuerySchema, countOf, createImportChecker, defineAbilityFor, ErrorCode, headerProblem, mapImportHeader, subjectOf, todayIn, type HerdExportQuery, type HerdImportConfirmInput, type HerdImportDto, type HerdImportProgressDto, type HerdImportRowsQuery, type ImportCheckResult,
} from '@burrowline/shared';
import { lockUntilCommit } from '../../db/advisory-lock';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { animalAccess, soldThroughSwapBoard } from '../animals/animal-facts.service';
import { animalForCertificate, getAnimal, listHerd, listHerdRecords } from '../animals/animals.service';
import { herdRecordsForImport, importSpreadsheet, lockHerdForImport } from '../animals/herd-import.service';
import { getPedigreeTree } from '../animals/pedigree.service';
import { recordAudit } from '../audit/audit.service';
import { breedsOf } from '../breeds/breeds.service';
import { getCoop } from '../coops/coops.service';
import { farmDirectoryOf } from '../farms/farms.service';
import { ensureCan, farmOf } from '../farms/farm-access';
import { DEFAULT_FARM_TIME_ZONE, farmClockOf, farmTodayIn } from '../farms/farm-clock';
import { kindlingDaysOfDams } from '../litters/litter-facts.service';
import { namesOf } from '../users/users.service';
import { readHerdCsv } from './csv-reading';
import { herdCsv } from './herd-export';
import { HerdImport } from './herd-import.model';
import { presentHerdImport } from './herd-files.presenter';
import { renderCertificate } from './pedigree-certificate';
import { renderHutchCards } from './hutch-cards';
import { nextTasksOfAnimals } from '../almanac/animal-next-tasks.service';

/** Rows checked between two progress reports of a large file. */
const CHECK_SLICE = 1000;
const UNCONFIRMED_KEPT_MS = 24 * 60 * 60 * 1000;
export interface ImportLimits {
  maxRows: number;
  /** Staged files a farm may keep unconfirmed at once: each is kept a day, so an unbounded pile costs disk and time. */
  maxWaiting: number;
}

type Progress = (progress: HerdImportProgressDto) => void | Promise<void>;

/** Who may stage and confirm imports: a member (or admin) of a farm, for that farm. */
export function assertCanImport(actor: SessionUser): void {
  importingFarmOf(actor);
}

/** The actor's farm, when they may import into its herd (apprentices read the herd but add no animals). */
function importingFarmOf(actor: SessionUser): string {
  const refusal = 'Only a member of the farm imports animals into its herd (apprentices read the herd)';
  const farmId = farmOf(actor, refusal);
  ensureCan(actor, 'create', 'HerdImport', { farmId }, 'That farm', refusal);
  return farmId;
}

function safeFileName(name: string): string {
  // eslint-disable-next-line no-control-regex
  const base = path.basename(name.replace(/\\/g, '/')).replace(/[\u0000-\u001f\u007f"]/g, '').trim();
  return (base || 'herd.csv').slice(0, 200);
}

/** Reads and checks a file against the farm's herd as it is in `tx` (the preview and, again, the confirm). */
async function checkFile(
  actor: SessionUser,
  farmId: string,
  content: Buffer,
  limits: ImportLimits,
  tx: Transaction,
  opts: { idFor: (line: number) => string; onProgress?: Progress },
): Promise<{ result: ImportCheckResult; mapping: ReturnType<typeof mapImportHeader>; checksum: string; hadByteOrderMark: boolean }> {
  const csv = await readHerdCsv(content, { maxRows: limits.maxRows });
  const mapping = mapImportHeader(csv.header);
  const problem = headerProblem(mapping, csv.header);
  if (problem) throw AppError.validation({ file: [problem] }, problem);
  await opts.onProgress?.({ phase: 'reading', done: csv.records.length, total: csv.records.length });

  const farms = await farmDirectoryOf(actor.coopId, tx);
  const farm = farms.get(farmId);
  const breeds = await breedsOf(actor.coopId, tx);
  const herd = await herdRecordsForImport(actor.coopId, farmId, tx);
  const checker = createImportChecker(csv.records, mapping, {
    today: farmTodayIn(farms, farmId),
    farmName: farm?.name ?? '',
    weightUnit: farm?.weightUnit ?? 'lb_oz',
    herd,
    breeds,
    kindlingDaysByDam: await kindlingDaysOfDams(tx, actor.coopId, farmId),
    idFor: opts.idFor,
  });
  if (checker.total === 0) {
    throw AppError.validation({ file: ['The file names its columns but has no rows of animals'] }, 'The file names its columns but has no rows of animals');
  }
  for (let from = 0; from < checker.total; from += CHECK_SLICE) {
    checker.check(from, from + CHECK_SLICE);
    if (opts.onProgress) {
      await opts.onProgress({ phase: 'checking', done: Math.min(from + CHECK_SLICE, checker.total), total: checker.total });
      await yieldToEventLoop();
    }
  }
  return { result: checker.finish(), mapping, checksum: csv.checksum, hadByteOrderMark: csv.hadByteOrderMark };
}

function summaryOf(result: ImportCheckResult, mapping: ReturnType<typeof mapImportHeader>): HerdImport['summary'] {
  return {
    ...result.summary,
    columns: { mapped: Object.keys(mapping.index) as HerdImport['summary']['columns']['mapped'], ignored: mapping.ignored, computed: mapping.computed },
    weightColumn: mapping.weightColumn,
  };
}

async function present(row: HerdImport, query: HerdImportRowsQuery, tx: Transaction): Promise<HerdImportDto> {
  const names = await namesOf([row.confirmedBy], tx);
  return presentHerdImport(row, query, names);
}

const firstPage: HerdImportRowsQuery = { show: 'all', page: 1, pageSize: 100 };

/**
 * Stages a herd spreadsheet: keeps the file with its checksum, checks every row against the farm's
 * herd and the rest of the file, and answers with the preview (its id, the counts, a page of rows
 * with their errors and warnings, what would be created or updated). Writes nothing to the herd.
 * A file that is not CSV, too long or without the required columns is refused with a message
 * saying which. `onProgress` hears how far the check is (for a progress bar on large files).
 */
export async function stageHerdImport(
  actor: SessionUser,
  input: { fileName: string; content: Buffer },
  limits: ImportLimits,
  onProgress?: Progress,
): Promise<HerdImportDto> {
  const farmId = importingFarmOf(actor);
  if (input.content.length === 0) throw AppError.validation({ file: ['The file is empty'] }, 'The file is empty');
  return withTenant(actor, async (tx) => {
    // Counted before the file is read, under a per-farm lock so parallel uploads cannot pass together.
    await lockUntilCommit(tx, `herd-import:${farmId}`);
    await HerdImport.destroy({ where: { farmId, status: 'ready', createdAt: { [Op.lt]: new Date(Date.now() - UNCONFIRMED_KEPT_MS) } }, transaction: tx });
    const waiting = await HerdImport.count({ where: { farmId, status: 'ready' }, transaction: tx });
    if (waiting >= limits.maxWaiting) {
      throw AppError.conflict(
        `${waiting} spreadsheets are already waiting to be imported into this farm's herd. Import or discard one of them first; unconfirmed files are removed after a day.`,
      );
    }
    const { result, mapping, checksum, hadByteOrderMark } = await checkFile(actor, farmId, input.content, limits, tx, { idFor: () => randomUUID(), onProgress });
    await onProgress?.({ phase: 'saving', done: 0, total: 1 });
    const row = await HerdImport.create(
      {
        coopId: actor.coopId,
        farmId,
        uploadedBy: actor.id,
        fileName: safeFileName(input.fileName),
        byteSize: input.content.length,
        checksum,
        hadBom: hadByteOrderMark,
        content: input.content,
        summary: summaryOf(result, mapping),
        rows: result.rows,
      },
      { transaction: tx },
    );
    return present(row, firstPage, tx);
  });
}

async function importForActor(actor: SessionUser, importId: string, tx: Transaction, lock: boolean): Promise<HerdImport> {
  const row = await HerdImport.findOne({ where: { id: importId, coopId: actor.coopId }, transaction: tx, lock: lock ? tx.LOCK.UPDATE : undefined });
  // Another farm's staged file is not theirs to know about.
  if (!row || row.farmId !== actor.farmId) throw AppError.notFound('That import');
  if (!defineAbilityFor(actor).can(lock ? 'update' : 'read', subjectOf('HerdImport', { coopId: row.coopId, farmId: row.farmId }))) {
    throw new AppError(ErrorCode.forbidden, 403, "Only a member of the farm works with its imports");
  }
  return row;
}

/** A staged import's preview with a page of its rows (all, only those with problems, or one action). */
export async function getHerdImport(actor: SessionUser, importId: string, query: HerdImportRowsQuery): Promise<HerdImportDto> {
  return withTenant(actor, async (tx) => present(await importForActor(actor, importId, tx, false), query, tx));
}

function outcomeOf(rows: ImportCheckResult['rows']): string {
  // Field by field: the stored rows come back from jsonb with their keys in another order.
  return rows.map((r) => `${r.line}:${r.action}:${r.animalId}:${r.errors.length}:${r.changes.map((c) => `${c.field}=${c.from}>${c.to}`).join(';')}`).join('|');
}

/**
 * Imports a staged file into the farm's herd, in one transaction: the file is checked again against
 * the herd as it is now (under the pedigree lock), then the new animals are created with the ids the
 * preview gave them, the updates and weigh-ins written, and COI recomputed once. The idempotency key
 * makes a double click (or a retried request) import once: the same key answers with the same result.
 * If the herd changed since the preview so that the file would do something else, nothing is written:
 * the preview is refreshed and the answer is 409.
 */
export async function confirmHerdImport(actor: SessionUser, importId: string, input: HerdImportConfirmInput, limits: ImportLimits): Promise<HerdImportDto> {
  const outcome = await withTenant(actor, async (tx) => {
    const row = await importForActor(actor, importId, tx, true);
    if (row.status === 'confirmed') {
      if (row.idempotencyKey === input.idempotencyKey) return { kind: 'done' as const, dto: await present(row, firstPage, tx) };
      throw new AppError(ErrorCode.conflict, 409, `This file was already imported on ${row.confirmedAt!.toISOString().slice(0, 10)}`);
    }
    if (row.summary.withErrors > 0) {
      throw AppError.validation(
        { file: [`${row.summary.withErrors === 1 ? '1 row has' : `${countOf(row.summary.withErrors, 'row')} have`} errors`] },
        'Some rows have errors: fix them in your spreadsheet and upload the file again',
      );
    }
    const farmId = importingFarmOf(actor);
    await lockHerdForImport(actor.coopId, tx);
    const idsByLine = new Map(row.rows.filter((r) => r.action === 'create').map((r) => [r.line, r.animalId]));
    const { result, mapping } = await checkFile(actor, farmId, row.content, limits, tx, { idFor: (line) => idsByLine.get(line) ?? randomUUID() });
    if (result.summary.withErrors > 0 || outcomeOf(result.rows) !== outcomeOf(row.rows)) {
      return { kind: 'stale' as const, rows: result.rows, summary: summaryOf(result, mapping) };
    }
    if (result.plan.creates.length + result.plan.updates.length + result.plan.weighIns.length === 0) {
      throw AppError.validation({ file: ['Every row is already in your herd as written'] }, 'Nothing to import: every row is already in your herd as written');
    }
    const written = await importSpreadsheet(actor, { ...result.plan, source: row.fileName }, tx);
    row.set({ status: 'confirmed', idempotencyKey: input.idempotencyKey, confirmedBy: actor.id, confirmedAt: new Date(), result: written });
    await row.save({ transaction: tx });
    await recordAudit(
      {
        coopId: actor.coopId,
        actorUserId: actor.id,
        action: 'herd.imported',
        subjectType: 'HerdImport',
        subjectId: row.id,
        details: { fileName: row.fileName, checksum: row.checksum, ...written },
      },
      tx,
    );
    return { kind: 'done' as const, dto: await present(row, firstPage, tx) };
  });
  if (outcome.kind === 'done') return outcome.dto;
  // Keep the fresh preview (in its own transaction: the refused confirm wrote nothing), then say so.
  await withTenant(actor, async (tx) => {
    const row = await importForActor(actor, importId, tx, true);
    row.set({ rows: outcome.rows, summary: outcome.summary });
    await row.save({ transaction: tx });
  });
  throw new AppError(
    ErrorCode.conflict,
    409,
    'Your herd changed since this file was checked, so it would now do something else. Nothing was imported; look at the new preview.',
  );
}

function slug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'herd'
  );
}

/**
 * The herd (or the Herd table's current filters and sort, every page) as CSV in the import format
 * plus computed columns (status, COI, breed make-up, age class) and the latest weight in the farm's
 * units. Readable by everyone who reads the herd (apprentices too).
 */
export async function exportHerdCsv(actor: SessionUser, query: HerdExportQuery): Promise<{ fileName: string; body: string; rows: number }> {
  const herd = await listHerdRecords(actor, { ...query, page: 1, pageSize: Number.MAX_SAFE_INTEGER });
  return withTenant(actor, async (tx) => {
    const farms = await farmDirectoryOf(actor.coopId, tx);
    const farm = actor.farmId ? farms.get(actor.farmId) : undefined;
    const records = actor.farmId ? await herdRecordsForImport(actor.coopId, actor.farmId, tx) : [];
    const parents = new Map(records.map((r) => [r.id, { sire: r.sireTattoo, dam: r.damTattoo }]));
    const today = farmTodayIn(farms, actor.farmId);
    return {
      fileName: `${slug(farm?.name ?? 'herd')}-herd-${today}.csv`,
      body: herdCsv(herd.items, { unit: farm?.weightUnit ?? 'lb_oz', parents }),
      rows: herd.items.length,
    };
  });
}

/**
 * A printable pedigree certificate (PDF) of an animal the viewer's farm owns or sold through the Swap Board
 * (a borrower gets 403): its details, four
 * generations with each ancestor's tattoo, name, breed, colour and registration, its COI, who bred
 * it, the issuing farm and the date. An animal the viewer may not see answers 404.
 */
export async function pedigreeCertificate(actor: SessionUser, animalId: string): Promise<{ fileName: string; body: Buffer }> {
  const context = await withTenant(actor, async (tx) => {
    const access = await animalAccess(actor, animalId, tx);
    // Both farms of a Swap Board sale keep the animal's papers: the seller too, after it left.
    const sold = Boolean(access) && !access!.canReadPapers && (await soldThroughSwapBoard(tx, animalId, actor.farmId));
    if (!access || (!access.canRead && !sold)) throw AppError.notFound('That animal');
    if (!access.canReadPapers && !sold) throw new AppError(ErrorCode.forbidden, 403, 'Only the farm that owns the animal issues its pedigree certificate');
    const farms = await farmDirectoryOf(actor.coopId, tx);
    const issuer = farms.get(access.owningFarmId ?? '') ?? (actor.farmId ? farms.get(actor.farmId) : undefined);
    const coop = await getCoop(actor.coopId, tx);
    return { access, issuer, coopName: coop?.name ?? '' };
  });
  const animal = await animalForCertificate(actor, animalId);
  const tree = await getPedigreeTree(actor, animalId, 4);
  const body = await renderCertificate({
    animal,
    tree,
    issuedBy: context.issuer?.name ?? 'the owning farm',
    coopName: context.coopName,
    issuedOn: todayIn(context.issuer?.timeZone ?? DEFAULT_FARM_TIME_ZONE),
  });
  return { fileName: `pedigree-${animal.tattoo}${animal.name ? `-${slug(animal.name)}` : ''}.pdf`, body };
}

/** At most this many cards in one sheet (six pages of four). */
const MAX_HUTCH_CARDS = 24;

/**
 * Hutch cards (PDF) for animals the actor's farm keeps: the chosen ones, or every doe in the breeding herd.
 * Each card carries the next Almanac dates and a QR code that opens the animal at `appUrl`.
 */
export async function hutchCards(actor: SessionUser, input: { animalIds: string[] } | { does: true }, appUrl: string): Promise<{ fileName: string; body: Buffer }> {
  const farmId = farmOf(actor);
  const ids = 'does' in input
    ? (await listHerd(actor, animalListQuerySchema.parse({ sex: 'doe', status: 'breeding', pageSize: MAX_HUTCH_CARDS }))).items.map((a) => a.id)
    : [...new Set(input.animalIds)];
  if (ids.length > MAX_HUTCH_CARDS) throw AppError.validation({ animalIds: [`Choose at most ${MAX_HUTCH_CARDS} animals for one sheet`] });
  const animals = await Promise.all(ids.map((id) => getAnimal(actor, id)));
  const { next, farmName } = await withTenant(actor, async (tx) => ({
    next: await nextTasksOfAnimals(tx, ids),
    farmName: (await farmClockOf(tx, actor.coopId, farmId)).name,
  }));
  const body = await renderHutchCards(
    animals.map((a) => ({
      name: a.name, tattoo: a.tattoo, sex: a.sex, birthDate: a.birthDate, breedMakeup: a.breedMakeup,
      next: next.get(a.id) ?? [], url: `${appUrl}/herd/${a.id}`,
    })),
    farmName,
  );
  return { fileName: `hutch-cards-${slug(farmName) || 'farm'}.pdf`, body };
}
