import { randomUUID } from 'node:crypto';
import { inject } from 'vitest';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { withTenant } from '../../packages/server/src/db/tenant';
import { createUser } from '../../packages/server/src/modules/users/users.service';
import { daysAgo } from './almanac';
import type { TestCoop, TestPerson } from './factories';
import { groupAs, grownLitterAs } from './grow-out';

/** One more apprentice on the mentor's farm, under that mentor, with the shared test password. */
export async function apprenticeOf(coop: TestCoop, mentor: TestPerson): Promise<TestPerson> {
  connectDatabase(process.env.DATABASE_URL!);
  const email = `apprentice-${randomUUID().slice(0, 12)}@example.test`;
  const user = await withTenant({ coopId: coop.id }, (tx) =>
    createUser({ coopId: coop.id, farmId: mentor.farmId, mentorId: mentor.id, email, name: `Apprentice ${email.slice(11, 17)}`, role: 'apprentice', passwordHash: inject('passwordHash') }, tx),
  );
  return { id: user.id, email, name: user.name, role: 'apprentice', farmId: mentor.farmId, coopId: coop.id };
}

/** A growing group of eight kits, 40 days old, on the member's farm (formed ten days ago). */
export async function growingGroupAs(member: TestPerson) {
  const { litter } = await grownLitterAs(member, 40, 8);
  return groupAs(member, { name: `Fryers ${randomUUID().slice(0, 4)}`, formedOn: daysAgo(10), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 8 }] });
}
