import { afterAll, describe, expect, it } from 'vitest';
import ical, { type VEvent } from 'node-ical';
import supertest from 'supertest';
import { addDays } from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { revokeFeedsNoLongerAllowed } from '../../packages/server/src/modules/almanac/calendar-feed.service';
import { attachToFarm, findUser } from '../../packages/server/src/modules/users/users.service';
import { breedingPair, daysAgo, serviceAs } from '../support/almanac';
import { asTenant, ownerDb } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

/** node-ical gives an all-day DTSTART as a local-midnight Date flagged dateOnly: back to YYYY-MM-DD. */
function dayOf(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

/** The feed fetched the way a phone calendar does: no session, no cookie, just the secret address. */
async function fetchFeed(url: string) {
  const path = new URL(url).pathname;
  return supertest(handle.app).get(path);
}

describe('the iCalendar feed (RFC 5545)', () => {
  it('when a member makes the feed, then its secret address serves every task as an all-day event whose UID is the task id, parsed by a real iCalendar parser', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Juniper' });
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
    const agent = await agentOf(coop.member.email);
    expect((await agent.get('/api/almanac/calendar-feed')).body).toEqual({ active: false, createdAt: null, url: null });
    const made = await agent.post('/api/almanac/calendar-feed');
    expect(made.status).toBe(201);
    expect(made.body.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/api\/calendar-feeds\/[A-Za-z0-9_-]{43}\.ics$/);
    // Only the hash is stored; the address is never shown again.
    expect((await agent.get('/api/almanac/calendar-feed')).body).toMatchObject({ active: true, url: null });
    const token = /calendar-feeds\/(.+)\.ics$/.exec(made.body.url)![1]!;
    const stored = await ownerDb(async (c) => (await c.query('SELECT token_hash FROM calendar_feed_tokens WHERE farm_id = $1', [coop.farms[0]!.id])).rows);
    expect(stored).toHaveLength(1);
    expect(stored[0].token_hash).not.toContain(token);
    expect(stored[0].token_hash).toMatch(/^[0-9a-f]{64}$/);

    // A task moved in the Almanac is moved in the feed, with a higher SEQUENCE.
    const nestBox = service.tasks.find((t) => t.kind === 'nest_box_in')!;
    await agent.patch(`/api/almanac/tasks/${nestBox.id}`).send({ action: 'move', dueOn: addDays(nestBox.dueOn, 1), version: nestBox.version });
    const palpation = service.tasks.find((t) => t.kind === 'palpation')!;
    await agent.patch(`/api/almanac/tasks/${palpation.id}`).send({ action: 'done', version: palpation.version });

    const res = await fetchFeed(made.body.url);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/calendar; charset=utf-8');
    expect(res.headers['set-cookie']).toBeUndefined();
    const parsed = ical.sync.parseICS(res.text);
    const events = Object.values(parsed).filter((c): c is VEvent => c?.type === 'VEVENT');
    expect(events.map((e) => e.uid).sort()).toEqual(service.tasks.map((t) => t.id).sort());
    const byUid = new Map(events.map((e) => [e.uid, e]));
    for (const task of service.tasks) {
      const event = byUid.get(task.id)!;
      expect(event.start.dateOnly).toBe(true);
      const expected = task.id === nestBox.id ? addDays(nestBox.dueOn, 1) : task.dueOn;
      expect(dayOf(event.start)).toBe(expected);
      expect(dayOf(event.end!)).toBe(addDays(expected, 1));
    }
    expect(Number(byUid.get(nestBox.id)!.sequence)).toBe(nestBox.version + 1);
    expect(byUid.get(palpation.id)!.summary).toBe('✓ Palpate: Juniper (' + doe.tattoo + ')');
    const kindling = byUid.get(service.tasks.find((t) => t.kind === 'kindling_due')!.id)!;
    expect(kindling.summary).toBe(`Kindling due: Juniper (${doe.tattoo})`);
    expect(kindling.description).toContain(`Kindling window ${addDays(daysAgo(12), 29)} to ${addDays(daysAgo(12), 35)}.`);
    const calendar = Object.values(parsed).find((c) => c?.type === 'VCALENDAR') as Record<string, unknown> | undefined;
    expect(calendar?.['WR-CALNAME'] ?? res.text).toMatch(/Almanac · /);
    const used = await ownerDb(async (c) => (await c.query('SELECT last_used_at FROM calendar_feed_tokens WHERE farm_id = $1', [coop.farms[0]!.id])).rows[0].last_used_at);
    expect(used).toBeInstanceOf(Date);
  });

  it('when the address is renewed or the feed turned off, then the old address answers 404 and the new one works', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const first = (await agent.post('/api/almanac/calendar-feed')).body.url as string;
    const second = (await agent.post('/api/almanac/calendar-feed')).body.url as string;
    expect(second).not.toBe(first);
    expect((await fetchFeed(first)).status).toBe(404);
    expect((await fetchFeed(second)).status).toBe(200);
    const audit = await asTenant(coop.id, async (c) => (await c.query(`SELECT action FROM audit_events WHERE coop_id = $1 AND action LIKE 'calendar_feed.%' ORDER BY created_at`, [coop.id])).rows.map((r) => r.action));
    expect(audit).toEqual(['calendar_feed.created', 'calendar_feed.renewed']);
    expect((await agent.delete('/api/almanac/calendar-feed')).status).toBe(204);
    expect((await fetchFeed(second)).status).toBe(404);
    expect((await supertest(handle.app).get('/api/calendar-feeds/not-a-token.ics')).status).toBe(404);
    expect((await agent.get('/api/almanac/calendar-feed')).body.active).toBe(false);
  });

  it('when an apprentice asks for the feed, then only members manage it; each farm\'s feed holds only its own tasks', async () => {
    const coop = await createTestCoop();
    const ours = await breedingPair(coop.member);
    const theirs = await breedingPair(coop.otherFarmMember);
    const ourService = await serviceAs(coop.member, { doeId: ours.doe.id, buckId: ours.buck.id, servicedOn: daysAgo(1) });
    await serviceAs(coop.otherFarmMember, { doeId: theirs.doe.id, buckId: theirs.buck.id, servicedOn: daysAgo(2) });
    const apprentice = await agentOf(coop.apprentice.email);
    expect((await apprentice.post('/api/almanac/calendar-feed')).status).toBe(403);
    expect((await apprentice.get('/api/almanac/calendar-feed')).status).toBe(403);
    const url = (await (await agentOf(coop.member.email)).post('/api/almanac/calendar-feed')).body.url as string;
    const events = Object.values(ical.sync.parseICS((await fetchFeed(url)).text)).filter((c): c is VEvent => c?.type === 'VEVENT');
    expect(events.map((e) => e.uid).sort()).toEqual(ourService.tasks.map((t) => t.id).sort());
  });

  const liveFeedsOf = (userId: string) =>
    ownerDb(async (c) => Number((await c.query('SELECT count(*) FROM calendar_feed_tokens WHERE created_by = $1 AND revoked_at IS NULL', [userId])).rows[0].count));

  it('when the maker of a feed is turned off, then the feed is revoked with the change and answers 404, also after they are turned on again', async () => {
    const coop = await createTestCoop();
    const url = (await (await agentOf(coop.member.email)).post('/api/almanac/calendar-feed')).body.url as string;
    expect((await fetchFeed(url)).status).toBe(200);
    const admin = await agentOf(coop.admin.email);
    expect((await admin.post(`/api/members/${coop.member.id}/disable`).send({ reason: 'Left the co-op', version: 0 })).status).toBe(200);
    // Revoked in the disabling transaction, before anyone fetches the feed.
    expect(await liveFeedsOf(coop.member.id)).toBe(0);
    expect((await fetchFeed(url)).status).toBe(404);
    const audit = await asTenant(coop.id, async (c) => (await c.query(`SELECT action, details FROM audit_events WHERE coop_id = $1 AND action = 'calendar_feed.revoked'`, [coop.id])).rows);
    expect(audit).toEqual([{ action: 'calendar_feed.revoked', details: { reason: 'maker_lost_access', makerUserId: coop.member.id } }]);
    expect((await admin.post(`/api/members/${coop.member.id}/enable`).send({ version: 1 })).status).toBe(200);
    expect((await fetchFeed(url)).status).toBe(404);
  });

  it('when the maker leaves the farm or loses the Almanac with a role change, then the feed is revoked in that transaction; a role that keeps the Almanac keeps the feed', async () => {
    const coop = await createTestCoop();
    const movingUrl = (await (await agentOf(coop.member.email)).post('/api/almanac/calendar-feed')).body.url as string;
    const demotedUrl = (await (await agentOf(coop.otherFarmMember.email)).post('/api/almanac/calendar-feed')).body.url as string;

    // Promoted to admin: still a member of the farm with its Almanac, so the feed keeps working.
    const admin = await agentOf(coop.admin.email);
    expect((await admin.patch(`/api/members/${coop.otherFarmMember.id}/role`).send({ role: 'admin', version: 0 })).status).toBe(200);
    expect((await fetchFeed(demotedUrl)).status).toBe(200);

    // Moving to the other farm: the old farm's feed is revoked by the same transaction that moves them.
    const revokedInTransaction = await withTenant({ coopId: coop.id }, async (tx) => {
      const person = (await findUser(coop.member.id, tx))!;
      await attachToFarm(person, coop.farms[1]!.id, tx);
      return revokeFeedsNoLongerAllowed(person, tx, coop.admin.id);
    });
    expect(revokedInTransaction).toBe(1);
    expect(await liveFeedsOf(coop.member.id)).toBe(0);
    expect((await fetchFeed(movingUrl)).status).toBe(404);

    // A role without the calendar feed, set by a path that forgot to revoke: the feed still stops and is revoked.
    const demoted = await asTenant(coop.id, async (c) => (await c.query(`UPDATE users SET role = 'apprentice', mentor_id = $2 WHERE id = $1`, [coop.otherFarmMember.id, coop.member.id])).rowCount, { commit: true });
    expect(demoted).toBe(1);
    expect((await fetchFeed(demotedUrl)).status).toBe(404);
    expect(await liveFeedsOf(coop.otherFarmMember.id)).toBe(0);
  });
});
