import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../packages/server/src/db/sequelize';

/**
 * The invented co-op's conversation: a lively channel over the last three days (mentions, a reply, reactions),
 * a topic about the heat, and a thread beside one of Hazelrun's litters (that farm's people only). Written once:
 * a co-op whose channel already has messages is left as it is.
 */
export interface DemoChatContext {
  coopId: string;
}

type Line = [author: string, minutesAgo: number, body: string, extra?: { mentions?: string[]; replyTo?: number; reactions?: [string, string[]][] }];

const channel: Line[] = [
  ['admin@demo.test', 2 * 1440 + 300, 'Morning all. Feed order closes Friday noon: pellets at the usual price, timothy hay by the bale. Post your numbers here.'],
  ['priya@demo.test', 2 * 1440 + 280, 'Cobble Creek: 6 bags of pellets, 10 bales. Thanks for organising!', { reactions: [['thumbs-up', ['admin@demo.test']]] }],
  ['dashiell@demo.test', 2 * 1440 + 250, 'Wrenfield: 4 bags, no hay this time (we cut our own).'],
  ['member@demo.test', 2 * 1440 + 200, 'Hazelrun: 8 bags and 12 bales. @Teodor Vance can you pick ours up on Saturday?', { mentions: ['teodor@demo.test'] }],
  ['teodor@demo.test', 2 * 1440 + 190, 'Yes, I will bring the trailer.', { replyTo: 3, reactions: [['heart', ['member@demo.test']]] }],
  ['ines@demo.test', 1440 + 600, 'Saltbush: 3 bags. Also, has anyone got a spare water bottle rack? Ours cracked in the frost.'],
  ['admin@demo.test', 1440 + 560, '@Ines Haverford there is one in the co-op shed, take it.', { mentions: ['ines@demo.test'], replyTo: 5 }],
  ['apprentice@demo.test', 1440 + 300, 'I weighed the Hazelrun grow-out pen today, the notes are in for Marisol to review.', { reactions: [['check', ['member@demo.test']], ['thumbs-up', ['admin@demo.test', 'priya@demo.test']]] }],
  ['priya@demo.test', 1440 + 120, 'Reminder: the pedigree cards from the spring show are in the binder at the shed. See https://example.org/showing-guide for the judging notes.'],
  ['dashiell@demo.test', 300, 'Who is coming to the next processing day? We have 6 fryers ready.'],
  ['member@demo.test', 240, 'We will be there with 10. Bring coolers with ice, it is going to be warm.', { replyTo: 9 }],
  ['admin@demo.test', 180, 'I started a topic for the heat this week, please share what works for you.', { reactions: [['thanks', ['ines@demo.test', 'dashiell@demo.test']]] }],
  ['ines@demo.test', 45, 'Saltbush can lend the big scale if anyone needs it before Saturday.'],
  ['teodor@demo.test', 12, '@Priya Lindqvist could we borrow the scale on Thursday?', { mentions: ['priya@demo.test'] }],
];

const heat: Line[] = [
  ['admin@demo.test', 170, 'Forecast says 34 °C (93 °F) by Wednesday. Rabbits suffer above about 29 °C (85 °F): check heavily pregnant does and young litters first. If one goes limp or breathes with its mouth open, call your vet.'],
  ['priya@demo.test', 150, 'Frozen 2-litre bottles in every cage, swapped morning and afternoon. Damp towels over the wire on the sunny side.'],
  ['dashiell@demo.test', 120, 'Shade cloth on the west side of the barn made a big difference last summer. Fans, but never blowing straight on the kits.'],
  ['member@demo.test', 60, 'We move the does due this week into the cooler row. @Odalys Brenner can we shift Saturday\'s processing to an early start?', { mentions: ['admin@demo.test'] }],
  ['admin@demo.test', 30, 'Yes: 6 am start, done before the heat. Keep carcasses chilled as your local rules require.', { replyTo: 3 }],
];

const litter: Line[] = [
  ['member@demo.test', 1440 + 90, 'Nest box checked: all kits warm and fed. One runt, keeping an eye on it.'],
  ['apprentice@demo.test', 1440 + 30, 'Added fresh hay to the nest box and topped up the water.'],
  ['teodor@demo.test', 200, 'Kits have their eyes open. Weighing on Friday.', { reactions: [['heart', ['member@demo.test', 'apprentice@demo.test']]] }],
];

export async function loadDemoChat(ctx: DemoChatContext, tx: Transaction): Promise<void> {
  const query = <T extends object>(sql: string, bind: unknown[]) => database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
  await query(`INSERT INTO chat_threads (coop_id, kind, title) VALUES ($1, 'channel', 'Co-op channel') ON CONFLICT DO NOTHING`, [ctx.coopId]);
  const [channelRow] = await query<{ id: string; n: string }>(
    `SELECT t.id, (SELECT count(*) FROM chat_messages m WHERE m.thread_id = t.id) AS n FROM chat_threads t WHERE t.coop_id = $1 AND t.kind = 'channel'`, [ctx.coopId],
  );
  if (!channelRow || Number(channelRow.n) > 0) return;
  const people = new Map((await query<{ id: string; email: string; name: string; farm_id: string | null }>(`SELECT id, email, name, farm_id FROM users WHERE coop_id = $1`, [ctx.coopId])).map((u) => [u.email, u]));
  const admin = people.get('admin@demo.test');
  const member = people.get('member@demo.test');
  if (!admin || !member) return;

  const [topic] = await query<{ id: string }>(`INSERT INTO chat_threads (coop_id, kind, title, created_by) VALUES ($1, 'topic', 'Heat this week', $2) RETURNING id`, [ctx.coopId, admin.id]);
  const [nursing] = await query<{ id: string; kindled_on: string; dam: string }>(
    `SELECT l.id, l.kindled_on::text, coalesce(nullif(a.name, ''), 'the doe') AS dam FROM litters l LEFT JOIN animals a ON a.id = l.dam_id
      WHERE l.coop_id = $1 AND l.farm_id = $2 ORDER BY l.kindled_on DESC LIMIT 1`, [ctx.coopId, member.farm_id],
  );
  const threads: [string, Line[]][] = [[channelRow.id, channel], [topic!.id, heat]];
  if (nursing) {
    const [thread] = await query<{ id: string }>(
      `INSERT INTO chat_threads (coop_id, kind, subject_type, subject_id, title) VALUES ($1, 'subject', 'litter', $2, $3) RETURNING id`,
      [ctx.coopId, nursing.id, `Litter of ${nursing.dam}, kindled ${nursing.kindled_on}`],
    );
    threads.push([thread!.id, litter]);
  }
  for (const [threadId, lines] of threads) {
    const ids: string[] = [];
    for (const [email, minutesAgo, body, extra = {}] of lines) {
      const author = people.get(email)!;
      const [row] = await query<{ id: string; seq: string }>(
        `INSERT INTO chat_messages (coop_id, thread_id, author_id, author_farm_id, client_id, body, reply_to_id, mentions, created_at)
         VALUES ($1, $2, $3, $4, gen_random_uuid(), $5, $6, $7::uuid[], now() - make_interval(mins => $8)) RETURNING id, seq`,
        [ctx.coopId, threadId, author.id, author.farm_id, body, extra.replyTo === undefined ? null : ids[extra.replyTo], (extra.mentions ?? []).map((m) => people.get(m)!.id), minutesAgo],
      );
      ids.push(row!.id);
      for (const [reaction, who] of extra.reactions ?? []) {
        for (const by of who) await query(`INSERT INTO chat_reactions (message_id, user_id, reaction, coop_id) VALUES ($1, $2, $3, $4)`, [row!.id, people.get(by)!.id, reaction, ctx.coopId]);
      }
    }
    await query(
      `UPDATE chat_threads SET last_seq = (SELECT max(seq) FROM chat_messages WHERE thread_id = $1),
              last_message_at = (SELECT max(created_at) FROM chat_messages WHERE thread_id = $1) WHERE id = $1`, [threadId],
    );
  }
  // Everyone has read the channel up to yesterday, so today's messages show as unread.
  await query(
    `INSERT INTO chat_read_positions (thread_id, user_id, coop_id, read_seq)
     SELECT $1, u.id, $2, coalesce((SELECT max(seq) FROM chat_messages WHERE thread_id = $1 AND created_at < now() - interval '20 hours'), 0)
       FROM users u WHERE u.coop_id = $2`, [channelRow.id, ctx.coopId],
  );
}
