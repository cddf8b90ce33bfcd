import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { addDays } from '@burrowline/shared';
import { startDigestScheduler, type DigestScheduler } from '../../packages/server/src/modules/almanac/digest-scheduler';
import { breedingPair, daysAgo, FARM_TIME_ZONE, farmToday, serviceAs } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { deliveredMailsTo, mailsTo, queuedMailTo, waitForMail } from '../support/mail';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';
import { withTenant } from '../../packages/server/src/db/tenant';
import { notify } from '../../packages/server/src/modules/notifications/notifications.service';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
const running: DigestScheduler[] = [];
/** Every worker takes jobs from the one queue: each test stops its instances, so no other clock works its runs. */
async function stopAll() {
  await Promise.all(running.splice(0).map((s) => s.stop()));
}
afterEach(stopAll);
afterAll(async () => {
  await stopAll();
  await handle.close();
});

/** The instant a farm's wall clock shows `hh:mm` on `date` (so the test can set the clock to a chosen morning). */
function farmInstant(date: string, hh: number, mm: number, timeZone = FARM_TIME_ZONE): Date {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const guess = Date.UTC(y, m - 1, d, hh, mm);
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' })
      .formatToParts(new Date(guess)).map((p) => [p.type, p.value]),
  );
  const wall = Date.UTC(Number(parts.year), Number(parts.month) - 1, Number(parts.day), Number(parts.hour), Number(parts.minute));
  return new Date(guess - (wall - guess));
}

async function scheduler(clock: () => Date, opts: { work?: boolean } = {}): Promise<DigestScheduler> {
  const s = await startDigestScheduler({ connectionString: process.env.DATABASE_URL!, appUrl: 'http://127.0.0.1:3000', clock, schedule: false, work: opts.work ?? true, pollingIntervalSeconds: 0.5 });
  running.push(s);
  return s;
}

async function finished(s: DigestScheduler, jobId: string) {
  await expect.poll(async () => (await s.boss.getJobById('almanac-morning-digest', jobId, { includeArchive: true }))?.state, { timeout: 30_000 }).toBe('completed');
}

/** A farm with a palpation due on `morning`, and one three days late by then. */
async function farmWithTasks(morning: string) {
  const coop = await createTestCoop();
  const a = await breedingPair(coop.member, { doe: 'Primrose' });
  const b = await breedingPair(coop.member, { doe: 'Bluebell' });
  const lateFrom = addDays(morning, -15);
  const dueFrom = addDays(morning, -12);
  await serviceAs(coop.member, { doeId: a.doe.id, buckId: a.buck.id, servicedOn: dueFrom });
  await serviceAs(coop.member, { doeId: b.doe.id, buckId: b.buck.id, servicedOn: lateFrom });
  return { coop, due: a, late: b };
}

// A run reads every farm of the test run: beside other test files it can take a while.
describe('the opt-in morning e-mail (pg-boss job, injectable clock)', { timeout: 90_000 }, () => {
  it('when a member opted in and the clock is set to 7:20 on a chosen morning of the farm, then the e-mail lists the day\'s tasks and what is overdue', async () => {
    const morning = addDays(farmToday(), 1);
    const { coop } = await farmWithTasks(morning);
    const agent = await agentOf(coop.member.email);
    expect((await agent.get('/api/almanac/morning-email')).body).toEqual({ enabled: false, hour: 6, timeZone: 'America/Chicago' });
    expect((await agent.put('/api/almanac/morning-email').send({ enabled: true, hour: 12 })).status).toBe(400);
    expect((await agent.put('/api/almanac/morning-email').send({ enabled: true, hour: 6 })).body).toEqual({ enabled: true, hour: 6, timeZone: 'America/Chicago' });

    const s = await scheduler(() => farmInstant(morning, 7, 20));
    await finished(s, (await s.runNow())!);
    const mail = await waitForMail(coop.member.email, { subject: /^Almanac for / });
    const weekday = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric', timeZone: 'UTC' }).format(new Date(`${morning}T00:00:00Z`));
    expect(mail.subject).toBe(`Almanac for ${weekday}: 1 task today, 1 overdue`);
    expect(mail.text).toContain('Due today:');
    expect(mail.text).toMatch(/• Palpate — Primrose \(T\d+-\w+\)/);
    expect(mail.text).toContain('Overdue:');
    expect(mail.text).toMatch(new RegExp(`• Palpate — Bluebell \\(T\\d+-\\w+\\), due ${addDays(morning, -3)} \\(3 days late\\)`));
    expect(mail.text).toContain('Palpation 3 days late');
    // The alert names the doe it is about.
    expect(mail.text).toMatch(/Bluebell \(T\d+-\w+\): Palpation 3 days late/);
    expect(mail.text).toContain('http://127.0.0.1:3000/almanac');
    expect(mail.html).toContain('Open the Almanac');
    const delivery = await asTenant(coop.id, async (c) => (await c.query('SELECT local_date::text AS local_date, task_count, overdue_count FROM almanac_digest_deliveries WHERE user_id = $1', [coop.member.id])).rows);
    expect(delivery).toEqual([{ local_date: morning, task_count: 1, overdue_count: 1 }]);
    // Nobody else of the co-op asked for it (the job queues its e-mail before it completes).
    expect(await queuedMailTo(coop.admin.email)).toEqual([]);
    expect(await mailsTo(coop.admin.email)).toEqual([]);
  });

  it('when a person chose the morning e-mail for a kind of notification, then it arrives there once and not at once', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    await agent.put('/api/almanac/morning-email').send({ enabled: true, hour: 6 });
    expect((await agent.put('/api/notifications/preferences').send({ preferences: [{ kind: 'stud.answered', delivery: 'digest' }] })).status).toBe(200);
    await withTenant({ coopId: coop.id }, (tx) => notify(tx, {
      coopId: coop.id, userIds: [coop.member.id], kind: 'stud.answered', title: 'Fern Gully accepted your request for Thistle',
      link: '/stud-share/loans/2', mail: { subject: 'Your request is accepted', text: 'Fern Gully accepted.' }, key: `digest-test:${coop.id}`,
    }));
    expect(await queuedMailTo(coop.member.email)).toEqual([]);

    const morning = addDays(farmToday(), 1);
    const s = await scheduler(() => farmInstant(morning, 7, 0));
    await finished(s, (await s.runNow())!);
    const mail = await waitForMail(coop.member.email, { subject: /^Almanac for / });
    expect(mail.text).toContain('From the co-op since yesterday:');
    expect(mail.text).toContain('• Fern Gully accepted your request for Thistle — http://127.0.0.1:3000/stud-share/loans/2');
    // The next morning has nothing new to carry, and an empty Almanac: no e-mail.
    const next = await scheduler(() => farmInstant(addDays(morning, 1), 7, 0));
    await finished(next, (await next.runNow())!);
    expect((await queuedMailTo(coop.member.email)).filter((m) => m.subject.startsWith('Almanac for'))).toHaveLength(1);
  });

  it('when two app instances each run the job twice that morning, then the e-mail goes out once', async () => {
    const morning = addDays(farmToday(), 1);
    const { coop } = await farmWithTasks(morning);
    await (await agentOf(coop.member.email)).put('/api/almanac/morning-email').send({ enabled: true, hour: 5 });
    const clock = () => farmInstant(morning, 6, 5);
    const [one, two] = [await scheduler(clock), await scheduler(clock)];
    const jobs = [await one.runNow(), await two.runNow(), await one.runNow(), await two.runNow()];
    for (const job of jobs) await finished(one, job!);
    await waitForMail(coop.member.email, { subject: /^Almanac for / });
    expect((await queuedMailTo(coop.member.email)).filter((m) => m.subject.startsWith('Almanac for'))).toHaveLength(1);
    expect((await deliveredMailsTo(coop.member.email)).filter((m) => m.subject.startsWith('Almanac for'))).toHaveLength(1);
  });

  it('when the clock is before the chosen hour, then nothing goes; a run queued before a restart is worked by the next instance', async () => {
    const morning = addDays(farmToday(), 1);
    const { coop } = await farmWithTasks(morning);
    await (await agentOf(coop.member.email)).put('/api/almanac/morning-email').send({ enabled: true, hour: 8 });
    const early = await scheduler(() => farmInstant(morning, 7, 50));
    await finished(early, (await early.runNow())!);
    expect(await queuedMailTo(coop.member.email)).toEqual([]);
    expect(await mailsTo(coop.member.email)).toEqual([]);

    // An instance queues the run and goes down before any worker takes it.
    const clock = () => farmInstant(morning, 8, 10);
    const down = await scheduler(clock, { work: false });
    const jobId = (await down.runNow())!;
    await down.stop();
    running.splice(running.indexOf(down), 1);
    const job = await early.boss.getJobById('almanac-morning-digest', jobId);
    expect(job?.state).toBe('created');
    await early.stop();
    running.splice(running.indexOf(early), 1);
    // The next instance starts and works it.
    const next = await scheduler(clock);
    await finished(next, jobId);
    const mail = await waitForMail(coop.member.email, { subject: /^Almanac for / });
    expect(mail.subject).toMatch(/: 1 task today, 1 overdue$/);
  });

  it('when the day holds nothing, then no e-mail is sent, and one who turned it off gets none', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    await agent.put('/api/almanac/morning-email').send({ enabled: true, hour: 6 });
    const other = await agentOf(coop.admin.email);
    await other.put('/api/almanac/morning-email').send({ enabled: false, hour: 6 });
    const { doe, buck } = await breedingPair(coop.admin);
    await serviceAs(coop.admin, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
    const s = await scheduler(() => farmInstant(farmToday(), 9, 0));
    await finished(s, (await s.runNow())!);
    // Same farm: the member would get the admin's palpation; the admin turned it off.
    await waitForMail(coop.member.email, { subject: /^Almanac for / });
    expect(await queuedMailTo(coop.admin.email)).toEqual([]);
    expect(await mailsTo(coop.admin.email)).toEqual([]);

    const quiet = await createTestCoop();
    await (await agentOf(quiet.otherFarmMember.email)).put('/api/almanac/morning-email').send({ enabled: true, hour: 6 });
    await finished(s, (await s.runNow())!);
    expect(await queuedMailTo(quiet.otherFarmMember.email)).toEqual([]);
    expect(await mailsTo(quiet.otherFarmMember.email)).toEqual([]);
    const claimed = await asTenant(quiet.id, async (c) => (await c.query('SELECT task_count FROM almanac_digest_deliveries WHERE user_id = $1', [quiet.otherFarmMember.id])).rows);
    expect(claimed).toEqual([{ task_count: 0 }]);
  });

  it('when the scheduler starts with its quarter-hour schedule as the app role, then the schedule is kept and its cron can hand a due run to the queue', async () => {
    const s = await startDigestScheduler({ connectionString: process.env.DATABASE_URL!, appUrl: 'http://127.0.0.1:3000', schedule: true, work: false });
    running.push(s);
    expect((await s.boss.getSchedules()).map((x) => [x.name, x.cron])).toContainEqual(['almanac-morning-digest', '*/15 * * * *']);
    // The cron's hand-off goes through pg-boss's own queue, which the app role cannot create itself.
    expect(await s.boss.getQueue('__pgboss__send-it')).toMatchObject({ name: '__pgboss__send-it' });
    const handedOff = await s.boss.send('__pgboss__send-it', { name: 'almanac-morning-digest', data: {}, options: {} });
    expect(handedOff).toEqual(expect.any(String));
  });
});
