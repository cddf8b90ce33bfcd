import type { Transaction } from 'sequelize';
import type { AccountRef, TransferKind } from '@burrowline/shared';
import { chargeDues } from '../packages/server/src/modules/ledger/dues.service';
import { duesPeriodOf, postPending, postTransfer } from '../packages/server/src/modules/ledger/ledger.service';

/**
 * A year of the invented co-op's Ledger: dues for 2026 (most paid, one by card, one still owing) and for
 * 2027, monthly processing-day fees to the co-op's site, stud fees between farms, shared feed orders, a
 * breeding-stock sale, cash settlements confirmed by the farm paid, and one fee still pending. Every
 * id is derived from what it stands for, so loading it twice posts nothing twice.
 */
export interface DemoLedgerContext {
  coopId: string;
  farms: Map<string, string>;
  keepers: Map<string, string>;
  appUrl: string;
}

const MONTHS = ['2026-01', '2026-02', '2026-03', '2026-04', '2026-05', '2026-06', '2026-07', '2026-08', '2026-09', '2026-10', '2026-11'];

export async function loadDemoLedger(ctx: DemoLedgerContext, tx: Transaction): Promise<void> {
  const farm = (key: string): AccountRef => ({ farmId: ctx.farms.get(key)! });
  const admin = ctx.keepers.get('quillfeather') ?? null;
  const post = (id: string, kind: TransferKind, debit: AccountRef, credit: AccountRef, amountCents: number, bookedOn: string, memo: string, extra: { pending?: boolean; method?: 'cash' | 'cheque' | 'bank_transfer' | 'card'; sourceType?: string; sourceId?: string } = {}) =>
    postTransfer(tx, { id: `demo:${id}`, kind, debit, credit, amountCents, bookedOn, memo, postedBy: admin, ...extra });

  await chargeDues(tx, ctx.coopId, 2026, { amountCents: 6_000, dueOn: '2026-03-31', reminderDaysBefore: 14 }, { setBy: admin, appUrl: ctx.appUrl, bookedOn: '2026-01-05' });
  const period = (await duesPeriodOf(tx, 2026))!;
  const duesPaid: [string, string, 'cash' | 'cheque' | 'card'][] = [['quillfeather', '2026-01-12', 'cheque'], ['hazelrun', '2026-02-03', 'card'], ['cobble-creek', '2026-03-18', 'cash'], ['wrenfield', '2026-03-29', 'cash']];
  for (const [key, on, method] of duesPaid) {
    await post(`dues-2026-paid:${key}`, 'payment', method === 'card' ? { coop: 'coop_card_clearing' } : { coop: 'coop_cash' }, farm(key), 6_000, on, method === 'card' ? 'Dues paid by card' : '2026 dues', { method, sourceType: 'dues_period', sourceId: period.id });
  }

  // Processing days at the co-op's site: a fee per head from each farm that booked places.
  const heads: Record<string, number[]> = {
    quillfeather: [6, 0, 8, 0, 10, 0, 12, 0, 8, 0, 6],
    hazelrun: [10, 8, 12, 10, 14, 12, 16, 14, 12, 10, 8],
    'cobble-creek': [0, 6, 0, 8, 0, 6, 0, 8, 0, 6, 0],
    wrenfield: [4, 4, 6, 6, 8, 8, 6, 6, 4, 4, 4],
    saltbush: [0, 0, 4, 0, 6, 0, 6, 0, 4, 0, 2],
  };
  for (const [key, perMonth] of Object.entries(heads)) {
    for (const [i, n] of perMonth.entries()) {
      if (n > 0) await post(`processing:${MONTHS[i]}:${key}`, 'processing_fee', farm(key), { coop: 'coop_processing' }, n * 350, `${MONTHS[i]}-14`, `Processing day, ${n} head at $3.50`);
    }
  }

  // Stud service with the co-op's bucks: the doe's farm owes the buck's.
  const studs: [string, string, string, number][] = [
    ['2026-01', 'hazelrun', 'quillfeather', 2_500], ['2026-02', 'cobble-creek', 'hazelrun', 2_000], ['2026-03', 'wrenfield', 'quillfeather', 2_500],
    ['2026-04', 'saltbush', 'hazelrun', 2_000], ['2026-05', 'hazelrun', 'cobble-creek', 1_500], ['2026-06', 'wrenfield', 'hazelrun', 2_000],
    ['2026-07', 'quillfeather', 'saltbush', 1_500], ['2026-08', 'cobble-creek', 'quillfeather', 2_500], ['2026-09', 'saltbush', 'quillfeather', 2_500],
    ['2026-10', 'wrenfield', 'cobble-creek', 1_500], ['2026-11', 'hazelrun', 'saltbush', 1_500],
  ];
  for (const [month, doeFarm, buckFarm, cents] of studs) {
    await post(`stud:${month}:${doeFarm}:${buckFarm}`, 'stud_fee', farm(doeFarm), farm(buckFarm), cents, `${month}-20`, 'Stud fee for a loaned buck', { sourceType: 'loan', sourceId: `demo-${month}` });
  }

  // The spring and autumn feed orders, split by the farms that shared the pallet.
  for (const [month, order] of [['2026-04', 'spring'], ['2026-10', 'autumn']] as const) {
    for (const key of ['hazelrun', 'cobble-creek', 'wrenfield']) {
      await post(`feed-order:${order}:${key}`, 'shared_cost', farm(key), farm('quillfeather'), 4_275, `${month}-08`, `Share of the ${order} feed order`);
    }
  }
  await post('sale:trio', 'sale', farm('saltbush'), farm('hazelrun'), 9_000, '2026-05-22', 'Breeding trio with pedigrees');

  // Settling up in cash and by cheque, confirmed by the farm paid.
  const settlements: [string, string, string, number, 'cash' | 'cheque'][] = [
    ['2026-06-30', 'hazelrun', 'quillfeather', 6_775, 'cash'],
    ['2026-09-30', 'saltbush', 'hazelrun', 5_000, 'cheque'],
    ['2026-10-31', 'wrenfield', 'quillfeather', 4_000, 'cash'],
  ];
  for (const [on, payer, payee, cents, method] of settlements) {
    const id = `demo:settle:${on}:${payer}`;
    await postTransfer(tx, { id, kind: 'payment', debit: farm(payee), credit: farm(payer), amountCents: cents, bookedOn: on, memo: 'Settling up', method, pending: true, awaitingFarmId: ctx.farms.get(payee)!, postedBy: ctx.keepers.get(payer) ?? null });
    await postPending(tx, id, ctx.keepers.get(payee) ?? null);
  }
  // One payment still waits for the farm paid to confirm it, and December's processing day is booked, not held yet.
  await postTransfer(tx, { id: 'demo:settle:2026-12-02:cobble-creek', kind: 'payment', debit: farm('hazelrun'), credit: farm('cobble-creek'), amountCents: 1_500, bookedOn: '2026-12-02', memo: 'Settling up', method: 'cash', pending: true, awaitingFarmId: ctx.farms.get('hazelrun')!, postedBy: ctx.keepers.get('cobble-creek') ?? null });
  await post('processing:2026-12:hazelrun', 'processing_fee', farm('hazelrun'), { coop: 'coop_processing' }, 12 * 350, '2026-12-12', 'Processing day, 12 places booked', { pending: true });

  await chargeDues(tx, ctx.coopId, 2027, { amountCents: 6_500, dueOn: '2027-03-31', reminderDaysBefore: 21 }, { setBy: admin, appUrl: ctx.appUrl, bookedOn: '2026-12-01' });
}
