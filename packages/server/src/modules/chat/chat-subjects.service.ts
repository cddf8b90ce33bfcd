import type { Transaction } from 'sequelize';
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
 * A subject whose facts come from one read of its rows by id: the read, who may read one row, its farms,
 * its title and its page. `mayRead`, `readableAmong`, `participants` and `title` all follow from these.
 */
export function subjectFromRows<Row extends { id: string }>(spec: {
  rowsOf: (tx: Transaction, ids: string[]) => Promise<Row[]>;
  mayRead: (actor: SessionUser, row: Row) => boolean;
  participants: (tx: Transaction, row: Row) => Promise<ThreadParticipants> | ThreadParticipants;
  title: (row: Row | undefined) => string;
  link: (subjectId: string) => string;
}): ThreadSubject {
  const one = async (tx: Transaction, id: string) => (await spec.rowsOf(tx, [id]))[0];
  return {
    async mayRead(tx, actor, subjectId) {
      const row = await one(tx, subjectId);
      return row !== undefined && spec.mayRead(actor, row);
    },
    async readableAmong(tx, actor, subjectIds) {
      return (await spec.rowsOf(tx, subjectIds)).filter((row) => spec.mayRead(actor, row)).map((row) => row.id);
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
