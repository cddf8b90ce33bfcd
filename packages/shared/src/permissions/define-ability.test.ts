import { describe, expect, it } from 'vitest';
import { defineAbilityFor, subjectOf, type AbilityUser } from './define-ability';

const coopId = 'coop-1';
const farmId = 'farm-1';
const admin: AbilityUser = { id: 'u-admin', coopId, role: 'admin', farmId: 'farm-admin', mentorId: null };
const member: AbilityUser = { id: 'u-member', coopId, role: 'member', farmId, mentorId: null };
const apprentice: AbilityUser = { id: 'u-app', coopId, role: 'apprentice', farmId, mentorId: 'u-member' };

const own = (type: Parameters<typeof subjectOf>[0], extra: Record<string, unknown> = {}) => subjectOf(type, { coopId, farmId, ...extra });
const otherFarm = (type: Parameters<typeof subjectOf>[0]) => subjectOf(type, { coopId, farmId: 'farm-2' });
/** Animal subjects name the owning and the keeping farm (they differ while an animal is lent). */
const animal = (owningFarmId: string, keepingFarmId = owningFarmId, inCoop = coopId) => subjectOf('Animal', { coopId: inCoop, owningFarmId, keepingFarmId });
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
      expect(a.can(action, animal(farmId))).toBe(true);
      expect(a.can(action, animal('farm-2'))).toBe(false);
    }
    expect(a.can('read', own('PedigreeCard'))).toBe(true);
    expect(a.can('read', otherFarm('PedigreeCard'))).toBe(true);
    expect(a.can('read', otherCoop('PedigreeCard'))).toBe(false);
    expect(a.can('create', subjectOf('Loan', { coopId }))).toBe(true);
    expect(a.can('book', subjectOf('ProcessingDay', { coopId }))).toBe(true);
    // A mentor reviews her own apprentices' chores; a farm-mate's apprentice is her mentor's to review.
    expect(a.can('review', own('ChoreLog', { mentorId: member.id }))).toBe(true);
    expect(a.can('review', own('ChoreLog', { mentorId: 'u-other-member' }))).toBe(false);
    expect(a.can('review', subjectOf('SkillRecord', { coopId, apprenticeId: apprentice.id, mentorId: member.id }))).toBe(true);
    expect(a.can('review', subjectOf('SkillRecord', { coopId, apprenticeId: 'u-app-2', mentorId: 'u-other-member' }))).toBe(false);
    expect(a.can('manage', subjectOf('MentorshipSettings', { coopId }))).toBe(false);
    expect(a.can('read', own('Money'))).toBe(true);
    expect(a.can('manage', subjectOf('Application', { coopId }))).toBe(false);
    expect(a.can('manage', subjectOf('Membership', { coopId }))).toBe(false);
    expect(a.can('read', subjectOf('AuditEvent', { coopId }))).toBe(false);
    expect(a.can('update', subjectOf('User', { id: 'u-other', coopId }), 'role')).toBe(false);
    expect(a.can('update', subjectOf('User', { id: 'u-other', coopId }), 'disabled')).toBe(false);
    expect(a.can('create', subjectOf('User', { coopId }))).toBe(false);
    expect(a.can('update', subjectOf('Coop', { id: coopId }))).toBe(false);
    expect(a.can('read', subjectOf('Ledger', { coopId }))).toBe(false);
    expect(a.can('moderate', subjectOf('ChatMessage', { coopId }))).toBe(false);
    expect(a.can('create', subjectOf('ChatMessage', { coopId }))).toBe(true);
  });

  it('when an apprentice, then they read the mentor\'s herd and log chores, but never sell, lend, book, approve or see money', () => {
    const a = defineAbilityFor(apprentice);
    expect(a.can('read', animal(farmId))).toBe(true);
    expect(a.can('update', animal(farmId))).toBe(false);
    expect(a.can('read', animal('farm-2'))).toBe(false);
    expect(a.can('create', own('ChoreLog', { authorId: apprentice.id }))).toBe(true);
    expect(a.can('create', own('ChoreLog', { authorId: 'someone-else' }))).toBe(false);
    expect(a.can('review', own('ChoreLog', { authorId: apprentice.id }))).toBe(false);
    expect(a.can('read', subjectOf('SkillRecord', { coopId, apprenticeId: apprentice.id, mentorId: 'u-member' }))).toBe(true);
    expect(a.can('review', subjectOf('SkillRecord', { coopId, apprenticeId: apprentice.id, mentorId: 'u-member' }))).toBe(false);
    for (const [action, type] of [
      ['trade', 'Animal'], ['lend', 'Animal'], ['create', 'Trade'], ['create', 'Loan'], ['book', 'ProcessingDay'],
      ['manage', 'Application'], ['manage', 'Membership'], ['read', 'AuditEvent'], ['create', 'User'],
      ['read', 'Money'], ['read', 'Ledger'], ['update', 'Farm'],
    ] as const) {
      expect(a.can(action, own(type, { id: farmId }))).toBe(false);
    }
    expect(a.can('create', subjectOf('ChatMessage', { coopId }))).toBe(true);
  });

  it('when a loan of a buck is between two farms, then their members act on it, their apprentices only read it, and a third farm neither', () => {
    const loan = (ownerFarmId: string, borrowerFarmId: string) => subjectOf('Loan', { coopId, ownerFarmId, borrowerFarmId });
    const m = defineAbilityFor(member);
    const app = defineAbilityFor(apprentice);
    for (const subject of [loan(farmId, 'farm-2'), loan('farm-2', farmId)]) {
      expect(m.can('update', subject)).toBe(true);
      expect(app.can('read', subject)).toBe(true);
      expect(app.can('update', subject)).toBe(false);
    }
    expect(m.can('read', loan('farm-2', 'farm-3'))).toBe(false);
    expect(app.can('read', loan('farm-2', 'farm-3'))).toBe(false);
    expect(defineAbilityFor(admin).can('read', loan('farm-2', 'farm-3'))).toBe(false);
    expect(m.can('manage', own('StudListing'))).toBe(true);
    expect(app.can('update', own('StudListing'))).toBe(false);
    expect(app.can('read', own('StudListing'))).toBe(true);
  });

  it('when an admin, then co-op powers on top of their own farm, but no editing of other farms\' herds', () => {
    const a = defineAbilityFor(admin);
    expect(a.can('manage', subjectOf('Application', { coopId }))).toBe(true);
    expect(a.can('manage', subjectOf('Application', { coopId: 'coop-2' }))).toBe(false);
    expect(a.can('update', subjectOf('Coop', { id: coopId }))).toBe(true);
    expect(a.can('update', subjectOf('User', { id: 'u-member', coopId }), 'role')).toBe(true);
    expect(a.can('update', subjectOf('User', { id: admin.id, coopId }), 'role')).toBe(false);
    expect(a.can('update', subjectOf('User', { id: admin.id, coopId }), 'disabled')).toBe(false);
    expect(a.can('update', subjectOf('User', { id: 'u-member', coopId: 'coop-2' }), 'role')).toBe(false);
    expect(a.can('manage', subjectOf('Membership', { coopId }))).toBe(true);
    expect(a.can('manage', subjectOf('Membership', { coopId: 'coop-2' }))).toBe(false);
    expect(a.can('create', subjectOf('User', { coopId }))).toBe(true);
    expect(a.can('read', subjectOf('Ledger', { coopId }))).toBe(true);
    expect(a.can('read', subjectOf('AuditEvent', { coopId }))).toBe(true);
    expect(a.can('moderate', subjectOf('ChatMessage', { coopId }))).toBe(true);
    expect(a.can('manage', subjectOf('ProcessingDay', { coopId }))).toBe(true);
    expect(a.can('update', animal('farm-2'))).toBe(false);
    expect(a.can('read', animal('farm-2'))).toBe(false);
    expect(a.can('update', subjectOf('Farm', { id: 'farm-2', coopId }))).toBe(false);
    expect(a.can('manage', animal('farm-admin'))).toBe(true);
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

describe('defineAbilityFor: the Herd', () => {
  const weighIn = (farm: string, enteredBy: string) => subjectOf('WeighIn', { coopId, farmId: farm, enteredBy });
  const note = (farm: string, enteredBy: string) => subjectOf('AnimalNote', { coopId, farmId: farm, enteredBy });

  it('when a member, then their farm\'s animals are theirs to edit, a lent-in animal is readable but not editable', () => {
    const a = defineAbilityFor(member);
    expect(a.can('update', animal(farmId))).toBe(true);
    expect(a.can('update', animal(farmId, 'farm-2'))).toBe(true); // theirs, lent out
    expect(a.can('read', animal('farm-2', farmId))).toBe(true); // on loan here
    expect(a.can('update', animal('farm-2', farmId))).toBe(false);
    expect(a.can('read', animal('farm-2'))).toBe(false); // others' herds: pedigree cards only
    expect(a.can('read', subjectOf('PedigreeCard', { coopId }))).toBe(true);
    expect(a.can('create', weighIn(farmId, member.id))).toBe(true);
    expect(a.can('review', weighIn(farmId, apprentice.id))).toBe(true);
    expect(a.can('review', weighIn('farm-2', 'x'))).toBe(false);
    // Only the apprentice's own mentor reviews her entries, not another member of the farm.
    for (const type of ['WeighIn', 'AnimalNote', 'LitterEvent', 'AlmanacTask'] as const) {
      expect(a.can('review', subjectOf(type, { coopId, farmId, enteredBy: apprentice.id, mentorId: member.id }))).toBe(true);
      expect(a.can('review', subjectOf(type, { coopId, farmId, enteredBy: 'u-app-2', mentorId: 'u-other-member' }))).toBe(false);
      expect(a.can('review', subjectOf(type, { coopId, farmId, enteredBy: member.id, mentorId: null }))).toBe(false);
    }
    expect(a.can('create', subjectOf('OutsideAnimal', { coopId }))).toBe(true);
    expect(a.can('merge', subjectOf('OutsideAnimal', { coopId }))).toBe(false);
    expect(a.can('create', subjectOf('Breed', { coopId }))).toBe(false);
    expect(a.can('read', subjectOf('Breed', { coopId: null }))).toBe(true);
  });

  it('when an apprentice, then they read the mentor\'s herd and add only their own weigh-ins and notes, never review them', () => {
    const a = defineAbilityFor(apprentice);
    expect(a.can('read', animal(farmId))).toBe(true);
    expect(a.can('create', animal(farmId))).toBe(false);
    expect(a.can('create', weighIn(farmId, apprentice.id))).toBe(true);
    expect(a.can('create', weighIn(farmId, member.id))).toBe(false);
    expect(a.can('create', note(farmId, apprentice.id))).toBe(true);
    expect(a.can('create', weighIn('farm-2', apprentice.id))).toBe(false);
    expect(a.can('review', weighIn(farmId, apprentice.id))).toBe(false);
    expect(a.can('create', subjectOf('OutsideAnimal', { coopId }))).toBe(false);
  });

  it('when an admin, then they add breeds and merge outside duplicates for their co-op, but edit no other farm\'s animals', () => {
    const a = defineAbilityFor(admin);
    expect(a.can('create', subjectOf('Breed', { coopId }))).toBe(true);
    expect(a.can('create', subjectOf('Breed', { coopId: 'coop-2' }))).toBe(false);
    expect(a.can('merge', subjectOf('OutsideAnimal', { coopId }))).toBe(true);
    expect(a.can('merge', subjectOf('OutsideAnimal', { coopId: 'coop-2' }))).toBe(false);
    expect(a.can('update', animal(farmId))).toBe(false);
    expect(a.can('create', weighIn(farmId, admin.id))).toBe(false);
  });

  it('when of another co-op, then no animal, card or registry entry of this co-op is reachable', () => {
    const a = defineAbilityFor({ ...member, coopId: 'coop-2' });
    expect(a.can('read', subjectOf('PedigreeCard', { coopId }))).toBe(false);
    expect(a.can('read', subjectOf('OutsideAnimal', { coopId }))).toBe(false);
    expect(a.can('create', subjectOf('OutsideAnimal', { coopId }))).toBe(false);
  });
});

describe('defineAbilityFor: the Almanac and litters', () => {
  const almanacSubjects = ['CycleSettings', 'Service', 'Treatment', 'AlmanacTask', 'CalendarFeed', 'Litter', 'LitterEvent', 'HousingUnit'] as const;

  it('when a member, then they plan and record everything for their own farm, and nothing of another farm', () => {
    const a = defineAbilityFor(member);
    for (const type of almanacSubjects) {
      for (const action of ['create', 'read', 'update', 'review'] as const) {
        expect(a.can(action, own(type))).toBe(true);
        expect(a.can(action, otherFarm(type))).toBe(false);
      }
    }
    expect(a.can('complete', own('AlmanacTask'))).toBe(true);
    expect(a.can('complete', otherFarm('AlmanacTask'))).toBe(false);
    expect(a.can('manage', subjectOf('DigestSubscription', { userId: member.id }))).toBe(true);
    expect(a.can('manage', subjectOf('DigestSubscription', { userId: 'u-other' }))).toBe(false);
  });

  it('when an apprentice, then they read the mentor\'s Almanac, tick tasks and record litter counts of their own, but plan nothing', () => {
    const a = defineAbilityFor(apprentice);
    for (const type of ['CycleSettings', 'Service', 'Treatment', 'AlmanacTask', 'Litter', 'LitterEvent', 'HousingUnit'] as const) {
      expect(a.can('read', own(type))).toBe(true);
      expect(a.can('read', otherFarm(type))).toBe(false);
    }
    expect(a.can('complete', own('AlmanacTask'))).toBe(true);
    expect(a.can('update', own('AlmanacTask'))).toBe(false);
    expect(a.can('review', own('AlmanacTask'))).toBe(false);
    expect(a.can('create', own('LitterEvent', { enteredBy: apprentice.id }))).toBe(true);
    expect(a.can('create', own('LitterEvent', { enteredBy: 'u-member' }))).toBe(false);
    expect(a.can('review', own('LitterEvent', { enteredBy: 'u-member' }))).toBe(false);
    for (const type of ['Service', 'Litter', 'CycleSettings', 'Treatment', 'HousingUnit'] as const) {
      expect(a.can('create', own(type))).toBe(false);
      expect(a.can('update', own(type))).toBe(false);
    }
    expect(a.can('read', own('CalendarFeed'))).toBe(false);
    expect(a.can('create', own('CalendarFeed'))).toBe(false);
    expect(a.can('manage', subjectOf('DigestSubscription', { userId: apprentice.id }))).toBe(true);
  });

  it('when an admin, then co-op powers give no rights on another farm\'s Almanac', () => {
    const a = defineAbilityFor(admin);
    for (const type of almanacSubjects) {
      expect(a.can('read', subjectOf(type, { coopId, farmId: 'farm-admin' }))).toBe(true);
      expect(a.can('read', otherFarm(type))).toBe(false);
      expect(a.can('update', otherFarm(type))).toBe(false);
    }
  });
});

describe('defineAbilityFor: herd files', () => {
  it('when a member, then they stage and confirm imports for their own farm only', () => {
    const a = defineAbilityFor(member);
    for (const action of ['create', 'read', 'update'] as const) {
      expect(a.can(action, own('HerdImport'))).toBe(true);
      expect(a.can(action, otherFarm('HerdImport'))).toBe(false);
    }
  });

  it('when an apprentice, then they import nothing (they read the herd, they add no animals)', () => {
    const a = defineAbilityFor(apprentice);
    for (const action of ['create', 'read', 'update'] as const) expect(a.can(action, own('HerdImport'))).toBe(false);
  });

  it('when an admin, then imports stay with their own farm', () => {
    const a = defineAbilityFor(admin);
    expect(a.can('create', subjectOf('HerdImport', { coopId, farmId: 'farm-admin' }))).toBe(true);
    expect(a.can('read', own('HerdImport'))).toBe(false);
  });
});

describe('defineAbilityFor: a lent animal\'s private records belong to the farm that recorded them', () => {
  const lender: AbilityUser = member;
  const borrower: AbilityUser = { id: 'u-borrower', coopId, role: 'member', farmId: 'farm-2', mentorId: null };
  const borrowersApprentice: AbilityUser = { id: 'u-b-app', coopId, role: 'apprentice', farmId: 'farm-2', mentorId: 'u-borrower' };
  const privateTypes = ['WeighIn', 'AnimalNote', 'Photo', 'Treatment'] as const;
  /** A record of the buck that farm-1 owns, recorded by `recordedBy` (`byAnOwner`: that farm owned the buck then). */
  const record = (type: (typeof privateTypes)[number], recordedBy: string, byAnOwner = recordedBy === farmId) =>
    subjectOf(type, { coopId, farmId: recordedBy, animalOwningFarmId: farmId, byAnOwner });

  it('when the buck is lent out, then the borrower reads the buck and its own records, never the lender\'s notes, weights, photos, treatments or papers', () => {
    for (const person of [borrower, borrowersApprentice]) {
      const a = defineAbilityFor(person);
      expect(a.can('read', animal(farmId, 'farm-2'))).toBe(true);
      expect(a.can('read', animal(farmId, 'farm-2'), 'notes')).toBe(false);
      expect(a.can('read', animal(farmId, 'farm-2'), 'certificate')).toBe(false);
      for (const type of privateTypes) {
        expect(a.can('read', record(type, farmId)), `${person.role} reads the lender's ${type}`).toBe(false);
        expect(a.can('read', record(type, 'farm-2')), `${person.role} reads its own ${type}`).toBe(true);
      }
    }
  });

  it('when the buck is lent out or back home, then the lender reads its own records and papers, never what the borrower recorded', () => {
    for (const person of [lender, apprentice]) {
      const a = defineAbilityFor(person);
      for (const buck of [animal(farmId, 'farm-2'), animal(farmId)]) {
        expect(a.can('read', buck, 'notes')).toBe(true);
        expect(a.can('read', buck, 'certificate')).toBe(true);
      }
      for (const type of privateTypes) {
        expect(a.can('read', record(type, farmId)), `${person.role} reads its own ${type}`).toBe(true);
        expect(a.can('read', record(type, 'farm-2')), `${person.role} reads the borrower's ${type}`).toBe(false);
      }
    }
  });

  it('when an animal was sold to the farm, then the buyer reads the history its former owners recorded, not a former borrower\'s', () => {
    const buyer = defineAbilityFor(borrower);
    const sold = (type: (typeof privateTypes)[number], recordedBy: string, byAnOwner: boolean) =>
      subjectOf(type, { coopId, farmId: recordedBy, animalOwningFarmId: 'farm-2', byAnOwner });
    for (const type of ['WeighIn', 'AnimalNote', 'Photo'] as const) {
      expect(buyer.can('read', sold(type, farmId, true))).toBe(true);
      expect(buyer.can('read', sold(type, 'farm-3', false))).toBe(false);
    }
    expect(buyer.can('read', animal('farm-2'), 'notes')).toBe(true);
  });
});

describe('defineAbilityFor: processing days', () => {
  const day = (hostFarmId: string, hostMaySchedule: boolean) => subjectOf('ProcessingDay', { coopId, hostFarmId, hostMaySchedule });
  it('when a member of the site\'s host farm, then they host days there and schedule them only when the admin allows it', () => {
    const a = defineAbilityFor(member);
    expect(a.can('host', day(farmId, false))).toBe(true);
    expect(a.can('create', day(farmId, false))).toBe(false);
    expect(a.can('create', day(farmId, true))).toBe(true);
    expect(a.can('update', day(farmId, true))).toBe(true);
    expect(a.can('host', day('farm-2', true))).toBe(false);
    expect(a.can('create', day('farm-2', true))).toBe(false);
  });

  it('when a member, then they book for their own farm only; the admin for any farm; the apprentice reads its bookings and books none', () => {
    expect(defineAbilityFor(member).can('manage', own('ProcessingBooking'))).toBe(true);
    expect(defineAbilityFor(member).can('manage', otherFarm('ProcessingBooking'))).toBe(false);
    expect(defineAbilityFor(admin).can('manage', otherFarm('ProcessingBooking'))).toBe(true);
    expect(defineAbilityFor(admin).can('host', day('farm-2', false))).toBe(true);
    expect(defineAbilityFor(admin).can('manage', otherCoop('ProcessingBooking'))).toBe(false);
    const a = defineAbilityFor(apprentice);
    expect(a.can('read', own('ProcessingBooking'))).toBe(true);
    expect(a.can('create', own('ProcessingBooking'))).toBe(false);
    expect(a.can('book', subjectOf('ProcessingDay', { coopId }))).toBe(false);
    expect(a.can('host', day(farmId, true))).toBe(false);
  });
});
