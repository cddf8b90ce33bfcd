// Co-op Chat benchmark on a real PostgreSQL database (DATABASE_URL of a migrated, throwaway database: e.g.
// `source .data/<name>.env` after `node scripts/test-infra.mjs <name> …`). It adds its own co-op ("Bench chat …")
// and leaves it there: a channel of 100,000 messages beside 20 topics of 5,000 each (200,000 rows in all), with
// reactions, replies and mentions, then prints the database time of opening the channel's latest page (EXPLAIN
// ANALYZE of the very statement the service sends), of a page deep in history, of catching up after a reconnect,
// of the thread list and of a search; and the service's own time for each.
// Run: `npm run bench chat` (BENCH_CHAT_MESSAGES=100000, BENCH_CHAT_TOPIC_MESSAGES=5000). The target: under 50 ms.
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { QueryTypes } from 'sequelize';
import pg from 'pg';
import { CHAT_PAGE_SIZE } from '@burrowline/shared';
import { closeDatabase, connectDatabase } from '../../packages/server/src/composition/database';
import { database } from '../../packages/server/src/db/sequelize';
import { withTenant } from '../../packages/server/src/db/tenant';
import type { SessionUser } from '../../packages/server/src/lib/session-user';
import { listMessages, listThreads, messagePageQuery, searchMessages, startTopic } from '../../packages/server/src/modules/chat/chat.service';
import { createCooperative } from '../../packages/server/src/modules/coops/coops.service';
import { createFarm } from '../../packages/server/src/modules/farms/farms.service';
import { createUser } from '../../packages/server/src/modules/users/users.service';

const MESSAGES = Number(process.env.BENCH_CHAT_MESSAGES ?? 100_000);
const TOPIC_MESSAGES = Number(process.env.BENCH_CHAT_TOPIC_MESSAGES ?? 5_000);
const TOPICS = 20;

const url = process.env.DATABASE_URL;
if (!url) {
  console.log('DATABASE_URL is not set: the chat bench needs a migrated throwaway database (see the comment at the top).');
  process.exit(0);
}
connectDatabase(url, 4);

/** Fresh statistics, as autovacuum would gather them soon after such a load (needs the owner's connection). */
async function analyze() {
  if (!process.env.DATABASE_OWNER_URL) return;
  const owner = new pg.Client({ connectionString: process.env.DATABASE_OWNER_URL });
  await owner.connect();
  await owner.query('ANALYZE chat_messages; ANALYZE chat_threads; ANALYZE chat_reactions; ANALYZE users;');
  await owner.end();
}

/** Every tenth message answers the one before it; every twentieth has three reactions. */
async function enrich(reader: SessionUser, people: SessionUser[], threadId: string) {
  await withTenant(reader, async (tx) => {
    await database().query(
      `UPDATE chat_messages m SET reply_to_id = x.previous
         FROM (SELECT id, seq, lag(id) OVER (ORDER BY seq) AS previous FROM chat_messages WHERE thread_id = $1) x
        WHERE m.id = x.id AND x.seq % 10 = 0 AND x.previous IS NOT NULL`, { bind: [threadId], transaction: tx });
    await database().query(
      `INSERT INTO chat_reactions (message_id, user_id, reaction, coop_id)
       SELECT m.id, u, 'thumbs-up', $2 FROM chat_messages m, unnest($3::uuid[]) u WHERE m.thread_id = $1 AND m.seq % 20 = 0`,
      { bind: [threadId, reader.coopId, people.slice(2, 5).map((p) => p.id)], transaction: tx });
    await database().query(
      `UPDATE chat_threads SET last_seq = (SELECT max(seq) FROM chat_messages WHERE thread_id = $1), last_message_at = now() WHERE id = $1`,
      { bind: [threadId], transaction: tx });
  });
}

// BENCH_CHAT_COOP=<id> measures a co-op an earlier run loaded (loading is the slow part on a busy machine).
const reused = process.env.BENCH_CHAT_COOP;
const { people, channel } = reused ? await existingBench(reused) : await loadBench();

async function existingBench(coopId: string) {
  const people = await withTenant({ coopId }, (tx) => database().query<{ id: string; farm_id: string; email: string; name: string; role: 'admin' | 'member' }>(
    `SELECT id, farm_id, email, name, role FROM users WHERE coop_id = $1 ORDER BY email`, { bind: [coopId], type: QueryTypes.SELECT, transaction: tx }));
  const actors: SessionUser[] = people.map((p) => ({ id: p.id, coopId, farmId: p.farm_id, mentorId: null, email: p.email, name: p.name, role: p.role }));
  const channel = (await listThreads(actors[1]!)).items.find((t) => t.kind === 'channel')!;
  return { people: actors, channel };
}

async function loadBench() {
  const tag = randomUUID().slice(0, 8);
  const { people } = await createCooperative({ name: `Bench chat ${tag}`, slug: `bench-chat-${tag}` }, async (coop, tx) => {
    const people: SessionUser[] = [];
    for (let i = 0; i < 6; i++) {
      const farm = await createFarm(coop.id, { name: `Bench chat farm ${i + 1}`, location: 'Bench County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '' }, tx);
      const user = await createUser({ coopId: coop.id, farmId: farm.id, mentorId: null, email: `bench-chat-${tag}-${i}@example.test`, name: `Bench person ${i + 1}`, role: i === 0 ? 'admin' : 'member', passwordHash: null }, tx);
      people.push({ id: user.id, coopId: coop.id, farmId: farm.id, mentorId: null, email: user.email, name: user.name, role: i === 0 ? 'admin' : 'member' });
    }
    return { people };
  });
  const reader = people[1]!;
  const channel = (await listThreads(reader)).items.find((t) => t.kind === 'channel')!;
  const topics: string[] = [];
  for (let i = 0; i < TOPICS; i++) topics.push((await startTopic(people[i % people.length]!, { title: `Bench topic ${i + 1}` })).id);

  const words = ['hay', 'pellets', 'kits', 'doe', 'buck', 'weaning', 'heat', 'water', 'nest box', 'processing', 'scale', 'fennel', 'fence', 'shade', 'litter'];
  async function fill(threadId: string, count: number) {
    const t0 = performance.now();
    console.log(`  ${count.toLocaleString('en-US')} messages…`);
    await withTenant(reader, (tx) => database().query(
      `INSERT INTO chat_messages (coop_id, thread_id, author_id, author_farm_id, client_id, body, mentions, created_at)
       SELECT $1, $2, (a.ids)[1 + g % 6], (a.farms)[1 + g % 6], gen_random_uuid(),
              'Note ' || g || ': ' || ($5::text[])[1 + g % 15] || ' and ' || ($5::text[])[1 + (g * 7) % 15] || ' today, check the ' || ($5::text[])[1 + (g * 3) % 15],
              CASE WHEN g % 50 = 0 THEN ARRAY[(a.ids)[1 + (g + 1) % 6]] ELSE '{}'::uuid[] END,
              now() - make_interval(secs => $3 - g)
         FROM generate_series(1, $3::int) g, (SELECT $4::uuid[] AS ids, $6::uuid[] AS farms) a`,
      { bind: [reader.coopId, threadId, count, people.map((p) => p.id), words, people.map((p) => p.farmId)], transaction: tx },
    ));
    await analyze();
    await enrich(reader, people, threadId);
    return performance.now() - t0;
  }

  console.log(`loading ${MESSAGES.toLocaleString('en-US')} messages into the channel and ${TOPICS} × ${TOPIC_MESSAGES.toLocaleString('en-US')} into topics…`);
  let loadMs = await fill(channel.id, MESSAGES);
  console.log(`co-op ${reader.coopId}: the channel is loaded (BENCH_CHAT_COOP=${reader.coopId} measures it again without loading)`);
  for (const topic of topics) loadMs += await fill(topic, TOPIC_MESSAGES);
  console.log(`loaded in ${(loadMs / 1000).toFixed(1)} s`);
  return { people, channel };
}
const reader = people[1]!;
await analyze();
if (reused) {
  // A load cut short before its replies and reactions gets them now.
  const [{ n } = { n: '0' }] = await withTenant(reader, (tx) => database().query<{ n: string }>(
    `SELECT count(*) AS n FROM chat_messages WHERE thread_id = $1 AND reply_to_id IS NOT NULL`, { bind: [channel.id], type: QueryTypes.SELECT, transaction: tx }));
  if (Number(n) === 0) {
    await enrich(reader, people, channel.id);
    await analyze();
  }
}
const channelSize = Number((await withTenant(reader, (tx) => database().query<{ n: string }>(
  `SELECT count(*) AS n FROM chat_messages WHERE thread_id = $1`, { bind: [channel.id], type: QueryTypes.SELECT, transaction: tx })))[0]!.n);

async function explain(label: string, sql: string, bind: unknown[]) {
  const runs: number[] = [];
  let plan = '';
  for (let i = 0; i < 5; i++) {
    const rows = await withTenant(reader, (tx) => database().query<{ 'QUERY PLAN': string }>(`EXPLAIN (ANALYZE, BUFFERS) ${sql}`, { bind, type: QueryTypes.SELECT, transaction: tx }));
    plan = rows.map((r) => r['QUERY PLAN']).join('\n');
    runs.push(Number(/Execution Time: ([\d.]+) ms/.exec(plan)?.[1] ?? NaN) + Number(/Planning Time: ([\d.]+) ms/.exec(plan)?.[1] ?? 0));
  }
  runs.sort((a, b) => a - b);
  console.log(`${label.padEnd(64)} database ${runs[0]!.toFixed(2)} ms best, ${runs[2]!.toFixed(2)} ms median (planning + execution)`);
  return plan;
}

async function timed(label: string, work: () => Promise<unknown>) {
  const runs: number[] = [];
  for (let i = 0; i < 5; i++) {
    const t0 = performance.now();
    await work();
    runs.push(performance.now() - t0);
  }
  runs.sort((a, b) => a - b);
  console.log(`${label.padEnd(64)} service ${runs[2]!.toFixed(2)} ms median`);
}

const latest = messagePageQuery(channel.id, { limit: CHAT_PAGE_SIZE });
const latestPlan = await explain(`the channel's latest page (${CHAT_PAGE_SIZE} of ${channelSize.toLocaleString('en-US')})`, latest.sql, latest.bind);
const middleSeq = (await withTenant(reader, (tx) => database().query<{ seq: string }>(
  `SELECT seq FROM chat_messages WHERE thread_id = $1 ORDER BY seq OFFSET $2 LIMIT 1`, { bind: [channel.id, Math.floor(channelSize / 2)], type: QueryTypes.SELECT, transaction: tx })))[0]!.seq;
const deep = messagePageQuery(channel.id, { before: Number(middleSeq), limit: CHAT_PAGE_SIZE });
await explain('a page half-way back in history (keyset, before a seq)', deep.sql, deep.bind);
const lastSeq = (await listThreads(reader)).items.find((t) => t.id === channel.id)!.lastSeq;
const missed = messagePageQuery(channel.id, { after: lastSeq - 3, limit: 200 });
await explain('catching up after a reconnect (3 missed)', missed.sql, missed.bind);

await timed('listMessages: the latest page, read check and presenting', () => listMessages(reader, channel.id, { limit: CHAT_PAGE_SIZE }));
await timed('listThreads: the channel and the topics with unread counts', () => listThreads(reader));
await timed('searchMessages: "fennel shade" over the co-op\'s messages', () => searchMessages(reader, { q: 'fennel shade', limit: 20 }));

console.log('\nplan of the latest page:');
console.log(latestPlan.split('\n').slice(0, 14).join('\n'));
await closeDatabase();
