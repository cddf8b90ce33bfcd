import { randomUUID } from 'node:crypto';
import { inject } from 'vitest';
import type { ApplicationInput, Role } from '@burrowline/shared';
import { loadConfig } from '../../packages/server/src/config/env';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { configureMailer } from '../../packages/server/src/lib/mailer';
import { withTenant } from '../../packages/server/src/db/tenant';
import { submitApplication } from '../../packages/server/src/modules/applications/applications.service';
import { inviteMember } from '../../packages/server/src/modules/members/members.service';
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

/** A complete, valid application form body with a unique e-mail and a fresh idempotency key. */
export function applicationBody(overrides: Partial<ApplicationInput> = {}): ApplicationInput {
  const tag = randomUUID().slice(0, 8);
  return {
    idempotencyKey: randomUUID(),
    applicantName: `Wren Applicant ${tag}`,
    email: `applicant-${tag}@example.test`,
    phone: '555-0142',
    farmName: `Bramblegate ${tag}`,
    location: 'Bramble Lane, Tamsin County',
    timeZone: 'America/Chicago',
    breedsKept: ['New Zealand', 'Californian'],
    does: 6,
    bucks: 2,
    quarantinePractice: 'New animals live in a separate shed for 30 days before they meet the herd; I use separate gloves and feeders.',
    diseaseLastYear: 'no',
    diseaseDetails: '',
    sharing: ['bucks', 'processing_days'],
    sharingNotes: 'Happy to lend my Californian buck in spring.',
    agreeToRules: true,
    ...overrides,
  };
}

/** Services compose e-mail with the configured sender (its domain names the Message-ID), even before a test has built an app. */
function connectServicesForFactories() {
  connectDatabase(process.env.DATABASE_URL!);
  configureMailer(loadConfig().smtp);
}

/** A pending application in the co-op, submitted through the service (no HTTP rate limit in the way). */
export async function createTestApplication(coop: { slug: string }, overrides: Partial<ApplicationInput> = {}) {
  connectServicesForFactories();
  const input = applicationBody(overrides);
  const { receipt } = await submitApplication(coop.slug, input, { appUrl: 'http://127.0.0.1:3000', ip: null });
  return { ...receipt, input };
}

/** One more member of farm B with the shared test password: a target whose role or account a test may change. */
export async function createTestMember(coop: TestCoop, opts: { role?: Role; farmIndex?: number } = {}): Promise<TestPerson> {
  connectDatabase(process.env.DATABASE_URL!);
  const passwordHash = inject('passwordHash');
  const email = `${unique('extra')}@example.test`;
  const role = opts.role ?? 'member';
  const farmId = coop.farms[opts.farmIndex ?? 1]!.id;
  const user = await withTenant({ coopId: coop.id }, (tx) =>
    createUser({ coopId: coop.id, farmId, email, name: `Extra ${email.slice(6, 14)}`, role, passwordHash }, tx),
  );
  return { id: user.id, email, name: user.name, role, farmId, coopId: coop.id };
}

/** Someone admitted who has not set a password yet (an approved applicant, say). */
export async function createAwaitingMember(coop: TestCoop): Promise<TestPerson> {
  connectDatabase(process.env.DATABASE_URL!);
  const email = `${unique('awaiting')}@example.test`;
  const user = await withTenant({ coopId: coop.id }, (tx) =>
    createUser({ coopId: coop.id, farmId: coop.farms[1]!.id, email, name: `Awaiting ${email.slice(9, 17)}`, role: 'member', passwordHash: null }, tx),
  );
  return { id: user.id, email, name: user.name, role: 'member', farmId: user.farmId, coopId: coop.id };
}

/** A pending invitation sent by the co-op's admin, through the service (it e-mails the invitee). */
export async function createTestInvitee(coop: TestCoop): Promise<TestPerson> {
  connectServicesForFactories();
  const tag = randomUUID().slice(0, 8);
  const actor = { ...coop.admin, mentorId: null };
  const email = `invitee-${tag}@example.test`;
  const member = await inviteMember(
    actor,
    { name: `Invitee ${tag}`, email, role: 'member', farm: { kind: 'new', name: `Invited Farm ${tag}`, location: 'Test County', timeZone: 'America/Chicago', breedsKept: [] } },
    { appUrl: 'http://127.0.0.1:3000', linkTtlHours: 72, ip: null },
  );
  return { id: member.id, email, name: member.name, role: 'member', farmId: null, coopId: coop.id };
}
