import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SWAP_MEAT_CAUTION, type SwapListingDto, type SwapOfferDto } from '@burrowline/shared';
import { expireListing } from '../../packages/server/src/modules/swap-board/swap-listings.service';
import { farmToday } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { growingGroupAs, treatmentAs } from '../support/health-yield';
import { addAnimalAs, catalogueBreeds } from '../support/herd';
import { binaryParser, pdfText, testImage } from '../support/herd-files';
import { deliveredMailsTo, queuedMailTo } from '../support/mail';
import { doeOf, offeredBuck, requestAs, acceptAs, custodyStep, thirdFarmMember } from '../support/stud-share';
import {
  custodyOf, inDays, listAs, listedDoe, offerAs, quarantinesOf, saleTransfersOf, stockOf, swapCounts,
} from '../support/swap-board';
import { signedInAgent, testApp, type Agent } from '../support/test-app';
import { makeOffer } from '../../packages/server/src/modules/swap-board/swap-offers.service';
import { actorOf as serviceActor } from '../support/herd';

const handle = testApp();
let coop: TestCoop;
let seller: Agent;
let buyer: Agent;
let apprentice: Agent;

beforeAll(async () => {
  coop = await createTestCoop();
  [seller, buyer, apprentice] = await Promise.all([
    signedInAgent(coop.member.email, TEST_PASSWORD, handle),
    signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle),
    signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle),
  ]);
});
afterAll(async () => {
  await handle.close();
});

const noticesOf = (listingId: string) =>
  asTenant(coop.id, async (c) => (await c.query(
    'SELECT user_id, kind, title FROM notifications WHERE link = $1 ORDER BY created_at', [`/swap-board/listings/${listingId}`],
  )).rows as { user_id: string; kind: string; title: string }[]);

describe('listing', () => {
  it('when a member lists a doe, then the board shows her card with its figures and price; her apprentice sees it without the price', async () => {
    const { doe, listing } = await listedDoe(coop.member, { title: 'Proven doe, Bramble line', priceCents: 7_500 });
    expect(listing).toMatchObject({ state: 'open', kind: 'breeding_stock', priceCents: 7_500, mine: true, canOffer: false, caution: null });
    const board = await buyer.get('/api/swap-board/listings?pageSize=50').expect(200);
    const card = board.body.items.find((l: SwapListingDto) => l.id === listing.id);
    expect(card).toMatchObject({ title: 'Proven doe, Bramble line', priceCents: 7_500, mine: false, canOffer: true, farm: { id: coop.member.farmId } });
    expect(card.animals[0]).toMatchObject({ card: { id: doe.id, coi: 0 }, completeness: 0 });
    const seen = await apprentice.get('/api/swap-board/listings?mine=true').expect(200);
    expect(seen.body.items.find((l: SwapListingDto) => l.id === listing.id)).toMatchObject({ priceCents: null, canOffer: false });
    const page = await apprentice.get(`/api/swap-board/listings/${listing.id}`).expect(200);
    expect(page.body.listing.priceCents).toBeNull();
  });

  it('when an animal is under a medicine withdrawal, in quarantine, on loan or not the farm\'s, then the listing is refused with each reason and nothing is written', async () => {
    const treated = await stockOf(coop.member, { name: 'Sorrel' });
    await treatmentAs(coop.member, { animalId: treated.id, startedOn: inDays(-3), lastDoseOn: inDays(-1), withdrawalDays: 10 });
    const arrived = await stockOf(coop.otherFarmMember, { name: 'Tansy' });
    // Tansy arrives at the seller's farm through the herd: the Almanac plans her quarantine.
    await buyer.post(`/api/animals/${arrived.id}/custody-events`).send({ kind: 'transferred', toFarmId: coop.member.farmId, movedOn: farmToday() }).expect(201);
    const { buck, card } = await offeredBuck(coop, {}, { name: 'Cedar' });
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: farmToday(), endOn: inDays(10) }));
    await custodyStep(coop.member, coop.otherFarmMember, loan, 'hand_over', { on: farmToday() });
    const someoneElses = await stockOf(coop.otherFarmMember, { name: 'Yarrow' });
    const before = await swapCounts(coop.id);

    const res = await seller.post('/api/swap-board/listings').send({
      kind: 'breeding_stock', title: 'Four to go', priceMode: 'offers', validUntil: inDays(20), animalIds: [treated.id, arrived.id, buck.id, someoneElses.id],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details['animalIds.0'][0]).toMatch(/^Sorrel .* is under a medicine withdrawal \(Coccidiosis course\) until .*; it may change hands from /);
    expect(res.body.error.details['animalIds.1'][0]).toMatch(/^Tansy .* is in its arrival quarantine until/);
    expect(res.body.error.details['animalIds.2'][0]).toMatch(/^Cedar .* is on loan at another farm/);
    expect(res.body.error.details['animalIds.3'][0]).toMatch(/^Yarrow .* is not owned by your farm/);
    expect(await swapCounts(coop.id)).toEqual(before);
  });

  it('when a grow-out group is listed, then the listing shows the caution on selling meat and live animals for meat', async () => {
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 60, heads: 6, name: 'Fryer pen' });
    const listing = await listAs(coop.member, { kind: 'grow_out', title: 'Six fryers', groupId: group.id, headCount: 6, readyOn: inDays(14), priceCents: 9_000 });
    expect(listing.caution).toBe(SWAP_MEAT_CAUTION);
    expect(listing.caution).toMatch(/Federal inspection of rabbit is voluntary in the US/);
    expect(listing.grownOut).toMatchObject({ groupId: group.id, groupName: 'Fryer pen', headCount: 6 });
  });

  it('when a buyer filters by COI with her buck, then a half-sister of his shows the half-sib litter COI of 1/8, and sex, breed and price filter in SQL', async () => {
    const breeds = await catalogueBreeds(coop.id);
    const rex = breeds['Rex']!;
    const sharedSire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Old Thistle', birthDate: '2021-01-01', breedId: rex.id });
    const { listing } = await listedDoe(coop.member, { title: 'Half-sister', priceCents: 4_000 }, { sireId: sharedSire.id, breedId: rex.id });
    const { listing: unrelated } = await listedDoe(coop.member, { title: 'Unrelated', priceCents: 20_000 });
    const myBuck = await addAnimalAs(coop.otherFarmMember, { sex: 'buck', name: 'Birch', birthDate: '2024-02-02', sireId: sharedSire.id });

    const ranked = await buyer.get(`/api/swap-board/listings?mateWith=${myBuck.id}&sort=coi&pageSize=50`).expect(200);
    const half = ranked.body.items.find((l: SwapListingDto) => l.id === listing.id);
    // Half-sib mating: F = 1/8 (Falconer & Mackay, Introduction to Quantitative Genetics, 4th ed., ch. 5).
    expect(half.animals[0].trialCoi).toBe(0.125);
    expect(ranked.body.items.find((l: SwapListingDto) => l.id === unrelated.id).animals[0].trialCoi).toBe(0);
    const lowCoi = await buyer.get(`/api/swap-board/listings?mateWith=${myBuck.id}&maxCoi=0.1&pageSize=50`).expect(200);
    expect(lowCoi.body.items.map((l: SwapListingDto) => l.id)).not.toContain(listing.id);
    expect(lowCoi.body.items.map((l: SwapListingDto) => l.id)).toContain(unrelated.id);

    const rexDoes = await buyer.get(`/api/swap-board/listings?breedId=${rex.id}&sex=doe&pageSize=50`).expect(200);
    expect(rexDoes.body.items.map((l: SwapListingDto) => l.id)).toEqual([listing.id]);
    const cheap = await buyer.get('/api/swap-board/listings?maxPriceCents=5000&kind=breeding_stock&pageSize=50').expect(200);
    expect(cheap.body.items.map((l: SwapListingDto) => l.id)).toContain(listing.id);
    expect(cheap.body.items.map((l: SwapListingDto) => l.id)).not.toContain(unrelated.id);
    expect((await buyer.get('/api/swap-board/listings?maxCoi=0.1').expect(400)).body.error.details.mateWith).toBeDefined();
    expect((await buyer.get(`/api/swap-board/listings?mateWith=${sharedSire.id}`).expect(400)).body.error.details.mateWith[0]).toMatch(/your farm's animals/);
  });
});

describe('editing a listing', () => {
  it('when the seller edits an open listing, then its title, notes, price, terms, last day and photos change and the version moves on; a stale version is refused', async () => {
    const { doe, listing } = await listedDoe(coop.member, { title: 'Willow, junior doe' });
    const upload = await seller.post(`/api/animals/${doe.id}/photos`)
      .attach('photos', await testImage('jpeg', { width: 40, height: 40 }), { filename: 'willow.jpg', contentType: 'image/jpeg' })
      .attach('photos', await testImage('png', { width: 40, height: 40 }), { filename: 'willow-side.png', contentType: 'image/png' })
      .expect(201);
    const photoIds = (upload.body.photos as { id: string }[]).map((p) => p.id);
    const body = {
      version: listing.version, title: 'Willow, junior doe, price lowered', description: 'Now weaned her first litter.', priceMode: 'price',
      priceCents: 5_500, collectPlace: 'Feed store car park, Fridays', validUntil: inDays(40), photoIds: [photoIds[1], photoIds[0]],
    };
    const edited = await seller.patch(`/api/swap-board/listings/${listing.id}`).send(body).expect(200);
    expect(edited.body).toMatchObject({
      title: 'Willow, junior doe, price lowered', description: 'Now weaned her first litter.', priceCents: 5_500, collectPlace: 'Feed store car park, Fridays',
      validUntil: inDays(40), photoIds: [photoIds[1], photoIds[0]], version: listing.version + 1, state: 'open',
    });
    expect((await buyer.get(`/api/swap-board/listings/${listing.id}`).expect(200)).body.listing).toMatchObject({ title: 'Willow, junior doe, price lowered', priceCents: 5_500 });

    const before = await swapCounts(coop.id);
    const stale = await seller.patch(`/api/swap-board/listings/${listing.id}`).send({ ...body, title: 'Second editor' });
    expect(stale.status).toBe(409);
    expect(await swapCounts(coop.id)).toEqual(before);
    // A photo of another animal, or a day past the longest listing, is refused field by field.
    const other = await stockOf(coop.member);
    const otherPhoto = await seller.post(`/api/animals/${other.id}/photos`)
      .attach('photos', await testImage('jpeg', { width: 40, height: 40 }), { filename: 'other.jpg', contentType: 'image/jpeg' }).expect(201);
    const beforeRefusal = await swapCounts(coop.id);
    const refused = await seller.patch(`/api/swap-board/listings/${listing.id}`)
      .send({ ...body, version: edited.body.version, photoIds: [otherPhoto.body.photos[0].id], validUntil: inDays(200) });
    expect(refused.status).toBe(400);
    expect(refused.body.error.details).toEqual({ 'photoIds.0': ['Pick a photo your farm took of a listed animal'], validUntil: ['Keep a listing up 120 days at most; list it again later'] });
    expect(await swapCounts(coop.id)).toEqual(beforeRefusal);
  });

  it('when another farm, an apprentice or a late editor tries to edit, then a draft does not exist for another farm (404), an open listing is refused (403), and one under offer or sold is refused (409)', async () => {
    const draft = await listAs(coop.member, { animalIds: [(await stockOf(coop.member)).id], publish: false, title: 'Draft doe' });
    const terms = (version: number) => ({ version, title: 'Changed by someone', priceMode: 'offers', validUntil: inDays(10) });
    const { listing } = await listedDoe(coop.member, { title: 'Open doe' });
    const before = await swapCounts(coop.id);
    expect((await buyer.patch(`/api/swap-board/listings/${draft.id}`).send(terms(draft.version))).status).toBe(404);
    expect((await buyer.patch(`/api/swap-board/listings/${listing.id}`).send(terms(listing.version))).status).toBe(403);
    expect((await apprentice.patch(`/api/swap-board/listings/${listing.id}`).send(terms(listing.version))).status).toBe(403);
    expect(await swapCounts(coop.id)).toEqual(before);

    const offer = await offerAs(coop.otherFarmMember, listing.id, { priceCents: 5_000 });
    const underOffer = (await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200)).body.listing as SwapListingDto;
    const busy = await seller.patch(`/api/swap-board/listings/${listing.id}`).send(terms(underOffer.version));
    expect(busy.status).toBe(409);
    expect(busy.body.error.message).toMatch(/Offers are open on this listing/);
    await seller.post(`/api/swap-board/offers/${offer.id}/accept`).send({ version: offer.version, key: randomUUID() }).expect(200);
    const sold = (await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200)).body.listing as SwapListingDto;
    const late = await seller.patch(`/api/swap-board/listings/${listing.id}`).send(terms(sold.version));
    expect(late.status).toBe(409);
    expect(late.body.error.message).toBe('This listing is sold; it can no longer be changed');
    expect((await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200)).body.listing).toMatchObject({ title: 'Open doe', version: sold.version });
  });

  it('when the seller edits a draft, then it stays a draft with the new terms', async () => {
    const draft = await listAs(coop.member, { animalIds: [(await stockOf(coop.member)).id], publish: false, title: 'Quiet draft' });
    const edited = await seller.patch(`/api/swap-board/listings/${draft.id}`).send({ version: draft.version, title: 'Quiet draft, for trade', priceMode: 'trade', validUntil: inDays(15) }).expect(200);
    expect(edited.body).toMatchObject({ state: 'draft', title: 'Quiet draft, for trade', priceMode: 'trade', priceCents: null, validUntil: inDays(15) });
  });
});

describe('offers and the sale', () => {
  it('when offers and counter-offers go both ways and the seller accepts, then the doe arrives at the buyer with her pedigree, weights and photos but not the seller\'s notes, quarantined, with the sale pending until collection', async () => {
    const sire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Hazel', birthDate: '2022-01-01' });
    const dam = await addAnimalAs(coop.member, { sex: 'doe', name: 'Primrose', birthDate: '2022-01-01' });
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Meadowsweet', birthDate: '2025-05-01', sireId: sire.id, damId: dam.id, notes: 'Asking 65, would take 55 from a friend' });
    await seller.post(`/api/animals/${doe.id}/notes`).send({ body: 'Bit a child once; keep away from visitors', notedOn: farmToday() }).expect(201);
    await seller.post('/api/weigh-ins').send({ animalId: doe.id, totalGrams: 4_300, weighedOn: farmToday() }).expect(201);
    const listing = await listAs(coop.member, { title: 'Meadowsweet, junior doe', animalIds: [doe.id], priceCents: 6_500 });

    const offered = await buyer.post('/api/swap-board/offers').send({ listingId: listing.id, priceCents: 5_000, message: 'Could collect Sunday', validUntil: inDays(7) });
    expect(offered.status).toBe(201);
    const rival = await offerAs(coop.otherFarmMember, listing.id, { priceCents: 4_000 });
    expect((await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200)).body.listing).toMatchObject({ state: 'under_offer', openOffers: 2 });
    // The seller is told at once: the bell and an e-mail through the outbox, delivered to maildev.
    expect((await noticesOf(listing.id)).filter((n) => n.user_id === coop.member.id && n.kind === 'swap.offer')).toHaveLength(2);
    const mails = await deliveredMailsTo(coop.member.email);
    expect(mails.some((m) => /offers \$50\.00 for “Meadowsweet, junior doe”/.test(m.subject))).toBe(true);

    // Out of turn: the buyer cannot accept her own offer.
    expect((await buyer.post(`/api/swap-board/offers/${offered.body.id}/accept`).send({ version: offered.body.version, key: randomUUID() })).status).toBe(403);
    const countered = await seller.post(`/api/swap-board/offers/${offered.body.id}/counter`).send({ version: offered.body.version, priceCents: 6_000, validUntil: inDays(7) }).expect(200);
    expect(countered.body).toMatchObject({ awaiting: 'buyer', priceCents: 6_000 });
    expect((await queuedMailTo(coop.otherFarmMember.email)).some((m) => /counters with \$60\.00/.test(m.subject))).toBe(true);
    const back = await buyer.post(`/api/swap-board/offers/${offered.body.id}/counter`).send({ version: countered.body.version, priceCents: 5_500, validUntil: inDays(7) }).expect(200);
    expect(back.body).toMatchObject({ awaiting: 'seller', priceCents: 5_500 });
    expect(back.body.events.map((e: { kind: string }) => e.kind)).toEqual(['offered', 'countered', 'countered']);

    const accepted = await seller.post(`/api/swap-board/offers/${offered.body.id}/accept`).send({ version: back.body.version, key: randomUUID() }).expect(200);
    expect(accepted.body).toMatchObject({ state: 'accepted', acceptedOn: farmToday(), may: { confirmCollection: false } });

    // Herd: owned and kept by the buyer; the seller stays the breeding farm; the pedigree is intact.
    expect(await custodyOf(coop.id, doe.id)).toMatchObject({
      owning_farm_id: coop.otherFarmMember.farmId, keeping_farm_id: coop.otherFarmMember.farmId, breeding_farm_id: coop.member.farmId,
      sire_id: sire.id, dam_id: dam.id, notes: '',
    });
    const record = await buyer.get(`/api/animals/${doe.id}`).expect(200);
    expect(record.body).toMatchObject({ sireId: sire.id, damId: dam.id, breedingFarm: { id: coop.member.farmId }, notes: '' });
    expect(record.body.noteLog).toEqual([]);
    const tree = await buyer.get(`/api/animals/${doe.id}/pedigree?generations=3`).expect(200);
    expect(tree.body.slots.slice(1, 4)).toEqual([doe.id, sire.id, dam.id]);
    const weights = await buyer.get(`/api/animals/${doe.id}/weigh-ins`).expect(200);
    expect(weights.body.weighIns.map((w: { totalGrams: number }) => w.totalGrams)).toEqual([4_300]);
    // The seller's note stays in its own records (the buyer just cannot read it).
    expect(await asTenant(coop.id, async (c) => (await c.query('SELECT farm_id, body FROM animal_notes WHERE animal_id = $1', [doe.id])).rows))
      .toEqual([{ farm_id: coop.member.farmId, body: 'Bit a child once; keep away from visitors' }]);
    // Almanac: her arrival quarantine on the buyer's farm (the co-op's 30 days).
    expect(await quarantinesOf(coop.id, doe.id)).toEqual([{ farm_id: coop.otherFarmMember.farmId, window_start: farmToday(), due_on: inDays(30) }]);
    // Ledger: pending from the buyer to the seller until the buyer confirms the collection.
    expect(await saleTransfersOf(coop.id, offered.body.id)).toEqual([{ id: `swap:${offered.body.id}:sale`, status: 'pending', kind: 'sale', amount_cents: 5_500 }]);
    // The listing is sold; the other offer is declined with a notice.
    const page = await buyer.get(`/api/swap-board/listings/${listing.id}`).expect(200);
    expect(page.body.listing.state).toBe('sold');
    expect((await buyer.get(`/api/swap-board/offers/${rival.id}`).expect(200)).body).toMatchObject({ state: 'declined', closedReason: 'Another offer was accepted' });
    expect((await queuedMailTo(coop.otherFarmMember.email)).some((m) => /accepts \$55\.00 for “Meadowsweet, junior doe”/.test(m.subject))).toBe(true);

    expect((await seller.post(`/api/swap-board/offers/${offered.body.id}/collected`).send({ version: accepted.body.version })).status).toBe(403);
    const collected = await buyer.post(`/api/swap-board/offers/${offered.body.id}/collected`).send({ version: accepted.body.version }).expect(200);
    expect(collected.body.state).toBe('collected');
    expect((await saleTransfersOf(coop.id, offered.body.id))[0]!.status).toBe('posted');
  });

  it('when an offer on grow-out heads is accepted, then the heads leave the group in the sale; more heads than the group has left are refused and nothing is written', async () => {
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 60, heads: 6, name: 'Sale pen' });
    const headsNow = async () => ((await seller.get('/api/grow-out/groups?status=all').expect(200)).body.groups as { id: string; currentHeads: number; status: string }[])
      .find((g) => g.id === group.id)!;
    const fryers = (headCount: number) => listAs(coop.member, { kind: 'grow_out', title: `${headCount} fryers`, groupId: group.id, headCount, readyOn: inDays(14), priceCents: 2_000 * headCount });
    const four = await fryers(4);
    const alsoFour = await fryers(4);
    const firstOffer = await offerAs(coop.otherFarmMember, four.id, { priceCents: 8_000 });
    const secondOffer = await offerAs(coop.otherFarmMember, alsoFour.id, { priceCents: 8_000 });
    await seller.post(`/api/swap-board/offers/${firstOffer.id}/accept`).send({ version: firstOffer.version, key: randomUUID() }).expect(200);
    expect(await headsNow()).toMatchObject({ currentHeads: 2, status: 'growing' });

    const before = await swapCounts(coop.id);
    const refused = await seller.post(`/api/swap-board/offers/${secondOffer.id}/accept`).send({ version: secondOffer.version, key: randomUUID() });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('Sale pen has 2 heads left; 4 cannot leave it');
    expect(await swapCounts(coop.id)).toEqual(before);
    expect(await headsNow()).toMatchObject({ currentHeads: 2 });
    // Processing counts the sold heads too: 3 of the 2 left are refused.
    const batch = await seller.post('/api/processing-records').send({ groupId: group.id, processedOn: farmToday(), headCount: 3, liveGrams: 7_000, hotCarcassGrams: 3_900 });
    expect(batch.status).toBe(400);
    expect(batch.body.error.details.headCount).toEqual(['Sale pen has 2 heads left; 3 cannot be processed from it']);

    // The last two heads sold: the group is done growing.
    const lastTwo = await fryers(2);
    const lastOffer = await offerAs(coop.otherFarmMember, lastTwo.id, { priceCents: 4_000 });
    await seller.post(`/api/swap-board/offers/${lastOffer.id}/accept`).send({ version: lastOffer.version, key: randomUUID() }).expect(200);
    expect(await headsNow()).toMatchObject({ currentHeads: 0, status: 'closed' });
  });

  it('when a trade is accepted, then both sides\' animals move in the one transaction, each with its arrival quarantine', async () => {
    const { doe, listing } = await listedDoe(coop.member, { priceMode: 'trade', priceCents: null, title: 'Trade for a buck' });
    const theirBuck = await stockOf(coop.otherFarmMember, { sex: 'buck', name: 'Elder' });
    const offer = await offerAs(coop.otherFarmMember, listing.id, { priceCents: null, tradeAnimalIds: [theirBuck.id] });
    await seller.post(`/api/swap-board/offers/${offer.id}/accept`).send({ version: offer.version, key: randomUUID() }).expect(200);
    expect(await custodyOf(coop.id, doe.id)).toMatchObject({ owning_farm_id: coop.otherFarmMember.farmId, keeping_farm_id: coop.otherFarmMember.farmId });
    expect(await custodyOf(coop.id, theirBuck.id)).toMatchObject({ owning_farm_id: coop.member.farmId, keeping_farm_id: coop.member.farmId, breeding_farm_id: coop.otherFarmMember.farmId });
    expect(await quarantinesOf(coop.id, theirBuck.id)).toEqual([{ farm_id: coop.member.farmId, window_start: farmToday(), due_on: inDays(30) }]);
    expect(await saleTransfersOf(coop.id, offer.id)).toEqual([]);
  });

  it('when a doe is sold, then both farms download her pedigree certificate (the seller after she left), a third farm does not, and the seller still cannot open her record', async () => {
    const sire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Cobnut', birthDate: '2022-02-01' });
    const { doe, listing } = await listedDoe(coop.member, { title: 'Sorrel, junior doe' }, { name: 'Sorrel', sireId: sire.id });
    const offer = await offerAs(coop.otherFarmMember, listing.id, { priceCents: 5_000 });
    await seller.post(`/api/swap-board/offers/${offer.id}/accept`).send({ version: offer.version, key: randomUUID() }).expect(200);
    const sellerFarm = coop.farms.find((f) => f.id === coop.member.farmId)!.name;
    const buyerFarm = coop.farms.find((f) => f.id === coop.otherFarmMember.farmId)!.name;
    for (const agent of [seller, buyer, apprentice]) {
      const res = await agent.get(`/api/pedigree-certificates/${doe.id}`).buffer(true).parse(binaryParser).expect(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      const { text } = await pdfText(res.body as Buffer);
      expect(text).toContain('Pedigree certificate');
      expect(text).toContain('Sorrel');
      expect(text).toContain(`Ear tattoo ${doe.tattoo}`);
      expect(text).toContain('Cobnut');
      expect(text).toContain(sellerFarm);
      expect(text).toMatch(new RegExp(`Issued by ${buyerFarm}`));
    }
    expect((await seller.get(`/api/animals/${doe.id}`)).status).toBe(403);
    const third = await thirdFarmMember(coop);
    const outsider = await signedInAgent(third.email, TEST_PASSWORD, handle);
    expect((await outsider.get(`/api/pedigree-certificates/${doe.id}`)).status).toBe(404);
  });

  it('when the hand-over fails, then the pending sale is voided and the animal goes back to the seller', async () => {
    const { doe, listing } = await listedDoe(coop.member);
    const offer = await offerAs(coop.otherFarmMember, listing.id, { priceCents: 3_000 });
    const accepted = await seller.post(`/api/swap-board/offers/${offer.id}/accept`).send({ version: offer.version, key: randomUUID() }).expect(200);
    const failed = await buyer.post(`/api/swap-board/offers/${offer.id}/hand-over-failed`).send({ version: accepted.body.version, reason: 'Car broke down, no date agreed' }).expect(200);
    expect(failed.body).toMatchObject({ state: 'failed', closedReason: 'Car broke down, no date agreed' });
    expect(await saleTransfersOf(coop.id, offer.id)).toEqual([expect.objectContaining({ status: 'voided' })]);
    expect(await custodyOf(coop.id, doe.id)).toMatchObject({ owning_farm_id: coop.member.farmId, keeping_farm_id: coop.member.farmId });
    expect((await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200)).body.listing.state).toBe('withdrawn');
  });

  it('when an offer is sent twice with one id and accepted twice with one key, then there is one offer and one sale', async () => {
    const { listing } = await listedDoe(coop.member);
    const id = randomUUID();
    const body = { id, listingId: listing.id, priceCents: 4_500, validUntil: inDays(5) };
    const first = await buyer.post('/api/swap-board/offers').send(body).expect(201);
    const again = await buyer.post('/api/swap-board/offers').send(body).expect(200);
    expect(again.body.id).toBe(first.body.id);
    const key = randomUUID();
    const accepted = await seller.post(`/api/swap-board/offers/${id}/accept`).send({ version: first.body.version, key }).expect(200);
    const repeated = await seller.post(`/api/swap-board/offers/${id}/accept`).send({ version: first.body.version, key }).expect(200);
    expect(repeated.body).toEqual(accepted.body);
    expect(await saleTransfersOf(coop.id, id)).toHaveLength(1);
    const otherKey = await seller.post(`/api/swap-board/offers/${id}/accept`).send({ version: first.body.version, key: randomUUID() });
    expect(otherKey.status).toBe(409);
    expect(otherKey.body.error.message).toMatch(/is sold already/);
    expect(await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM swap_offers WHERE listing_id = $1', [listing.id])).rows[0].n)).toBe(1);
  });

  it('when a listed animal is sold through the herd meanwhile, then its listing closes and its offers are declined with a notice', async () => {
    const { doe, listing } = await listedDoe(coop.member);
    const offer = await offerAs(coop.otherFarmMember, listing.id);
    await seller.post(`/api/animals/${doe.id}/custody-events`).send({ kind: 'transferred', toFarmId: coop.otherFarmMember.farmId, movedOn: farmToday() }).expect(201);
    const page = await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200);
    expect(page.body.listing).toMatchObject({ state: 'withdrawn', closedReason: expect.stringMatching(/no longer belongs to the farm/) });
    expect(page.body.offers[0]).toMatchObject({ id: offer.id, state: 'declined' });
    expect((await noticesOf(listing.id)).some((n) => n.user_id === coop.otherFarmMember.id && /is declined/.test(n.title))).toBe(true);
  });

  it('when the listing\'s last day has passed, then the expiry job closes it and expires its open offers; before then it leaves it', async () => {
    const { listing } = await listedDoe(coop.member, { validUntil: inDays(3) });
    const offer = await offerAs(coop.otherFarmMember, listing.id, { validUntil: inDays(3) });
    expect(await expireListing({ coopId: coop.id, listingId: listing.id })).toBe('not yet');
    const later = new Date(Date.now() + 5 * 86_400_000);
    expect(await expireListing({ coopId: coop.id, listingId: listing.id }, later)).toBe('expired');
    expect(await expireListing({ coopId: coop.id, listingId: listing.id }, later)).toBe('closed');
    const page = await seller.get(`/api/swap-board/listings/${listing.id}`).expect(200);
    expect(page.body.listing.state).toBe('expired');
    expect(page.body.offers.map((o: SwapOfferDto) => o.state)).toEqual(['expired']);
    expect(offer.state).toBe('open');
  });

  it('when an apprentice opens an offer of her mentor\'s farm, then she follows it without prices and every action answers 403', async () => {
    const { listing } = await listedDoe(coop.member);
    const offer = await offerAs(coop.otherFarmMember, listing.id);
    const seen = await apprentice.get(`/api/swap-board/offers/${offer.id}`).expect(200);
    expect(seen.body).toMatchObject({ priceCents: null, may: { accept: false, counter: false, decline: false } });
    const before = await swapCounts(coop.id);
    expect((await apprentice.post(`/api/swap-board/offers/${offer.id}/accept`).send({ version: offer.version, key: randomUUID() })).status).toBe(403);
    expect((await apprentice.post('/api/swap-board/listings').send({ kind: 'wanted', title: 'A Rex buck', priceMode: 'offers', validUntil: inDays(9) })).status).toBe(403);
    expect(await swapCounts(coop.id)).toEqual(before);
  });

  it('when a third farm of the co-op asks for an offer it is not party to, then it does not exist for it, and the listing page shows it no offers', async () => {
    const { listing } = await listedDoe(coop.member);
    const offer = await offerAs(coop.otherFarmMember, listing.id);
    const third = await thirdFarmMember(coop);
    const outsider = await signedInAgent(third.email, TEST_PASSWORD, handle);
    expect((await outsider.get(`/api/swap-board/offers/${offer.id}`)).status).toBe(404);
    const page = await outsider.get(`/api/swap-board/listings/${listing.id}`).expect(200);
    expect(page.body.offers).toEqual([]);
    expect(JSON.stringify(page.body)).not.toContain(offer.id);
  });

  it('when a wanted post is on the board, then it shows under its own tab, not among what is offered, and takes no offers', async () => {
    const wanted = await listAs(coop.otherFarmMember, { kind: 'wanted', title: 'Wanted: a Rex doe', priceMode: 'offers', priceCents: null, wantedSex: 'doe' });
    const board = await seller.get('/api/swap-board/listings?pageSize=50').expect(200);
    expect(board.body.items.map((l: SwapListingDto) => l.id)).not.toContain(wanted.id);
    const posts = await seller.get('/api/swap-board/listings?kind=wanted&pageSize=50').expect(200);
    expect(posts.body.items.map((l: SwapListingDto) => l.id)).toContain(wanted.id);
    await expect(makeOffer(serviceActor(coop.member), { listingId: wanted.id, priceCents: 1_000, tradeAnimalIds: [], message: '', validUntil: inDays(3) }))
      .rejects.toMatchObject({ status: 409, message: expect.stringMatching(/A wanted post takes no offers/) });
  });
});
