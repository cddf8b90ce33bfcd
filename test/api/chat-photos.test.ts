import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import type { ChatMessageDto, ChatMessagePageDto, ChatThreadDto, ChatThreadListDto, PhotoDto } from '@burrowline/shared';
import { loadConfig } from '../../packages/server/src/config/env';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { binaryParser, testImage } from '../support/herd-files';
import { doeOf, offeredBuck, requestAs, thirdFarmMember } from '../support/stud-share';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const uploadsDir = fs.mkdtempSync(path.join(os.tmpdir(), 'burrowline-chat-photos-'));
const handle = testApp({ uploads: { ...loadConfig().uploads, dir: uploadsDir, photoMaxBytes: 300_000 } });
afterAll(async () => {
  await handle.close();
  fs.rmSync(uploadsDir, { recursive: true, force: true });
});

const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
const storedFiles = (coopId: string): string[] => (fs.existsSync(path.join(uploadsDir, coopId)) ? fs.readdirSync(path.join(uploadsDir, coopId)).sort() : []);
const chatPhotoRows = async (coopId: string) =>
  (await asTenant(coopId, (c) => c.query(`SELECT id, chat_thread_id, chat_message_id, uploaded_by, deleted_at FROM photos WHERE subject = 'chat' ORDER BY created_at, id`))).rows;

const share = (agent: Agent, threadId: string, files: { body: Buffer; name: string; type: string }[]) => {
  let req = agent.post(`/api/chat/threads/${threadId}/attachments`);
  for (const file of files) req = req.attach('photos', file.body, { filename: file.name, contentType: file.type });
  return req;
};
const image = (agent: Agent, url: string) => agent.get(url).buffer(true).parse(binaryParser);

async function loanThread(coop: TestCoop) {
  const { card } = await offeredBuck(coop);
  const loan = await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id]);
  const owner = await agentOf(coop.member.email);
  const opened = await owner.post(`/api/chat/subjects/loan/${loan.id}/open`);
  expect(opened.status).toBe(200);
  return { owner, thread: opened.body as ChatThreadDto };
}

describe('Co-op Chat photos', () => {
  it('when a member shares a photo in a loan\'s thread, then it is re-encoded without metadata with a thumbnail, and only who reads the thread sees it', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const { owner, thread } = await loanThread(coop);

    const jpeg = await testImage('jpeg', { width: 1600, height: 1200, artist: 'Dana at 44.97N 93.26W' });
    const uploaded = await share(owner, thread.id, [{ body: jpeg, name: '../../buck.jpg', type: 'image/jpeg' }]);
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    const [photo] = uploaded.body.photos as PhotoDto[];
    expect(photo).toMatchObject({ subject: 'chat', contentType: 'image/jpeg', width: 1600, height: 1200 });
    // Server-made names only; the stored file carries no EXIF (the uploader's position stays home).
    expect(storedFiles(coop.id)).toEqual([`${photo!.id}-thumb.jpg`, `${photo!.id}.jpg`].sort());
    expect((await sharp(path.join(uploadsDir, coop.id, `${photo!.id}.jpg`)).metadata()).exif).toBeUndefined();

    // Before it is sent, the photo is its uploader's alone, even for the thread's other farm.
    const borrower = await agentOf(coop.otherFarmMember.email);
    expect((await image(owner, photo!.thumbnailUrl)).status).toBe(200);
    expect((await image(borrower, photo!.url)).status).toBe(404);

    const sent = await owner.post(`/api/chat/threads/${thread.id}/messages`).send({ clientId: randomUUID(), body: '', attachmentIds: [photo!.id] });
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    const message = sent.body as ChatMessageDto;
    expect(message.attachments).toEqual([{ id: photo!.id, url: `/api/photos/${photo!.id}`, thumbnailUrl: `/api/photos/${photo!.id}/thumbnail`, width: 1600, height: 1200 }]);
    expect((await chatPhotoRows(coop.id))[0]).toMatchObject({ chat_thread_id: thread.id, chat_message_id: message.id, uploaded_by: coop.member.id });

    // The borrower reads the loan's thread: the page lists the photo, the image and the thumbnail are served.
    const page = (await borrower.get(`/api/chat/threads/${thread.id}/messages`)).body as ChatMessagePageDto;
    expect(page.items.map((m) => m.attachments.map((a) => a.id))).toEqual([[photo!.id]]);
    const full = await image(borrower, photo!.url);
    expect(full.status).toBe(200);
    expect(full.headers['content-type']).toBe('image/jpeg');
    expect(full.headers['content-disposition']).toBe(`inline; filename="chat-photo-${photo!.id.slice(0, 8)}.jpg"`);
    expect((full.body as Buffer).equals(fs.readFileSync(path.join(uploadsDir, coop.id, `${photo!.id}.jpg`)))).toBe(true);
    const thumb = await image(borrower, photo!.thumbnailUrl);
    expect(thumb.status).toBe(200);
    expect([(await sharp(thumb.body as Buffer).metadata()).width, thumb.headers['content-type']]).toEqual([480, 'image/jpeg']);
    expect((await (await agentOf(coop.apprentice.email)).get(photo!.thumbnailUrl)).status).toBe(200);
    // The thread list tells of a photo where a message has no text.
    const list = (await borrower.get('/api/chat/threads')).body as ChatThreadListDto;
    expect(list.items.find((t) => t.id === thread.id)?.lastMessage?.excerpt).toBe('Sent a photo');

    // A farm outside the loan, and another co-op, get nothing: not the image, not the thumbnail.
    const third = await agentOf((await thirdFarmMember(coop)).email);
    const foreign = await agentOf(other.admin.email);
    for (const stranger of [third, foreign]) {
      expect((await image(stranger, photo!.url)).status).toBe(404);
      expect((await image(stranger, photo!.thumbnailUrl)).status).toBe(404);
      expect((await share(stranger, thread.id, [{ body: jpeg, name: 'x.jpg', type: 'image/jpeg' }])).status).toBe(404);
    }
    // Nobody edits or removes a chat photo by itself, not even its uploader.
    expect((await owner.delete(`/api/photos/${photo!.id}`)).status).toBe(403);

    // Removing the message takes its photo: the row is kept as removed, the files go, the image is no more.
    const removed = await owner.delete(`/api/chat/messages/${message.id}`);
    expect(removed.body).toMatchObject({ state: 'deleted', attachments: [] });
    await expect.poll(() => storedFiles(coop.id)).toEqual([]);
    expect((await chatPhotoRows(coop.id))[0]!.deleted_at).not.toBeNull();
    expect((await image(borrower, photo!.url)).status).toBe(404);
  });

  it('when a photo is attached that is someone else\'s, another thread\'s or already sent, then the message is refused and nothing is stored', async () => {
    const coop = await createTestCoop();
    const { owner, thread } = await loanThread(coop);
    const member = await agentOf(coop.otherFarmMember.email);
    const channel = ((await member.get('/api/chat/threads')).body as ChatThreadListDto).items.find((t) => t.kind === 'channel')!;
    const png = await testImage('png', { width: 300, height: 200 });
    const [inLoan] = (await share(owner, thread.id, [{ body: png, name: 'a.png', type: 'image/png' }])).body.photos as PhotoDto[];
    const [inChannel] = (await share(member, channel.id, [{ body: png, name: 'b.png', type: 'image/png' }])).body.photos as PhotoDto[];

    const post = (agent: Agent, threadId: string, attachmentIds: string[]) =>
      agent.post(`/api/chat/threads/${threadId}/messages`).send({ clientId: randomUUID(), body: 'look', attachmentIds });
    // Another person's photo, and one uploaded to another thread.
    expect((await post(owner, channel.id, [inChannel!.id])).status).toBe(400);
    expect((await post(member, channel.id, [inLoan!.id])).status).toBe(400);
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: '' })).status).toBe(400);
    expect((await asTenant(coop.id, (c) => c.query(`SELECT count(*)::int AS n FROM chat_messages WHERE body = 'look'`))).rows[0].n).toBe(0);
    // Sent once, a photo is not sent again with another message.
    expect((await post(member, channel.id, [inChannel!.id])).status).toBe(201);
    expect((await post(member, channel.id, [inChannel!.id])).status).toBe(400);
    expect((await asTenant(coop.id, (c) => c.query(`SELECT count(*)::int AS n FROM chat_messages WHERE body = 'look'`))).rows[0].n).toBe(1);
  });

  it('when a file that is not a photo is shared (text, a PDF, a GIF claiming JPEG), then it is refused by its content and nothing is stored', async () => {
    const coop = await createTestCoop();
    const member = await agentOf(coop.member.email);
    const channel = ((await member.get('/api/chat/threads')).body as ChatThreadListDto).items.find((t) => t.kind === 'channel')!;
    const text = await share(member, channel.id, [{ body: Buffer.from('not a photo at all'), name: 'hay.jpg', type: 'image/jpeg' }]);
    expect(text.status).toBe(415);
    expect(text.body.error).toMatchObject({ code: 'unsupported_file', message: 'The file is not a JPEG, PNG or WebP photo' });
    const pdf = await share(member, channel.id, [{ body: Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj<<>>endobj\n'), name: 'hay.png', type: 'image/png' }]);
    expect(pdf.status).toBe(415);
    const mixed = await share(member, channel.id, [
      { body: await testImage('webp'), name: 'a.webp', type: 'image/webp' },
      { body: Buffer.from('GIF89a not really'), name: 'b.jpg', type: 'image/jpeg' },
    ]);
    expect(mixed.status).toBe(415);
    expect(mixed.body.error.message).toMatch(/^File 2 is not a JPEG, PNG or WebP photo/);
    expect(storedFiles(coop.id)).toEqual([]);
    expect(await chatPhotoRows(coop.id)).toEqual([]);
  });

  it('when the admin hides a message with a photo, then its readers no longer get the photo and the admin still does', async () => {
    const coop = await createTestCoop();
    const member = await agentOf(coop.member.email);
    const channel = ((await member.get('/api/chat/threads')).body as ChatThreadListDto).items.find((t) => t.kind === 'channel')!;
    const [photo] = (await share(member, channel.id, [{ body: await testImage('jpeg'), name: 'a.jpg', type: 'image/jpeg' }])).body.photos as PhotoDto[];
    const sent = (await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'New hutch', attachmentIds: [photo!.id] })).body as ChatMessageDto;
    const reader = await agentOf(coop.otherFarmMember.email);
    expect((await image(reader, photo!.thumbnailUrl)).status).toBe(200);
    const admin = await agentOf(coop.admin.email);
    expect((await admin.post(`/api/chat/messages/${sent.id}/hide`).send({ reason: 'A neighbour\'s yard is in the picture' })).status).toBe(200);
    expect((await image(reader, photo!.thumbnailUrl)).status).toBe(404);
    expect((await image(reader, photo!.url)).status).toBe(404);
    expect((await image(admin, photo!.url)).status).toBe(200);
    const page = (await reader.get(`/api/chat/threads/${channel.id}/messages`)).body as ChatMessagePageDto;
    expect(page.items[0]).toMatchObject({ state: 'hidden', attachments: [] });
  });
});
