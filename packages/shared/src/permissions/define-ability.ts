import { AbilityBuilder, createMongoAbility, subject, type MongoAbility } from '@casl/ability';

export const roles = ['admin', 'member', 'apprentice'] as const;
export type Role = (typeof roles)[number];

export type Action =
  | 'manage'
  | 'create'
  | 'read'
  | 'update'
  | 'delete'
  | 'review'
  | 'moderate'
  | 'book'
  | 'lend'
  | 'trade'
  | 'merge'
  /** Ticking an Almanac task off (an apprentice's tick waits for the mentor's review). */
  | 'complete'
  /** Running a processing day at one's own site: check-in, yields of the day, closing it. */
  | 'host';

/**
 * Subjects of the brief's role table. `Money` stands for prices, costs, fees and balances;
 * apprentices never get it. `Membership` is the co-op's roster as its admin manages it (e-mails,
 * statuses, invitations, set-password links), beyond the directory everyone reads.
 */
export type SubjectName =
  | 'Coop'
  | 'Farm'
  | 'User'
  | 'Application'
  | 'Membership'
  | 'AuditEvent'
  | 'Animal'
  | 'PedigreeCard'
  | 'Breed'
  | 'OutsideAnimal'
  | 'WeighIn'
  | 'AnimalNote'
  /** An animal's photo: `{ farmId }` is the farm that took it, like the other private records. */
  | 'Photo'
  | 'HerdImport'
  // The Almanac and litters: farm-private, subjects carry { farmId }.
  | 'CycleSettings'
  | 'Service'
  | 'Treatment'
  | 'AlmanacTask'
  | 'CalendarFeed'
  | 'DigestSubscription'
  | 'Notification'
  | 'Litter'
  | 'LitterEvent'
  | 'HousingUnit'
  // Grow-out, feed, health and yield: farm-private, subjects carry { farmId }. Money in them
  // (prices, costs) is shown only to who can read 'Money'.
  | 'GrowOutGroup'
  | 'FeedRecord'
  | 'TemperatureReading'
  | 'ProcessingRecord'
  | 'Performance'
  | 'ChoreLog'
  /** An apprentice's skills and their sign-offs: `{ apprenticeId, mentorId, coopId }`. */
  | 'SkillRecord'
  /** The co-op's chore kinds, skills checklist and roster rule. */
  | 'MentorshipSettings'
  | 'StudListing'
  | 'Loan'
  | 'Trade'
  | 'ProcessingDay'
  /** A farm's booking of head on a processing day: { farmId }. */
  | 'ProcessingBooking'
  | 'Booking'
  | 'ChatMessage'
  | 'Money'
  | 'Ledger';

export type AppAbility = MongoAbility<[Action, SubjectName | Record<string, unknown>]>;

/** Tags a plain object (a row, a DTO) with its subject type so `ability.can` can match conditions. */
export function subjectOf(type: SubjectName, object: Record<string, unknown>): Record<string, unknown> {
  return subject(type, { ...object }) as Record<string, unknown>;
}

/**
 * The animal's fields only its owning farm reads: its own notes (prices, health remarks) and the pedigree
 * certificate it issues. A farm keeping a lent animal reads the rest of the record.
 */
export const ownerOnlyAnimalFields = ['notes', 'certificate'] as const;

/**
 * The private records of an animal (weigh-ins, notes, photos, treatments) belong to the farm that recorded
 * them, `{ farmId }`, never to whoever keeps the animal now: a borrower never reads the lender's, nor the
 * lender the borrower's. Subjects of such a record about an animal also carry `animalOwningFarmId` and
 * `byAnOwner` (the recording farm owned the animal), so a sold animal's history goes with it to the buyer.
 */
function privateRecordRules(can: AbilityBuilder<AppAbility>['can'], cannot: AbilityBuilder<AppAbility>['cannot'], farmId: string): void {
  can('read', ['WeighIn', 'AnimalNote', 'Photo', 'Treatment'], { farmId });
  can('read', ['WeighIn', 'AnimalNote', 'Photo'], { animalOwningFarmId: farmId, byAnOwner: true });
  cannot('read', 'Animal', [...ownerOnlyAnimalFields], { owningFarmId: { $ne: farmId } });
}

/** The facts about a signed-in person that permissions depend on. */
export interface AbilityUser {
  id: string;
  coopId: string;
  role: Role;
  farmId: string | null;
  mentorId: string | null;
}

/**
 * The single source of permissions (brief, "Who uses it"). Pure: the server enforces it, the client
 * uses the same rules only to shape menus and buttons.
 */
export function defineAbilityFor(user: AbilityUser | null): AppAbility {
  const { can, cannot, build } = new AbilityBuilder<AppAbility>(createMongoAbility);
  if (!user) return build();

  const { coopId, farmId } = user;

  // Everyone in the co-op
  can('read', 'Coop', { id: coopId });
  can('read', 'Farm', { coopId });
  can('read', 'User', { coopId });
  can('update', 'User', ['name'], { id: user.id });
  can('read', 'PedigreeCard', { coopId });
  // The catalogue has no co-op; row-level security shows a co-op only its own added breeds.
  can('read', 'Breed');
  can('read', 'OutsideAnimal', { coopId });
  can('read', 'ProcessingDay', { coopId });
  can('read', 'StudListing', { coopId });
  can('read', 'Trade', { coopId });
  can('create', 'ChatMessage', { coopId });
  can('read', 'ChatMessage', { coopId });

  if (user.role === 'apprentice') {
    // An apprentice works on the mentor's farm: reads it, logs chores that wait for review.
    if (farmId) {
      // Animal subjects: { owningFarmId, keepingFarmId } (a lent animal is kept by another farm).
      can('read', 'Animal', { owningFarmId: farmId });
      can('read', 'Animal', { keepingFarmId: farmId });
      // Weigh-ins and notes of their own that wait for the mentor's review.
      can('create', ['WeighIn', 'AnimalNote'], { farmId, enteredBy: user.id });
      can('read', ['WeighIn', 'AnimalNote'], { farmId });
      // Her own chore log and skills; she sends entries for review and corrects returned ones.
      can(['create', 'update'], 'ChoreLog', { farmId, authorId: user.id });
      can('read', 'ChoreLog', { farmId, authorId: user.id });
      can('read', 'SkillRecord', { apprenticeId: user.id });
      // The mentor's Almanac and litters: read all of it; tick tasks off and record litter counts, which
      // wait for the mentor's review. No planning (services, settings), no calendar feed, no fostering.
      can('read', ['CycleSettings', 'Service', 'Treatment', 'AlmanacTask', 'Litter', 'LitterEvent', 'HousingUnit'], { farmId });
      can('complete', 'AlmanacTask', { farmId });
      can('create', 'LitterEvent', { farmId, enteredBy: user.id });
      // Grow-out and results: read them (without money); weigh groups (pending review) and log the barn's temperature.
      can('read', ['GrowOutGroup', 'FeedRecord', 'TemperatureReading', 'ProcessingRecord', 'Performance'], { farmId });
      can('create', 'TemperatureReading', { farmId });
      can('read', 'ProcessingBooking', { farmId });
      // Stud Share: the loans of the mentor's farm (either side), to see who is away or visiting; never act on them.
      can('read', 'Loan', { ownerFarmId: farmId });
      can('read', 'Loan', { borrowerFarmId: farmId });
      privateRecordRules(can, cannot, farmId);
    }
    can('manage', 'DigestSubscription', { userId: user.id });
    can('manage', 'Notification', { userId: user.id });
    cannot('read', 'Money');
    cannot('read', 'Ledger');
    return build();
  }

  // Members (and admins, who are members of their own farm with co-op powers on top)
  if (farmId) {
    can('update', 'Farm', { id: farmId });
    // The owning farm has every right on its animals; a farm keeping a lent animal reads it and weighs it.
    can('manage', 'Animal', { owningFarmId: farmId });
    can('read', 'Animal', { keepingFarmId: farmId });
    can(['create', 'read', 'update', 'review'], ['WeighIn', 'AnimalNote'], { farmId });
    // A mentor reads and reviews her own apprentices' log and skills only, not another member's apprentices.
    can(['read', 'review'], 'ChoreLog', { farmId, mentorId: user.id });
    can(['read', 'review'], 'SkillRecord', { mentorId: user.id });
    can('manage', 'StudListing', { farmId });
    // Swap Board listings and offers of the farm: `{ farmId }` is the seller's farm on a listing, the
    // farm's side (seller or buyer) on an offer.
    can('manage', 'Trade', { farmId });
    // A loan belongs to both farms: the buck's owning farm and the one that asked for him (the service
    // decides which side may take which step).
    can(['read', 'update'], 'Loan', { ownerFarmId: farmId });
    can(['read', 'update'], 'Loan', { borrowerFarmId: farmId });
    can('lend', 'Animal', { owningFarmId: farmId });
    can('trade', 'Animal', { owningFarmId: farmId });
    can('read', 'Money', { farmId });
    // Spreadsheets staged for import into the farm's herd (apprentices read the herd but add no animals).
    can('manage', 'HerdImport', { farmId });
    // The farm's Almanac: cycle settings, services and palpations, treatments, tasks, the calendar feed,
    // litters and their kit-count events, housing. Other farms see none of it.
    can('manage', ['CycleSettings', 'Service', 'Treatment', 'AlmanacTask', 'CalendarFeed', 'Litter', 'LitterEvent', 'HousingUnit'], { farmId });
    // Grow-out groups, feed bought and given, temperature readings, processing records, performance tables.
    can('manage', ['GrowOutGroup', 'FeedRecord', 'TemperatureReading', 'ProcessingRecord', 'Performance'], { farmId });
    // Processing days: the farm's own bookings; a host farm runs days at its site, and schedules them there
    // when the admin allows it (the site's setting travels in the subject).
    can('manage', 'ProcessingBooking', { farmId });
    can('host', 'ProcessingDay', { hostFarmId: farmId });
    can(['create', 'update'], 'ProcessingDay', { hostFarmId: farmId, hostMaySchedule: true });
    privateRecordRules(can, cannot, farmId);
    // An apprentice's entries are her mentor's to review, not another member's of the farm (nor the admin's).
    // The server names the author's mentor on every review; a subject without one is a farm-wide question.
    cannot('review', ['WeighIn', 'AnimalNote', 'LitterEvent', 'AlmanacTask'], { mentorId: { $exists: true, $ne: user.id } })
      .because("Only her mentor reviews an apprentice's work");
  }
  can('manage', 'DigestSubscription', { userId: user.id });
  can('manage', 'Notification', { userId: user.id });
  can('create', 'OutsideAnimal', { coopId });
  can('create', 'Loan', { coopId });
  can('create', 'Trade', { coopId });
  can('book', 'ProcessingDay', { coopId });
  can('manage', 'Booking', { userId: user.id });

  if (user.role === 'admin') {
    can('manage', 'Application', { coopId });
    can('manage', 'Membership', { coopId });
    can('update', 'Coop', { id: coopId });
    can('update', 'User', ['role', 'disabled'], { coopId });
    cannot('update', 'User', ['role', 'disabled'], { id: user.id }).because(
      'An admin cannot change their own role or disable themselves',
    );
    can('create', 'User', { coopId });
    can('read', 'AuditEvent', { coopId });
    // The co-op's books: every farm's account, co-op transfers and corrections, dues.
    can('manage', 'Ledger', { coopId });
    can('read', 'Money', { coopId });
    can('moderate', 'ChatMessage', { coopId });
    can('manage', 'ProcessingDay', { coopId });
    can('manage', 'ProcessingBooking', { coopId });
    can('create', 'Breed', { coopId });
    can('merge', 'OutsideAnimal', { coopId });
    // Helps every apprentice of the co-op: reads their logs and skills (the mentor decides), edits the checklist.
    can('read', ['ChoreLog', 'SkillRecord'], { coopId });
    can('manage', 'MentorshipSettings', { coopId });
  }

  return build();
}
