import { randomUUID } from 'node:crypto';
import type { TransferCreateBody, TransferDto } from '@burrowline/shared';
import { asTenant } from './db';
import type { Agent } from './test-app';

/** A transfer id nobody else uses. */
export const transferId = (label = 't') => `${label}:${randomUUID()}`;

/** Posts a transfer as the (admin) agent and expects it to be written or repeated. */
export async function postTransferAs(agent: Agent, body: TransferCreateBody): Promise<TransferDto> {
  const res = await agent.post('/api/ledger/transfers').send(body);
  if (res.status !== 201 && res.status !== 200) throw new Error(`posting ${body.id} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as TransferDto;
}

export interface BooksCheck {
  /** Accounts whose cached balances differ from the sums of their transfers. */
  mismatches: { accountId: string; cached: number[]; summed: number[] }[];
  /** Posted balances over every account: zero when the books balance. */
  postedTotal: number;
  pendingDebits: number;
  pendingCredits: number;
  transfers: number;
  balances: Map<string, number>;
}

/** Reads the co-op's accounts and transfers straight from PostgreSQL and compares the cached balances with the sums. */
export async function checkBooks(coopId: string): Promise<BooksCheck> {
  return asTenant(coopId, async (c) => {
    const accounts = (await c.query(`SELECT id, farm_id, posted_cents::bigint AS posted, pending_debit_cents AS pd, pending_credit_cents AS pc FROM ledger_accounts`)).rows;
    const sums = (await c.query(`
      SELECT a.id,
        COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'posted' AND credit_account_id = a.id), 0)
          - COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'posted' AND debit_account_id = a.id), 0) AS posted,
        COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'pending' AND debit_account_id = a.id), 0) AS pd,
        COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'pending' AND credit_account_id = a.id), 0) AS pc
      FROM ledger_accounts a`)).rows;
    const summed = new Map(sums.map((r) => [r.id as string, [Number(r.posted), Number(r.pd), Number(r.pc)]]));
    const mismatches = accounts
      .map((a) => ({ accountId: a.id as string, cached: [Number(a.posted), Number(a.pd), Number(a.pc)], summed: summed.get(a.id)! }))
      .filter((m) => m.cached.join() !== m.summed.join());
    const [count] = (await c.query('SELECT count(*)::int AS n FROM ledger_transfers')).rows;
    return {
      mismatches,
      postedTotal: accounts.reduce((s, a) => s + Number(a.posted), 0),
      pendingDebits: accounts.reduce((s, a) => s + Number(a.pd), 0),
      pendingCredits: accounts.reduce((s, a) => s + Number(a.pc), 0),
      transfers: count.n as number,
      balances: new Map(accounts.map((a) => [(a.farm_id ?? a.id) as string, Number(a.posted)])),
    };
  });
}
