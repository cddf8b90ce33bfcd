import type { Transaction } from 'sequelize';
import {
  coopAccountKinds, defineAbilityFor, ErrorCode, RealtimeEvent, rooms, settleUp, subjectOf,
  type AccountRef, type CoopLedgerDto, type CorrectionCreateInput, type FarmDuesDto, type FeesByMonthDto, type LedgerSummaryDto,
  type PaymentCreateInput, type SettleUpDto, type TransferCreateInput, type TransferDto, type TransferKind, type TransferListDto,
  type TransferListQuery,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { getCoop } from '../coops/coops.service';
import { authorize, canSeeMoney } from '../farms/farm-access';
import { farmDirectoryOf, findFarmRefs } from '../farms/farms.service';
import {
  accountOf, accountsByIds, allAccounts, cents, coopAccountOf, findTransfer, insertTransfer, postPendingTransfer, selectRows,
  TRANSFER_COLUMNS, uncorrectedCents, voidPendingTransfer, type AccountRow, type NewTransfer, type TransferRow,
} from './ledger-books';
import { presentAccount, presentTransfer, type LedgerNames, type TransferPermissions } from './ledger.presenter';

/*
 * The Ledger's public service. Other modules (stud fees of a loan, processing fees of a booking, a sale)
 * post through `postTransfer`, `postPending` and `voidPending` inside their own transaction, with an id
 * derived from their record ("loan:<id>:fee"), so a retried request never charges twice. The rest answers
 * the Ledger's routes: every function checks that the actor may see the money it returns.
 */

// ---------------------------------------------------------------------------------------------
// For other modules, inside the caller's transaction
// ---------------------------------------------------------------------------------------------

export interface LedgerPosting {
  id: string;
  kind: TransferKind;
  /** Charged (its balance goes down) and credited (goes up). */
  debit: AccountRef;
  credit: AccountRef;
  amountCents: number;
  /** Pending: shown as expected until posted or voided (a booking's fee before the day). */
  pending?: boolean;
  sourceType?: string;
  sourceId?: string;
  memo?: string;
  bookedOn?: string;
  postedBy?: string | null;
  awaitingFarmId?: string | null;
  method?: NewTransfer['method'];
}

/** Posts a transfer once; the same id and fields again answer the original, other fields a 409. */
export async function postTransfer(tx: Transaction, posting: LedgerPosting): Promise<TransferDto> {
  return (await postTransferOnce(tx, posting)).transfer;
}

/** `postTransfer`, also telling whether this call wrote it. */
export async function postTransferOnce(tx: Transaction, posting: LedgerPosting): Promise<{ transfer: TransferDto; created: boolean }> {
  if (!Number.isSafeInteger(posting.amountCents) || posting.amountCents <= 0) throw AppError.validation({ amountCents: ['The amount must be whole cents above zero'] });
  const debit = await accountOf(tx, posting.debit);
  const credit = await accountOf(tx, posting.credit);
  if (debit.id === credit.id) throw AppError.validation({ credit: ['A transfer moves money between two different accounts'] });
  const { row, created } = await insertTransfer(tx, {
    id: posting.id, kind: posting.kind, debitAccountId: debit.id, creditAccountId: credit.id, amountCents: posting.amountCents,
    status: posting.pending ? 'pending' : 'posted', sourceType: posting.sourceType, sourceId: posting.sourceId, memo: posting.memo,
    bookedOn: posting.bookedOn, postedBy: posting.postedBy ?? null, awaitingFarmId: posting.awaitingFarmId ?? null, method: posting.method ?? null,
  });
  if (created) await announce(tx, [debit, credit]);
  return { transfer: (await presentRows(tx, [row], null))[0]!, created };
}

/** Posts a pending transfer (the day happened, the buck came home). Posting a voided one is refused. */
export async function postPending(tx: Transaction, transferId: string, postedBy: string | null): Promise<TransferDto> {
  const { row, changed } = await postPendingTransfer(tx, transferId, postedBy);
  if (changed) await announce(tx, await accountsOfRow(tx, row));
  return presentRows(tx, [row], null).then((list) => list[0]!);
}

/** Voids a pending transfer (cancelled). Voiding a posted one is refused: correct it instead. */
export async function voidPending(tx: Transaction, transferId: string): Promise<TransferDto> {
  const { row, changed } = await voidPendingTransfer(tx, transferId);
  if (changed) await announce(tx, await accountsOfRow(tx, row));
  return presentRows(tx, [row], null).then((list) => list[0]!);
}

// ---------------------------------------------------------------------------------------------
// Access
// ---------------------------------------------------------------------------------------------

function isLedgerAdmin(actor: SessionUser): boolean {
  return defineAbilityFor(actor).can('manage', subjectOf('Ledger', { coopId: actor.coopId }));
}

/** The actor's own farm, whose money they see; apprentices (and anyone without a farm) are refused. */
function ownMoneyFarm(actor: SessionUser): string {
  if (!actor.farmId || !canSeeMoney(actor, actor.farmId)) throw new AppError(ErrorCode.forbidden, 403, 'The Ledger is for the farm\'s members and the co-op\'s admin');
  return actor.farmId;
}

/** Refuses anyone who may see no money at all (apprentices), before anything is read. */
function ensureSeesMoney(actor: SessionUser): void {
  if (isLedgerAdmin(actor)) return;
  ownMoneyFarm(actor);
}

function ensureLedgerAdmin(actor: SessionUser): void {
  ensureSeesMoney(actor);
  if (!isLedgerAdmin(actor)) throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin keeps the co-op\'s books');
}

/** The farm whose account is asked for: the actor's own unless an admin names another. */
function farmAsked(actor: SessionUser, farmId: string | undefined): string {
  ensureSeesMoney(actor);
  const farm = farmId ?? ownMoneyFarm(actor);
  authorize(actor, 'read', { subject: 'Money', fields: { farmId: farm }, farmIds: [farm], what: 'That farm\'s account' }, 'The Ledger is for the farm\'s members and the co-op\'s admin');
  return farm;
}

function permissionsFor(actor: SessionUser | null, row: TransferRow, accounts: Map<string, AccountRow>): TransferPermissions {
  if (!actor) return { canConfirm: false, canVoid: false, canCorrect: false };
  const admin = isLedgerAdmin(actor);
  const debit = accounts.get(row.debit_account_id);
  const credit = accounts.get(row.credit_account_id);
  const partyFarms = [debit?.farm_id, credit?.farm_id].filter(Boolean);
  const ownParty = Boolean(actor.farmId && partyFarms.includes(actor.farmId) && canSeeMoney(actor, actor.farmId));
  const farmToFarm = debit?.kind === 'farm' && credit?.kind === 'farm';
  const pending = row.status === 'pending';
  return {
    canConfirm: pending && (row.awaiting_farm_id ? row.awaiting_farm_id === actor.farmId && ownParty : admin),
    canVoid: pending && (admin || ownParty),
    canCorrect: row.status === 'posted' && row.kind !== 'correction' && (admin || (farmToFarm && ownParty)),
  };
}

// ---------------------------------------------------------------------------------------------
// Presenting
// ---------------------------------------------------------------------------------------------

/** Names of the accounts given and of their farms only (a post presents two accounts, not the whole co-op). */
async function namesFor(tx: Transaction, coopId: string, accountIds: string[]): Promise<LedgerNames> {
  const accounts = await accountsByIds(tx, accountIds);
  const farmIds = [...new Set([...accounts.values()].map((a) => a.farm_id).filter((id): id is string => Boolean(id)))];
  const refs = await findFarmRefs(coopId, farmIds, tx);
  return { farmNames: new Map([...refs.values()].map((f) => [f.id, f.name])), accounts };
}

async function presentRows(tx: Transaction, rows: TransferRow[], actor: SessionUser | null, coopId?: string): Promise<TransferDto[]> {
  const [first] = rows;
  if (!first) return [];
  const ids = rows.flatMap((r) => [r.debit_account_id, r.credit_account_id]);
  const names = await namesFor(tx, coopId ?? actor?.coopId ?? (await currentCoop(tx)), ids);
  return rows.map((r) => presentTransfer(r, names, permissionsFor(actor, r, names.accounts)));
}

async function currentCoop(tx: Transaction): Promise<string> {
  const [row] = await selectRows<{ coop_id: string }>(tx, 'SELECT current_coop_id() AS coop_id', []);
  return row!.coop_id;
}

async function accountsOfRow(tx: Transaction, row: TransferRow): Promise<AccountRow[]> {
  return [...(await accountsByIds(tx, [row.debit_account_id, row.credit_account_id])).values()];
}

/** After commit: the farms' members who see money and the co-op's admins refetch. No amount travels. */
async function announce(tx: Transaction, accounts: AccountRow[]): Promise<void> {
  const farmIds = [...new Set(accounts.map((a) => a.farm_id).filter((id): id is string => Boolean(id)))];
  const coopId = await currentCoop(tx);
  tx.afterCommit(() => {
    for (const farmId of farmIds) publish(rooms.farmLedger(farmId), RealtimeEvent.ledgerChanged, { farmIds });
    publish(rooms.coopAdmins(coopId), RealtimeEvent.ledgerChanged, { farmIds });
  });
}

// ---------------------------------------------------------------------------------------------
// Routes: transfers
// ---------------------------------------------------------------------------------------------

/** The admin posts a transfer (a fee, a shared cost, a co-op charge), pending or posted. */
export async function createTransfer(actor: SessionUser, input: TransferCreateInput): Promise<{ transfer: TransferDto; created: boolean }> {
  ensureLedgerAdmin(actor);
  return withTenant(actor, async (tx) => {
    const { transfer, created } = await postTransferOnce(tx, { ...input, postedBy: actor.id });
    const [presented] = await presentRows(tx, [(await findTransfer(tx, transfer.id))!], actor);
    return { transfer: presented!, created };
  });
}

export async function getTransfer(actor: SessionUser, transferId: string): Promise<TransferDto> {
  ensureSeesMoney(actor);
  return withTenant(actor, async (tx) => {
    const row = await findTransfer(tx, transferId);
    if (!row) throw AppError.notFound('That transfer');
    await ensureTransferVisible(tx, actor, row);
    return (await presentRows(tx, [row], actor))[0]!;
  });
}

async function ensureTransferVisible(tx: Transaction, actor: SessionUser, row: TransferRow): Promise<AccountRow[]> {
  const accounts = await accountsOfRow(tx, row);
  if (isLedgerAdmin(actor)) return accounts;
  const farm = ownMoneyFarm(actor);
  if (!accounts.some((a) => a.farm_id === farm)) throw AppError.notFound('That transfer');
  return accounts;
}

/** The receiving farm confirms a recorded payment (or the other farm a correction); the admin a payment to the co-op. */
export async function confirmTransfer(actor: SessionUser, transferId: string): Promise<TransferDto> {
  ensureSeesMoney(actor);
  return withTenant(actor, async (tx) => {
    const row = await findTransfer(tx, transferId, { lock: true });
    if (!row) throw AppError.notFound('That transfer');
    const accounts = await ensureTransferVisible(tx, actor, row);
    if (row.status === 'posted') return (await presentRows(tx, [row], actor))[0]!;
    const can = permissionsFor(actor, row, new Map(accounts.map((a) => [a.id, a])));
    if (!can.canConfirm) {
      if (row.status === 'voided') throw AppError.conflict('That transfer was voided; a voided transfer is never posted');
      throw new AppError(ErrorCode.forbidden, 403, row.awaiting_farm_id ? 'The other farm confirms it' : 'The co-op\'s admin confirms it');
    }
    await postPending(tx, transferId, actor.id);
    return (await presentRows(tx, [(await findTransfer(tx, transferId))!], actor))[0]!;
  });
}

/** A pending transfer is cancelled: by the admin, or declined or withdrawn by a farm it involves. */
export async function voidTransfer(actor: SessionUser, transferId: string): Promise<TransferDto> {
  ensureSeesMoney(actor);
  return withTenant(actor, async (tx) => {
    const row = await findTransfer(tx, transferId, { lock: true });
    if (!row) throw AppError.notFound('That transfer');
    const accounts = await ensureTransferVisible(tx, actor, row);
    if (row.status === 'posted') throw AppError.conflict('That transfer is posted; correct it with a reversing transfer instead');
    if (row.status === 'pending' && !permissionsFor(actor, row, new Map(accounts.map((a) => [a.id, a]))).canVoid) {
      throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin voids it');
    }
    await voidPending(tx, transferId);
    return (await presentRows(tx, [(await findTransfer(tx, transferId))!], actor))[0]!;
  });
}

/**
 * A reversing transfer linked to a posted one, for all of it or a part not yet reversed. The admin's
 * posts at once; a member's (farm-to-farm only) waits for the other farm's member to confirm it.
 */
export async function correctTransfer(actor: SessionUser, transferId: string, input: CorrectionCreateInput): Promise<{ transfer: TransferDto; created: boolean }> {
  ensureSeesMoney(actor);
  return withTenant(actor, async (tx) => {
    const original = await findTransfer(tx, transferId, { lock: true });
    if (!original) throw AppError.notFound('That transfer');
    const accounts = await ensureTransferVisible(tx, actor, original);
    const byId = new Map(accounts.map((a) => [a.id, a]));
    const debit = byId.get(original.debit_account_id)!;
    const credit = byId.get(original.credit_account_id)!;
    const admin = isLedgerAdmin(actor);
    const farmToFarm = debit.kind === 'farm' && credit.kind === 'farm';
    if (!admin && !farmToFarm) throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin corrects a transfer with the co-op');
    if (original.kind === 'correction') throw AppError.conflict('Correct the original transfer, not its correction');
    if (original.status !== 'posted') throw AppError.conflict(original.status === 'pending' ? 'A pending transfer is voided, not corrected' : 'A voided transfer has nothing to correct');
    const repeated = await findTransfer(tx, input.id);
    const amount = input.amountCents ?? (repeated ? cents(repeated.amount_cents) : await uncorrectedCents(tx, original));
    if (!repeated) {
      const left = await uncorrectedCents(tx, original);
      if (left <= 0) throw AppError.conflict('That transfer is corrected in full already');
      if (amount > left) throw AppError.validation({ amountCents: [`At most ${left} cents of it are left to correct`] });
    }
    const otherFarm = !admin ? [debit.farm_id, credit.farm_id].find((f) => f !== actor.farmId) ?? null : null;
    const { row, created } = await insertTransfer(tx, {
      id: input.id, kind: 'correction', debitAccountId: credit.id, creditAccountId: debit.id, amountCents: amount,
      status: admin ? 'posted' : 'pending', sourceType: original.source_type, sourceId: original.source_id,
      memo: `Correction of ${original.id}`, correctsTransferId: original.id, correctionReason: input.reason,
      awaitingFarmId: otherFarm, postedBy: actor.id,
    });
    if (created) await announce(tx, accounts);
    return { transfer: (await presentRows(tx, [row], actor))[0]!, created };
  });
}

/** A farm records a payment made outside the app; it posts once the receiving farm (or the co-op's admin) confirms. */
export async function recordPayment(actor: SessionUser, input: PaymentCreateInput): Promise<{ transfer: TransferDto; created: boolean }> {
  const payer = ownMoneyFarm(actor);
  if (input.toFarmId === payer) throw AppError.validation({ toFarmId: ['Choose another farm, or the co-op'] });
  return withTenant(actor, async (tx) => {
    const period = input.duesYear ? await duesPeriodOf(tx, input.duesYear) : null;
    if (input.duesYear && !period) throw AppError.validation({ duesYear: [`No dues are set for ${input.duesYear}`] });
    if (period && input.toFarmId) throw AppError.validation({ toFarmId: ['Dues are paid to the co-op'] });
    if (input.toFarmId) {
      const [farm] = await selectRows<{ id: string }>(tx, 'SELECT id FROM farms WHERE id = $1', [input.toFarmId]);
      if (!farm) throw AppError.validation({ toFarmId: ['Choose a farm of the co-op'] });
    }
    const receiver: AccountRef = input.toFarmId ? { farmId: input.toFarmId } : { coop: 'coop_cash' };
    const { transfer, created } = await postTransferOnce(tx, {
      id: input.id, kind: 'payment', debit: receiver, credit: { farmId: payer }, amountCents: input.amountCents, pending: true,
      sourceType: period ? 'dues_period' : '', sourceId: period?.id ?? '', memo: input.memo, bookedOn: input.paidOn,
      method: input.method, awaitingFarmId: input.toFarmId, postedBy: actor.id,
    });
    return { transfer: (await presentRows(tx, [(await findTransfer(tx, transfer.id))!], actor))[0]!, created };
  });
}

// ---------------------------------------------------------------------------------------------
// Routes: reading
// ---------------------------------------------------------------------------------------------

/** One page of the transfers of a farm's account (or, for the admin, of the co-op), newest first. */
export async function listTransfers(actor: SessionUser, query: TransferListQuery): Promise<TransferListDto> {
  const wholeCoop = isLedgerAdmin(actor) && !query.farmId;
  const farmId = wholeCoop ? null : farmAsked(actor, query.farmId);
  return withTenant(actor, async (tx) => {
    const where: string[] = [];
    const bind: unknown[] = [];
    const param = (value: unknown) => {
      bind.push(value);
      return `$${bind.length}`;
    };
    let own: string | null = null;
    if (farmId) {
      own = param((await accountOf(tx, { farmId }, { reading: true })).id);
      where.push(`(t.debit_account_id = ${own} OR t.credit_account_id = ${own})`);
    }
    if (query.kind) where.push(`t.kind = ${param(query.kind)}`);
    if (query.status) where.push(`t.status = ${param(query.status)}`);
    if (query.from) where.push(`t.booked_on >= ${param(query.from)}::date`);
    if (query.to) where.push(`t.booked_on <= ${param(query.to)}::date`);
    if (query.counterparty) {
      const other = query.counterparty === 'coop'
        ? `(SELECT id FROM ledger_accounts WHERE farm_id IS NULL)`
        : `(SELECT id FROM ledger_accounts WHERE farm_id = ${param(query.counterparty)})`;
      where.push(own
        ? `((t.debit_account_id = ${own} AND t.credit_account_id IN ${other}) OR (t.credit_account_id = ${own} AND t.debit_account_id IN ${other}))`
        : `(t.debit_account_id IN ${other} OR t.credit_account_id IN ${other})`);
    }
    const filter = where.length > 0 ? `WHERE ${where.join(' AND ')}` : '';
    const [count] = await selectRows<{ total: string }>(tx, `SELECT count(*) AS total FROM ledger_transfers t ${filter}`, bind);
    const rows = await selectRows<TransferRow>(
      tx,
      `SELECT ${TRANSFER_COLUMNS} FROM ledger_transfers t ${filter}
       ORDER BY t.booked_on DESC, t.created_at DESC, t.id LIMIT ${param(query.pageSize)} OFFSET ${param((query.page - 1) * query.pageSize)}`,
      bind,
    );
    return { items: await presentRows(tx, rows, actor), total: Number(count?.total ?? 0), page: query.page, pageSize: query.pageSize };
  });
}

interface Position {
  /** The other farm, or null for the co-op's accounts together. */
  farmId: string | null;
  netCents: number;
}

/** A farm account's posted net with each counterparty: the co-op's accounts count as one. */
async function positionsOf(tx: Transaction, account: AccountRow): Promise<Position[]> {
  const rows = await selectRows<{ farm_id: string | null; net: string }>(
    tx,
    `SELECT other.farm_id, sum(CASE WHEN t.credit_account_id = $1 THEN t.amount_cents ELSE -t.amount_cents END) AS net
     FROM ledger_transfers t
     JOIN ledger_accounts other ON other.id = CASE WHEN t.debit_account_id = $1 THEN t.credit_account_id ELSE t.debit_account_id END
     WHERE t.status = 'posted' AND (t.debit_account_id = $1 OR t.credit_account_id = $1)
     GROUP BY other.farm_id`,
    [account.id],
  );
  return rows.map((r) => ({ farmId: r.farm_id, netCents: cents(r.net) }));
}

interface DuesPeriodRow {
  id: string;
  year: number;
  amount_cents: string;
  due_on: string;
  reminder_days_before: number;
  version: number;
}

export async function duesPeriodOf(tx: Transaction, year: number): Promise<DuesPeriodRow | null> {
  const [row] = await selectRows<DuesPeriodRow>(tx, `SELECT id, year, amount_cents, to_char(due_on, 'YYYY-MM-DD') AS due_on, reminder_days_before, version FROM dues_periods WHERE year = $1`, [year]);
  return row ?? null;
}

export async function duesPeriods(tx: Transaction): Promise<DuesPeriodRow[]> {
  return selectRows<DuesPeriodRow>(tx, `SELECT id, year, amount_cents, to_char(due_on, 'YYYY-MM-DD') AS due_on, reminder_days_before, version FROM dues_periods ORDER BY year DESC`, []);
}

/** Each farm's dues per period: what it was charged and what it has paid towards it (posted payments only). */
export async function duesOfFarms(tx: Transaction, farmIds: string[]): Promise<Map<string, FarmDuesDto[]>> {
  const periods = await duesPeriods(tx);
  const rows = await selectRows<{ farm_id: string; period_id: string; charged: string | null; paid: string | null }>(
    tx,
    `SELECT a.farm_id, p.id AS period_id,
       (SELECT sum(amount_cents) FROM ledger_transfers WHERE kind = 'dues' AND status = 'posted' AND source_type = 'dues_period' AND source_id = p.id::text AND debit_account_id = a.id) AS charged,
       (SELECT sum(amount_cents) FROM ledger_transfers WHERE kind = 'payment' AND status = 'posted' AND source_type = 'dues_period' AND source_id = p.id::text AND credit_account_id = a.id) AS paid
     FROM ledger_accounts a CROSS JOIN dues_periods p WHERE a.farm_id = ANY($1::uuid[])`,
    [farmIds],
  );
  const byKey = new Map(rows.map((r) => [`${r.farm_id}:${r.period_id}`, r]));
  return new Map(farmIds.map((farmId) => [farmId, periods.flatMap((p) => {
    const row = byKey.get(`${farmId}:${p.id}`);
    const charged = cents(row?.charged);
    if (charged === 0) return [];
    const paid = cents(row?.paid);
    return [{ year: p.year, amountCents: charged, dueOn: p.due_on, paidCents: paid, owedCents: Math.max(0, charged - paid) }];
  })]));
}

/** The balance cards of a farm. */
export async function ledgerSummary(actor: SessionUser, farmIdAsked: string | undefined, opts: { cardPayments: boolean }): Promise<LedgerSummaryDto> {
  const farmId = farmAsked(actor, farmIdAsked);
  return withTenant(actor, async (tx) => {
    const account = await accountOf(tx, { farmId }, { reading: true });
    const names = await namesFor(tx, actor.coopId, [account.id]);
    const positions = await positionsOf(tx, account);
    const coopNet = positions.filter((p) => p.farmId === null).reduce((s, p) => s + p.netCents, 0);
    const [awaiting] = await selectRows<{ n: string }>(tx, `SELECT count(*) AS n FROM ledger_transfers WHERE status = 'pending' AND awaiting_farm_id = $1`, [farmId]);
    const coop = await getCoop(actor.coopId, tx);
    return {
      farmId,
      farmName: names.farmNames.get(farmId) ?? '',
      currency: coop?.currency ?? 'USD',
      account: presentAccount(account, names),
      owedToYouCents: positions.reduce((s, p) => s + Math.max(0, p.netCents), 0),
      youOweCents: positions.reduce((s, p) => s + Math.max(0, -p.netCents), 0),
      expectedInCents: cents(account.pending_credit_cents),
      expectedOutCents: cents(account.pending_debit_cents),
      owedToCoopCents: Math.max(0, -coopNet),
      dues: (await duesOfFarms(tx, [farmId])).get(farmId) ?? [],
      awaitingYourConfirmation: farmId === actor.farmId ? Number(awaiting?.n ?? 0) : 0,
      cardPaymentsEnabled: opts.cardPayments,
    };
  });
}

/** What a farm owes the co-op itself (dues, fees), from its posted transfers: what a card payment of the balance pays. */
export async function owedToCoopOf(tx: Transaction, farmId: string): Promise<number> {
  const positions = await positionsOf(tx, await accountOf(tx, { farmId }));
  return Math.max(0, -positions.filter((p) => p.farmId === null).reduce((s, p) => s + p.netCents, 0));
}

/** Farm-to-farm net positions and the payments that clear them; a member sees only their farm's part. */
export async function settleUpFor(actor: SessionUser): Promise<SettleUpDto> {
  ensureSeesMoney(actor);
  const admin = isLedgerAdmin(actor);
  const ownFarm = admin ? actor.farmId : ownMoneyFarm(actor);
  return withTenant(actor, async (tx) => {
    const rows = await selectRows<{ debit_farm: string; credit_farm: string; amount: string }>(
      tx,
      `SELECT d.farm_id AS debit_farm, c.farm_id AS credit_farm, sum(t.amount_cents) AS amount
       FROM ledger_transfers t JOIN ledger_accounts d ON d.id = t.debit_account_id JOIN ledger_accounts c ON c.id = t.credit_account_id
       WHERE t.status = 'posted' AND d.kind = 'farm' AND c.kind = 'farm'
       GROUP BY d.farm_id, c.farm_id`,
      [],
    );
    const net = new Map<string, number>();
    for (const r of rows) {
      net.set(r.credit_farm, (net.get(r.credit_farm) ?? 0) + cents(r.amount));
      net.set(r.debit_farm, (net.get(r.debit_farm) ?? 0) - cents(r.amount));
    }
    const positions = [...net].map(([farmId, netCents]) => ({ farmId, netCents }));
    const names = new Map([...(await farmDirectoryOf(actor.coopId, tx)).values()].map((f) => [f.id, f.name]));
    const name = (id: string) => names.get(id) ?? 'A former farm';
    const payments = settleUp(positions).filter((p) => admin || p.fromFarmId === ownFarm || p.toFarmId === ownFarm);
    return {
      positions: positions
        .filter((p) => p.netCents !== 0 && (admin || p.farmId === ownFarm))
        .map((p) => ({ farmId: p.farmId, farmName: name(p.farmId), netCents: p.netCents }))
        .sort((a, b) => b.netCents - a.netCents),
      payments: payments.map((p) => ({ ...p, fromFarmName: name(p.fromFarmId), toFarmName: name(p.toFarmId) })),
      note: 'Suggested by matching the largest debtor with the largest creditor, again and again: every farm is square after at most one payment fewer than there are farms with something owing (n − 1).',
    };
  });
}

/** The co-op's books for its admin: every account, every farm's balance and dues, and that the books balance. */
export async function coopLedger(actor: SessionUser): Promise<CoopLedgerDto> {
  ensureLedgerAdmin(actor);
  return withTenant(actor, async (tx) => {
    for (const kind of coopAccountKinds) await coopAccountOf(tx, kind);
    const directory = await farmDirectoryOf(actor.coopId, tx);
    const accounts = await allAccounts(tx);
    const names: LedgerNames = { farmNames: new Map([...directory.values()].map((f) => [f.id, f.name])), accounts: new Map(accounts.map((a) => [a.id, a])) };
    const farmIds = [...directory.keys()];
    const dues = await duesOfFarms(tx, farmIds);
    const byFarm = new Map(accounts.filter((a) => a.farm_id).map((a) => [a.farm_id!, a]));
    const periods = await duesPeriods(tx);
    const [awaiting] = await selectRows<{ n: string }>(tx, `SELECT count(*) AS n FROM ledger_transfers WHERE status = 'pending' AND awaiting_farm_id IS NULL AND kind = 'payment'`, []);
    const coop = await getCoop(actor.coopId, tx);
    return {
      currency: coop?.currency ?? 'USD',
      accounts: accounts.filter((a) => a.farm_id === null).map((a) => presentAccount(a, names)),
      farms: [...directory.values()].sort((a, b) => a.name.localeCompare(b.name)).map((f) => {
        const account = byFarm.get(f.id);
        const latest = (dues.get(f.id) ?? []).find((d) => d.year === periods[0]?.year) ?? null;
        return {
          farmId: f.id, farmName: f.name, balanceCents: cents(account?.posted_cents), expectedInCents: cents(account?.pending_credit_cents),
          expectedOutCents: cents(account?.pending_debit_cents), dues: latest,
        };
      }),
      duesPeriods: periods.map((p) => ({ year: p.year, amountCents: cents(p.amount_cents), dueOn: p.due_on, reminderDaysBefore: p.reminder_days_before })),
      booksTotalCents: accounts.reduce((s, a) => s + cents(a.posted_cents), 0),
      awaitingYourConfirmation: Number(awaiting?.n ?? 0),
    };
  });
}

const FEE_KINDS: TransferKind[] = ['stud_fee', 'processing_fee', 'shared_cost', 'sale', 'dues'];

/** Posted fees by kind for each of the twelve months up to `through` (YYYY-MM-DD): the farm's, or the whole co-op's for its admin. */
export async function feesByMonth(actor: SessionUser, opts: { farmId?: string; coop?: boolean; through: string }): Promise<FeesByMonthDto> {
  const wholeCoop = Boolean(opts.coop);
  if (wholeCoop) ensureLedgerAdmin(actor);
  const farmId = wholeCoop ? null : farmAsked(actor, opts.farmId);
  const [y, m] = opts.through.split('-').map(Number) as [number, number];
  const months = Array.from({ length: 12 }, (_, i) => {
    const d = new Date(Date.UTC(y, m - 12 + i, 1));
    return `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
  });
  return withTenant(actor, async (tx) => {
    const account = farmId ? await accountOf(tx, { farmId }, { reading: true }) : null;
    const rows = await selectRows<{ kind: TransferKind; month: string; total: string }>(
      tx,
      `SELECT kind, to_char(booked_on, 'YYYY-MM') AS month, sum(amount_cents) AS total FROM ledger_transfers
       WHERE status = 'posted' AND kind = ANY($1) AND booked_on >= $2::date AND booked_on < ($3::date + interval '1 month')
         ${account ? 'AND (debit_account_id = $4 OR credit_account_id = $4)' : ''}
       GROUP BY 1, 2`,
      account ? [FEE_KINDS, `${months[0]}-01`, `${months[11]}-01`, account.id] : [FEE_KINDS, `${months[0]}-01`, `${months[11]}-01`],
    );
    const result: Record<string, number[]> = Object.fromEntries(FEE_KINDS.map((k) => [k, months.map(() => 0)]));
    for (const r of rows) {
      const i = months.indexOf(r.month);
      if (i >= 0) result[r.kind]![i] = cents(r.total);
    }
    return { months, kinds: FEE_KINDS, cents: result };
  });
}
