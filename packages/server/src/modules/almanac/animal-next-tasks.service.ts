import { QueryTypes, type Transaction } from 'sequelize';
import { TASK_KIND_LABELS, type PlannedTaskKind } from '@burrowline/shared';
import { database } from '../../db/sequelize';

export interface NextTask {
  title: string;
  dueOn: string;
}

/** The next open Almanac tasks of each of these animals (a doe's palpation, nest box, kindling…), soonest first. */
export async function nextTasksOfAnimals(tx: Transaction, animalIds: string[], perAnimal = 3): Promise<Map<string, NextTask[]>> {
  const rows = await database().query<{ animal_id: string; kind: PlannedTaskKind; due_on: string }>(
    `SELECT animal_id, kind, due_on::text AS due_on FROM (
       SELECT animal_id, kind, due_on, row_number() OVER (PARTITION BY animal_id ORDER BY due_on, kind) AS n
         FROM almanac_tasks WHERE animal_id = ANY($1::uuid[]) AND state IN ('open', 'moved')
     ) t WHERE n <= $2 ORDER BY animal_id, due_on`,
    { bind: [animalIds, perAnimal], type: QueryTypes.SELECT, transaction: tx },
  );
  const out = new Map<string, NextTask[]>();
  for (const row of rows) out.set(row.animal_id, [...(out.get(row.animal_id) ?? []), { title: TASK_KIND_LABELS[row.kind], dueOn: row.due_on }]);
  return out;
}
