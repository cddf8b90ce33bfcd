// Loads the demo co-op through the services, so it obeys the same rules as any user's data.
import { connectDatabase, closeDatabase } from '../packages/server/src/composition/database';
import { hashPassword } from '../packages/server/src/lib/passwords';
import { createCooperative, findPublicCoop } from '../packages/server/src/modules/coops/coops.service';
import { createFarm } from '../packages/server/src/modules/farms/farms.service';
import { createUser } from '../packages/server/src/modules/users/users.service';
import { DEMO_PASSWORD, demoApprentice, demoCoop, demoFarms, demoSecondApprentice } from './demo-coop';
import { withTenant } from '../packages/server/src/db/tenant';
import { coopHasAnimals } from '../packages/server/src/modules/animals/herd-import.service';
import { farmDirectoryOf } from '../packages/server/src/modules/farms/farms.service';
import { findUserByEmail } from '../packages/server/src/modules/users/users.service';
import { loadDemoAlmanac } from './demo-almanac';
import { loadDemoGrowOut } from './demo-grow-out';
import { loadDemoHealthYield } from './demo-health-yield';
import { loadDemoHerds } from './demo-herds';
import { loadDemoLedger } from './demo-ledger';
import { loadDemoProcessingDays } from './demo-processing-days';
import { loadDemoStudShare } from './demo-stud-share';
import { loadDemoSwapBoard } from './demo-swap-board';
import { loadDemoMentorship } from './demo-mentorship';
import { loadDemoChat } from './demo-chat';

const appUrl = (process.env.APP_URL ?? 'http://127.0.0.1:3000').replace(/\/$/, '');

/** The farm the demo apprentice works on: their mentor's. */
const apprenticeFarmKey = demoFarms.find((f) => f.people.some((p) => p.email === demoApprentice.mentorEmail))?.key;
const temperatureUnits = new Map(demoFarms.map((f) => [f.key, f.profile.temperatureUnit] as const));

export async function loadDemoCoop(): Promise<'loaded' | 'already-present'> {
  const present = await findPublicCoop(demoCoop.slug);
  if (present) {
    // A demo co-op loaded before the Herd (or the Almanac) existed gets its herds (and breeding history) once.
    await withTenant({ coopId: present.id }, async (tx) => {
      const directory = await farmDirectoryOf(present.id, tx);
      const farms = new Map<string, string>();
      const keepers = new Map<string, string>();
      for (const farm of demoFarms) {
        const found = [...directory.values()].find((f) => f.name === farm.profile.name);
        const keeper = await findUserByEmail(farm.people[0]!.email, tx);
        if (found && keeper) {
          farms.set(farm.key, found.id);
          keepers.set(farm.key, keeper.id);
        }
      }
      if (farms.size !== demoFarms.length) return;
      const apprentice = await findUserByEmail(demoApprentice.email, tx);
      if (!(await coopHasAnimals(present.id, tx))) await loadDemoHerds({ coopId: present.id, farms, keepers, apprenticeId: apprentice?.id ?? null }, tx);
      await loadDemoAlmanac({ coopId: present.id, farms, keepers, apprenticeId: apprentice?.id ?? null, apprenticeFarmKey }, tx);
      await loadDemoGrowOut({ coopId: present.id, farms, keepers, apprenticeId: apprentice?.id ?? null, apprenticeFarmKey }, tx);
      await loadDemoHealthYield({ coopId: present.id, farms, keepers, apprenticeId: apprentice?.id ?? null, apprenticeFarmKey, temperatureUnits }, tx);
      await loadDemoLedger({ coopId: present.id, farms, keepers, appUrl }, tx);
      await loadApprenticeship(present.id, tx);
      await loadDemoChat({ coopId: present.id }, tx);
      await loadDemoProcessingDays({ coopId: present.id, farms, keepers }, tx);
    });
    // Stud Share goes through its services, each in a transaction of its own, once the co-op exists.
    await loadDemoStudShare(present.id);
    await loadDemoSwapBoard(present.id);
    return 'already-present';
  }
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const coopId = await createCooperative(demoCoop, async (coop, tx) => {
    const userIds = new Map<string, { id: string; farmId: string }>();
    for (const farm of demoFarms) {
      const created = await createFarm(coop.id, farm.profile, tx);
      for (const person of farm.people) {
        const user = await createUser({ coopId: coop.id, farmId: created.id, ...person, passwordHash }, tx);
        userIds.set(person.email, { id: user.id, farmId: created.id });
      }
    }
    const mentor = userIds.get(demoApprentice.mentorEmail)!;
    const apprentice = await createUser(
      { coopId: coop.id, farmId: mentor.farmId, mentorId: mentor.id, email: demoApprentice.email, name: demoApprentice.name, role: 'apprentice', passwordHash },
      tx,
    );
    const farms = new Map<string, string>();
    const keepers = new Map<string, string>();
    for (const farm of demoFarms) {
      const keeper = userIds.get(farm.people[0]!.email)!;
      farms.set(farm.key, keeper.farmId);
      keepers.set(farm.key, keeper.id);
    }
    await loadDemoHerds({ coopId: coop.id, farms, keepers, apprenticeId: apprentice.id }, tx);
    await loadDemoAlmanac({ coopId: coop.id, farms, keepers, apprenticeId: apprentice.id, apprenticeFarmKey }, tx);
    await loadDemoGrowOut({ coopId: coop.id, farms, keepers, apprenticeId: apprentice.id, apprenticeFarmKey }, tx);
    await loadDemoHealthYield({ coopId: coop.id, farms, keepers, apprenticeId: apprentice.id, apprenticeFarmKey, temperatureUnits }, tx);
    await loadDemoLedger({ coopId: coop.id, farms, keepers, appUrl }, tx);
    await loadApprenticeship(coop.id, tx);
    await loadDemoChat({ coopId: coop.id }, tx);
    await loadDemoProcessingDays({ coopId: coop.id, farms, keepers }, tx);
    return coop.id;
  });
  await loadDemoStudShare(coopId);
  await loadDemoSwapBoard(coopId);
  return 'loaded';
}

/** The second apprentice (added once) and both apprentices' weeks of chores and skills. */
async function loadApprenticeship(coopId: string, tx: Parameters<typeof findUserByEmail>[1]) {
  const mentor = await findUserByEmail(demoSecondApprentice.mentorEmail, tx);
  let second = await findUserByEmail(demoSecondApprentice.email, tx);
  if (!second && mentor?.farmId) {
    second = await createUser(
      { coopId, farmId: mentor.farmId, mentorId: mentor.id, email: demoSecondApprentice.email, name: demoSecondApprentice.name, role: 'apprentice', passwordHash: await hashPassword(DEMO_PASSWORD) },
      tx,
    );
  }
  const apprentices = [await findUserByEmail(demoApprentice.email, tx), second]
    .filter((u): u is NonNullable<typeof u> => Boolean(u?.farmId && u.mentorId))
    .map((u) => ({ id: u.id, farmId: u.farmId!, mentorId: u.mentorId! }));
  await loadDemoMentorship({ coopId, apprentices }, tx);
}

const isMain = process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop()!);
if (isMain) {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is required');
  connectDatabase(url);
  try {
    const result = await loadDemoCoop();
    console.log(result === 'loaded' ? '[burrowline] demo co-op loaded' : '[burrowline] demo co-op already present');
  } finally {
    await closeDatabase();
  }
}
