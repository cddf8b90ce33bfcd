import type { AnimalRefDto, Sex } from '@burrowline/shared';

/*
 * The short reference to an animal (name, tattoo, sex, the farm keeping it) read in the list's own
 * statement, beside the rows that name the animal, instead of a second read of whole animal records.
 * It answers what the herd's presentAnimalRef answers from the animal's facts.
 */

/** The reference's columns of animal `alias`, named `<prefix>_name`, `<prefix>_tattoo`, `<prefix>_sex`, `<prefix>_keeping_farm_id`. */
export function animalRefColumnsSql(alias: string, prefix: string): string {
  return `${alias}.name AS ${prefix}_name, ${alias}.tattoo AS ${prefix}_tattoo, ${alias}.sex AS ${prefix}_sex, ${alias}.keeping_farm_id AS ${prefix}_keeping_farm_id`;
}

/** Joins the co-op's live animal `alias` whose id is `idSql` (none when deleted: the reference then shows no name). */
export function animalRefJoinSql(alias: string, idSql: string): string {
  return `LEFT JOIN animals ${alias} ON ${alias}.id = ${idSql} AND ${alias}.deleted_at IS NULL`;
}

/** A row's reference columns under `prefix`, as the statement returns them. */
export type AnimalRefRow<P extends string> = {
  [K in `${P}_name` | `${P}_tattoo` | `${P}_keeping_farm_id`]: string | null;
} & { [K in `${P}_sex`]: Sex | null };

/** What a reference shows of an animal (the herd's facts of an animal have these too). */
export interface AnimalRefFacts {
  name: string;
  tattoo: string | null;
  sex: Sex;
  keepingFarmId: string | null;
}

/** The reference to animal `id`; with no facts (deleted, or not the co-op's) it shows no name. */
export function animalRef(id: string, animal: AnimalRefFacts | undefined, farms: Map<string, { name: string }>): AnimalRefDto {
  const farm = animal?.keepingFarmId ? { id: animal.keepingFarmId, name: farms.get(animal.keepingFarmId)?.name ?? 'A former member farm' } : null;
  return { id, name: animal?.name ?? '', tattoo: animal?.tattoo ?? null, sex: animal?.sex ?? 'doe', farm };
}

/** The facts under `prefix` of `row`; undefined when the statement found no live animal. */
export function animalRefFactsOf<P extends string>(row: AnimalRefRow<P>, prefix: P): AnimalRefFacts | undefined {
  const r = row as Record<string, unknown>;
  const sex = r[`${prefix}_sex`] as Sex | null;
  if (sex === null) return undefined;
  return {
    name: (r[`${prefix}_name`] as string | null) ?? '',
    tattoo: r[`${prefix}_tattoo`] as string | null,
    sex,
    keepingFarmId: r[`${prefix}_keeping_farm_id`] as string | null,
  };
}

/** The reference to animal `id` from the columns under `prefix` of `row`; farm names from the co-op's directory. */
export function animalRefOf<P extends string>(id: string, row: AnimalRefRow<P>, prefix: P, farms: Map<string, { name: string }>): AnimalRefDto {
  return animalRef(id, animalRefFactsOf(row, prefix), farms);
}
