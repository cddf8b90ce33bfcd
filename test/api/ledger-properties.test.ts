import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import type { AccountRef } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { AppError } from '../../packages/server/src/lib/app-error';
import { confirmTransfer, correctTransfer, createTransfer, voidTransfer } from '../../packages/server/src/modules/ledger/ledger.service';
import { asTenant } from '../support/db';
import { createTestCoop, type TestCoop } from '../support/factories';
import { actorOf } from '../support/herd';
import { checkBooks } from '../support/ledger';

/**
 * Random sequences of posts, pending posts, posting, voiding, corrections and retries of any of them,
 * run through the Ledger's service on the real database and mirrored by a model in memory. After every
 * sequence: the books sum to zero, each cached balance equals the sum of its transfers, every id was
 * written at most once, and the balances are the model's.
 */

type Op =
  | { op: 'post'; slot: number; debit: number; credit: number; amount: number; pending: boolean }
  | { op: 'confirm'; slot: number }
  | { op: 'void'; slot: number }
  | { op: 'correct'; slot: number; part: number }
  | { op: 'retry'; back: number };

const ACCOUNTS = 5; // two farms and three co-op accounts
const opArbitrary: fc.Arbitrary<Op> = fc.oneof(
  { weight: 5, arbitrary: fc.record({ op: fc.constant('post' as const), slot: fc.nat(7), debit: fc.nat(ACCOUNTS - 1), credit: fc.nat(ACCOUNTS - 1), amount: fc.integer({ min: 1, max: 50_000 }), pending: fc.boolean() }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('confirm' as const), slot: fc.nat(7) }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('void' as const), slot: fc.nat(7) }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('correct' as const), slot: fc.nat(7), part: fc.integer({ min: 1, max: 100 }) }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('retry' as const), back: fc.nat(10) }) },
);

interface ModelTransfer {
  debit: number;
  credit: number;
  amount: number;
  status: 'pending' | 'posted' | 'voided';
  corrected: number;
  isCorrection: boolean;
}

let coop: TestCoop;
let refs: AccountRef[];
let accountKeys: string[];
const stats = { runs: 0, operations: 0, written: 0, refused: 0 };

beforeAll(async () => {
  connectDatabase(process.env.DATABASE_URL!);
  coop = await createTestCoop();
  refs = [{ farmId: coop.farms[0]!.id }, { farmId: coop.farms[1]!.id }, { coop: 'coop_processing' }, { coop: 'coop_dues' }, { coop: 'coop_cash' }];
  accountKeys = refs.map((r) => ('farmId' in r ? r.farmId : r.coop));
});

const isRefusal = (e: unknown) => e instanceof AppError && e.status >= 400 && e.status < 500;

describe('ledger properties', () => {
  it('for random sequences with retries, the books balance, no id applies twice, and balances equal the sums', async () => {
    const admin = actorOf(coop.admin);
    await fc.assert(
      fc.asyncProperty(fc.array(opArbitrary, { minLength: 5, maxLength: 30, size: 'max' }), async (ops) => {
        stats.runs++;
        const run = randomUUID().slice(0, 8);
        const before = await checkBooks(coop.id);
        const model = new Map<string, ModelTransfer>();
        const done: Op[] = [];
        const idOf = (slot: number) => `p-${run}-${slot}`;
        const apply = async (op: Op): Promise<void> => {
          stats.operations++;
          try {
            if (op.op === 'post') {
              const id = idOf(op.slot);
              const existing = model.get(id);
              await createTransfer(admin, { id, kind: 'shared_cost', debit: refs[op.debit]!, credit: refs[op.credit]!, amountCents: op.amount, pending: op.pending, sourceType: '', sourceId: '', memo: '' });
              expect(op.debit).not.toBe(op.credit);
              if (existing) {
                // Accepted again only as the very same transfer.
                expect([existing.debit, existing.credit, existing.amount, existing.isCorrection]).toEqual([op.debit, op.credit, op.amount, false]);
              } else {
                model.set(id, { debit: op.debit, credit: op.credit, amount: op.amount, status: op.pending ? 'pending' : 'posted', corrected: 0, isCorrection: false });
                stats.written++;
              }
            } else if (op.op === 'confirm') {
              const t = model.get(idOf(op.slot));
              await confirmTransfer(admin, idOf(op.slot));
              expect(t && t.status !== 'voided').toBe(true);
              t!.status = 'posted';
            } else if (op.op === 'void') {
              const t = model.get(idOf(op.slot));
              await voidTransfer(admin, idOf(op.slot));
              expect(t && t.status !== 'posted').toBe(true);
              t!.status = 'voided';
            } else if (op.op === 'correct') {
              const id = idOf(op.slot);
              const t = model.get(id);
              const correctionId = `${id}-c${op.part}`;
              const repeated = model.get(correctionId);
              const amount = t ? Math.max(1, Math.floor((t.amount * op.part) / 100)) : 1;
              await correctTransfer(admin, id, { id: correctionId, amountCents: amount, reason: 'Property check' });
              expect(t?.status).toBe('posted');
              expect(t?.isCorrection).toBe(false);
              if (!repeated) {
                expect(t!.corrected + amount).toBeLessThanOrEqual(t!.amount);
                t!.corrected += amount;
                model.set(correctionId, { debit: t!.credit, credit: t!.debit, amount, status: 'posted', corrected: 0, isCorrection: true });
                stats.written++;
              }
            } else {
              const earlier = done[done.length - 1 - op.back];
              if (earlier) await apply(earlier);
              return;
            }
          } catch (error) {
            if (!isRefusal(error)) throw error;
            stats.refused++;
            // Each refusal is one the model expects.
            if (op.op === 'post') expect(op.debit === op.credit || (model.has(idOf(op.slot)) && !sameAsModel(model.get(idOf(op.slot))!, op))).toBe(true);
            const t = 'slot' in op ? model.get(idOf(op.slot)) : undefined;
            if (op.op === 'confirm') expect(t === undefined || t.status === 'voided').toBe(true);
            if (op.op === 'void') expect(t === undefined || t.status === 'posted').toBe(true);
            if (op.op === 'correct') {
              const amount = t ? Math.max(1, Math.floor((t.amount * op.part) / 100)) : 1;
              expect(t === undefined || t.status !== 'posted' || t.isCorrection || t.corrected + amount > t.amount).toBe(true);
            }
          }
          done.push(op);
        };
        for (const op of ops) await apply(op);

        const after = await checkBooks(coop.id);
        expect(after.mismatches).toEqual([]);
        expect(after.postedTotal).toBe(0);
        expect(after.pendingDebits).toBe(after.pendingCredits);
        expect(after.transfers - before.transfers).toBe(model.size);
        const delta = accountKeys.map(() => 0);
        for (const t of model.values()) {
          if (t.status !== 'posted') continue;
          delta[t.debit]! -= t.amount;
          delta[t.credit]! += t.amount;
        }
        const coopAccountBalances = await accountBalancesByKey(after, before);
        expect(coopAccountBalances).toEqual(delta);
      }),
      { numRuns: 50 },
    );
    // Printed for the report: how much the property covered.
    console.log(`ledger property: ${stats.runs} sequences, ${stats.operations} operations, ${stats.written} transfers written, ${stats.refused} refusals checked`);
    expect(stats.written).toBeGreaterThan(0);
    expect(stats.refused).toBeGreaterThan(0);
  }, 240_000);
});

function sameAsModel(t: ModelTransfer, op: Extract<Op, { op: 'post' }>): boolean {
  return !t.isCorrection && t.debit === op.debit && t.credit === op.credit && t.amount === op.amount;
}

/** Balance changes of the five accounts between two reads (co-op accounts are keyed by their row id there). */
async function accountBalancesByKey(after: Awaited<ReturnType<typeof checkBooks>>, before: Awaited<ReturnType<typeof checkBooks>>): Promise<number[]> {
  const ids = await asTenant(coop.id, (c) => c.query(`SELECT id, farm_id, kind FROM ledger_accounts`));
  const keyToBalanceKey = new Map(ids.rows.map((r) => [(r.farm_id ?? r.kind) as string, (r.farm_id ?? r.id) as string]));
  return accountKeys.map((key) => {
    const k = keyToBalanceKey.get(key);
    return k ? (after.balances.get(k) ?? 0) - (before.balances.get(k) ?? 0) : 0;
  });
}
