import { randomUUID } from 'node:crypto';
import { inject } from 'vitest';
import type { Role } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/db/sequelize';
import { createCooperative } from '../../packages/server/src/modules/coops/coops.service';
import { createFarm } from '../../packages/server/src/modules/farms/farms.service';
import { createUser } from '../../packages/server/src/modules/users/users.service';
import { TEST_PASSWORD } from './global-setup';

export { TEST_PASSWORD };

export interface TestPerson {
  id: string;
  email: string;
  name: string;
  role: Role;
  farmId: string | null;
  coopId: string;
}

export interface TestCoop {
  id: string;
  slug: string;
  name: string;
  farms: { id: string; name: string }[];
  /** admin of farm 0; member of farm 0 beside the admin; member of farm 1; apprentice under the farm-0 member. */
  admin: TestPerson;
  member: TestPerson;
  otherFarmMember: TestPerson;
  apprentice: TestPerson;
}

function unique(label: string) {
  return `${label}-${randomUUID().slice(0, 8)}`;
}

/** A fresh co-op of its own per test: two farms, an admin, two members and an apprentice. */
export async function createTestCoop(opts: { name?: string } = {}): Promise<TestCoop> {
  connectDatabase(process.env.DATABASE_URL!);
  const passwordHash = inject('passwordHash');
  const slug = unique('coop');
  return createCooperative({ name: opts.name ?? `Test Co-op ${slug}`, slug }, async (coop, tx) => {
    const farms: { id: string; name: string }[] = [];
    for (const name of [unique('Farm A'), unique('Farm B')]) {
      const farm = await createFarm(
        coop.id,
        { name, location: 'Test County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: ['New Zealand'], description: '' },
        tx,
      );
      farms.push({ id: farm.id, name: farm.name });
    }
    const person = async (role: Role, farmIndex: number, mentorId: string | null = null): Promise<TestPerson> => {
      const email = `${unique(role)}@example.test`;
      const user = await createUser(
        { coopId: coop.id, farmId: farms[farmIndex]!.id, mentorId, email, name: `${role} ${email.slice(0, 12)}`, role, passwordHash },
        tx,
      );
      return { id: user.id, email, name: user.name, role, farmId: user.farmId, coopId: coop.id };
    };
    const admin = await person('admin', 0);
    const member = await person('member', 0);
    const otherFarmMember = await person('member', 1);
    const apprentice = await person('apprentice', 0, member.id);
    return { id: coop.id, slug, name: coop.name, farms, admin, member, otherFarmMember, apprentice };
  });
}
