// Ledger benchmark on a real PostgreSQL database (DATABASE_URL of a migrated, throwaway database: e.g.
// `source .data/<name>.env` after `node scripts/test-infra.mjs <name> …`). It adds its own co-op of 50
// farms ("Bench ledger …") and leaves it there, then:
//   1. posts 10,000 transfers through the Ledger's service, one transaction each, from 8 concurrent callers
//      (the way requests and other modules post), and reports the rate and latencies;
//   2. bulk-loads more transfers with SQL up to 100,000 and recomputes the cached balances from them;
//   3. times every balance (the admin's co-op view and each farm's summary), the settle-up, and a year's
//      statement of every farm (data, CSV and PDF) and of the co-op.
// Run: `npm run bench ledger` (BENCH_LEDGER_FARMS=50, BENCH_LEDGER_POSTS=10000, BENCH_LEDGER_TOTAL=100000).
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { QueryTypes } from 'sequelize';
import type { TransferKind } from '@burrowline/shared';
import { closeDatabase, connectDatabase } from '../../packages/server/src/composition/database';
import { database } from '../../packages/server/src/db/sequelize';
import { withTenant } from '../../packages/server/src/db/tenant';
import type { SessionUser } from '../../packages/server/src/lib/session-user';
import { createCooperative } from '../../packages/server/src/modules/coops/coops.service';
import { createFarm } from '../../packages/server/src/modules/farms/farms.service';
import { coopLedger, ledgerSummary, postTransfer, settleUpFor } from '../../packages/server/src/modules/ledger/ledger.service';
import { statementFor } from '../../packages/server/src/modules/ledger/statements.service';
import { createUser } from '../../packages/server/src/modules/users/users.service';

const FARMS = Number(process.env.BENCH_LEDGER_FARMS ?? 50);
const POSTS = Number(process.env.BENCH_LEDGER_POSTS ?? 10_000);
const TOTAL = Number(process.env.BENCH_LEDGER_TOTAL ?? 100_000);
const CONCURRENCY = 8;
const KINDS: TransferKind[] = ['stud_fee', 'processing_fee', 'shared_cost', 'sale', 'payment'];

const url = process.env.DATABASE_URL;
if (!url) {
  console.log('DATABASE_URL is not set: the ledger bench needs a migrated throwaway database (see the comment at the top).');
  process.exit(0);
}
connectDatabase(url, 12);

const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!;
const ms = (v: number) => `${v.toFixed(1)} ms`;

async function timed<T>(label: string, work: () => Promise<T>): Promise<T> {
  const t0 = performance.now();
  const result = await work();
  console.log(`${label.padEnd(58)} ${ms(performance.now() - t0)}`);
  return result;
}

const tag = randomUUID().slice(0, 8);
const { coopId, farmIds, admin } = await createCooperative({ name: `Bench ledger ${tag}`, slug: `bench-ledger-${tag}` }, async (coop, tx) => {
  const farmIds: string[] = [];
  for (let i = 0; i < FARMS; i++) {
    const farm = await createFarm(coop.id, { name: `Bench farm ${i + 1}`, location: 'Bench County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '' }, tx);
    farmIds.push(farm.id);
  }
  const user = await createUser({ coopId: coop.id, farmId: farmIds[0]!, mentorId: null, email: `bench-${tag}@example.test`, name: 'Bench admin', role: 'admin', passwordHash: null }, tx);
  const admin: SessionUser = { id: user.id, coopId: coop.id, farmId: farmIds[0]!, mentorId: null, email: user.email, name: user.name, role: 'admin' };
  return { coopId: coop.id, farmIds, admin };
});
console.log(`co-op ${coopId}: ${FARMS} farms`);

// 1. Posting through the service.
let seed = 20261204;
const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
const pickFarm = () => farmIds[Math.floor(random() * farmIds.length)]!;
const dayOf = (i: number) => {
  const d = new Date(Date.UTC(2026, 0, 1) + (i % 365) * 86_400_000);
  return d.toISOString().slice(0, 10);
};
const latencies: number[] = [];
let next = 0;
const t0 = performance.now();
await Promise.all(Array.from({ length: CONCURRENCY }, async () => {
  while (next < POSTS) {
    const i = next++;
    const debit = pickFarm();
    let credit = pickFarm();
    while (credit === debit) credit = pickFarm();
    const toCoop = i % 5 === 0;
    const start = performance.now();
    await withTenant({ coopId }, (tx) => postTransfer(tx, {
      id: `bench:${i}`, kind: toCoop ? 'processing_fee' : KINDS[i % KINDS.length]!, debit: { farmId: debit }, credit: toCoop ? { coop: 'coop_processing' } : { farmId: credit },
      amountCents: 100 + Math.floor(random() * 20_000), bookedOn: dayOf(i), memo: 'Bench', pending: i % 17 === 0,
    }));
    latencies.push(performance.now() - start);
  }
}));
const postSeconds = (performance.now() - t0) / 1000;
latencies.sort((a, b) => a - b);
console.log(`posted ${POSTS} transfers through the service in ${postSeconds.toFixed(1)} s: ${(POSTS / postSeconds).toFixed(0)} transfers/s; latency p50 ${ms(quantile(latencies, 0.5))}, p95 ${ms(quantile(latencies, 0.95))}, p99 ${ms(quantile(latencies, 0.99))}`);

// Retrying all of them once: each answers the original.
const r0 = performance.now();
let repeatNext = 0;
const sample = Math.min(POSTS, 2_000);
await Promise.all(Array.from({ length: CONCURRENCY }, async () => {
  while (repeatNext < sample) {
    const i = repeatNext++;
    await withTenant({ coopId }, async (tx) => {
      const [row] = await database().query<{ kind: TransferKind; debit: string; credit: string; amount: string; booked: string; memo: string }>(
        `SELECT t.kind, d.farm_id AS debit, c.farm_id AS credit, t.amount_cents AS amount, to_char(t.booked_on, 'YYYY-MM-DD') AS booked, t.memo
         FROM ledger_transfers t JOIN ledger_accounts d ON d.id = t.debit_account_id JOIN ledger_accounts c ON c.id = t.credit_account_id WHERE t.id = $1`,
        { bind: [`bench:${i}`], type: QueryTypes.SELECT, transaction: tx },
      );
      await postTransfer(tx, { id: `bench:${i}`, kind: row!.kind, debit: { farmId: row!.debit }, credit: row!.credit ? { farmId: row!.credit } : { coop: 'coop_processing' }, amountCents: Number(row!.amount), bookedOn: row!.booked, memo: row!.memo });
    });
  }
}));
console.log(`${sample} retried posts answered with the original in ${((performance.now() - r0) / 1000).toFixed(1)} s`);

// 2. Bulk load to TOTAL, then the cached balances from the sums.
await timed(`bulk-loaded ${TOTAL - POSTS} more transfers with SQL, balances recomputed`, () => withTenant({ coopId }, async (tx) => {
  await database().query(
    `WITH accounts AS (SELECT array_agg(id ORDER BY id) AS ids FROM ledger_accounts WHERE farm_id IS NOT NULL),
     picks AS (
       SELECT g, (1 + (g * 7919) % array_length(a.ids, 1))::int AS d, (1 + (g * 104729 + 13) % array_length(a.ids, 1))::int AS c, a.ids FROM generate_series($1::bigint, $2::bigint) g, accounts a
     )
     INSERT INTO ledger_transfers (coop_id, id, kind, status, debit_account_id, credit_account_id, amount_cents, memo, booked_on, posted_at)
     SELECT current_coop_id(), 'bulk:' || g, (ARRAY['stud_fee','processing_fee','shared_cost','sale','payment'])[1 + g % 5], 'posted', ids[d],
       ids[CASE WHEN c = d THEN 1 + c % array_length(ids, 1) ELSE c END], 100 + (g * 37) % 20000, 'Bench bulk', DATE '2026-01-01' + (g % 365)::int, now()
     FROM picks`,
    { bind: [POSTS, TOTAL - 1], transaction: tx },
  );
  await database().query(
    `UPDATE ledger_accounts a SET posted_cents = s.posted, pending_debit_cents = s.pd, pending_credit_cents = s.pc
     FROM (SELECT a2.id,
       COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'posted' AND credit_account_id = a2.id), 0)
         - COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'posted' AND debit_account_id = a2.id), 0) AS posted,
       COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'pending' AND debit_account_id = a2.id), 0) AS pd,
       COALESCE((SELECT sum(amount_cents) FROM ledger_transfers WHERE status = 'pending' AND credit_account_id = a2.id), 0) AS pc
       FROM ledger_accounts a2) s WHERE s.id = a.id`,
    { transaction: tx },
  );
}));
await database().query('ANALYZE ledger_transfers');
const [count] = await withTenant({ coopId }, (tx) => database().query<{ n: string }>('SELECT count(*) AS n FROM ledger_transfers', { type: QueryTypes.SELECT, transaction: tx }));
console.log(`the co-op holds ${count!.n} transfers`);

// 3. Reading it all.
const view = await timed('co-op view (every account, every farm\'s balance and dues)', () => coopLedger(admin));
console.log(`  books total ${view.booksTotalCents} (zero when balanced)`);
await timed(`balance cards of all ${FARMS} farms (one request each)`, async () => {
  for (const farmId of farmIds) await ledgerSummary(admin, farmId, { cardPayments: false });
});
await timed('settle-up over every farm-to-farm transfer', () => settleUpFor(admin));
for (const format of ['json', 'csv', 'pdf'] as const) {
  await timed(`a year's statement of all ${FARMS} farms (${format})`, async () => {
    for (const farmId of farmIds) await statementFor(admin, { from: '2026-01-01', to: '2026-12-31', farmId, format });
  });
}
await timed('the co-op\'s statement for the year (pdf)', () => statementFor(admin, { from: '2026-01-01', to: '2026-12-31', coop: 'true', format: 'pdf' }));
const lines = await statementFor(admin, { from: '2026-01-01', to: '2026-12-31', farmId: farmIds[1]!, format: 'json' });
if ('lines' in lines) console.log(`  one farm's statement: ${lines.lines.length} lines`);
await closeDatabase();
