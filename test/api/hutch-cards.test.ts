import { describe, expect, it } from 'vitest';
import { daysAgo, serviceAs } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { binaryParser, pdfQrCodes, pdfText } from '../support/herd-files';
import { signedInAgent } from '../support/test-app';

describe('hutch cards', () => {
  it('when a member prints her breeding does, then each card names the doe with her next Almanac dates, and its QR code opens her in the product', async () => {
    const coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Primrose', birthDate: '2023-01-10' });
    const buck = await addAnimalAs(coop.member, { sex: 'buck', name: 'Bracken', birthDate: '2022-11-02' });
    await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(3) });
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);

    const res = await agent.get('/api/hutch-cards').query({ animalIds: `${doe.id},${buck.id}` }).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const { text, pages } = await pdfText(res.body as Buffer);
    expect(pages).toBe(1);
    expect(text).toContain('Primrose');
    expect(text).toContain(`Tattoo ${doe.tattoo} · Doe`);
    expect(text).toContain('Palpate');
    expect(text).toContain('Bracken');
    const codes = await pdfQrCodes(res.body as Buffer);
    expect(codes).toHaveLength(2);
    expect(codes[0]).toMatch(new RegExp(`^https?://[^/]+/herd/${doe.id}$`));
    expect(codes[1]).toMatch(new RegExp(`/herd/${buck.id}$`));
  });

  it('when another farm asks for a doe\'s card, or too many or no animals, then it is refused and says why', async () => {
    const coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Yarrow' });
    const stranger = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    // Her pedigree card is the co-op's to read; her hutch card is her farm's.
    expect((await stranger.get('/api/hutch-cards').query({ animalIds: doe.id })).status).toBe(403);
    const own = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const none = await own.get('/api/hutch-cards');
    expect(none.status).toBe(400);
    expect(JSON.stringify(none.body)).toContain('Choose the animals');
    const many = Array.from({ length: 25 }, () => doe.id).join(',');
    expect((await own.get('/api/hutch-cards').query({ animalIds: many })).status).toBe(200); // the same doe 25 times is one card
  });

  it('when a member prints every breeding doe, then the sheet holds all of them', async () => {
    const coop = await createTestCoop();
    for (const name of ['Aster', 'Briar', 'Cress', 'Dill', 'Elder']) await addAnimalAs(coop.member, { sex: 'doe', name, lifecycle: 'breeding' });
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const res = await agent.get('/api/hutch-cards').query({ does: 'breeding' }).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    const { text, pages } = await pdfText(res.body as Buffer);
    expect(pages).toBe(2);
    for (const name of ['Aster', 'Briar', 'Cress', 'Dill', 'Elder']) expect(text).toContain(name);
  });
});
