import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { lentBuck, type LentBuck } from '../support/lent-animal';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let lender: Agent;
let lendersApprentice: Agent;
let borrower: Agent;

beforeAll(async () => {
  coop = await createTestCoop();
  [lender, lendersApprentice, borrower] = await Promise.all([
    signedInAgent(coop.member.email, TEST_PASSWORD, handle),
    signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle),
    signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle),
  ]);
});
afterAll(async () => {
  await handle.close();
});

const ids = (rows: { id: string }[]) => rows.map((r) => r.id).sort();

/** What one farm reads of the buck's private history, through every list that carries it. */
async function historySeenBy(agent: Agent, buck: LentBuck) {
  const detail = await agent.get(`/api/animals/${buck.animalId}`).expect(200);
  const weighIns = await agent.get(`/api/animals/${buck.animalId}/weigh-ins`).expect(200);
  const photos = await agent.get(`/api/animals/${buck.animalId}/photos`).expect(200);
  const treatments = await agent.get(`/api/treatments?animalId=${buck.animalId}`).expect(200);
  const herd = await agent.get('/api/animals?status=all&pageSize=200').expect(200);
  const inHerd = herd.body.items.find((a: { id: string }) => a.id === buck.animalId);
  return {
    notesField: detail.body.notes as string,
    noteLog: ids(detail.body.noteLog),
    latestWeighedOn: detail.body.latestWeight?.weighedOn ?? null,
    herdLatestWeighedOn: inHerd?.latestWeight?.weighedOn ?? null,
    // The herd list's rows carry no notes at all: a farm's notes are read on the animal's own record only.
    herdNotesField: inHerd && 'notes' in inHerd ? inHerd.notes : 'not in the list',
    weighIns: ids(weighIns.body.weighIns),
    photos: ids(photos.body.photos),
    treatments: ids(treatments.body.treatments),
  };
}

describe('a lent animal\'s private history stays with the farm that recorded it', () => {
  it('when a buck is lent out, then the borrower reads only what it records in its care, and the lender only its own', async () => {
    const buck = await lentBuck(coop, 'duringLoan');
    const { lender: a, borrower: b } = { lender: buck.lender, borrower: buck.borrower! };

    expect(await historySeenBy(borrower, buck)).toEqual({
      notesField: '', noteLog: [b.noteId], latestWeighedOn: '2024-02-10', herdLatestWeighedOn: '2024-02-10', herdNotesField: 'not in the list',
      weighIns: [b.weighInId], photos: [], treatments: [b.treatmentId],
    });
    await borrower.get(`/api/photos/${a.photoId}`).expect(404);
    await borrower.get(`/api/photos/${a.photoId}/thumbnail`).expect(404);
    const certificate = await borrower.get(`/api/pedigree-certificates/${buck.animalId}`);
    expect(certificate.status).toBe(403);
    // The pedigree card stays open to the co-op.
    const card = await borrower.get(`/api/pedigree-cards/${buck.animalId}`).expect(200);
    expect(card.body).toMatchObject({ id: buck.animalId, name: 'Lent buck' });

    for (const agent of [lender, lendersApprentice]) {
      const seen = await historySeenBy(agent, buck);
      expect(seen.notesField).toContain('Bought for 120 dollars');
      expect(seen).toMatchObject({
        noteLog: [a.noteId], latestWeighedOn: '2024-01-10', herdLatestWeighedOn: '2024-01-10', weighIns: [a.weighInId], photos: [a.photoId], treatments: [a.treatmentId],
      });
    }
    await lender.get(`/api/pedigree-certificates/${buck.animalId}`).expect(200);
  });

  it('when the buck is back home, then the lender does not read what the borrower recorded, and the borrower sees only the pedigree card', async () => {
    const buck = await lentBuck(coop, 'afterLoan');
    const a = buck.lender;
    const seen = await historySeenBy(lender, buck);
    expect(seen.notesField).toContain('Bought for 120 dollars');
    expect(seen).toMatchObject({
      noteLog: [a.noteId], latestWeighedOn: '2024-01-10', herdLatestWeighedOn: '2024-01-10', weighIns: [a.weighInId], photos: [a.photoId], treatments: [a.treatmentId],
    });
    await borrower.get(`/api/animals/${buck.animalId}`).expect(403);
    await borrower.get(`/api/animals/${buck.animalId}/weigh-ins`).expect(403);
    await borrower.get(`/api/animals/${buck.animalId}/photos`).expect(404);
    // What the borrower recorded while it kept the buck stays its own.
    const own = await borrower.get(`/api/treatments?animalId=${buck.animalId}`).expect(200);
    expect(ids(own.body.treatments)).toEqual([buck.borrower!.treatmentId]);
  });

  it('when a buck is sold, then the buyer reads the history its seller recorded', async () => {
    const buck = await lentBuck(coop, 'beforeLoan');
    await lender.post(`/api/animals/${buck.animalId}/custody-events`).send({ kind: 'transferred', toFarmId: coop.farms[1]!.id, movedOn: '2024-05-01' }).expect(201);
    const detail = await borrower.get(`/api/animals/${buck.animalId}`).expect(200);
    expect(ids(detail.body.noteLog)).toEqual([buck.lender.noteId]);
    expect(detail.body.latestWeight).toMatchObject({ weighedOn: '2024-01-10' });
    const weighIns = await borrower.get(`/api/animals/${buck.animalId}/weigh-ins`).expect(200);
    expect(ids(weighIns.body.weighIns)).toEqual([buck.lender.weighInId]);
    const photos = await borrower.get(`/api/animals/${buck.animalId}/photos`).expect(200);
    expect(ids(photos.body.photos)).toEqual([buck.lender.photoId]);
  });
});
