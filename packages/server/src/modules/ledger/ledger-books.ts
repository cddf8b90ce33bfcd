import { QueryTypes, type Transaction } from 'sequelize';
import type { AccountKind, AccountRef, CoopAccountKind, PaymentMethod, TransferKind, TransferStatus } from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { AppError } from '../../lib/app-error';

/*
 * The books themselves, private to the Ledger: accounts, the journal and the cached balances. Every
 * write runs in the caller's tenant transaction. Balances change only here, under row locks on both
 * accounts taken in id order (so two transfers between the same accounts never deadlock).
 */

export interface AccountRow {
  id: string;
  kind: AccountKind;
  farm_id: string | null;
  posted_cents: string;
  pending_debit_cents: string;
  pending_credit_cents: string;
}

export interface TransferRow {
  id: string;
  kind: TransferKind;
  status: TransferStatus;
  debit_account_id: string;
  credit_account_id: string;
  amount_cents: string;
  source_type: string;
  source_id: string;
  memo: string;
  booked_on: string;
  method: PaymentMethod | null;
  corrects_transfer_id: string | null;
  correction_reason: string | null;
  awaiting_farm_id: string | null;
  posted_by: string | null;
  created_at: Date;
  posted_at: Date | null;
  voided_at: Date | null;
}

export interface NewTransfer {
  id: string;
  kind: TransferKind;
  debitAccountId: string;
  creditAccountId: string;
  amountCents: number;
  status: 'pending' | 'posted';
  sourceType?: string;
  sourceId?: string;
  memo?: string;
  /** Defaults to today (UTC) and then plays no part in "same fields". */
  bookedOn?: string;
  method?: PaymentMethod | null;
  correctsTransferId?: string | null;
  correctionReason?: string | null;
  awaitingFarmId?: string | null;
  postedBy?: string | null;
}

export const cents = (value: string | number | null | undefined): number => Number(value ?? 0);

async function select<T extends object>(tx: Transaction, sql: string, bind: unknown[]): Promise<T[]> {
  return database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
}

const TRANSFER_COLUMNS = `id, kind, status, debit_account_id, credit_account_id, amount_cents, source_type, source_id, memo,
  to_char(booked_on, 'YYYY-MM-DD') AS booked_on, method, corrects_transfer_id, correction_reason, awaiting_farm_id, posted_by,
  created_at, posted_at, voided_at`;

/**
 * The account of a farm or of the co-op, made on first use. A farm of another co-op is not found (row-level
 * security): a field error when posting names it, a 404 (`reading`) when it is the account asked for.
 */
export async function accountOf(tx: Transaction, ref: AccountRef, opts: { reading?: boolean } = {}): Promise<AccountRow> {
  if ('farmId' in ref) {
    const [farm] = await select<{ id: string }>(tx, 'SELECT id FROM farms WHERE id = $1', [ref.farmId]);
    if (!farm && opts.reading) throw AppError.notFound('That farm\'s account');
    if (!farm) throw AppError.validation({ farmId: ['Choose a farm of the co-op'] });
    await database().query(
      `INSERT INTO ledger_accounts (coop_id, farm_id, kind) VALUES (current_coop_id(), $1, 'farm')
       ON CONFLICT (coop_id, farm_id) WHERE farm_id IS NOT NULL DO NOTHING`,
      { bind: [ref.farmId], transaction: tx },
    );
    const [row] = await select<AccountRow>(tx, 'SELECT * FROM ledger_accounts WHERE farm_id = $1', [ref.farmId]);
    return row!;
  }
  return coopAccountOf(tx, ref.coop);
}

export async function coopAccountOf(tx: Transaction, kind: CoopAccountKind): Promise<AccountRow> {
  await database().query(
    `INSERT INTO ledger_accounts (coop_id, kind) VALUES (current_coop_id(), $1)
     ON CONFLICT (coop_id, kind) WHERE farm_id IS NULL DO NOTHING`,
    { bind: [kind], transaction: tx },
  );
  const [row] = await select<AccountRow>(tx, 'SELECT * FROM ledger_accounts WHERE farm_id IS NULL AND kind = $1', [kind]);
  return row!;
}

export async function accountsByIds(tx: Transaction, ids: string[]): Promise<Map<string, AccountRow>> {
  if (ids.length === 0) return new Map();
  const rows = await select<AccountRow>(tx, 'SELECT * FROM ledger_accounts WHERE id = ANY($1::uuid[])', [[...new Set(ids)]]);
  return new Map(rows.map((r) => [r.id, r]));
}

export async function allAccounts(tx: Transaction): Promise<AccountRow[]> {
  return select<AccountRow>(tx, 'SELECT * FROM ledger_accounts ORDER BY kind, id', []);
}

export async function findTransfer(tx: Transaction, id: string, opts: { lock?: boolean } = {}): Promise<TransferRow | null> {
  const [row] = await select<TransferRow>(tx, `SELECT ${TRANSFER_COLUMNS} FROM ledger_transfers WHERE id = $1 ${opts.lock ? 'FOR UPDATE' : ''}`, [id]);
  return row ?? null;
}

/**
 * Locks both accounts' rows in id order, then applies `change` to each. FOR NO KEY UPDATE, not FOR UPDATE:
 * the transfer's own foreign keys hold KEY SHARE locks on the same rows, which FOR UPDATE would wait on.
 */
async function moveBalances(tx: Transaction, debitId: string, creditId: string, change: { debit: string; credit: string }, amount: number): Promise<void> {
  const ordered = [debitId, creditId].sort();
  await database().query('SELECT id FROM ledger_accounts WHERE id = ANY($1::uuid[]) ORDER BY id FOR NO KEY UPDATE', { bind: [ordered], transaction: tx });
  await database().query(`UPDATE ledger_accounts SET ${change.debit}, updated_at = now() WHERE id = $1`, { bind: [debitId, amount], transaction: tx });
  await database().query(`UPDATE ledger_accounts SET ${change.credit}, updated_at = now() WHERE id = $1`, { bind: [creditId, amount], transaction: tx });
}

/** The fields two posts of one id must share to be the same transfer. */
function sameTransfer(row: TransferRow, t: NewTransfer): boolean {
  return row.kind === t.kind
    && row.debit_account_id === t.debitAccountId
    && row.credit_account_id === t.creditAccountId
    && cents(row.amount_cents) === t.amountCents
    && row.source_type === (t.sourceType ?? '')
    && row.source_id === (t.sourceId ?? '')
    && row.memo === (t.memo ?? '')
    && (t.bookedOn === undefined || row.booked_on === t.bookedOn)
    && (row.method ?? null) === (t.method ?? null)
    && (row.corrects_transfer_id ?? null) === (t.correctsTransferId ?? null);
}

/**
 * Writes a transfer exactly once. A second post with the same id and fields answers the original (and
 * changes nothing, whatever its status is by now); with other fields it is a 409. Concurrent posts of
 * one id wait on the first one's insert, then find its row.
 */
export async function insertTransfer(tx: Transaction, t: NewTransfer): Promise<{ row: TransferRow; created: boolean }> {
  const [inserted] = await select<TransferRow>(
    tx,
    `INSERT INTO ledger_transfers (coop_id, id, kind, status, debit_account_id, credit_account_id, amount_cents, source_type, source_id,
       memo, booked_on, method, corrects_transfer_id, correction_reason, awaiting_farm_id, posted_by, posted_at)
     VALUES (current_coop_id(), $1, $2, $3, $4, $5, $6, $7, $8, $9, COALESCE($10::date, (now() AT TIME ZONE 'UTC')::date), $11, $12, $13, $14, $15,
       CASE WHEN $3 = 'posted' THEN now() END)
     ON CONFLICT (coop_id, id) DO NOTHING
     RETURNING ${TRANSFER_COLUMNS}`,
    [
      t.id, t.kind, t.status, t.debitAccountId, t.creditAccountId, t.amountCents, t.sourceType ?? '', t.sourceId ?? '', t.memo ?? '',
      t.bookedOn ?? null, t.method ?? null, t.correctsTransferId ?? null, t.correctionReason ?? null, t.awaitingFarmId ?? null, t.postedBy ?? null,
    ],
  );
  if (!inserted) {
    const existing = await findTransfer(tx, t.id);
    if (!existing) throw AppError.idTaken();
    if (!sameTransfer(existing, t)) throw AppError.conflict(`Transfer ${t.id} was already posted with other details`);
    return { row: existing, created: false };
  }
  if (t.status === 'posted') {
    await moveBalances(tx, t.debitAccountId, t.creditAccountId, { debit: 'posted_cents = posted_cents - $2', credit: 'posted_cents = posted_cents + $2' }, t.amountCents);
  } else {
    await moveBalances(tx, t.debitAccountId, t.creditAccountId, { debit: 'pending_debit_cents = pending_debit_cents + $2', credit: 'pending_credit_cents = pending_credit_cents + $2' }, t.amountCents);
  }
  return { row: inserted, created: true };
}

/** Pending → posted: the amount leaves "expected" and enters the balances. Posting twice answers the posted transfer. */
export async function postPendingTransfer(tx: Transaction, id: string, postedBy: string | null): Promise<{ row: TransferRow; changed: boolean }> {
  const row = await findTransfer(tx, id, { lock: true });
  if (!row) throw AppError.notFound('That transfer');
  if (row.status === 'posted') return { row, changed: false };
  if (row.status === 'voided') throw AppError.conflict('That transfer was voided; a voided transfer is never posted');
  await moveBalances(tx, row.debit_account_id, row.credit_account_id, {
    debit: 'pending_debit_cents = pending_debit_cents - $2, posted_cents = posted_cents - $2',
    credit: 'pending_credit_cents = pending_credit_cents - $2, posted_cents = posted_cents + $2',
  }, cents(row.amount_cents));
  await database().query(
    // The booking date stays the one it was given (the day a payment was made), whenever it is confirmed.
    `UPDATE ledger_transfers SET status = 'posted', posted_at = now(), posted_by = COALESCE($2, posted_by), awaiting_farm_id = NULL WHERE id = $1`,
    { bind: [id, postedBy], transaction: tx },
  );
  return { row: (await findTransfer(tx, id))!, changed: true };
}

/** Pending → voided: the expected amount goes away. Voiding twice answers the voided transfer. */
export async function voidPendingTransfer(tx: Transaction, id: string): Promise<{ row: TransferRow; changed: boolean }> {
  const row = await findTransfer(tx, id, { lock: true });
  if (!row) throw AppError.notFound('That transfer');
  if (row.status === 'voided') return { row, changed: false };
  if (row.status === 'posted') throw AppError.conflict('That transfer is posted; correct it with a reversing transfer instead');
  await moveBalances(tx, row.debit_account_id, row.credit_account_id, {
    debit: 'pending_debit_cents = pending_debit_cents - $2',
    credit: 'pending_credit_cents = pending_credit_cents - $2',
  }, cents(row.amount_cents));
  await database().query(`UPDATE ledger_transfers SET status = 'voided', voided_at = now(), awaiting_farm_id = NULL WHERE id = $1`, { bind: [id], transaction: tx });
  return { row: (await findTransfer(tx, id))!, changed: true };
}

/** What of a posted transfer its pending and posted corrections have not reversed yet. */
export async function uncorrectedCents(tx: Transaction, original: TransferRow): Promise<number> {
  const [row] = await select<{ corrected: string | null }>(
    tx,
    `SELECT sum(amount_cents) AS corrected FROM ledger_transfers WHERE corrects_transfer_id = $1 AND status <> 'voided'`,
    [original.id],
  );
  return cents(original.amount_cents) - cents(row?.corrected);
}

export { select as selectRows, TRANSFER_COLUMNS };
