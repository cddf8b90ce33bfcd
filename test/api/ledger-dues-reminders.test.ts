import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sendDuesReminders } from '../../packages/server/src/modules/ledger/dues.service';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { deliveredMailsTo, queuedMailTo } from '../support/mail';
import { sharedSignedInAgent, testApp } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;

beforeAll(async () => {
  coop = await createTestCoop();
  const admin = await sharedSignedInAgent(coop.admin.email, TEST_PASSWORD, handle);
  expect((await admin.put('/api/ledger/dues/2031').send({ amountCents: 5_000, dueOn: '2031-03-31', reminderDaysBefore: 10 })).status).toBe(200);
  // Farm B pays its dues in cash and the admin confirms it: farm B owes nothing more.
  const other = await sharedSignedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle);
  const paid = await other.post('/api/ledger/payments').send({ id: 'dues-cash-2031-b', toFarmId: null, amountCents: 5_000, method: 'cash', paidOn: '2026-01-05', duesYear: 2031 });
  expect(paid.status).toBe(201);
  expect((await admin.post('/api/ledger/transfers/dues-cash-2031-b/confirmation')).body.status).toBe('posted');
});

afterAll(async () => {
  await handle.close();
});

describe('dues reminders', () => {
  it('when the reminder runs before its day, then nobody is e-mailed', async () => {
    expect(await sendDuesReminders({ coopId: coop.id, year: 2031, appUrl: handle.config.appUrl }, new Date('2031-03-20T08:00:00Z'))).toBe(0);
    expect(await queuedMailTo(coop.member.email)).toEqual([]);
  });

  it('when it runs on its day, then each member of a farm that still owes gets one e-mail, once however often it runs', async () => {
    const day = new Date('2031-03-21T09:00:00Z');
    const queued = await sendDuesReminders({ coopId: coop.id, year: 2031, appUrl: handle.config.appUrl }, day);
    // Farm A's admin and member; farm B paid; the apprentice never hears about money.
    expect(queued).toBe(2);
    expect(await sendDuesReminders({ coopId: coop.id, year: 2031, appUrl: handle.config.appUrl }, day)).toBe(0);
    const [mail] = await deliveredMailsTo(coop.member.email);
    expect(mail!.subject).toMatch(/2031 dues of \$50\.00 are due on 2031-03-31/);
    expect(mail!.text).toContain(`${handle.config.appUrl}/ledger`);
    expect(await queuedMailTo(coop.otherFarmMember.email)).toEqual([]);
    expect(await queuedMailTo(coop.apprentice.email)).toEqual([]);
    expect((await deliveredMailsTo(coop.admin.email)).length).toBe(1);
  });
});
