import { randomUUID } from 'node:crypto';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LedgerSummaryDto, SettleUpDto, StatementDto, TransferDto, TransferListDto } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { binaryParser, pdfText } from '../support/herd-files';
import { checkBooks, postTransferAs, transferId } from '../support/ledger';
import { sharedSignedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let admin: Agent;
let member: Agent;
let otherMember: Agent;
let apprentice: Agent;
let farmA: string;
let farmB: string;

beforeAll(async () => {
  coop = await createTestCoop();
  [farmA, farmB] = [coop.farms[0]!.id, coop.farms[1]!.id];
  admin = await sharedSignedInAgent(coop.admin.email, TEST_PASSWORD, handle);
  member = await sharedSignedInAgent(coop.member.email, TEST_PASSWORD, handle);
  otherMember = await sharedSignedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
  apprentice = await sharedSignedInAgent(coop.apprentice.email, TEST_PASSWORD, handle);
});

afterAll(async () => {
  await handle.close();
});

/** Farm A owes farm B a stud fee of `cents`. */
const studFee = (cents: number, id = transferId('loan')) => ({
  id, kind: 'stud_fee' as const, debit: { farmId: farmA }, credit: { farmId: farmB }, amountCents: cents, sourceType: 'loan', sourceId: id, memo: 'Stud fee',
});

async function balancesNow() {
  const books = await checkBooks(coop.id);
  expect(books.mismatches).toEqual([]);
  expect(books.postedTotal).toBe(0);
  expect(books.pendingDebits).toBe(books.pendingCredits);
  return books;
}

describe('transfers', () => {
  it('when the admin posts a stud fee, then farm A owes it, farm B is owed it, and the books still sum to zero', async () => {
    const before = await balancesNow();
    const res = await admin.post('/api/ledger/transfers').send(studFee(2_500));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'stud_fee', status: 'posted', amountCents: 2_500, debit: { farmId: farmA }, credit: { farmId: farmB } });
    const after = await balancesNow();
    expect((after.balances.get(farmA) ?? 0) - (before.balances.get(farmA) ?? 0)).toBe(-2_500);
    expect((after.balances.get(farmB) ?? 0) - (before.balances.get(farmB) ?? 0)).toBe(2_500);
  });

  it('when the same transfer is posted again, then it answers the original and writes nothing; with another amount it is a 409', async () => {
    const body = studFee(1_200);
    const first = await admin.post('/api/ledger/transfers').send(body);
    expect(first.status).toBe(201);
    const before = await balancesNow();
    const again = await admin.post('/api/ledger/transfers').send(body);
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(first.body.id);
    expect(again.body.createdAt).toBe(first.body.createdAt);
    const changed = await admin.post('/api/ledger/transfers').send({ ...body, amountCents: 1_300 });
    expect(changed.status).toBe(409);
    const after = await balancesNow();
    expect(after.transfers).toBe(before.transfers);
    expect(after.balances).toEqual(before.balances);
  });

  it('when twenty requests post one id at once, then exactly one transfer is written and the balances move once', async () => {
    const before = await balancesNow();
    const body = studFee(700);
    const answers = await Promise.all(Array.from({ length: 20 }, () => admin.post('/api/ledger/transfers').send(body)));
    expect(answers.map((r) => r.status).sort()).toEqual([...Array(19).fill(200), 201]);
    expect(new Set(answers.map((r) => r.body.createdAt)).size).toBe(1);
    const after = await balancesNow();
    expect(after.transfers).toBe(before.transfers + 1);
    expect(after.balances.get(farmA)! - (before.balances.get(farmA) ?? 0)).toBe(-700);
  });

  it('when many different transfers between the same farms race, then every one is counted and the cache equals the sum', async () => {
    const before = await balancesNow();
    const bodies = Array.from({ length: 16 }, (_, i) => (i % 2 === 0 ? studFee(100 + i) : { ...studFee(100 + i), debit: { farmId: farmB }, credit: { farmId: farmA } }));
    const answers = await Promise.all(bodies.map((b) => admin.post('/api/ledger/transfers').send(b)));
    expect(answers.every((r) => r.status === 201)).toBe(true);
    const after = await balancesNow();
    const expected = bodies.reduce((s, b) => s + (b.credit.farmId === farmA ? b.amountCents : -b.amountCents), 0);
    expect(after.balances.get(farmA)! - (before.balances.get(farmA) ?? 0)).toBe(expected);
  });

  it('when a transfer names one account twice, a farm of another co-op, or a fractional amount, then it is refused with field messages', async () => {
    const foreign = await createTestCoop();
    const same = await admin.post('/api/ledger/transfers').send({ ...studFee(100), credit: { farmId: farmA } });
    expect(same.status).toBe(400);
    const outsider = await admin.post('/api/ledger/transfers').send({ ...studFee(100), credit: { farmId: foreign.farms[0]!.id } });
    expect(outsider.status).toBe(400);
    const fraction = await admin.post('/api/ledger/transfers').send({ ...studFee(100), amountCents: 10.5 });
    expect(fraction.status).toBe(400);
    expect(fraction.body.error.details.amountCents).toBeDefined();
  });
});

describe('pending, posted and voided', () => {
  it('when a fee is pending, then it shows as expected and not in the balance; posting it moves the balance', async () => {
    const before = await balancesNow();
    const fee = await postTransferAs(admin, { ...studFee(4_000), pending: true });
    expect(fee.status).toBe('pending');
    const summary = (await member.get('/api/ledger/summary')).body as LedgerSummaryDto;
    expect(summary.expectedOutCents).toBeGreaterThanOrEqual(4_000);
    const mid = await balancesNow();
    expect(mid.balances.get(farmA)).toBe(before.balances.get(farmA) ?? 0);
    const posted = await admin.post(`/api/ledger/transfers/${fee.id}/confirmation`);
    expect(posted.status).toBe(200);
    expect(posted.body.status).toBe('posted');
    const after = await balancesNow();
    expect(after.balances.get(farmA)! - (before.balances.get(farmA) ?? 0)).toBe(-4_000);
    const summaryAfter = (await member.get('/api/ledger/summary')).body as LedgerSummaryDto;
    expect(summaryAfter.expectedOutCents).toBe(summary.expectedOutCents - 4_000);
  });

  it('when a voided transfer is posted, or a posted one voided, then both are refused and nothing changes', async () => {
    const pending = await postTransferAs(admin, { ...studFee(900), pending: true });
    expect((await admin.post(`/api/ledger/transfers/${pending.id}/void`)).body.status).toBe('voided');
    const before = await balancesNow();
    expect((await admin.post(`/api/ledger/transfers/${pending.id}/confirmation`)).status).toBe(409);
    const posted = await postTransferAs(admin, studFee(800));
    const mid = await balancesNow();
    expect((await admin.post(`/api/ledger/transfers/${posted.id}/void`)).status).toBe(409);
    const after = await balancesNow();
    expect(after.balances).toEqual(mid.balances);
    expect(before.pendingDebits).toBe(after.pendingDebits);
  });
});

describe('corrections', () => {
  it('when the admin corrects a posted fee, then a linked reversing transfer restores both balances; more than is left is refused', async () => {
    const before = await balancesNow();
    const fee = await postTransferAs(admin, studFee(3_000));
    const correction = await admin.post(`/api/ledger/transfers/${fee.id}/corrections`).send({ id: `${fee.id}:fix`, reason: 'Wrong buck' });
    expect(correction.status).toBe(201);
    expect(correction.body).toMatchObject({ kind: 'correction', status: 'posted', correctsTransferId: fee.id, correctionReason: 'Wrong buck', amountCents: 3_000 });
    expect(correction.body.debit.farmId).toBe(farmB);
    const after = await balancesNow();
    expect(after.balances.get(farmA)).toBe(before.balances.get(farmA) ?? 0);
    expect((await admin.post(`/api/ledger/transfers/${fee.id}/corrections`).send({ id: `${fee.id}:fix2`, reason: 'Again' })).status).toBe(409);
    // The same correction again answers the original.
    const repeat = await admin.post(`/api/ledger/transfers/${fee.id}/corrections`).send({ id: `${fee.id}:fix`, reason: 'Wrong buck' });
    expect(repeat.status).toBe(200);
  });

  it('when a member corrects a farm-to-farm fee, then it waits for the other farm, which confirms it; the proposer cannot', async () => {
    const fee = await postTransferAs(admin, studFee(1_000));
    const before = await balancesNow();
    const proposed = await member.post(`/api/ledger/transfers/${fee.id}/corrections`).send({ id: `${fee.id}:part`, amountCents: 400, reason: 'Two matings, not three' });
    expect(proposed.status).toBe(201);
    expect(proposed.body).toMatchObject({ status: 'pending', awaitingFarmId: farmB, amountCents: 400 });
    expect((await member.post(`/api/ledger/transfers/${fee.id}:part/confirmation`)).status).toBe(403);
    expect((await balancesNow()).balances.get(farmA)).toBe(before.balances.get(farmA));
    const confirmed = await otherMember.post(`/api/ledger/transfers/${fee.id}:part/confirmation`);
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.status).toBe('posted');
    expect((await balancesNow()).balances.get(farmA)! - before.balances.get(farmA)!).toBe(400);
  });

  it('when a member corrects a transfer with the co-op, then only the admin may', async () => {
    const dues = await postTransferAs(admin, { id: transferId('charge'), kind: 'shared_cost', debit: { farmId: farmA }, credit: { coop: 'coop_processing' }, amountCents: 1_500 });
    const res = await member.post(`/api/ledger/transfers/${dues.id}/corrections`).send({ id: `${dues.id}:fix`, reason: 'Not ours' });
    expect(res.status).toBe(403);
  });
});

describe('recorded payments', () => {
  it('when farm A records a cash payment to farm B, then it posts only once farm B confirms', async () => {
    const before = await balancesNow();
    const id = transferId('pay');
    const res = await member.post('/api/ledger/payments').send({ id, toFarmId: farmB, amountCents: 2_000, method: 'cash', paidOn: '2026-03-02', memo: 'At the swap meet' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'payment', status: 'pending', awaitingFarmId: farmB, method: 'cash', credit: { farmId: farmA } });
    expect((await member.post(`/api/ledger/transfers/${id}/confirmation`)).status).toBe(403);
    const summaryB = (await otherMember.get('/api/ledger/summary')).body as LedgerSummaryDto;
    expect(summaryB.awaitingYourConfirmation).toBeGreaterThan(0);
    expect((await balancesNow()).balances.get(farmA)).toBe(before.balances.get(farmA));
    const confirmed = await otherMember.post(`/api/ledger/transfers/${id}/confirmation`);
    expect(confirmed.body.status).toBe('posted');
    const after = await balancesNow();
    expect(after.balances.get(farmA)! - before.balances.get(farmA)!).toBe(2_000);
    expect(after.balances.get(farmB)! - before.balances.get(farmB)!).toBe(-2_000);
  });

  it('when a member pays themselves, then it is refused', async () => {
    const res = await member.post('/api/ledger/payments').send({ id: transferId('pay'), toFarmId: farmA, amountCents: 100, method: 'cash', paidOn: '2026-03-02' });
    expect(res.status).toBe(400);
  });
});

describe('reading the books', () => {
  let local: TestCoop;
  let localAdmin: Agent;
  let localMember: Agent;
  beforeAll(async () => {
    local = await createTestCoop();
    localAdmin = await sharedSignedInAgent(local.admin.email, TEST_PASSWORD, handle);
    localMember = await sharedSignedInAgent(local.member.email, TEST_PASSWORD, handle);
    const [a, b] = [local.farms[0]!.id, local.farms[1]!.id];
    const day = (d: number) => `2026-02-${String(d).padStart(2, '0')}`;
    for (let i = 1; i <= 12; i++) {
      await postTransferAs(localAdmin, { id: `fee-${i}`, kind: i % 3 === 0 ? 'processing_fee' : 'stud_fee', debit: { farmId: a }, credit: i % 3 === 0 ? { coop: 'coop_processing' } : { farmId: b }, amountCents: 1_000 * i, bookedOn: day(i) });
    }
    await postTransferAs(localAdmin, { id: 'before-period', kind: 'sale', debit: { farmId: b }, credit: { farmId: a }, amountCents: 5_000, bookedOn: '2026-01-15' });
  });

  it('when a member lists transfers, then they come a page at a time with the total, filtered by kind and counterparty', async () => {
    const page1 = (await localMember.get('/api/ledger/transfers?pageSize=5&page=1')).body as TransferListDto;
    expect(page1.total).toBe(13);
    expect(page1.items).toHaveLength(5);
    expect(page1.items[0]!.id).toBe('fee-12');
    const page3 = (await localMember.get('/api/ledger/transfers?pageSize=5&page=3')).body as TransferListDto;
    expect(page3.items.map((t) => t.id)).toEqual(['fee-2', 'fee-1', 'before-period']);
    const processing = (await localMember.get('/api/ledger/transfers?kind=processing_fee')).body as TransferListDto;
    expect(processing.items.map((t) => t.id)).toEqual(['fee-12', 'fee-9', 'fee-6', 'fee-3']);
    const withCoop = (await localMember.get('/api/ledger/transfers?counterparty=coop')).body as TransferListDto;
    expect(withCoop.total).toBe(4);
    const inPeriod = (await localMember.get('/api/ledger/transfers?from=2026-02-05&to=2026-02-07')).body as TransferListDto;
    expect(inPeriod.items.map((t) => t.id)).toEqual(['fee-7', 'fee-6', 'fee-5']);
  });

  it('when a member opens the summary, then the cards show what is owed to them and by them', async () => {
    const summary = (await localMember.get('/api/ledger/summary')).body as LedgerSummaryDto;
    // Stud fees to farm B: 1+2+4+5+7+8+10+11 thousand; processing: 3+6+9+12 thousand; sale from B: 5 thousand.
    expect(summary.youOweCents).toBe(48_000 - 5_000 + 30_000);
    expect(summary.owedToYouCents).toBe(0);
    expect(summary.owedToCoopCents).toBe(30_000);
    expect(summary.account.balanceCents).toBe(-73_000);
  });

  it('when a statement is asked for, then it opens with what came before, runs through the period and closes; CSV and PDF say the same', async () => {
    const json = (await localMember.get('/api/ledger/statement?from=2026-02-01&to=2026-02-28')).body as StatementDto;
    expect(json.openingBalanceCents).toBe(5_000);
    expect(json.lines).toHaveLength(12);
    expect(json.lines[0]).toMatchObject({ transferId: 'fee-1', amountCents: -1_000, runningBalanceCents: 4_000 });
    expect(json.closingBalanceCents).toBe(5_000 - 78_000);
    const csv = await localMember.get('/api/ledger/statement?from=2026-02-01&to=2026-02-28&format=csv').buffer(true).parse(binaryParser);
    expect(csv.headers['content-disposition']).toMatch(/attachment; filename="statement-.*\.csv"/);
    const rows = parse((csv.body as Buffer).toString('utf8'), { bom: true, relax_column_count: true }) as string[][];
    const header = rows.findIndex((r) => r[0] === 'date');
    expect(rows[header + 1]).toEqual(['2026-02-01', '', '', '', 'Opening balance', '', '50']);
    expect(rows[header + 2]).toEqual(['2026-02-01', 'fee-1', 'Stud fee', local.farms[1]!.name, '', '-10', '40']);
    expect(rows.at(-1)).toEqual(['2026-02-28', '', '', '', 'Closing balance', '', '-730']);
    const pdf = await localMember.get('/api/ledger/statement?from=2026-02-01&to=2026-02-28&format=pdf').buffer(true).parse(binaryParser);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const { text } = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Opening balance $50.00');
    expect(text).toContain('Closing balance -$730.00');
    expect(text).toContain('Processing site');
    expect(text).toContain('-$120.00');
  });

  it('when the admin asks for the co-op statement, then it shows the co-op accounts\' side', async () => {
    const json = (await localAdmin.get('/api/ledger/statement?from=2026-02-01&to=2026-02-28&coop=true')).body as StatementDto;
    expect(json.lines.map((l) => l.transferId)).toEqual(['fee-3', 'fee-6', 'fee-9', 'fee-12']);
    expect(json.closingBalanceCents).toBe(30_000);
  });

  it('when farms owe each other, then settle-up suggests at most n − 1 payments that clear them and says so', async () => {
    const settle = (await localAdmin.get('/api/ledger/settle-up')).body as SettleUpDto;
    expect(settle.payments).toEqual([{ fromFarmId: local.farms[0]!.id, fromFarmName: local.farms[0]!.name, toFarmId: local.farms[1]!.id, toFarmName: local.farms[1]!.name, amountCents: 43_000 }]);
    expect(settle.note).toMatch(/n − 1/);
  });
});

describe('who sees money', () => {
  it('when an apprentice asks for any part of the Ledger, then every answer is a refusal with no amount in it', async () => {
    for (const path of ['/api/ledger/summary', '/api/ledger/transfers', '/api/ledger/settle-up', '/api/ledger/statement?from=2026-01-01&to=2026-12-31', '/api/ledger/fees-by-month']) {
      const res = await apprentice.get(path);
      expect(res.status, path).toBe(403);
      expect(JSON.stringify(res.body)).not.toMatch(/Cents/);
    }
  });

  it('when a member asks for another farm\'s account, then it does not exist for them', async () => {
    expect((await member.get(`/api/ledger/summary?farmId=${farmB}`)).status).toBe(404);
    expect((await member.get(`/api/ledger/transfers?farmId=${farmB}`)).status).toBe(404);
    expect((await admin.get(`/api/ledger/summary?farmId=${farmB}`)).status).toBe(200);
  });
});

describe('dues', () => {
  it('when the admin sets the year\'s dues, then every farm is charged once and the co-op view shows what each owes', async () => {
    const local = await createTestCoop();
    const localAdmin = await sharedSignedInAgent(local.admin.email, TEST_PASSWORD, handle);
    const body = { amountCents: 6_000, dueOn: '2027-03-31', reminderDaysBefore: 14 };
    const res = await localAdmin.put('/api/ledger/dues/2027').send(body);
    expect(res.status).toBe(200);
    expect(res.body.farms.map((f: { dues: { owedCents: number } }) => f.dues.owedCents)).toEqual([6_000, 6_000]);
    expect(res.body.booksTotalCents).toBe(0);
    // Setting it again (a later due date) charges nobody twice; another amount is refused.
    expect((await localAdmin.put('/api/ledger/dues/2027').send({ ...body, dueOn: '2027-04-15' })).status).toBe(200);
    expect((await localAdmin.put('/api/ledger/dues/2027').send({ ...body, amountCents: 7_000 })).status).toBe(409);
    const books = await checkBooks(local.id);
    expect(books.transfers).toBe(2);
    expect(books.mismatches).toEqual([]);
    const jobs = await asTenant(local.id, (c) => c.query(`SELECT start_after FROM pgboss.job WHERE name = 'ledger-dues-reminders' AND data->>'coopId' = $1 ORDER BY start_after`, [local.id]));
    expect(jobs.rows.map((r) => new Date(r.start_after).toISOString())).toEqual(['2027-03-17T09:00:00.000Z', '2027-04-01T09:00:00.000Z']);
    expect((await sharedSignedInAgent(local.apprentice.email, TEST_PASSWORD, handle).then((a) => a.put('/api/ledger/dues/2027').send(body))).status).toBe(403);
  });
});

it('the transfer ids of this file are unique per co-op: another co-op may use the same id', async () => {
  const foreign = await createTestCoop();
  const foreignAdmin = await sharedSignedInAgent(foreign.admin.email, TEST_PASSWORD, handle);
  const id = `shared-${randomUUID()}`;
  await postTransferAs(admin, { ...studFee(100), id });
  const res = await foreignAdmin.post('/api/ledger/transfers').send({ id, kind: 'stud_fee', debit: { farmId: foreign.farms[0]!.id }, credit: { farmId: foreign.farms[1]!.id }, amountCents: 100 });
  expect(res.status).toBe(201);
  const mine = (await admin.get(`/api/ledger/transfers/${id}`)).body as TransferDto;
  expect(mine.debit.farmId).toBe(farmA);
});
