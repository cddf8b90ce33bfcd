import fs from 'node:fs';
import path from 'node:path';
import { io as connect, type Socket } from 'socket.io-client';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent, type PhotoDto } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD, type TestCoop, type TestPerson } from '../support/factories';
import { binaryParser, testImage } from '../support/herd-files';
import { fakeS3, instancePorts, scratchDatabase, startInstance, type Instance } from '../support/instances';
import { mailsTo } from '../support/mail';
import { waitUntil } from '../support/own-server';
import { doeOf, inDays, offeredBuck } from '../support/stud-share';
import { sessionCookieOf } from '../support/test-app';

// Its own file and process: the factories here write to the instances' scratch database, not the run's.
const ports = instancePorts();
let database: Awaited<ReturnType<typeof scratchDatabase>>;
let s3: Awaited<ReturnType<typeof fakeS3>>;
let a: Instance;
let b: Instance;
let coop: TestCoop;
let otherCoop: TestCoop;
const sockets: Socket[] = [];

beforeAll(async () => {
  database = await scratchDatabase();
  process.env.DATABASE_URL = database.appUrl;
  process.env.DATABASE_OWNER_URL = database.ownerUrl;
  s3 = await fakeS3(ports.s3);
  const env = {
    DATABASE_URL: database.appUrl,
    DATABASE_OWNER_URL: database.ownerUrl,
    REALTIME_ACROSS_INSTANCES: 'true',
    ...s3.env,
    // Both instances work the job queues (e-mail, password resets, the morning e-mail); no other process does here.
    MAIL_WORKER: 'true',
    MAIL_POLL_SECONDS: '0.5',
    MORNING_EMAIL_JOBS: 'true',
    SIGNIN_MAX_PER_IP: '100000',
    PASSWORD_RESET_MAX_PER_IP: '100000',
  };
  [a, b] = await Promise.all([startInstance(ports.a, env), startInstance(ports.b, env)]);
  [coop, otherCoop] = await Promise.all([createTestCoop(), createTestCoop()]);
}, 180_000);

afterAll(async () => {
  for (const socket of sockets) socket.close();
  await Promise.all([a?.kill(), b?.kill()]);
  await s3?.stop();
  await database?.drop();
}, 60_000);

async function signIn(instance: Instance, person: TestPerson): Promise<string> {
  const res = await supertest(instance.url).post('/api/session').set(CSRF_HEADER, '1').send({ email: person.email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  return sessionCookieOf(res);
}

const as = (instance: Instance, cookie: string) => ({
  get: (url: string) => supertest(instance.url).get(url).set('Cookie', cookie),
  post: (url: string) => supertest(instance.url).post(url).set('Cookie', cookie).set(CSRF_HEADER, '1'),
  delete: (url: string) => supertest(instance.url).delete(url).set('Cookie', cookie).set(CSRF_HEADER, '1'),
});

async function socketOn(instance: Instance, cookie: string): Promise<Socket> {
  const socket = connect(instance.url, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false, forceNew: true });
  sockets.push(socket);
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
  return socket;
}

function nextEvent<T>(socket: Socket, event: string, matches: (payload: T) => boolean): Promise<T> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${event} never arrived`)), 15_000);
    const listener = (payload: T) => {
      if (!matches(payload)) return;
      clearTimeout(timer);
      socket.off(event, listener);
      resolve(payload);
    };
    socket.on(event, listener);
  });
}

describe('two app instances on one database', { timeout: 120_000 }, () => {
  it('when a person signs in through A, then the session is valid on B, and signing out on B ends it on A too, its live connection to A included', async () => {
    const cookie = await signIn(a, coop.member);
    const onB = await as(b, cookie).get('/api/me');
    expect(onB.status).toBe(200);
    expect(onB.body.user).toMatchObject({ id: coop.member.id });
    const socketOnA = await socketOn(a, cookie);
    const ended = nextEvent<{ reason: string }>(socketOnA, RealtimeEvent.sessionEnded, () => true);
    const dropped = new Promise<string>((resolve) => socketOnA.once('disconnect', (reason) => resolve(reason)));
    expect((await as(b, cookie).delete('/api/session')).status).toBeLessThan(300);
    expect((await as(a, cookie).get('/api/me')).status).toBe(401);
    expect(await ended).toHaveProperty('reason');
    expect(await dropped).toBe('io server disconnect');
  });

  it('when a member connected to B is asked for a buck through A, then the request reaches B live, and a person of another co-op on B hears nothing', async () => {
    const { card } = await offeredBuck(coop);
    const doe = await doeOf(coop.otherFarmMember);
    const ownerOnB = await socketOn(b, await signIn(b, coop.member));
    const borrowerOnA = await socketOn(a, await signIn(a, coop.otherFarmMember));
    const outsiderOnB = await socketOn(b, await signIn(b, otherCoop.member));
    const outsiderHeard: string[] = [];
    outsiderOnB.onAny((event: string) => outsiderHeard.push(event));

    type LoanEvent = { loanId: string; state: string };
    const heardOnB = nextEvent<LoanEvent>(ownerOnB, RealtimeEvent.studLoanChanged, () => true);
    const heardOnA = nextEvent<LoanEvent>(borrowerOnA, RealtimeEvent.studLoanChanged, () => true);
    const requested = await as(a, await signIn(a, coop.otherFarmMember)).post('/api/stud-share/loans').send({
      offerId: card.offerId, kind: 'loan', doeIds: [doe.id], farmId: coop.otherFarmMember.farmId, startOn: inDays(3), endOn: inDays(10),
    });
    expect(requested.status).toBe(201);
    expect(await heardOnB).toMatchObject({ loanId: requested.body.id, state: 'requested' });
    expect(await heardOnA).toMatchObject({ loanId: requested.body.id, state: 'requested' });

    // The outsider's own bell event, published by A after the loan's events, reaches B through the same channel
    // behind them: had the loan's events been sent to the outsider, they would have arrived first.
    const outsiderNotified = nextEvent(outsiderOnB, RealtimeEvent.notificationsChanged, () => true);
    expect((await as(a, await signIn(a, otherCoop.member)).post('/api/notifications/read').send({})).status).toBe(200);
    await outsiderNotified;
    expect(outsiderHeard).not.toContain(RealtimeEvent.studLoanChanged);
  });

  it("when an admin adds a breed through A, then B, which keeps the co-op's breeds in memory, lists it on the next request", async () => {
    const onB = as(b, await signIn(b, coop.member));
    const before = await onB.get('/api/breeds');
    expect(before.status).toBe(200);
    expect(before.body.breeds.map((x: { name: string }) => x.name)).not.toContain('Ridgeway Cross');
    const added = await as(a, await signIn(a, coop.admin)).post('/api/breeds').send({ name: 'Ridgeway Cross', sizeClass: 'medium', source: "The co-op's own records (common practice)" });
    expect(added.status).toBe(201);
    const after = await onB.get('/api/breeds');
    expect(after.body.breeds.map((x: { name: string }) => x.name)).toContain('Ridgeway Cross');
  });

  it('when a photo is uploaded through A, then B serves the same bytes from the object store, only to those who may see it', async () => {
    const memberCookie = await signIn(a, coop.member);
    const animal = await as(a, memberCookie).post('/api/animals').send({ tattoo: `IN-${Date.now() % 100000}`, sex: 'doe', birthDate: '2023-01-10', confirm: true });
    expect(animal.status).toBe(201);
    const image = await testImage('png', { width: 320, height: 240 });
    const uploaded = await as(a, memberCookie).post(`/api/animals/${animal.body.id}/photos`).attach('photos', image, { filename: 'doe.png', contentType: 'image/png' });
    expect(uploaded.status).toBe(201);
    const photo = (uploaded.body.photos as PhotoDto[])[0]!;

    // Stored in the object store's folder, under the co-op's prefix, not on instance A's disk.
    const stored = await waitForStoredFiles(path.join(s3.dir, 'burrowline', coop.id));
    const original = `${coop.id}/${photo.id}.png`;
    expect(stored.sort()).toEqual([original, `${coop.id}/${photo.id}-thumb.jpg`].sort());

    const ownerOnB = await as(b, memberCookie).get(photo.url).buffer(true).parse(binaryParser);
    expect(ownerOnB.status).toBe(200);
    expect(ownerOnB.headers['content-type']).toBe('image/png');
    const fromStore = fs.readFileSync(path.join(s3.dir, 'burrowline', `${original}${OBJECT_SUFFIX}`));
    expect(Buffer.compare(ownerOnB.body as Buffer, fromStore)).toBe(0);
    expect((await as(b, await signIn(b, otherCoop.member)).get(photo.url)).status).toBe(404);
    expect((await supertest(b.url).get(photo.url)).status).toBe(401);
  });

  it('when password resets are asked through A and B, then both instances work the queues and each e-mail goes exactly once; the morning e-mail has one schedule', async () => {
    const people = [coop.admin, coop.apprentice, otherCoop.admin, otherCoop.otherFarmMember, otherCoop.apprentice];
    for (const [i, person] of people.entries()) {
      const via = i % 2 === 0 ? a : b;
      expect((await supertest(via.url).post('/api/password-resets').set(CSRF_HEADER, '1').send({ email: person.email })).status).toBe(202);
    }
    const emails = people.map((p) => p.email.toLowerCase());
    type Row = { recipient: string; attempts: number; sent_at: Date | null };
    const sentRows = async () => database.query<Row>(`SELECT lower(recipient) AS recipient, attempts, sent_at FROM email_outbox WHERE lower(recipient) = ANY($1) AND idempotency_key LIKE 'password-reset:%'`, [emails]);
    await waitUntil(async () => {
      const rows = await sentRows();
      return rows.length === people.length && rows.every((r) => r.sent_at);
    }, 'the reset e-mails were not all sent', 60_000, 200).catch(async (error: Error) => {
      const jobs = await database.query(`SELECT name, state, retry_count, output FROM pgboss.job WHERE name <> '__pgboss__send-it'`);
      throw new Error(`${error.message}: outbox ${JSON.stringify(await sentRows())}, jobs ${JSON.stringify(jobs)}`);
    });
    const rows = await sentRows();
    expect(rows.map((r) => [r.recipient, r.attempts]).sort()).toEqual(emails.map((e) => [e, 1]).sort());
    for (const email of emails) expect((await mailsTo(email)).filter((m) => m.subject === 'Reset your Burrowline password')).toHaveLength(1);
    // Each job was taken by one worker once (pg-boss's SKIP LOCKED), whichever instance it was.
    const jobs = await database.query<{ name: string; state: string; retry_count: number }>(
      `SELECT name, state, retry_count FROM pgboss.job WHERE name IN ('mail-outbox', 'password-reset-requests')`,
    );
    expect(jobs.length).toBeGreaterThanOrEqual(people.length * 2);
    expect(jobs.filter((j) => j.state !== 'completed' || j.retry_count !== 0)).toEqual([]);
    const schedules = await database.query<{ name: string }>(`SELECT name FROM pgboss.schedule WHERE name = 'almanac-morning-digest'`);
    expect(schedules).toHaveLength(1);
  });

  it('when instance A is killed mid-request, then every write it acknowledged is kept and B keeps serving, live events included', async () => {
    const cookie = await signIn(a, coop.member);
    const listener = await socketOn(b, await signIn(b, coop.member));
    const acknowledged: string[] = [];
    let refused = 0;
    let killed: Promise<void> | null = null;
    const addThrough = (instance: Instance, n: number) =>
      as(instance, cookie).post('/api/animals').send({ tattoo: `K${n}-${Date.now() % 100000}`, sex: 'doe', birthDate: '2023-01-10', confirm: true });

    // Eight requests in flight at all times; A dies the moment it has answered ten.
    let sent = 0;
    const lane = async () => {
      while (!killed) {
        const n = (sent += 1);
        try {
          const res = await addThrough(a, n);
          if (res.status === 201) acknowledged.push(res.body.id as string);
          if (acknowledged.length >= 10 && !killed) killed = a.kill('SIGKILL');
        } catch {
          refused += 1;
        }
      }
    };
    await Promise.all(Array.from({ length: 8 }, lane));
    await killed;
    expect(acknowledged.length).toBeGreaterThanOrEqual(10);
    // The lanes that were waiting on A when it died got no answer: nothing was acknowledged for them.
    expect(refused).toBeGreaterThan(0);

    const kept = await database.query<{ id: string }>('SELECT id FROM animals WHERE id = ANY($1::uuid[])', [acknowledged]);
    expect(kept.map((r) => r.id).sort()).toEqual([...acknowledged].sort());

    // B still answers, and still carries live events to its sockets.
    const heard = nextEvent<unknown>(listener, RealtimeEvent.herdChanged, () => true);
    const afterwards = await addThrough(b, 0);
    expect(afterwards.status).toBe(201);
    await heard;
    expect(listener.connected).toBe(true);
  });
});

/** How the S3 fake names an object's bytes on its disk (`<key>._S3rver_object`). */
const OBJECT_SUFFIX = '._S3rver_object';

/** The object keys stored under `dir` of the fake's bucket folder. */
async function waitForStoredFiles(dir: string): Promise<string[]> {
  let files: string[] = [];
  await waitUntil(async () => {
    files = fs.readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith(OBJECT_SUFFIX));
    return files.length > 0;
  }, `no stored file under ${dir}`, 10_000);
  return files.map((f) => path.relative(path.join(s3.dir, 'burrowline'), path.join(dir, f.slice(0, -OBJECT_SUFFIX.length))));
}

