import type { Transaction } from 'sequelize';
import { defineAbilityFor, ErrorCode, subjectOf, type StatementDto, type StatementQuery, type TransferKind } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { getCoop } from '../coops/coops.service';
import { authorize, canSeeMoney } from '../farms/farm-access';
import { farmDirectoryOf } from '../farms/farms.service';
import { accountOf, allAccounts, cents, selectRows } from './ledger-books';
import { accountName } from './ledger.presenter';
import { statementCsv, statementPdf } from './statement-files';

export interface StatementFile {
  fileName: string;
  contentType: string;
  body: string | Buffer;
}

/**
 * A statement of one farm's account, or of the co-op's own accounts together, over a period: the opening
 * balance (everything posted before it), each posted transfer with the running balance, the closing balance.
 */
export async function buildStatement(tx: Transaction, coopId: string, target: { farmId: string } | { coop: true }, from: string, to: string): Promise<StatementDto> {
  const directory = await farmDirectoryOf(coopId, tx);
  const accounts = await allAccounts(tx);
  const names = { farmNames: new Map([...directory.values()].map((f) => [f.id, f.name])), accounts: new Map(accounts.map((a) => [a.id, a])) };
  const own = 'farmId' in target ? [await accountOf(tx, { farmId: target.farmId }, { reading: true })] : accounts.filter((a) => a.farm_id === null);
  const ownIds = own.map((a) => a.id);
  const signed = `(CASE WHEN credit_account_id = ANY($1::uuid[]) THEN amount_cents ELSE 0 END - CASE WHEN debit_account_id = ANY($1::uuid[]) THEN amount_cents ELSE 0 END)`;
  const touches = `(debit_account_id = ANY($1::uuid[]) OR credit_account_id = ANY($1::uuid[]))`;
  const [opening] = await selectRows<{ total: string | null }>(tx, `SELECT sum(${signed}) AS total FROM ledger_transfers WHERE status = 'posted' AND ${touches} AND booked_on < $2::date`, [ownIds, from]);
  const rows = await selectRows<{ id: string; booked_on: string; kind: TransferKind; memo: string; debit_account_id: string; credit_account_id: string; signed: string }>(
    tx,
    `SELECT id, to_char(booked_on, 'YYYY-MM-DD') AS booked_on, kind, memo, debit_account_id, credit_account_id, ${signed} AS signed
     FROM ledger_transfers WHERE status = 'posted' AND ${touches} AND booked_on BETWEEN $2::date AND $3::date
     ORDER BY booked_on, posted_at, id`,
    [ownIds, from, to],
  );
  const coop = await getCoop(coopId, tx);
  let balance = cents(opening?.total);
  const openingBalanceCents = balance;
  const lines = rows
    // Moves between two of the co-op's own accounts change nothing in the co-op's statement.
    .filter((r) => cents(r.signed) !== 0)
    .map((r) => {
      balance += cents(r.signed);
      const other = ownIds.includes(r.debit_account_id) ? r.credit_account_id : r.debit_account_id;
      return { transferId: r.id, bookedOn: r.booked_on, kind: r.kind, counterparty: accountName(names.accounts.get(other), names), memo: r.memo, amountCents: cents(r.signed), runningBalanceCents: balance };
    });
  const title = 'farmId' in target ? accountName(own[0], names) : `${coop?.name ?? 'The co-op'} (co-op accounts)`;
  return {
    title, accountNames: own.map((a) => accountName(a, names)), currency: coop?.currency ?? 'USD', from, to,
    openingBalanceCents, closingBalanceCents: balance, lines,
  };
}

function moneyIn(currency: string) {
  const format = new Intl.NumberFormat('en-US', { style: 'currency', currency });
  return (value: number) => format.format(value / 100);
}

/** The statement a member (their farm) or the admin (any farm, or the co-op's books) asked for, as data or a file. */
export async function statementFor(actor: SessionUser, query: StatementQuery): Promise<StatementDto | StatementFile> {
  const ability = defineAbilityFor(actor);
  const admin = ability.can('manage', subjectOf('Ledger', { coopId: actor.coopId }));
  if (!admin && !(actor.farmId && canSeeMoney(actor, actor.farmId))) throw new AppError(ErrorCode.forbidden, 403, 'The Ledger is for the farm\'s members and the co-op\'s admin');
  if (query.coop && !admin) throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin reads the co-op\'s books');
  const farmId = query.coop ? null : query.farmId ?? actor.farmId!;
  if (farmId) authorize(actor, 'read', { subject: 'Money', fields: { farmId }, farmIds: [farmId], what: 'That farm\'s account' });
  const statement = await withTenant(actor, (tx) => buildStatement(tx, actor.coopId, farmId ? { farmId } : { coop: true }, query.from, query.to));
  const base = `statement-${(farmId ? statement.title : 'co-op').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '')}-${query.from}-to-${query.to}`;
  if (query.format === 'csv') return { fileName: `${base}.csv`, contentType: 'text/csv; charset=utf-8', body: statementCsv(statement) };
  if (query.format === 'pdf') return { fileName: `${base}.pdf`, contentType: 'application/pdf', body: await statementPdf(statement, moneyIn(statement.currency)) };
  return statement;
}
