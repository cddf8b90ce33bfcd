import { randomUUID } from 'node:crypto';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { createTransfer, recordPayment } from '../../packages/server/src/modules/ledger/ledger.service';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { actorOf } from './herd';

/** Objects of the Ledger's rows, made fresh for every cell so one persona's change never alters the next cell. */
export interface LedgerIds {
  /** A posted stud fee: farm A owes farm B. */
  transferId?: string;
  /** A posted processing charge of farm A to the co-op (farm B and the other co-op's admin's farm are charged one too). */
  coopTransferId?: string;
  /** A cash payment farm A recorded to farm B, waiting for farm B's confirmation. */
  paymentId?: string;
  /** An open card checkout of farm A's member. */
  checkoutId?: string;
  year?: string;
}

let nextYear = 2040;

/** `foreign` is the other co-op, whose admin's farm is charged too, so every persona has something to pay by card. */
export async function ledgerTarget(coop: TestCoop, target: string, foreign: TestCoop): Promise<LedgerIds> {
  if (target !== 'ledgerA') return {};
  connectDatabase(process.env.DATABASE_URL!);
  const tag = randomUUID();
  const [a, b] = [coop.farms[0]!.id, coop.farms[1]!.id];
  const admin = actorOf(coop.admin);
  const fee = await createTransfer(admin, { id: `fee:${tag}`, kind: 'stud_fee', debit: { farmId: a }, credit: { farmId: b }, amountCents: 2_000, pending: false, sourceType: 'loan', sourceId: tag, memo: 'Matrix stud fee' });
  const coopFee = await createTransfer(admin, { id: `site:${tag}`, kind: 'processing_fee', debit: { farmId: a }, credit: { coop: 'coop_processing' }, amountCents: 1_200, pending: false, sourceType: '', sourceId: '', memo: 'Matrix processing fee' });
  await createTransfer(admin, { id: `site-b:${tag}`, kind: 'processing_fee', debit: { farmId: b }, credit: { coop: 'coop_processing' }, amountCents: 800, pending: false, sourceType: '', sourceId: '', memo: 'Matrix processing fee' });
  await createTransfer(actorOf(foreign.admin), { id: `site-foreign:${tag}`, kind: 'processing_fee', debit: { farmId: foreign.farms[0]!.id }, credit: { coop: 'coop_processing' }, amountCents: 900, pending: false, sourceType: '', sourceId: '', memo: 'Matrix processing fee' });
  const payment = await recordPayment(actorOf(coop.member), { id: `cash:${tag}`, toFarmId: b, amountCents: 500, method: 'cash', paidOn: '2026-01-10', memo: 'Matrix payment' });
  const checkout = await asTenant(coop.id, (c) => c.query(
    `INSERT INTO card_checkouts (coop_id, farm_id, idempotency_key, purpose, amount_cents, currency, created_by, session_id, url)
     VALUES ($1, $2, $3, 'balance', 1200, 'USD', $4, $5, 'http://127.0.0.1/pay/none') RETURNING id`,
    [coop.id, a, randomUUID(), coop.member.id, `cs_test_matrix_${tag.replace(/-/g, '')}`],
  ), { commit: true });
  return {
    transferId: fee.transfer.id, coopTransferId: coopFee.transfer.id, paymentId: payment.transfer.id, checkoutId: checkout.rows[0].id as string,
    year: String(nextYear++),
  };
}

export function ledgerBody(coop: TestCoop, body: string | undefined, ids: LedgerIds): object | undefined {
  switch (body) {
    case 'ledgerTransfer':
      return { id: `matrix:${randomUUID()}`, kind: 'shared_cost', debit: { farmId: coop.farms[0]!.id }, credit: { farmId: coop.farms[1]!.id }, amountCents: 300 };
    case 'ledgerCorrection':
      return { id: `fix:${randomUUID()}`, reason: 'Checked by the authorization matrix', amountCents: 100 };
    case 'ledgerPayment':
      return { id: `paid:${randomUUID()}`, toFarmId: null, amountCents: 250, method: 'cheque', paidOn: '2026-01-12' };
    case 'dues':
      return { amountCents: 4_000, dueOn: `${ids.year ?? '2040'}-03-31`, reminderDaysBefore: 7 };
    case 'cardCheckout':
      return { idempotencyKey: randomUUID(), purpose: 'balance' };
    case 'cardWebhook':
      return { id: 'evt_unsigned', type: 'checkout.session.completed', data: { object: {} } };
    default:
      return undefined;
  }
}

/** What a refused Ledger call must leave as it was. */
export async function ledgerStateOf(coopId: string) {
  return asTenant(coopId, async (c) => ({
    transfers: (await c.query(`SELECT count(*)::int AS n, string_agg(id || '=' || status, ',' ORDER BY id) AS s FROM ledger_transfers`)).rows[0],
    balances: (await c.query(`SELECT string_agg(id || '=' || posted_cents || '/' || pending_debit_cents || '/' || pending_credit_cents, ',' ORDER BY id) AS s FROM ledger_accounts`)).rows[0].s,
    dues: (await c.query('SELECT count(*)::int AS n FROM dues_periods')).rows[0].n,
    checkouts: (await c.query(`SELECT string_agg(id || '=' || status || coalesce(session_id, ''), ',' ORDER BY id) AS s FROM card_checkouts`)).rows[0].s,
  }));
}
