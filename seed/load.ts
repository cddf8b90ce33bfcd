// Loads the demo co-op through the services, so it obeys the same rules as any user's data.
import { connectDatabase, closeDatabase } from '../packages/server/src/db/sequelize';
import { hashPassword } from '../packages/server/src/lib/passwords';
import { createCooperative, findPublicCoop } from '../packages/server/src/modules/coops/coops.service';
import { createFarm } from '../packages/server/src/modules/farms/farms.service';
import { createUser } from '../packages/server/src/modules/users/users.service';
import { DEMO_PASSWORD, demoApprentice, demoCoop, demoFarms } from './demo-coop';

export async function loadDemoCoop(): Promise<'loaded' | 'already-present'> {
  if (await findPublicCoop(demoCoop.slug)) return 'already-present';
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await createCooperative(demoCoop, async (coop, tx) => {
    const userIds = new Map<string, { id: string; farmId: string }>();
    for (const farm of demoFarms) {
      const created = await createFarm(coop.id, farm.profile, tx);
      for (const person of farm.people) {
        const user = await createUser({ coopId: coop.id, farmId: created.id, ...person, passwordHash }, tx);
        userIds.set(person.email, { id: user.id, farmId: created.id });
      }
    }
    const mentor = userIds.get(demoApprentice.mentorEmail)!;
    await createUser(
      { coopId: coop.id, farmId: mentor.farmId, mentorId: mentor.id, email: demoApprentice.email, name: demoApprentice.name, role: 'apprentice', passwordHash },
      tx,
    );
  });
  return 'loaded';
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
