import { randomUUID } from 'node:crypto';
import Stripe from 'stripe';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, type CardCheckoutDto, type LedgerSummaryDto } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { checkBooks } from '../support/ledger';
import { cardAccount, cardTestServer, eventually, fakeCard } from '../support/card-service';
import { ROOMY_SIGN_IN } from '../support/test-app';

const card = cardAccount();
let server: Awaited<ReturnType<typeof cardTestServer>>;
let coop: TestCoop;
let year = 2030;

type Agent = ReturnType<typeof supertest.agent>;
async function signIn(email: string): Promise<Agent> {
  const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
  const res = await agent.post('/api/session').send({ email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  return agent;
}

beforeAll(async () => {
  server = await cardTestServer(card, 0, { signIn: ROOMY_SIGN_IN });
  await fakeCard.register(card, `${server.url}/api/card-webhooks`);
  coop = await createTestCoop();
});

afterAll(async () => {
  await server.close();
});

/** A fresh year's dues of `cents` for every farm, so each test pays its own. */
async function newDues(cents: number): Promise<number> {
  year += 1;
  const admin = await signIn(coop.admin.email);
  const res = await admin.put(`/api/ledger/dues/${year}`).send({ amountCents: cents, dueOn: `${year}-03-31`, reminderDaysBefore: 7 });
  expect(res.status).toBe(200);
  return year;
}

async function openCheckout(agent: Agent, duesYear: number): Promise<CardCheckoutDto> {
  const res = await agent.post('/api/ledger/card-checkouts').send({ idempotencyKey: randomUUID(), purpose: 'dues', duesYear });
  expect(res.status).toBe(201);
  return res.body as CardCheckoutDto;
}

const sessionOf = async (checkoutId: string) => (await asTenant(coop.id, (c) => c.query('SELECT session_id, status, transfer_id FROM card_checkouts WHERE id = $1', [checkoutId]))).rows[0];
const duesOwed = async (agent: Agent, duesYear: number) => ((await agent.get('/api/ledger/summary')).body as LedgerSummaryDto).dues.find((d) => d.year === duesYear)?.owedCents;
const cardTransfers = async () => (await asTenant(coop.id, (c) => c.query(`SELECT id FROM ledger_transfers WHERE method = 'card'`))).rows.map((r) => r.id as string);

describe('paying dues by card', () => {
  it('when a member pays on the card page, then the checkout is created once per key and only the verified webhook posts the payment', async () => {
    const dues = await newDues(4_500);
    const member = await signIn(coop.member.email);
    const key = randomUUID();
    const first = await member.post('/api/ledger/card-checkouts').send({ idempotencyKey: key, purpose: 'dues', duesYear: dues });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ status: 'open', amountCents: 4_500, currency: 'USD', purpose: 'dues' });
    expect(first.body.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_test_/);
    // A double click answers the same checkout and the same card page.
    const again = await member.post('/api/ledger/card-checkouts').send({ idempotencyKey: key, purpose: 'dues', duesYear: dues });
    expect(again.body).toEqual(first.body);
    expect(await duesOwed(member, dues)).toBe(4_500);

    const { session_id: sessionId } = await sessionOf(first.body.id);
    await fakeCard.pay(sessionId);
    const settled = await eventually(() => member.get(`/api/ledger/card-checkouts/${first.body.id}`).then((r) => r.body as CardCheckoutDto), (c) => c.status === 'paid');
    expect(settled.status).toBe('paid');
    const deliveries = (await fakeCard.deliveries(card)).deliveries.filter((d) => d.type === 'checkout.session.completed');
    const eventId = deliveries.at(-1)!.eventId;
    // The event's id is the transfer's id.
    expect(settled.transferId).toBe(eventId);
    expect(await duesOwed(member, dues)).toBe(0);
    const books = await checkBooks(coop.id);
    expect(books.mismatches).toEqual([]);
    expect(books.postedTotal).toBe(0);
  });

  it('when a webhook carries a bad or an old signature, then it gets 400 and nothing changes', async () => {
    const dues = await newDues(1_000);
    const member = await signIn(coop.member.email);
    const checkout = await openCheckout(member, dues);
    const { session_id: sessionId } = await sessionOf(checkout.id);
    const payload = JSON.stringify({
      id: `evt_forged_${randomUUID().slice(0, 8)}`, object: 'event', type: 'checkout.session.completed',
      data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'paid', amount_total: 1_000, currency: 'usd', metadata: { coopId: coop.id, checkoutId: checkout.id } } },
    });
    const sdk = new Stripe(card.secretKey);
    const wrongSecret = sdk.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_right_one' });
    const old = sdk.webhooks.generateTestHeaderString({ payload, secret: card.webhookSecret, timestamp: Math.floor(Date.now() / 1000) - 600 });
    const before = await checkBooks(coop.id);
    for (const signature of [wrongSecret, old, 't=1,v1=abc', '']) {
      const res = await supertest(server.url).post('/api/card-webhooks').set('content-type', 'application/json').set('stripe-signature', signature).send(payload);
      expect(res.status).toBe(400);
    }
    // The same payload properly signed would be accepted: the refusals above are the signature's.
    const good = sdk.webhooks.generateTestHeaderString({ payload, secret: card.webhookSecret });
    const after = await checkBooks(coop.id);
    expect(after.transfers).toBe(before.transfers);
    expect((await sessionOf(checkout.id)).status).toBe('open');
    const accepted = await supertest(server.url).post('/api/card-webhooks').set('content-type', 'application/json').set('stripe-signature', good).send(payload);
    expect(accepted.status).toBe(200);
    expect(accepted.body.handled).toBe('paid');
  });

  it('when the card service delivers an event twice, then the payment is posted once', async () => {
    const dues = await newDues(2_200);
    const member = await signIn(coop.member.email);
    const checkout = await openCheckout(member, dues);
    await fakeCard.switches(card, { duplicate: true });
    try {
      const before = await cardTransfers();
      await fakeCard.pay((await sessionOf(checkout.id)).session_id);
      const both = await eventually(() => fakeCard.deliveries(card), (d) => d.deliveries.filter((x) => x.status === 200).length >= 2 && new Set(d.deliveries.slice(-2).map((x) => x.eventId)).size === 1);
      const [a, b] = both.deliveries.slice(-2);
      expect(a!.eventId).toBe(b!.eventId);
      expect([a!.status, b!.status]).toEqual([200, 200]);
      const after = await cardTransfers();
      expect(after.length - before.length).toBe(1);
      expect(await duesOwed(member, dues)).toBe(0);
    } finally {
      await fakeCard.switches(card, { duplicate: false });
    }
  });

  it('when events arrive out of order, then each payment is posted once and a late expiry does not undo a payment', async () => {
    const dues = await newDues(1_500);
    const member = await signIn(coop.member.email);
    const other = await signIn(coop.otherFarmMember.email);
    const mine = await openCheckout(member, dues);
    const theirs = await openCheckout(other, dues);
    await fakeCard.switches(card, { outOfOrder: true });
    try {
      await fakeCard.pay((await sessionOf(mine.id)).session_id);
      await fakeCard.pay((await sessionOf(theirs.id)).session_id);
      expect((await fakeCard.release(card)).released).toBe(2);
    } finally {
      await fakeCard.switches(card, { outOfOrder: false });
    }
    expect((await sessionOf(mine.id)).status).toBe('paid');
    expect((await sessionOf(theirs.id)).status).toBe('paid');
    expect(await duesOwed(member, dues)).toBe(0);
    expect(await duesOwed(other, dues)).toBe(0);

    // An expiry signed after the payment, delivered late, leaves the paid checkout paid.
    const { session_id: sessionId } = await sessionOf(mine.id);
    const late = JSON.stringify({ id: `evt_late_${randomUUID().slice(0, 8)}`, object: 'event', type: 'checkout.session.expired', data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'unpaid', metadata: { coopId: coop.id, checkoutId: mine.id } } } });
    const res = await supertest(server.url).post('/api/card-webhooks').set('content-type', 'application/json')
      .set('stripe-signature', new Stripe(card.secretKey).webhooks.generateTestHeaderString({ payload: late, secret: card.webhookSecret })).send(late);
    expect(res.body.handled).toBe('already settled');
    expect((await sessionOf(mine.id)).status).toBe('paid');
  });

  it('when the payer declines, then the checkout says so and nothing is posted', async () => {
    const dues = await newDues(800);
    const member = await signIn(coop.member.email);
    const checkout = await openCheckout(member, dues);
    const before = await cardTransfers();
    await fakeCard.decline((await sessionOf(checkout.id)).session_id);
    const settled = await eventually(() => member.get(`/api/ledger/card-checkouts/${checkout.id}`).then((r) => r.body as CardCheckoutDto), (c) => c.status !== 'open');
    expect(settled.status).toBe('declined');
    expect(await cardTransfers()).toEqual(before);
    expect(await duesOwed(member, dues)).toBe(800);
  });

  it('when the server is down as the payment is made, then the retried delivery posts it once the server is back', async () => {
    const dues = await newDues(3_300);
    const member = await signIn(coop.member.email);
    const checkout = await openCheckout(member, dues);
    await fakeCard.switches(card, { retryBaseMs: 300 });
    const port = server.port;
    await server.close();
    try {
      await fakeCard.pay((await sessionOf(checkout.id)).session_id);
      const failed = await eventually(() => fakeCard.deliveries(card), (d) => d.deliveries.some((x) => x.status === 0));
      expect(failed.deliveries.some((x) => x.status === 0)).toBe(true);
      expect((await sessionOf(checkout.id)).status).toBe('open');
    } finally {
      server = await cardTestServer(card, port, { signIn: ROOMY_SIGN_IN });
    }
    const row = await eventually(() => sessionOf(checkout.id), (r) => r.status === 'paid', 20_000);
    expect(row.status).toBe('paid');
    const deliveries = (await fakeCard.deliveries(card)).deliveries.filter((d) => d.eventId === row.transfer_id);
    expect(deliveries.at(-1)!.status).toBe(200);
    expect(deliveries.length).toBeGreaterThan(1);
    await fakeCard.switches(card, { retryBaseMs: 500 });
  });

  it('when card payments are off, then opening a checkout says so', async () => {
    const off = await cardTestServer(card, 0, { card: null, signIn: ROOMY_SIGN_IN });
    try {
      const agent = supertest.agent(off.url).set(CSRF_HEADER, '1');
      await agent.post('/api/session').send({ email: coop.member.email, password: TEST_PASSWORD });
      const res = await agent.post('/api/ledger/card-checkouts').send({ idempotencyKey: randomUUID(), purpose: 'balance' });
      expect(res.status).toBe(503);
      expect(((await agent.get('/api/ledger/summary')).body as LedgerSummaryDto).cardPaymentsEnabled).toBe(false);
    } finally {
      await off.close();
    }
  });
});
