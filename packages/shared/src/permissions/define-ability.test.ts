import { describe, expect, it } from 'vitest';
import { defineAbilityFor, subjectOf, type AbilityUser } from './define-ability';

const coopId = 'coop-1';
const farmId = 'farm-1';
const admin: AbilityUser = { id: 'u-admin', coopId, role: 'admin', farmId: 'farm-admin', mentorId: null };
const member: AbilityUser = { id: 'u-member', coopId, role: 'member', farmId, mentorId: null };
const apprentice: AbilityUser = { id: 'u-app', coopId, role: 'apprentice', farmId, mentorId: 'u-member' };

const own = (type: Parameters<typeof subjectOf>[0], extra: Record<string, unknown> = {}) => subjectOf(type, { coopId, farmId, ...extra });
const otherFarm = (type: Parameters<typeof subjectOf>[0]) => subjectOf(type, { coopId, farmId: 'farm-2' });
const otherCoop = (type: Parameters<typeof subjectOf>[0]) => subjectOf(type, { coopId: 'coop-2', farmId: 'farm-9', id: 'coop-2' });

describe('defineAbilityFor (the brief\'s role table)', () => {
  it('when signed out, then nothing is allowed', () => {
    const ability = defineAbilityFor(null);
    expect(ability.can('read', 'Farm')).toBe(false);
    expect(ability.rules).toEqual([]);
  });

  it('when a member, then everything about their own farm\'s herd, and only pedigree cards elsewhere', () => {
    const a = defineAbilityFor(member);
    expect(a.can('update', subjectOf('Farm', { id: farmId, coopId }))).toBe(true);
    expect(a.can('update', subjectOf('Farm', { id: 'farm-2', coopId }))).toBe(false);
    for (const action of ['create', 'read', 'update', 'delete', 'lend', 'trade'] as const) {
      expect(a.can(action, own('Animal'))).toBe(true);
      expect(a.can(action, otherFarm('Animal'))).toBe(false);
    }
    expect(a.can('read', own('PedigreeCard'))).toBe(true);
    expect(a.can('read', otherFarm('PedigreeCard'))).toBe(true);
    expect(a.can('read', otherCoop('PedigreeCard'))).toBe(false);
    expect(a.can('create', subjectOf('Loan', { coopId }))).toBe(true);
    expect(a.can('book', subjectOf('ProcessingDay', { coopId }))).toBe(true);
    expect(a.can('review', own('ChoreLog'))).toBe(true);
    expect(a.can('read', own('Money'))).toBe(true);
    expect(a.can('manage', subjectOf('Application', { coopId }))).toBe(false);
    expect(a.can('read', subjectOf('Ledger', { coopId }))).toBe(false);
    expect(a.can('moderate', subjectOf('ChatMessage', { coopId }))).toBe(false);
    expect(a.can('create', subjectOf('ChatMessage', { coopId }))).toBe(true);
  });

  it('when an apprentice, then they read the mentor\'s herd and log chores, but never sell, lend, book, approve or see money', () => {
    const a = defineAbilityFor(apprentice);
    expect(a.can('read', own('Animal'))).toBe(true);
    expect(a.can('update', own('Animal'))).toBe(false);
    expect(a.can('read', otherFarm('Animal'))).toBe(false);
    expect(a.can('create', own('ChoreLog', { authorId: apprentice.id }))).toBe(true);
    expect(a.can('create', own('ChoreLog', { authorId: 'someone-else' }))).toBe(false);
    expect(a.can('review', own('ChoreLog', { authorId: apprentice.id }))).toBe(false);
    for (const [action, type] of [
      ['trade', 'Animal'], ['lend', 'Animal'], ['create', 'Trade'], ['create', 'Loan'], ['book', 'ProcessingDay'],
      ['manage', 'Application'], ['read', 'Money'], ['read', 'Ledger'], ['update', 'Farm'],
    ] as const) {
      expect(a.can(action, own(type, { id: farmId }))).toBe(false);
    }
    expect(a.can('create', subjectOf('ChatMessage', { coopId }))).toBe(true);
  });

  it('when an admin, then co-op powers on top of their own farm, but no editing of other farms\' herds', () => {
    const a = defineAbilityFor(admin);
    expect(a.can('manage', subjectOf('Application', { coopId }))).toBe(true);
    expect(a.can('manage', subjectOf('Application', { coopId: 'coop-2' }))).toBe(false);
    expect(a.can('update', subjectOf('Coop', { id: coopId }))).toBe(true);
    expect(a.can('update', subjectOf('User', { id: 'u-member', coopId }), 'role')).toBe(true);
    expect(a.can('update', subjectOf('User', { id: admin.id, coopId }), 'role')).toBe(false);
    expect(a.can('read', subjectOf('Ledger', { coopId }))).toBe(true);
    expect(a.can('read', subjectOf('AuditEvent', { coopId }))).toBe(true);
    expect(a.can('moderate', subjectOf('ChatMessage', { coopId }))).toBe(true);
    expect(a.can('manage', subjectOf('ProcessingDay', { coopId }))).toBe(true);
    expect(a.can('update', otherFarm('Animal'))).toBe(false);
    expect(a.can('update', subjectOf('Farm', { id: 'farm-2', coopId }))).toBe(false);
    expect(a.can('manage', subjectOf('Animal', { coopId, farmId: 'farm-admin' }))).toBe(true);
  });

  it('when anyone of another co-op, then nothing of this co-op is readable', () => {
    for (const user of [admin, member, apprentice]) {
      const a = defineAbilityFor({ ...user, coopId: 'coop-2' });
      expect(a.can('read', subjectOf('Farm', { id: farmId, coopId }))).toBe(false);
      expect(a.can('read', subjectOf('Coop', { id: coopId }))).toBe(false);
      expect(a.can('read', subjectOf('User', { coopId }))).toBe(false);
    }
  });
});
