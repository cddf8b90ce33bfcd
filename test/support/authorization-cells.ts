import { loadConfig } from '../../packages/server/src/config/env';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { authorizationMatrix, areaOf, type Body, type MatrixArea, type MatrixRow, type Persona, type Target } from '../api/authorization-matrix';
import { almanacBody, almanacStateOf, almanacTarget } from './almanac-matrix';
import { breedingPair, daysAgo, serviceAs } from './almanac';
import { asTenant } from './db';
import {
  applicationBody,
  createAwaitingMember,
  createTestApplication,
  createTestCoop,
  createTestInvitee,
  createTestMember,
  TEST_PASSWORD,
  type TestCoop,
  type TestPerson,
} from './factories';
import { herdFilesSend, herdFilesStateOf, herdFilesTarget } from './herd-files-matrix';
import { purchaseAs } from './grow-out';
import { temperatureAs } from './health-yield';
import { herdBody, herdStateOf, herdTarget } from './herd-matrix';
import { ledgerBody, ledgerStateOf, ledgerTarget } from './ledger-matrix';
import { mentorshipBody, mentorshipStateOf, mentorshipTarget } from './mentorship-matrix';
import { notificationBody, notificationStateOf, notificationTarget } from './notifications-matrix';
import { chatBody, chatStateOf, chatTarget } from './chat-matrix';
import { processingDayBody, processingDaysStateOf, processingDayTarget } from './processing-days-matrix';
import { loanTarget, tracesHiddenFrom } from './lent-animal';
import { studBody, studStateOf, studTarget } from './stud-share-matrix';
import { swapBody, swapStateOf, swapTarget } from './swap-board-matrix';
import { agentFor, ROOMY_SIGN_IN, sharedSignedInAgent, signedInAgent, testApp, type Agent } from './test-app';

/**
 * Runs every cell of one area of the authorization matrix (test/api/authorization-matrix.ts) against two
 * fresh co-ops of the calling test file.
 */
/** The row's path with its ids; a placeholder without an id fails the cell (a typo must not become a 404 that "passes"). */
export function pathWithIds(path: string, ids: Record<string, unknown>): string {
  return path.replace(/:([A-Za-z]+)/g, (placeholder: string, name: string) => {
    const id = ids[name];
    if (typeof id !== 'string' || id === '') throw new Error(`${path}: the target makes no id for ${placeholder}`);
    return id;
  });
}

/** Rows only the farm that recorded them may read (a farm's own profile photo is the co-op's to see). */
const FARM_PRIVATE_ROWS = [
  'weigh_ins', 'animal_notes', 'feed_purchases', 'feed_uses', 'temperature_readings', 'treatments', 'processing_records',
  'processing_marks', 'herd_imports', 'calendar_feed_tokens', 'services', 'almanac_tasks', 'grow_out_groups',
].map((table) => `SELECT id::text FROM ${table} WHERE coop_id = $1 AND farm_id <> ALL($2::uuid[])`)
  .concat(`SELECT id::text FROM photos WHERE coop_id = $1 AND subject <> 'farm' AND farm_id <> ALL($2::uuid[])`)
  .join(' UNION ALL ');

/** A farm's private records in every table above, so a list that leaks them has something to leak. */
async function recordPrivateRows(person: TestPerson) {
  const { doe, buck } = await breedingPair(person);
  await serviceAs(person, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(3) });
  await purchaseAs(person, { boughtOn: daysAgo(2), productName: `Private feed ${randomUUID().slice(0, 6)}`, bagGrams: 20_000, bags: 1, priceCents: 1500 });
  await temperatureAs(person, { value: 21, unit: 'C', place: 'Private barn' });
}

async function farmProfileBody(coop: TestCoop, farmId: string) {
  const row = await asTenant(coop.id, (c) => c.query('SELECT * FROM farms WHERE id = $1', [farmId]));
  const f = row.rows[0];
  return {
    name: f.name, location: `Checked ${Date.now()}`, timeZone: f.time_zone, weightUnit: f.weight_unit,
    temperatureUnit: f.temperature_unit, breedsKept: f.breeds_kept, description: f.description, version: f.version,
  };
}

/** A fresh object for membership targets, so one persona's allowed change never alters the next cell. */
async function membershipTarget(coop: TestCoop, target: Target): Promise<{ applicationId?: string; userId?: string }> {
  switch (target) {
    case 'application':
      return { applicationId: (await createTestApplication(coop)).id };
    case 'freshMember':
      return { userId: (await createTestMember(coop)).id };
    case 'disabledMember': {
      const person = await createTestMember(coop);
      await asTenant(coop.id, (c) => c.query(`UPDATE users SET disabled_at = now(), disabled_reason = 'Matrix' WHERE id = $1`, [person.id]), { commit: true });
      return { userId: person.id };
    }
    case 'awaitingMember':
      return { userId: (await createAwaitingMember(coop)).id };
    case 'invitee':
      return { userId: (await createTestInvitee(coop)).id };
    case 'coopAdmin':
      return { userId: coop.admin.id };
    default:
      return {};
  }
}

/**
 * The ids a row's target names, made afresh in `coop` (`foreign` is another co-op, for rows that need one).
 * The matrix and the fuzzing of every route share it.
 */
export async function matrixTargetIds(coop: TestCoop, foreign: TestCoop, target: Target) {
  return { ...(await membershipTarget(coop, target)), ...(await herdTarget(coop, target)), ...(await almanacTarget(coop, target)), ...(await herdFilesTarget(coop, target)), ...(await loanTarget(coop, target)), ...(await ledgerTarget(coop, target, foreign)), ...(await notificationTarget(coop, target)), ...(await studTarget(coop, target)), ...(await mentorshipTarget(coop, target)), ...(await chatTarget(coop, target)), ...(await processingDayTarget(coop, target)), ...(await swapTarget(coop, target)) };
}
export type MatrixTargetIds = Awaited<ReturnType<typeof matrixTargetIds>> & { farmId: string };

async function membershipBody(coop: TestCoop, foreign: TestCoop, body: Body | undefined, ids: { farmId: string; userId?: string }, persona: Persona): Promise<object | undefined> {
  const userVersion = async () =>
    ids.userId ? (await asTenant(coop.id, (c) => c.query('SELECT version FROM users WHERE id = $1', [ids.userId]))).rows[0].version : 0;
  switch (body) {
    case 'farmProfile':
      return farmProfileBody(coop, ids.farmId);
    case 'application':
      return applicationBody();
    case 'approval':
      return {};
    case 'rejection':
      return { reason: 'Checked by the authorization matrix.' };
    case 'withdrawal':
      return { note: 'Checked by the authorization matrix.' };
    case 'roleChange':
      return { role: 'admin', version: await userVersion() };
    case 'disable':
      return { reason: 'Checked by the authorization matrix.', version: await userVersion() };
    case 'enable':
      return { version: await userVersion() };
    case 'invitation': {
      const tag = randomUUID().slice(0, 8);
      return { name: `Matrix ${tag}`, email: `matrix-${tag}@example.test`, role: 'member', farm: { kind: 'existing', farmId: persona === 'otherCoop' ? foreign.farms[0]!.id : coop.farms[1]!.id } };
    }
    case 'rules': {
      const ownCoop = persona === 'otherCoop' ? foreign.id : coop.id;
      const version = (await asTenant(ownCoop, (c) => c.query('SELECT version FROM cooperatives WHERE id = $1', [ownCoop]))).rows[0].version;
      return { rulesText: `Rules checked by the authorization matrix at ${Date.now()}.`, version };
    }
    default:
      return undefined;
  }
}

/** The valid body a row sends as `persona` (undefined when the row sends none); shared with the fuzzing of every route. */
export async function matrixBody(
  coop: TestCoop, foreign: TestCoop, body: Body | undefined, ids: MatrixTargetIds, persona: Persona,
  /** Who the persona is, when the caller knows people the test co-op does not name (a farm-mate). */
  person?: TestPerson | null,
): Promise<object | undefined> {
  const personaOf = person !== undefined ? person : persona === 'otherCoop' ? foreign.admin : persona === 'anonymous' ? null : coop[persona as keyof TestCoop] as TestPerson | undefined;
  return (await membershipBody(coop, foreign, body, ids, persona)) ?? (await herdBody(coop, body, ids))
    ?? (await almanacBody(coop, body, ids, personaOf?.coopId ?? coop.id, personaOf?.farmId ?? null)) ?? ledgerBody(coop, body, ids) ?? notificationBody(body) ?? studBody(coop, body, ids)
    ?? (await mentorshipBody(body, ids, personaOf?.coopId ?? coop.id)) ?? chatBody(body, ids)
    ?? processingDayBody(coop, body, ids) ?? swapBody(body, ids);
}

export function describeMatrixArea(area: MatrixArea) {
  // Some cells send applications and stage spreadsheets on one farm: rate limits and the farm's pile of
  // waiting files stay out of the way here (they have their own tests).
  const handle = testApp({
    signIn: ROOMY_SIGN_IN,
    membership: { linkTtlHours: 72, applyWindowSeconds: 60, applyMaxPerIp: 100_000, applyMaxPerEmail: 100_000 },
    uploads: { ...loadConfig().uploads, importsWaitingPerFarm: 10_000 },
  });
  let coop: TestCoop;
  let foreign: TestCoop;
  /** A second member of farm A: not the apprentice's mentor (farm A's first member is). */
  let farmMate: TestPerson;
  const personOf = (persona: Exclude<Persona, 'anonymous' | 'otherCoop'>): TestPerson => (persona === 'farmMateNotMentor' ? farmMate : coop[persona]);

  beforeAll(async () => {
    [coop, foreign] = await Promise.all([createTestCoop(), createTestCoop()]);
    farmMate = await createTestMember(coop, { farmIndex: 0 });
    await recordPrivateRows(coop.member);
    await recordPrivateRows(coop.otherFarmMember);
  });

  /** Ids of the test co-op's farm-private rows that `persona` may not read: the other farm's, or all for another co-op. */
  async function othersPrivateIds(persona: Persona): Promise<string[]> {
    const ownFarms = persona === 'otherCoop' || persona === 'anonymous' ? [] : [personOf(persona).farmId].filter((id): id is string => Boolean(id));
    const rows = await asTenant(coop.id, (c) => c.query<{ id: string }>(FARM_PRIVATE_ROWS, [coop.id, ownFarms]));
    return rows.rows.map((r) => r.id);
  }
  afterAll(async () => {
    await handle.close();
  });

  /** Each persona signs in once per file; a cell that ends its session signs in afresh so the others keep theirs. */
  async function agentOf(persona: Persona, row: MatrixRow): Promise<Agent> {
    if (persona === 'anonymous') return agentFor(handle);
    const person = persona === 'otherCoop' ? foreign.admin : personOf(persona);
    const endsSession = row.method === 'DELETE' && row.path === '/api/session';
    if (endsSession) return signedInAgent(person.email, TEST_PASSWORD, handle);
    return sharedSignedInAgent(person.email, TEST_PASSWORD, handle);
  }

  const freshTarget = (target: Target) => matrixTargetIds(coop, foreign, target);
  type TargetIds = Awaited<ReturnType<typeof freshTarget>>;
  const readTargets = new Map<Target, Promise<TargetIds>>();

  /**
   * The row's target: built afresh for a call that may change it, so one persona's allowed change never
   * alters the next cell; built once per kind for reads, which every persona of every read row may share.
   */
  function targetOf(row: MatrixRow): Promise<TargetIds> {
    if (row.method !== 'GET') return freshTarget(row.target);
    let ids = readTargets.get(row.target);
    if (!ids) {
      ids = freshTarget(row.target);
      readTargets.set(row.target, ids);
      ids.catch(() => readTargets.delete(row.target));
    }
    return ids;
  }

  /** What a refused call must leave exactly as it was. */
  async function stateOf(ids: { farmId: string; applicationId?: string; userId?: string }, persona: Persona) {
    const ownCoop = persona === 'otherCoop' ? foreign.id : coop.id;
    return {
      farmVersion: ids.farmId ? (await farmProfileBody(coop, ids.farmId)).version : null,
      application: ids.applicationId
        ? (await asTenant(coop.id, (c) => c.query('SELECT status, version FROM applications WHERE id = $1', [ids.applicationId]))).rows[0]
        : null,
      user: ids.userId
        ? (await asTenant(coop.id, (c) => c.query('SELECT role, disabled_at, version FROM users WHERE id = $1', [ids.userId]))).rows[0]
        : null,
      coopVersion: (await asTenant(ownCoop, (c) => c.query('SELECT version FROM cooperatives WHERE id = $1', [ownCoop]))).rows[0].version,
    };
  }

  describe('authorization matrix', () => {
    for (const row of authorizationMatrix.filter((r) => areaOf(r) === area)) {
      for (const [persona, status] of Object.entries(row.expect) as [Persona, number][]) {
        it(`when ${persona} calls ${row.method} ${row.path} on ${row.target}, then it answers ${status}`, async () => {
          const agent = await agentOf(persona, row);
          const farmId = row.target === 'farmA' ? coop.farms[0]!.id : row.target === 'farmB' ? coop.farms[1]!.id : '';
          const ids = { farmId, ...(await targetOf(row)) };
          const path = pathWithIds(row.path, { ...ids, coopSlug: coop.slug });
          const body = await matrixBody(coop, foreign, row.body, ids, persona, persona === 'otherCoop' ? foreign.admin : persona === 'anonymous' ? null : personOf(persona));
          const before = await stateOf(ids, persona);
          const herdBefore = await herdStateOf(coop.id, ids);
          const almanacBefore = await almanacStateOf(coop.id);
          const filesBefore = await herdFilesStateOf(coop.id, ids);
          const ledgerBefore = await ledgerStateOf(coop.id);
          const notificationsBefore = await notificationStateOf(coop.id);
          const daysBefore = await processingDaysStateOf(coop.id);
          const studBefore = await studStateOf(coop.id);
          const mentorshipBefore = await mentorshipStateOf(coop.id);
          const chatBefore = await chatStateOf(coop.id);
          const swapBefore = await swapStateOf(coop.id);
          const method = row.method.toLowerCase() as 'get' | 'patch' | 'delete' | 'post' | 'put';
          const res = await herdFilesSend(agent[method](path), row.body, body);
          expect(res.status).toBe(status);
          if (status < 300 && ids.loan) {
            // A lent animal's answers carry no trace of the other farm's private records.
            const answer = res.text ?? JSON.stringify(res.body);
            for (const trace of tracesHiddenFrom(ids.loan, persona)) expect(answer, `${persona} sees ${trace}`).not.toContain(trace);
          }
          // The calendar feed's secret address is its own key: whoever holds it reads that farm's Almanac, session or not.
          const readsBySession = !row.path.startsWith('/api/calendar-feeds/');
          if (row.method === 'GET' && status < 300 && readsBySession && typeof res.text === 'string') {
            // A list (or any read) shows nothing another farm recorded privately, nor anything of another co-op.
            const leaked = (await othersPrivateIds(persona)).filter((id) => res.text.includes(id));
            expect(leaked, `${persona} reads other farms' private ids`).toEqual([]);
          }
          if (status >= 400) {
            expect(res.body.error.code).toBeTypeOf('string');
            expect(await stateOf(ids, persona)).toEqual(before); // a refusal changes nothing
            expect(await herdStateOf(coop.id, ids)).toEqual(herdBefore);
            expect(await almanacStateOf(coop.id)).toEqual(almanacBefore);
            expect(await herdFilesStateOf(coop.id, ids)).toEqual(filesBefore);
            expect(await ledgerStateOf(coop.id)).toEqual(ledgerBefore);
            expect(await notificationStateOf(coop.id)).toEqual(notificationsBefore);
            expect(await processingDaysStateOf(coop.id)).toEqual(daysBefore);
            expect(await studStateOf(coop.id)).toEqual(studBefore);
            expect(await mentorshipStateOf(coop.id)).toEqual(mentorshipBefore);
            expect(await chatStateOf(coop.id)).toEqual(chatBefore);
            expect(await swapStateOf(coop.id)).toEqual(swapBefore);
          }
        });
      }
    }
  });
}
