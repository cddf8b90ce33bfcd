/**
 * Checks a herd spreadsheet row by row against the farm's herd and the rest of the file, and plans
 * what confirming it would write. Pure: the server reads the file and the herd, this decides.
 *
 * Rules (ours, shown to breeders as messages):
 * - A row whose tattoo is an animal the farm keeps now is about that animal: cells that differ are
 *   updates (name, colour, registration, hutch, notes, breed, a parent the herd does not know yet, a
 *   new weight); a different sex or birth date, or a different parent than the herd records, is an
 *   error (those change on the animal's page, where the whole pedigree is checked).
 * - Any other row adds an animal, with an id assigned now so the preview and the confirm agree.
 * - `sire`/`dam` name tattoos of rows of the same file or of the farm's herd (its animals, present
 *   or gone); blank means unknown. A parent must be of the right sex and born before its offspring;
 *   one younger than its breed's usual first-breeding age is a warning.
 * - A kit of a dam whose litters the farm has recorded is born on one of her kindling days.
 * - No animal may be its own ancestor (a cycle), a tattoo may appear once per file.
 * - Errors block the whole import; warnings are shown and accepted by confirming.
 */
import { daysBetween, EARLIEST_RECORD_DATE, isIsoDate, isRecordDate, LATEST_RECORD_DATE } from '../herd/herd-dates';
import { MEDIUM_BREED_FIRST_BREEDING_DAYS, youngParentAt } from '../herd/first-breeding';
import { kitBirthDateProblem } from '../herd/kit-birth';
import type { Disposition, Lifecycle, Sex } from '../herd/herd-enums';
import { formatWeight, type WeightUnit } from '../units/units';
import { fromSpreadsheetSafe, gramsPerWeightUnit, type HeaderMapping, type ImportField } from './csv-columns';
import type { HerdImportRowDto, HerdImportSummaryDto, ImportAction, ImportFieldChangeDto, ImportIssueDto } from './herd-files-dto';

/** One data row of the file: the line it starts on and its cells. */
export interface ImportRecord {
  line: number;
  cells: readonly string[];
}

/** An animal of the farm's records (owned or kept by it, present or gone), as the check needs it. */
export interface HerdRecordForImport {
  id: string;
  tattoo: string;
  name: string;
  sex: Sex;
  birthDate: string;
  breedId: string | null;
  colour: string;
  registrationNumber: string | null;
  hutch: string;
  notes: string;
  sireId: string | null;
  damId: string | null;
  sireTattoo: string | null;
  damTattoo: string | null;
  /** Kept on this farm now (alive, here). */
  onFarmHere: boolean;
  /** Owned by this farm (a buck on loan here is kept, not owned). */
  ownedHere: boolean;
  disposition: Disposition;
  version: number;
  latestWeight: { grams: number; weighedOn: string } | null;
}

export interface ImportBreedRef {
  id: string;
  name: string;
  firstBreedingDays: { doe: { min: number }; buck: { min: number } };
}

export interface ImportCheckContext {
  /** Today on the farm's clock. */
  today: string;
  farmName: string;
  weightUnit: WeightUnit;
  herd: readonly HerdRecordForImport[];
  breeds: readonly ImportBreedRef[];
  /** The days each of the farm's dams kindled on its record, by dam id (a kit's birth date must be one). */
  kindlingDaysByDam?: ReadonlyMap<string, readonly string[]>;
  /** The id a new animal on this line gets; the same at preview and at confirm. */
  idFor: (line: number) => string;
}

export interface PlannedAnimal {
  id: string;
  line: number;
  tattoo: string;
  name: string;
  sex: Sex;
  breedId: string | null;
  colour: string;
  birthDate: string;
  sireId: string | null;
  damId: string | null;
  registrationNumber: string | null;
  hutch: string;
  notes: string;
  lifecycle: Lifecycle;
  /** Who bred it, when not this farm (then `arrivedOn` is when it came). */
  breederName: string;
  arrivedOn: string | null;
}

export interface PlannedUpdate {
  animalId: string;
  version: number;
  line: number;
  changes: {
    name?: string;
    colour?: string;
    registrationNumber?: string | null;
    hutch?: string;
    notes?: string;
    breedId?: string | null;
    sireId?: string;
    damId?: string;
  };
}

export interface PlannedWeighIn {
  animalId: string;
  line: number;
  grams: number;
  weighedOn: string;
}

export interface ImportPlan {
  creates: PlannedAnimal[];
  updates: PlannedUpdate[];
  weighIns: PlannedWeighIn[];
}

export interface ImportCheckResult {
  rows: HerdImportRowDto[];
  summary: Omit<HerdImportSummaryDto, 'columns' | 'weightColumn'>;
  plan: ImportPlan;
}

const TATTOO = /^[A-Za-z0-9][A-Za-z0-9-]*$/;
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;
const LINE_BREAK = /[\r\n]/;
/** A live weight outside this is a slip of unit or of a digit (a newborn kit is about 50 g; giants stay under 10 kg). */
const PLAUSIBLE_GRAMS = { min: 20, max: 16_000 } as const;
/** A re-imported export rounds weights; closer than this on the same day is the same weigh-in. */
const SAME_WEIGHT_GRAMS = 5;
/** Kits stay with the doe to weaning, 4–8 weeks (Texas Extension; Rabbit Production): 8 weeks here. */
const KIT_DAYS = 56;
const CROSS_WORDS = new Set(['cross', 'crossbred', 'mixed']);

type ParentRole = 'sire' | 'dam';

interface ParentRef {
  id: string;
  sex: Sex | null;
  birthDate: string | null;
  breedId: string | null;
  label: string;
  /** The file row it is, when it is one. */
  row: number | null;
}

interface Row {
  line: number;
  raw: Record<ImportField, string>;
  present: Set<ImportField>;
  tattoo: string | null;
  key: string;
  name: string;
  sex: Sex | null;
  born: string | null;
  /** undefined = not resolved (an error says why). */
  breedId: string | null | undefined;
  colour: string;
  registration: string | null;
  hutch: string;
  notes: string;
  grams: number | null;
  weighedOn: string | null;
  breederName: string;
  arrivedOn: string | null;
  existing: HerdRecordForImport | null;
  /** Matches an animal that has left the herd: left as it is. */
  departed: HerdRecordForImport | null;
  action: ImportAction;
  animalId: string;
  parents: Record<ParentRole, ParentRef | null>;
  /** The parent ids the animal will have (recorded or new). */
  effective: Record<ParentRole, string | null>;
  changes: ImportFieldChangeDto[];
  updates: PlannedUpdate['changes'];
  errors: ImportIssueDto[];
  warnings: ImportIssueDto[];
}

function breedKey(name: string): string {
  return name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '');
}

function editDistance(a: string, b: string): number {
  const previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let diagonal = previous[0]!;
    previous[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const above = previous[j]!;
      previous[j] = Math.min(above + 1, previous[j - 1]! + 1, diagonal + (a[i - 1] === b[j - 1] ? 0 : 1));
      diagonal = above;
    }
  }
  return previous[b.length]!;
}

function labelOf(name: string, tattoo: string | null): string {
  if (name && tattoo) return `${name} (${tattoo})`;
  return name || tattoo || 'that animal';
}

function issue(list: ImportIssueDto[], column: ImportField | null, message: string) {
  list.push({ column, message });
}

/** The stage a newly recorded animal is at, from its age and its breed's first-breeding age. */
export function lifecycleByAge(sex: Sex, birthDate: string, today: string, firstBreedingMinDays: { doe: number; buck: number } | null): Lifecycle {
  const age = daysBetween(birthDate, today);
  if (age < KIT_DAYS) return 'kit';
  const grown = (firstBreedingMinDays ?? MEDIUM_BREED_FIRST_BREEDING_DAYS)[sex];
  return age < grown ? 'junior' : 'breeding';
}

/**
 * A checker for the file's rows. `check(from, to)` checks rows against the herd and the file (a
 * caller can check a large file in slices and report progress between them); `finish()` adds the
 * checks that need every row (cycles) and returns the rows, the counts and the plan.
 */
export function createImportChecker(records: readonly ImportRecord[], mapping: HeaderMapping, ctx: ImportCheckContext) {
  const breedsByKey = new Map(ctx.breeds.map((b) => [breedKey(b.name), b]));
  const breedsById = new Map(ctx.breeds.map((b) => [b.id, b]));
  const onFarmByTattoo = new Map<string, HerdRecordForImport>();
  const recordsByTattoo = new Map<string, HerdRecordForImport[]>();
  const recordsById = new Map<string, HerdRecordForImport>();
  for (const record of ctx.herd) {
    const key = record.tattoo.toLowerCase();
    recordsById.set(record.id, record);
    if (record.onFarmHere) onFarmByTattoo.set(key, record);
    const list = recordsByTattoo.get(key);
    if (list) list.push(record);
    else recordsByTattoo.set(key, [record]);
  }
  const farmKey = breedKey(ctx.farmName);
  const unit = mapping.weightColumn;

  const rows: Row[] = [];
  for (const record of records) {
    const raw = {} as Record<ImportField, string>;
    const present = new Set<ImportField>();
    for (const [field, column] of Object.entries(mapping.index) as [ImportField, number][]) {
      raw[field] = fromSpreadsheetSafe((record.cells[column] ?? '').trim());
      present.add(field);
    }
    // A row of empty cells (a spreadsheet's trailing ",,,,") is not an animal.
    if ([...present].every((field) => raw[field] === '')) continue;
    rows.push(readOwnCells(record.line, raw, present));
  }

  const fileByTattoo = new Map<string, number[]>();
  rows.forEach((row, index) => {
    if (!row.tattoo) return;
    const list = fileByTattoo.get(row.key);
    if (list) list.push(index);
    else fileByTattoo.set(row.key, [index]);
  });
  for (const indexes of fileByTattoo.values()) {
    if (indexes.length < 2) continue;
    for (const index of indexes) {
      const others = indexes.filter((i) => i !== index).map((i) => rows[i]!.line);
      const row = rows[index]!;
      issue(row.errors, 'tattoo', `Tattoo ${row.tattoo} is also on line${others.length > 1 ? 's' : ''} ${others.slice(0, 5).join(', ')}; each animal once`);
    }
  }
  for (const row of rows) matchHerd(row);
  const rowByAnimalId = new Map(rows.map((row, index) => [row.animalId, index]));

  function readOwnCells(line: number, raw: Record<ImportField, string>, present: Set<ImportField>): Row {
    const errors: ImportIssueDto[] = [];
    const warnings: ImportIssueDto[] = [];
    const text = (field: ImportField, max: number, what: string, multiline = false): string => {
      const value = raw[field] ?? '';
      if (value.length > max) issue(errors, field, `Keep the ${what} under ${max} characters`);
      if (CONTROL.test(value) || (!multiline && LINE_BREAK.test(value))) issue(errors, field, `Keep the ${what} on one line, without control characters`);
      return value;
    };

    let tattoo: string | null = raw.tattoo ?? '';
    if (!tattoo) {
      issue(errors, 'tattoo', 'Enter the ear tattoo (every animal needs one)');
      tattoo = null;
    } else if (tattoo.length > 20) {
      issue(errors, 'tattoo', 'An ear tattoo has at most 20 characters');
      tattoo = null;
    } else if (!TATTOO.test(tattoo)) {
      issue(errors, 'tattoo', `"${tattoo}" is not a tattoo: use letters, digits and hyphens (e.g. HR-14)`);
      tattoo = null;
    }

    const name = text('name', 60, 'name');
    const sexCell = (raw.sex ?? '').toLowerCase();
    let sex: Sex | null = null;
    if (sexCell === 'doe' || sexCell === 'buck') sex = sexCell;
    else issue(errors, 'sex', sexCell ? `"${raw.sex}" is not a sex here: write doe or buck` : 'Enter the sex: doe or buck');

    const born = dateCell(raw.born ?? '', 'born', 'birth date', errors);
    if (born && born > ctx.today) issue(errors, 'born', `A birth date cannot be in the future (${born})`);

    let breedId: string | null | undefined;
    const breedCell = raw.breed ?? '';
    const key = breedKey(breedCell);
    if (!breedCell) issue(errors, 'breed', 'Enter the breed: a breed of the list, cross, or unknown');
    else if (CROSS_WORDS.has(key)) breedId = null;
    else if (key === 'unknown') breedId = null;
    else {
      const breed = breedsByKey.get(key);
      if (breed) breedId = breed.id;
      else issue(errors, 'breed', `Unknown breed "${breedCell}"${suggestBreed(key)}: use a breed of the co-op's list, cross, or unknown`);
    }

    const colour = text('colour', 60, 'colour');
    const registrationCell = text('registration', 40, 'registration number');
    const hutch = text('hutch', 30, 'hutch');
    const notes = text('notes', 2000, 'notes', true);

    let grams: number | null = null;
    let weighedOn: string | null = null;
    const weightCell = raw.weight ?? '';
    if (unit && weightCell) {
      const number = Number(weightCell.replace(/\s/g, '').replace(/^(\d+),(\d+)$/, '$1.$2'));
      if (!Number.isFinite(number) || number <= 0) {
        issue(errors, 'weight', `"${weightCell}" is not a weight: write a number of ${unit.slice(7)} (e.g. ${unit === 'weight_g' ? '3850' : '8.5'})`);
      } else {
        grams = Math.round(number * gramsPerWeightUnit[unit]);
        if (grams < PLAUSIBLE_GRAMS.min || grams > PLAUSIBLE_GRAMS.max) {
          issue(errors, 'weight', `${weightCell} ${unit.slice(7)} is not a plausible live weight; check the number and the column's unit`);
          grams = null;
        }
      }
      const weighedCell = raw.weighed ?? '';
      weighedOn = weighedCell ? dateCell(weighedCell, 'weighed', 'weighing date', errors) : ctx.today;
      if (weighedOn && weighedOn > ctx.today) issue(errors, 'weighed', 'A weighing date cannot be in the future');
      if (weighedOn && born && weighedOn < born) issue(errors, 'weighed', 'It was weighed before it was born; check the dates');
      if (!weighedOn) grams = null;
    } else if (raw.weighed) {
      issue(warnings, 'weighed', 'A weighing date without a weight is not used');
    }

    let breederName = '';
    let arrivedOn: string | null = null;
    const bredBy = text('bred_by', 120, 'breeder');
    if (bredBy && breedKey(bredBy) !== farmKey) {
      breederName = bredBy;
      const arrivedCell = raw.arrived ?? '';
      arrivedOn = arrivedCell ? dateCell(arrivedCell, 'arrived', 'arrival date', errors) : null;
      if (arrivedOn && arrivedOn > ctx.today) issue(errors, 'arrived', 'An arrival date cannot be in the future');
      if (arrivedOn && born && arrivedOn < born) issue(errors, 'arrived', 'It cannot arrive before it was born');
      if (!arrivedCell && born) {
        arrivedOn = born;
        issue(warnings, 'arrived', `Bred by ${bredBy} with no arrival date: recorded as arriving on its birth date`);
      }
    }

    return {
      line, raw, present, tattoo, key: tattoo?.toLowerCase() ?? '', name, sex, born, breedId, colour,
      registration: registrationCell || null, hutch, notes, grams, weighedOn, breederName, arrivedOn,
      existing: null, departed: null, action: 'create', animalId: '', parents: { sire: null, dam: null },
      effective: { sire: null, dam: null }, changes: [], updates: {}, errors, warnings,
    };
  }

  function dateCell(value: string, field: ImportField, what: string, errors: ImportIssueDto[]): string | null {
    if (isRecordDate(value)) return value;
    if (isIsoDate(value)) {
      issue(errors, field, `${value} is out of range for a ${what}: use a date from ${EARLIEST_RECORD_DATE} to ${LATEST_RECORD_DATE}`);
      return null;
    }
    const hint = /^\d{1,2}[/.]\d{1,2}[/.]\d{2,4}$/.test(value) ? ` (spreadsheets often turn dates into ${value}; format the column as text or YYYY-MM-DD)` : '';
    issue(errors, field, `"${value}" is not a ${what}: write it as YYYY-MM-DD, e.g. 2024-03-15${hint}`);
    return null;
  }

  function suggestBreed(key: string): string {
    let best: { name: string; distance: number } | null = null;
    for (const [candidateKey, breed] of breedsByKey) {
      const distance = candidateKey.startsWith(key) && key.length >= 3 ? 0 : editDistance(key, candidateKey);
      if (!best || distance < best.distance) best = { name: breed.name, distance };
    }
    return best && best.distance <= Math.max(2, Math.floor(key.length / 4)) ? ` (did you mean ${best.name}?)` : '';
  }

  function matchHerd(row: Row) {
    row.animalId = ctx.idFor(row.line);
    if (!row.tattoo) return;
    const existing = onFarmByTattoo.get(row.key);
    if (existing) {
      row.animalId = existing.id;
      row.action = 'unchanged';
      if (!existing.ownedHere) {
        issue(row.errors, 'tattoo', `${labelOf(existing.name, existing.tattoo)} is on loan here from another farm; its own farm keeps its record`);
        return;
      }
      row.existing = existing;
      if (row.sex && row.sex !== existing.sex) {
        issue(row.errors, 'sex', `Your herd records ${labelOf(existing.name, existing.tattoo)} as a ${existing.sex}; change it on the animal's page if that is wrong`);
      }
      if (row.born && row.born !== existing.birthDate) {
        issue(row.errors, 'born', `Your herd records ${labelOf(existing.name, existing.tattoo)} as born on ${existing.birthDate}; change it on the animal's page if that is wrong`);
      }
      return;
    }
    const earlier = recordsByTattoo.get(row.key) ?? [];
    const departed = earlier.find((r) => r.ownedHere && r.birthDate === row.born && r.sex === row.sex);
    if (departed) {
      row.animalId = departed.id;
      row.action = 'unchanged';
      row.departed = departed;
      issue(row.warnings, null, `Already in your records as ${departed.disposition.replace('_', ' ')}; left as it is`);
      return;
    }
    if (earlier.length > 0) {
      const dates = earlier.map((r) => r.birthDate).join(', ');
      issue(row.warnings, 'tattoo', `Tattoo ${row.tattoo} was carried by an animal no longer in your herd (born ${dates}); this row adds a new animal`);
    }
  }

  function firstBreedingOf(breedId: string | null): { doe: number; buck: number } | null {
    const breed = breedId ? breedsById.get(breedId) : undefined;
    return breed ? { doe: breed.firstBreedingDays.doe.min, buck: breed.firstBreedingDays.buck.min } : null;
  }

  function resolveParent(row: Row, role: ParentRole, tattoo: string): ParentRef | null {
    const key = tattoo.toLowerCase();
    if (key === row.key) {
      issue(row.errors, role, `An animal cannot be its own ${role}`);
      return null;
    }
    const inFile = fileByTattoo.get(key);
    if (inFile) {
      const index = inFile[0]!;
      const parent = rows[index]!;
      const record = parent.existing ?? parent.departed;
      return {
        id: parent.animalId,
        // An animal already on record is what the record says (its row may be wrong, and says so).
        sex: record?.sex ?? parent.sex,
        birthDate: record?.birthDate ?? parent.born,
        breedId: parent.breedId === undefined ? (record?.breedId ?? null) : parent.breedId,
        label: labelOf(parent.name || record?.name || '', parent.tattoo),
        row: index,
      };
    }
    const candidates = onFarmByTattoo.has(key) ? [onFarmByTattoo.get(key)!] : (recordsByTattoo.get(key) ?? []);
    if (candidates.length === 0) {
      issue(row.errors, role, `No animal with tattoo ${tattoo} in this file or in your herd (leave the ${role} blank if it is unknown)`);
      return null;
    }
    if (candidates.length > 1) {
      const dates = candidates.map((c) => c.birthDate).join(' and ');
      issue(row.errors, role, `More than one animal of your records has carried tattoo ${tattoo} (born ${dates}); choose the ${role} on the animal's page instead`);
      return null;
    }
    const record = candidates[0]!;
    return { id: record.id, sex: record.sex, birthDate: record.birthDate, breedId: record.breedId, label: labelOf(record.name, record.tattoo), row: null };
  }

  function checkParent(row: Row, role: ParentRole, parent: ParentRef) {
    const wanted: Sex = role === 'sire' ? 'buck' : 'doe';
    if (parent.sex && parent.sex !== wanted) {
      issue(row.errors, role, `${parent.label} is a ${parent.sex}; a ${role} must be a ${wanted}`);
      return;
    }
    if (!row.born || !parent.birthDate) return;
    if (parent.birthDate >= row.born) {
      issue(row.errors, role, `${parent.label} was born on ${parent.birthDate}, not before this animal (${row.born}); a parent is born first`);
      return;
    }
    if (role === 'dam') {
      const problem = kitBirthDateProblem(row.born, { label: parent.label, kindledOn: ctx.kindlingDaysByDam?.get(parent.id) ?? [] });
      if (problem) issue(row.errors, 'born', problem);
    }
    if (!parent.sex) return;
    const young = youngParentAt({ sex: parent.sex, birthDate: parent.birthDate }, row.born, firstBreedingOf(parent.breedId));
    if (young) {
      issue(
        row.warnings,
        role,
        `${parent.label} was ${young.ageDays} days old at this birth, younger than the usual first-breeding age of ${young.minimumDays} days for its breed`,
      );
    }
  }

  function breedName(breedId: string | null, word = 'unknown'): string {
    return breedId ? (breedsById.get(breedId)?.name ?? 'a removed breed') : word;
  }

  function checkRow(row: Row) {
    if (row.departed || (row.action === 'unchanged' && !row.existing)) return;
    const existing = row.existing;
    for (const role of ['sire', 'dam'] as const) {
      const cell = row.raw[role] ?? '';
      const recordedId = existing ? (role === 'sire' ? existing.sireId : existing.damId) : null;
      const recordedTattoo = existing ? (role === 'sire' ? existing.sireTattoo : existing.damTattoo) : null;
      row.effective[role] = recordedId;
      if (!cell) continue;
      if (cell !== '' && !TATTOO.test(cell)) {
        issue(row.errors, role, `"${cell}" is not a tattoo: write the ${role}'s tattoo, or leave it blank if unknown`);
        continue;
      }
      if (recordedId) {
        if (recordedTattoo && recordedTattoo.toLowerCase() === cell.toLowerCase()) continue;
        const recorded = recordsById.get(recordedId);
        issue(
          row.errors,
          role,
          `Your herd records ${recordedTattoo ?? recorded?.name ?? 'another animal'} as its ${role}, not ${cell}; change parents on the animal's page`,
        );
        continue;
      }
      const parent = resolveParent(row, role, cell);
      if (!parent) continue;
      row.parents[role] = parent;
      row.effective[role] = parent.id;
      checkParent(row, role, parent);
      if (existing) {
        row.updates[role === 'sire' ? 'sireId' : 'damId'] = parent.id;
        row.changes.push({ field: role, from: 'unknown', to: cell });
      }
    }

    if (!existing) {
      if (row.breedId === null && (row.raw.breed ?? '') !== '' && CROSS_WORDS.has(breedKey(row.raw.breed ?? '')) && !row.raw.sire && !row.raw.dam) {
        issue(row.warnings, 'breed', 'A cross takes its make-up from its parents; with neither given it is recorded as unknown ancestry');
      }
      return;
    }
    const change = (field: ImportField, from: string, to: string) => row.changes.push({ field, from: from || '(blank)', to });
    if (row.name && row.name !== existing.name) {
      change('name', existing.name, row.name);
      row.updates.name = row.name;
    }
    if (row.colour && row.colour !== existing.colour) {
      change('colour', existing.colour, row.colour);
      row.updates.colour = row.colour;
    }
    if (row.registration && row.registration !== existing.registrationNumber) {
      change('registration', existing.registrationNumber ?? '', row.registration);
      row.updates.registrationNumber = row.registration;
    }
    if (row.hutch && row.hutch !== existing.hutch) {
      change('hutch', existing.hutch, row.hutch);
      row.updates.hutch = row.hutch;
    }
    if (row.notes && row.notes !== existing.notes) {
      change('notes', existing.notes, row.notes);
      row.updates.notes = row.notes;
    }
    // "unknown" never erases a recorded breed; "cross" or a breed of the list replaces it.
    const saysUnknown = breedKey(row.raw.breed ?? '') === 'unknown';
    if (row.breedId !== undefined && !(saysUnknown && existing.breedId) && row.breedId !== existing.breedId) {
      change('breed', breedName(existing.breedId), breedName(row.breedId, 'cross'));
      row.updates.breedId = row.breedId;
    }
    if (row.grams !== null && row.weighedOn) {
      const latest = existing.latestWeight;
      const same = latest && latest.weighedOn === row.weighedOn && Math.abs(latest.grams - row.grams) <= SAME_WEIGHT_GRAMS;
      if (!same) change('weight', latest ? `${formatWeight(latest.grams, ctx.weightUnit)} on ${latest.weighedOn}` : '', `${formatWeight(row.grams, ctx.weightUnit)} on ${row.weighedOn}`);
    }
    row.action = row.changes.length > 0 ? 'update' : 'unchanged';
  }

  /** Rows whose parents (through other rows of the file) lead back to themselves. */
  function markCycles() {
    const parentRows = (index: number): number[] => {
      const row = rows[index]!;
      const out: number[] = [];
      for (const role of ['sire', 'dam'] as const) {
        const id = row.effective[role];
        const parentIndex = id ? rowByAnimalId.get(id) : undefined;
        if (parentIndex !== undefined && parentIndex !== index) out.push(parentIndex);
      }
      return out;
    };
    const state = new Uint8Array(rows.length); // 0 unseen, 1 on the path, 2 done
    const inCycle = new Set<number>();
    for (let root = 0; root < rows.length; root++) {
      if (state[root] !== 0) continue;
      const path: number[] = [root];
      const next: number[][] = [parentRows(root)];
      state[root] = 1;
      while (path.length > 0) {
        const pending = next[next.length - 1]!;
        if (pending.length === 0) {
          state[path.pop()!] = 2;
          next.pop();
          continue;
        }
        const parent = pending.pop()!;
        if (state[parent] === 1) {
          const cycle = path.slice(path.indexOf(parent));
          const names = [...cycle, parent].map((i) => rows[i]!.tattoo ?? `line ${rows[i]!.line}`).join(' → ');
          for (const index of cycle) {
            if (inCycle.has(index)) continue;
            inCycle.add(index);
            issue(rows[index]!.errors, null, `Part of a cycle in the pedigree (${names}, each arrow pointing to a parent): an animal cannot be its own ancestor`);
          }
        } else if (state[parent] === 0) {
          state[parent] = 1;
          path.push(parent);
          next.push(parentRows(parent));
        }
      }
    }
  }

  function present(row: Row): HerdImportRowDto {
    return {
      line: row.line,
      action: row.action,
      animalId: row.animalId,
      tattoo: row.raw.tattoo ?? '',
      name: row.raw.name ?? '',
      sex: row.raw.sex ?? '',
      breed: row.raw.breed ?? '',
      born: row.raw.born ?? '',
      sire: row.raw.sire ?? '',
      dam: row.raw.dam ?? '',
      colour: row.raw.colour ?? '',
      registration: row.raw.registration ?? '',
      weight: row.raw.weight ?? '',
      changes: row.changes,
      errors: row.errors,
      warnings: row.warnings,
    };
  }

  function plan(): ImportPlan {
    const result: ImportPlan = { creates: [], updates: [], weighIns: [] };
    for (const row of rows) {
      if (row.errors.length > 0) continue;
      if (row.action === 'create' && row.tattoo && row.sex && row.born && row.breedId !== undefined) {
        const declared = row.breedId;
        result.creates.push({
          id: row.animalId,
          line: row.line,
          tattoo: row.tattoo,
          name: row.name,
          sex: row.sex,
          breedId: declared,
          colour: row.colour,
          birthDate: row.born,
          sireId: row.effective.sire,
          damId: row.effective.dam,
          registrationNumber: row.registration,
          hutch: row.hutch,
          notes: row.notes,
          lifecycle: lifecycleByAge(row.sex, row.born, ctx.today, firstBreedingOf(declared)),
          breederName: row.breederName,
          arrivedOn: row.arrivedOn,
        });
        if (row.grams !== null && row.weighedOn) result.weighIns.push({ animalId: row.animalId, line: row.line, grams: row.grams, weighedOn: row.weighedOn });
      } else if (row.action === 'update' && row.existing) {
        if (Object.keys(row.updates).length > 0) {
          result.updates.push({ animalId: row.existing.id, version: row.existing.version, line: row.line, changes: row.updates });
        }
        if (row.grams !== null && row.weighedOn && row.changes.some((c) => c.field === 'weight')) {
          result.weighIns.push({ animalId: row.existing.id, line: row.line, grams: row.grams, weighedOn: row.weighedOn });
        }
      }
    }
    return result;
  }

  let finished: ImportCheckResult | null = null;
  return {
    /** Rows that hold an animal (blank rows are left out). */
    total: rows.length,
    check(from: number, to: number) {
      for (let i = from; i < Math.min(to, rows.length); i++) checkRow(rows[i]!);
    },
    finish(): ImportCheckResult {
      if (finished) return finished;
      markCycles();
      const presented = rows.map(present);
      const planned = plan();
      const count = (action: ImportAction) => presented.filter((r) => r.action === action && r.errors.length === 0).length;
      finished = {
        rows: presented,
        plan: planned,
        summary: {
          rows: presented.length,
          create: count('create'),
          update: count('update'),
          unchanged: count('unchanged'),
          withErrors: presented.filter((r) => r.errors.length > 0).length,
          withWarnings: presented.filter((r) => r.warnings.length > 0).length,
          withProblems: presented.filter((r) => r.errors.length > 0 || r.warnings.length > 0).length,
          weighIns: planned.weighIns.length,
        },
      };
      return finished;
    },
  };
}

/** Checks every row at once (for callers that need no progress). */
export function checkImportRows(records: readonly ImportRecord[], mapping: HeaderMapping, ctx: ImportCheckContext): ImportCheckResult {
  const checker = createImportChecker(records, mapping, ctx);
  checker.check(0, checker.total);
  return checker.finish();
}
