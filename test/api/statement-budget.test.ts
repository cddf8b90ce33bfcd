import { afterAll, describe, expect, it } from 'vitest';
import { studFinderQuerySchema } from '@burrowline/shared';
import { findStuds } from '../../packages/server/src/modules/stud-share/stud-finder.service';
import { copyLitter, copyRow, rowCount } from '../support/bulk-rows';
import { asTenant } from '../support/db';
import { createTestApplication, createTestCoop, TEST_PASSWORD, type TestCoop, type TestPerson } from '../support/factories';
import { daysAgo, farmToday, litterAs } from '../support/almanac';
import { feedAs, groupAs, purchaseAs } from '../support/grow-out';
import { growingGroupAs } from '../support/health-yield';
import { actorOf, addAnimalAs } from '../support/herd';
import { bookingBody, dayAs, siteAs } from '../support/processing-days';
import { countingAgentFor, type StatementCount } from '../support/statement-counter';
import { testApp } from '../support/test-app';
import { doeOf, offeredBuck, requestAs } from '../support/stud-share';
import { listedDoe, offerAs } from '../support/swap-board';
import { fillThread } from '../support/chat';
import { listThreads, openSubjectThread } from '../../packages/server/src/modules/chat/chat.service';
import { choreEntrySchema } from '@burrowline/shared';
import { logChore } from '../../packages/server/src/modules/mentorship/mentorship.service';

/** A chore entry of farm A's apprentice, waiting for her mentor (farm A's member). */
async function choreArranged(coop: TestCoop) {
  const entry = await logChore(actorOf(coop.apprentice), choreEntrySchema.parse({ kind: 'feeding', minutes: 15, notes: 'Hay and pellets' }));
  return grower(coop.id, 'chore_entries', entry.id, {}, `review_state = 'pending'`);
}

/** The co-op's channel and a litter's thread of farm A, so every read of subjects runs at 10 rows as at 1,000. */
async function chatArranged(coop: TestCoop) {
  const member = actorOf(coop.member);
  const channel = (await listThreads(member)).items.find((t) => t.kind === 'channel')!.id;
  const { litter } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 5 });
  const litterThread = (await openSubjectThread(member, 'litter', litter.id)).id;
  return { channel, litterThread };
}

afterAll(() => testApp().close());

/** Round trips every request may spend on its session, person, transaction and tenant. */
const FIXED_BUDGET = 2;
/** Statements of the endpoint's own work. */
const OWN_BUDGET = 5;

interface Arranged {
  /** The endpoint, and who asks. */
  url: string;
  asker: TestPerson;
  /** Adds rows until there are `total` of what the endpoint lists; answers how many there are. */
  growTo(total: number): Promise<number>;
}

/**
 * One endpoint and how to give it 10, then 1,000 rows of what it shows. A paged list is asked for pages
 * of 10, so both are a full page: a short page tells its own total, a full one counts the rest.
 */
interface Endpoint {
  name: string;
  arrange(coop: TestCoop): Promise<Arranged>;
  /** Where the endpoint still reads more than OWN_BUDGET: its count today, so it cannot grow unseen, and why. */
  over?: { ownBudget: number; why: string };
}

/** Grows the copies of one template row to `total` rows of the table matching `where`. */
function grower(coopId: string, table: string, templateId: string, fresh: Record<string, string> = {}, where = 'true', values: unknown[] = []) {
  return async (total: number) => {
    await copyRow(coopId, table, templateId, total - (await rowCount(coopId, table, where, values)), fresh);
    return rowCount(coopId, table, where, values);
  };
}

const endpoints: Endpoint[] = [
  {
    name: 'the herd list',
    async arrange(coop) {
      const doe = await addAnimalAs(coop.member, { sex: 'doe' });
      const farm = coop.member.farmId;
      return {
        url: '/api/animals?pageSize=10',
        asker: coop.member,
        growTo: grower(coop.id, 'animals', doe.id, { tattoo: `t.tattoo || '-' || left(md5(random()::text), 8)` }, 'keeping_farm_id = $2', [farm]),
      };
    },
  },
  {
    name: 'the doe board',
    async arrange(coop) {
      const { service } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 6 });
      const farm = coop.member.farmId;
      return {
        url: '/api/almanac/doe-board?pageSize=10',
        asker: coop.member,
        growTo: grower(coop.id, 'animals', service.doe.id, { tattoo: `t.tattoo || '-' || left(md5(random()::text), 8)` }, `keeping_farm_id = $2 AND sex = 'doe'`, [farm]),
      };
    },
  },
  {
    name: "a doe's breeding record",
    async arrange(coop) {
      const { doe, litter } = await litterAs(coop.member, { servicedDaysAgo: 60, kindledDaysAgo: 29, bornAlive: 7 });
      return { url: `/api/almanac/does/${doe.id}/breeding-record`, asker: coop.member, growTo: litterGrower(coop.id, litter.id) };
    },
  },
  {
    name: "an animal's detail",
    async arrange(coop) {
      const doe = await addAnimalAs(coop.member, { sex: 'doe' });
      const weighInId = await firstWeighIn(coop.member, doe.id);
      return {
        url: `/api/animals/${doe.id}`,
        asker: coop.member,
        growTo: grower(coop.id, 'weigh_ins', weighInId, {}, 'animal_id = $2', [doe.id]),
      };
    },
  },
  {
    name: "an animal's weigh-ins",
    async arrange(coop) {
      const doe = await addAnimalAs(coop.member, { sex: 'doe' });
      const weighInId = await firstWeighIn(coop.member, doe.id);
      return {
        url: `/api/animals/${doe.id}/weigh-ins?pageSize=10`,
        asker: coop.member,
        growTo: grower(coop.id, 'weigh_ins', weighInId, {}, 'animal_id = $2', [doe.id]),
      };
    },
  },
  {
    name: 'the litters',
    async arrange(coop) {
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: 60, kindledDaysAgo: 29, bornAlive: 7 });
      return { url: '/api/litters?pageSize=10', asker: coop.member, growTo: litterGrower(coop.id, litter.id) };
    },
  },
  {
    name: 'the services',
    async arrange(coop) {
      const { service } = await litterAs(coop.member, { servicedDaysAgo: 60, kindledDaysAgo: 29, bornAlive: 7 });
      return { url: '/api/services?pageSize=10', asker: coop.member, growTo: grower(coop.id, 'services', service.id) };
    },
  },
  {
    name: "the Almanac's week",
    async arrange(coop) {
      const taskId = await openTaskOf(coop);
      return { url: '/api/almanac/summary', asker: coop.member, growTo: taskGrower(coop.id, taskId) };
    },
  },
  {
    name: 'the Almanac tasks',
    async arrange(coop) {
      const taskId = await openTaskOf(coop);
      return { url: '/api/almanac/tasks?days=62', asker: coop.member, growTo: taskGrower(coop.id, taskId) };
    },
  },
  {
    name: 'the feed book',
    async arrange(coop) {
      await purchaseAs(coop.member, { boughtOn: daysAgo(30), productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000 });
      const purchaseId = await onlyRowOf(coop.id, 'feed_purchases');
      return { url: '/api/feed', asker: coop.member, growTo: grower(coop.id, 'feed_purchases', purchaseId) };
    },
  },
  {
    name: "the feed book's feed given",
    async arrange(coop) {
      const doe = await addAnimalAs(coop.member, { sex: 'doe' });
      await purchaseAs(coop.member, { boughtOn: daysAgo(30), productName: 'Grower', bagGrams: 25_000, bags: 100, priceCents: 100_000 });
      await feedAs(coop.member, { givenOn: daysAgo(2), grams: 500, productName: 'Grower', target: 'doe', doeId: doe.id });
      const useId = await onlyRowOf(coop.id, 'feed_uses');
      return { url: '/api/feed?pageSize=10', asker: coop.member, growTo: grower(coop.id, 'feed_uses', useId) };
    },
  },
  {
    name: 'the grow-out groups',
    over: { ownBudget: 8, why: 'the groups, their litters, the litters’ events, animals, weigh-ins, processing, the settings (breeds and farms come in one)' },
    async arrange(coop) {
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: 80, kindledDaysAgo: 49, bornAlive: 7 });
      const group = await groupAs(coop.member, { name: 'Fryers', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 7 }] });
      return { url: '/api/grow-out/groups', asker: coop.member, growTo: grower(coop.id, 'grow_out_groups', group.id) };
    },
  },
  {
    name: 'the performance tables',
    async arrange(coop) {
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: 60, kindledDaysAgo: 29, bornAlive: 7 });
      return { url: '/api/performance', asker: coop.member, growTo: litterGrower(coop.id, litter.id) };
    },
  },
  {
    name: 'the applications',
    async arrange(coop) {
      await createTestApplication(coop);
      const applicationId = await onlyRowOf(coop.id, 'applications');
      return {
        url: '/api/applications',
        asker: coop.admin,
        growTo: grower(coop.id, 'applications', applicationId, {
          idempotency_key: 'gen_random_uuid()',
          email: `'copy-' || left(md5(random()::text), 8) || '-' || t.email`,
        }),
      };
    },
  },
  {
    name: 'the members',
    over: { ownBudget: 6, why: 'the page of ids with its total, then the people, their invitations, last sign-ins, who invited them and their farms' },
    async arrange(coop) {
      return {
        url: '/api/members?pageSize=10',
        asker: coop.admin,
        growTo: grower(coop.id, 'users', coop.otherFarmMember.id, { email: `'copy-' || left(md5(random()::text), 8) || '-' || t.email` }),
      };
    },
  },
  {
    name: 'the processing days list',
    async arrange(coop) {
      const site = await siteAs(coop.admin, coop);
      const day = await dayAs(coop.admin, site.id);
      return { url: '/api/processing-days?pageSize=10', asker: coop.member, growTo: grower(coop.id, 'processing_days', day.id) };
    },
  },
  {
    name: "a processing day's bookings",
    async arrange(coop) {
      const { dayId, bookingId } = await dayWithBooking(coop);
      return {
        url: `/api/processing-days/${dayId}/bookings`, asker: coop.member,
        growTo: grower(coop.id, 'processing_bookings', bookingId, { idempotency_key: 'gen_random_uuid()', queue_number: 't.queue_number + g' }),
      };
    },
  },
  {
    name: "a processing day's page",
    async arrange(coop) {
      const { dayId, bookingId } = await dayWithBooking(coop);
      return {
        url: `/api/processing-days/${dayId}`, asker: coop.member,
        growTo: grower(coop.id, 'processing_bookings', bookingId, { idempotency_key: 'gen_random_uuid()', queue_number: 't.queue_number + g' }),
      };
    },
  },
  {
    name: 'the buck cards',
    async arrange(coop) {
      const { card } = await offeredBuck(coop);
      return { url: '/api/stud-share/offers?pageSize=10', asker: coop.otherFarmMember, growTo: offerGrower(coop.id, card.offerId) };
    },
  },
  {
    name: 'the Stud Share finder',
    async arrange(coop) {
      const { card } = await offeredBuck(coop);
      const doe = await doeOf(coop.otherFarmMember);
      // The co-op's pedigree is read into memory once per process; count the requests after that.
      await findStuds(actorOf(coop.otherFarmMember), studFinderQuerySchema.parse({ damId: doe.id }));
      return { url: `/api/stud-share/finder?damId=${doe.id}&pageSize=10`, asker: coop.otherFarmMember, growTo: offerGrower(coop.id, card.offerId) };
    },
  },
  {
    name: 'the stud requests',
    async arrange(coop) {
      const { card } = await offeredBuck(coop);
      const loan = await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id]);
      return {
        url: '/api/stud-share/loans?side=requests&pageSize=10',
        asker: coop.otherFarmMember,
        growTo: grower(coop.id, 'stud_loans', loan.id),
      };
    },
  },
  {
    name: 'the Swap Board',
    async arrange(coop) {
      const { listing } = await listedDoe(coop.member);
      return { url: '/api/swap-board/listings?pageSize=10', asker: coop.otherFarmMember, growTo: grower(coop.id, 'swap_listings', listing.id) };
    },
  },
  {
    name: 'a Swap Board listing with its offers',
    over: { ownBudget: 6, why: 'the listing, its offers and their thread, the farms, breeds and animals (listed and in trade) they present, the kept pedigree\'s version, the seller\'s latest weights' },
    async arrange(coop) {
      const { listing } = await listedDoe(coop.member);
      const offer = await offerAs(coop.otherFarmMember, listing.id);
      return { url: `/api/swap-board/listings/${listing.id}`, asker: coop.member, growTo: grower(coop.id, 'swap_offers', offer.id) };
    },
  },
  {
    name: 'the offers on my listings',
    async arrange(coop) {
      const { listing } = await listedDoe(coop.member);
      const offer = await offerAs(coop.otherFarmMember, listing.id);
      return { url: '/api/swap-board/offers?side=received&pageSize=10', asker: coop.member, growTo: grower(coop.id, 'swap_offers', offer.id) };
    },
  },
  {
    name: "the mentor's review queue",
    async arrange(coop) {
      return { url: '/api/mentorship/review', asker: coop.member, growTo: await choreArranged(coop) };
    },
  },
  {
    name: "the apprentice's own log",
    async arrange(coop) {
      return { url: '/api/mentorship/chores', asker: coop.apprentice, growTo: await choreArranged(coop) };
    },
  },
  {
    name: "the co-op's apprentices (the admin's list)",
    async arrange(coop) {
      const growChores = await choreArranged(coop);
      await growChores(5);
      return {
        url: '/api/mentorship/apprentices',
        asker: coop.admin,
        growTo: grower(coop.id, 'users', coop.apprentice.id, { email: `'copy-' || gen_random_uuid() || '@example.test'` }, `role = 'apprentice'`),
      };
    },
  },
  {
    name: "an apprentice's page (skills, hours, entries)",
    async arrange(coop) {
      return { url: `/api/mentorship/apprentices/${coop.apprentice.id}`, asker: coop.member, growTo: await choreArranged(coop) };
    },
    over: { ownBudget: 8, why: 'the apprentice, the checklist, what waits, her figures, her skill marks, her hours by kind and week, her latest entries and their photos: one statement each' },
  },
  {
    name: 'the weighing round of every growing animal',
    over: { ownBudget: 9, why: 'the growing animals with their last weights, then the growing groups as the grow-out list reads them (groups, litters, events, animals, weigh-ins, processing)' },
    async arrange(coop) {
      await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 4 });
      const junior = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(70), lifecycle: 'junior' });
      const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
      const weighed = await counting.agent.post('/api/weigh-ins').send({ animalId: junior.id, totalGrams: 1800, weighedOn: daysAgo(10) });
      if (weighed.status !== 201) throw new Error(`weigh-in refused: ${weighed.status} ${JSON.stringify(weighed.body)}`);
      const farm = coop.member.farmId;
      return {
        url: '/api/weighing-rounds/candidates?set=growing',
        asker: coop.member,
        growTo: grower(coop.id, 'animals', junior.id, { tattoo: `t.tattoo || '-' || left(md5(random()::text), 8)` }, `keeping_farm_id = $2 AND lifecycle = 'junior'`, [farm]),
      };
    },
  },
  {
    name: "the person's chat threads",
    async arrange(coop) {
      const { channel } = await chatArranged(coop);
      await fillThread(coop.id, channel, coop.otherFarmMember.id, 3);
      return {
        url: '/api/chat/threads',
        asker: coop.member,
        growTo: async (total) => {
          const have = await rowCount(coop.id, 'chat_threads', `kind = 'topic'`);
          await asTenant(coop.id, (c) => c.query(
            `INSERT INTO chat_threads (coop_id, kind, title, last_message_at) SELECT $1, 'topic', 'Topic ' || g, now() FROM generate_series(1, $2::int) g`,
            [coop.id, total - have],
          ), { commit: true });
          return rowCount(coop.id, 'chat_threads', `kind = 'topic'`);
        },
      };
    },
  },
  {
    name: "a chat thread's latest messages",
    async arrange(coop) {
      const { channel } = await chatArranged(coop);
      return {
        url: `/api/chat/threads/${channel}/messages?limit=10`,
        asker: coop.member,
        growTo: async (total) => {
          await fillThread(coop.id, channel, coop.otherFarmMember.id, total - (await rowCount(coop.id, 'chat_messages', 'thread_id = $2', [channel])));
          return rowCount(coop.id, 'chat_messages', 'thread_id = $2', [channel]);
        },
      };
    },
  },
  {
    name: 'a chat thread',
    async arrange(coop) {
      const { litterThread } = await chatArranged(coop);
      return {
        url: `/api/chat/threads/${litterThread}`,
        asker: coop.member,
        growTo: async (total) => {
          await fillThread(coop.id, litterThread, coop.otherFarmMember.id, total - (await rowCount(coop.id, 'chat_messages', 'thread_id = $2', [litterThread])));
          return rowCount(coop.id, 'chat_messages', 'thread_id = $2', [litterThread]);
        },
      };
    },
  },
  {
    name: 'a chat search',
    async arrange(coop) {
      const { channel } = await chatArranged(coop);
      return {
        url: '/api/chat/search?q=hay&limit=10',
        asker: coop.member,
        growTo: async (total) => {
          await fillThread(coop.id, channel, coop.otherFarmMember.id, total - (await rowCount(coop.id, 'chat_messages', 'thread_id = $2', [channel])), 'Who has hay');
          return rowCount(coop.id, 'chat_messages', 'thread_id = $2', [channel]);
        },
      };
    },
  },
  {
    name: 'the nursing litters',
    async arrange(coop) {
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 7 });
      return { url: '/api/litters?status=nursing&pageSize=10', asker: coop.member, growTo: litterGrower(coop.id, litter.id) };
    },
  },
  {
    name: "the Almanac agenda's open tasks of the week",
    async arrange(coop) {
      const taskId = await openTaskOf(coop);
      return { url: '/api/almanac/tasks?days=7&include=open', asker: coop.member, growTo: taskGrower(coop.id, taskId) };
    },
  },
  {
    name: "the feed book's feed given to a grow-out group",
    async arrange(coop) {
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: 80, kindledDaysAgo: 49, bornAlive: 7 });
      const group = await groupAs(coop.member, { name: 'Fryers', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 7 }] });
      await purchaseAs(coop.member, { boughtOn: daysAgo(30), productName: 'Grower', bagGrams: 25_000, bags: 100, priceCents: 100_000 });
      await feedAs(coop.member, { givenOn: farmToday(), grams: 500, productName: 'Grower', target: 'group', groupId: group.id });
      const useId = await onlyRowOf(coop.id, 'feed_uses');
      return { url: '/api/feed?pageSize=10', asker: coop.member, growTo: grower(coop.id, 'feed_uses', useId) };
    },
  },
];

/** A day with one booking of farm A's member (its copies make the many bookings). */
async function dayWithBooking(coop: TestCoop): Promise<{ dayId: string; bookingId: string }> {
  const site = await siteAs(coop.admin, coop);
  const day = await dayAs(coop.admin, site.id);
  const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 4 });
  const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
  const res = await counting.agent.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 2 }]));
  if (res.status !== 201) throw new Error(`booking refused: ${res.status} ${JSON.stringify(res.body)}`);
  return { dayId: day.id, bookingId: res.body.id as string };
}

/** Offers of copies of the template's buck (one offer per buck). */
function offerGrower(coopId: string, offerId: string) {
  return async (total: number) => {
    const count = async () => asTenant(coopId, async (c) => (await c.query('SELECT count(*)::int AS n FROM stud_offers')).rows[0].n as number);
    const missing = total - (await count());
    if (missing > 0) {
      await asTenant(coopId, (c) => c.query(
        `WITH template AS (SELECT * FROM stud_offers WHERE id = $1),
         bucks AS (
           INSERT INTO animals
             SELECT (jsonb_populate_record(NULL::animals, to_jsonb(a) || jsonb_build_object('id', gen_random_uuid(), 'tattoo', a.tattoo || '-' || left(md5(random()::text), 8)))).*
               FROM animals a, generate_series(1, $2::int) WHERE a.id = (SELECT buck_id FROM template)
           RETURNING id)
         INSERT INTO stud_offers
           SELECT (jsonb_populate_record(NULL::stud_offers, to_jsonb(t) || jsonb_build_object('id', gen_random_uuid(), 'buck_id', b.id))).* FROM template t, bucks b`,
        [offerId, missing],
      ), { commit: true });
    }
    return count();
  };
}

async function firstWeighIn(person: TestPerson, animalId: string): Promise<string> {
  const counting = await countingAgentFor(person.email, TEST_PASSWORD);
  const res = await counting.agent.post('/api/weigh-ins').send({ animalId, totalGrams: 4650, weighedOn: '2024-06-01' });
  if (res.status !== 201) throw new Error(`weigh-in refused: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}

async function onlyRowOf(coopId: string, table: string): Promise<string> {
  const { rows } = await asTenant(coopId, (c) => c.query<{ id: string }>(`SELECT id FROM ${table} WHERE coop_id = $1`, [coopId]));
  if (rows.length !== 1) throw new Error(`expected one row in ${table}, found ${rows.length}`);
  return rows[0]!.id;
}

function litterGrower(coopId: string, litterId: string) {
  return async (total: number) => {
    await copyLitter(coopId, litterId, total - (await rowCount(coopId, 'litters')));
    return rowCount(coopId, 'litters');
  };
}

/** An open task of the member's farm (one a kindling planned), moved to be due today. */
async function openTaskOf(coop: TestCoop): Promise<string> {
  await litterAs(coop.member, { servicedDaysAgo: 30, kindledDaysAgo: 1, bornAlive: 7 });
  const { rows } = await asTenant(
    coop.id,
    (c) =>
      c.query<{ id: string }>(
        `UPDATE almanac_tasks SET due_on = $3, window_start = NULL, window_end = NULL
          WHERE id = (SELECT id FROM almanac_tasks WHERE coop_id = $1 AND farm_id = $2 AND state = 'open' ORDER BY due_on LIMIT 1)
          RETURNING id`,
        [coop.id, coop.member.farmId, farmToday()],
      ),
    { commit: true },
  );
  if (!rows[0]) throw new Error('the kindling planned no task');
  return rows[0].id;
}

/** Copies of the task on other anchor days (a source plans one task per key and anchor), all due today. */
function taskGrower(coopId: string, taskId: string) {
  return grower(coopId, 'almanac_tasks', taskId, { anchor_date: `(t.anchor_date - g - (SELECT count(*) FROM almanac_tasks)::int)` }, `state = 'open' AND due_on = $2`, [farmToday()]);
}

const summary = (count: StatementCount) => count.statements.map((sql, i) => `${i + 1}. ${sql.replace(/\s+/g, ' ').slice(0, 160)}`).join('\n');

describe('statements per request', () => {
  for (const endpoint of endpoints) {
    it(`when ${endpoint.name} shows 10 and then 1,000 rows, then it sends the same statements, at most ${FIXED_BUDGET} of fixed cost and ${endpoint.over?.ownBudget ?? OWN_BUDGET} of its own`, async () => {
      const coop = await createTestCoop();
      const arranged = await endpoint.arrange(coop);
      const counting = await countingAgentFor(arranged.asker.email, TEST_PASSWORD);

      // Each count after one request of the same page: the co-op's breeds and farms are then kept in memory,
      // as they are for every request but the first after a change to them.
      expect(await arranged.growTo(10)).toBe(10);
      await counting.agent.get(arranged.url).expect(200);
      const few = await counting.count((agent) => agent.get(arranged.url));
      expect(few.res.status, JSON.stringify(few.res.body)).toBe(200);

      expect(await arranged.growTo(1000)).toBe(1000);
      await counting.agent.get(arranged.url).expect(200);
      const many = await counting.count((agent) => agent.get(arranged.url));
      expect(many.res.status, JSON.stringify(many.res.body)).toBe(200);

      expect(many.statements.length, `10 rows:\n${summary(few)}\n1,000 rows:\n${summary(many)}`).toBe(few.statements.length);
      expect(many.fixed.length, summary(many)).toBeLessThanOrEqual(FIXED_BUDGET);
      expect(many.own.length, summary(many)).toBeLessThanOrEqual(endpoint.over?.ownBudget ?? OWN_BUDGET);
    });
  }
});
