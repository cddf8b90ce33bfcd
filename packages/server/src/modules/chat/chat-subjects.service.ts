import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../../db/sequelize';
import type { SessionUser } from '../../lib/session-user';

/** Who a subject's thread reaches: every active member of these farms (their apprentices too), and these people. */
export interface ThreadParticipants {
  farmIds: string[];
  userIds: string[];
}

/**
 * What the module that owns a subject (a litter, a processing day, a loan, a listing) tells Co-op Chat
 * about it. Every function runs inside the caller's tenant transaction; decide with the one access helper
 * (modules/farms/farm-access.ts) so the thread's readers are exactly the subject's readers.
 */
export interface ThreadSubject {
  /** Whether the actor may read the subject (and so its thread). False for another co-op's or an unknown id: a 404. */
  mayRead(tx: Transaction, actor: SessionUser, subjectId: string): Promise<boolean>;
  /** Who is told of new messages and may be mentioned; must agree with `mayRead`. */
  participants(tx: Transaction, subjectId: string): Promise<ThreadParticipants>;
  /** The thread's title, read when the thread is opened: "Processing day, 14 March at Wren Hollow". */
  title(tx: Transaction, subjectId: string): Promise<string>;
  /** The subject's page in the app, e.g. "/processing-days/<id>". */
  link(subjectId: string): string;
  /**
   * Optional, for lists and search: which of these subjects the actor may read, in one query. Without it,
   * `mayRead` is asked once per subject thread.
   */
  readableAmong?(tx: Transaction, actor: SessionUser, subjectIds: string[]): Promise<string[]>;
  /**
   * Optional, for the thread list: the subject's rows as SQL, so every kind of subject is read in one
   * statement with the others (the list's cost stays the same however many kinds there are).
   */
  rowsInSql?: RowsInSql;
}

/** A subject's rows by SQL: `rowsSql(ids)` selects them (with an `id` column) for an SQL expression of a uuid[]. */
export interface RowsInSql {
  rowsSql(ids: string): string;
  mayReadRow(actor: SessionUser, row: { id: string }): boolean;
}

const subjects = new Map<string, ThreadSubject>();

/**
 * Makes a kind of subject able to have a thread: `type` is the name used in paths and rows ("litter",
 * "processing-day", "loan"). Registered once at start-up (composition/ports.ts); a second registration of
 * the same type is a programming error.
 */
export function registerThreadSubject(type: string, subject: ThreadSubject): void {
  if (!/^[a-z][a-z-]{1,39}$/.test(type)) throw new Error(`A thread subject's type is lower-case words with dashes, not "${type}"`);
  const known = subjects.get(type);
  if (known && known !== subject) throw new Error(`The thread subject "${type}" is registered already`);
  subjects.set(type, subject);
}

export function threadSubjectOf(type: string): ThreadSubject | undefined {
  return subjects.get(type);
}

/** The subject ids among `ids` (all of one type) the actor may read. */
export async function readableSubjects(tx: Transaction, actor: SessionUser, type: string, ids: string[]): Promise<string[]> {
  const subject = subjects.get(type);
  if (!subject || ids.length === 0) return [];
  if (subject.readableAmong) return subject.readableAmong(tx, actor, ids);
  const readable: string[] = [];
  for (const id of ids) if (await subject.mayRead(tx, actor, id)) readable.push(id);
  return readable;
}

/**
 * The subject threads of the co-op the actor may read, by id, in one statement for every kind of subject
 * that gives its rows as SQL (one more per kind that does not).
 */
export async function readableSubjectThreads(tx: Transaction, actor: SessionUser): Promise<string[]> {
  const inSql = [...subjects].filter(([, subject]) => subject.rowsInSql);
  // Types are checked lower-case words with dashes at registration, so they are safe to write into the SQL.
  const unions = inSql.map(([type, subject]) =>
    `SELECT '${type}'::text AS subject_type, to_jsonb(r) AS row FROM (${subject.rowsInSql!.rowsSql(`ARRAY(SELECT subject_id FROM threads WHERE subject_type = '${type}')`)}) r`);
  const rows = await database().query<{ id: string; subject_type: string; subject_id: string; row: { id: string } | null }>(
    `WITH threads AS (SELECT id, subject_type, subject_id FROM chat_threads WHERE coop_id = $1 AND kind = 'subject')${unions.length > 0 ? `,
     subject_rows AS (${unions.join(' UNION ALL ')})` : ''}
     SELECT t.id, t.subject_type, t.subject_id, ${unions.length > 0 ? 's.row' : 'NULL::jsonb AS row'} FROM threads t
     ${unions.length > 0 ? `LEFT JOIN subject_rows s ON s.subject_type = t.subject_type AND (s.row->>'id')::uuid = t.subject_id` : ''}`,
    { bind: [actor.coopId], type: QueryTypes.SELECT, transaction: tx },
  );
  const ids: string[] = [];
  const others = new Map<string, { id: string; subject_id: string }[]>();
  for (const r of rows) {
    const subject = subjects.get(r.subject_type);
    if (!subject) continue;
    if (subject.rowsInSql) {
      if (r.row && subject.rowsInSql.mayReadRow(actor, r.row)) ids.push(r.id);
    } else {
      others.set(r.subject_type, [...(others.get(r.subject_type) ?? []), r]);
    }
  }
  for (const [type, threads] of others) {
    const readable = new Set(await readableSubjects(tx, actor, type, threads.map((t) => t.subject_id)));
    for (const t of threads) if (readable.has(t.subject_id)) ids.push(t.id);
  }
  return ids;
}

/**
 * A subject whose facts come from one read of its rows by id: the read, who may read one row, its farms,
 * its title and its page. `mayRead`, `readableAmong`, `participants` and `title` all follow from these.
 * Give the read as `rowsSql` (a SELECT of the rows whose id is in the uuid[] expression it is handed) and
 * the thread list reads this kind of subject in the same statement as the others; `rowsOf` costs one more.
 */
export function subjectFromRows<Row extends { id: string }>(spec: {
  mayRead: (actor: SessionUser, row: Row) => boolean;
  participants: (tx: Transaction, row: Row) => Promise<ThreadParticipants> | ThreadParticipants;
  title: (row: Row | undefined) => string;
  link: (subjectId: string) => string;
} & ({ rowsSql: (ids: string) => string; rowsOf?: never } | { rowsOf: (tx: Transaction, ids: string[]) => Promise<Row[]>; rowsSql?: never })): ThreadSubject {
  const rowsSql = spec.rowsSql;
  const rowsOf = rowsSql
    ? (tx: Transaction, ids: string[]) => database().query<Row>(rowsSql('$1::uuid[]'), { bind: [ids], type: QueryTypes.SELECT, transaction: tx })
    : spec.rowsOf!;
  const one = async (tx: Transaction, id: string) => (await rowsOf(tx, [id]))[0];
  return {
    rowsInSql: rowsSql ? { rowsSql, mayReadRow: (actor, row) => spec.mayRead(actor, row as Row) } : undefined,
    async mayRead(tx, actor, subjectId) {
      const row = await one(tx, subjectId);
      return row !== undefined && spec.mayRead(actor, row);
    },
    async readableAmong(tx, actor, subjectIds) {
      return (await rowsOf(tx, subjectIds)).filter((row) => spec.mayRead(actor, row)).map((row) => row.id);
    },
    async participants(tx, subjectId) {
      const row = await one(tx, subjectId);
      return row ? spec.participants(tx, row) : { farmIds: [], userIds: [] };
    },
    async title(tx, subjectId) {
      return spec.title(await one(tx, subjectId));
    },
    link: spec.link,
  };
}
