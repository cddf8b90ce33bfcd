import { describe, expect, it } from 'vitest';
import type { Role } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { authorize, ensureCan, farmOf, refuseOrConfirm, type FarmRecord } from './farm-access';

const coopId = 'coop-1';
const owning = 'farm-owning';
const keeping = 'farm-keeping';
const third = 'farm-third';

function person(farmId: string | null, role: Role = 'member', overrides: Partial<SessionUser> = {}): SessionUser {
  return { id: `user-${farmId}-${role}`, coopId, farmId, mentorId: null, email: `${role}@${farmId}.test`, name: role, role, ...overrides };
}

/** The status `fn` is refused with, or 'allowed'. */
function outcome(fn: () => void): number | 'allowed' {
  try {
    fn();
    return 'allowed';
  } catch (error) {
    if (error instanceof AppError) return error.status;
    throw error;
  }
}

/** A group kept by the owning farm and shared with a second farm (as a loan or a booking will be). */
const sharedGroup: FarmRecord = { subject: 'GrowOutGroup', fields: { farmId: owning }, farmIds: [owning, keeping], what: 'That group' };
/** A buck the owning farm lent to the keeping farm, checked as a farm-private record (no co-op-wide card). */
const lentBuck: FarmRecord = {
  subject: 'Animal', fields: { owningFarmId: owning, keepingFarmId: keeping }, farmIds: [owning, keeping], what: 'That animal',
};

describe('authorize: one farm access check for records of several farms', () => {
  it('when a member of the owning farm changes its record, then it is allowed', () => {
    expect(outcome(() => authorize(person(owning), 'update', sharedGroup))).toBe('allowed');
    expect(outcome(() => authorize(person(owning), 'lend', lentBuck))).toBe('allowed');
  });

  it('when the record belongs to two farms, then both farms see it exist: the second farm reads the lent buck and is refused a change with 403', () => {
    expect(outcome(() => authorize(person(keeping), 'read', lentBuck))).toBe('allowed');
    expect(outcome(() => authorize(person(keeping), 'update', lentBuck))).toBe(403);
    expect(outcome(() => authorize(person(keeping), 'update', sharedGroup))).toBe(403);
  });

  it('when a third farm of the same co-op asks for a record of two other farms, then it does not exist for it (404)', () => {
    expect(outcome(() => authorize(person(third), 'read', lentBuck))).toBe(404);
    expect(outcome(() => authorize(person(third), 'update', sharedGroup))).toBe(404);
    expect(outcome(() => authorize(person(third, 'admin'), 'read', sharedGroup))).toBe(404);
  });

  it("when an apprentice of the owning farm changes a record they may read, then it is a 403 with the reason given", () => {
    const apprentice = person(owning, 'apprentice', { mentorId: 'mentor-1' });
    expect(outcome(() => authorize(apprentice, 'read', sharedGroup))).toBe('allowed');
    expect(outcome(() => authorize(apprentice, 'update', sharedGroup, 'Only members of the farm close groups'))).toBe(403);
    expect(() => authorize(apprentice, 'update', sharedGroup, 'Only members of the farm close groups')).toThrow('Only members of the farm close groups');
  });

  it("when the record is another co-op's, then it is a 404 even for a member of a farm with the same id", () => {
    expect(outcome(() => authorize(person(owning), 'read', { ...sharedGroup, coopId: 'coop-2' }))).toBe(404);
  });

  it('when the whole co-op knows the record (a pedigree card), then a third farm is refused a change with 403, not 404', () => {
    expect(outcome(() => authorize(person(third), 'update', { ...lentBuck, knownToCoop: true }))).toBe(403);
  });

  it('when ensureCan checks a one-farm record, then its own farm is refused with 403 and another farm gets 404', () => {
    const apprentice = person(owning, 'apprentice', { mentorId: 'mentor-1' });
    expect(outcome(() => ensureCan(apprentice, 'create', 'Service', { farmId: owning }, 'That service'))).toBe(403);
    expect(outcome(() => ensureCan(person(third), 'read', 'Service', { farmId: owning }, 'That service'))).toBe(404);
    expect(outcome(() => ensureCan(person(owning), 'create', 'Service', { farmId: owning }, 'That service'))).toBe('allowed');
  });

  it('when someone of no farm works on farm records, then farmOf refuses with 403', () => {
    expect(outcome(() => farmOf(person(null, 'admin')))).toBe(403);
    expect(farmOf(person(owning))).toBe(owning);
  });
});

describe('refuseOrConfirm', () => {
  it('when there are errors, then nothing is saved (400); when only warnings, then confirmation is asked (422) until given', () => {
    expect(outcome(() => refuseOrConfirm({ tattoo: ['Taken'] }, {}, true))).toBe(400);
    expect(outcome(() => refuseOrConfirm({}, { birthDate: ['Young parent'] }, false))).toBe(422);
    expect(outcome(() => refuseOrConfirm({}, { birthDate: ['Young parent'] }, true))).toBe('allowed');
    expect(outcome(() => refuseOrConfirm({}, {}, undefined))).toBe('allowed');
  });
});
