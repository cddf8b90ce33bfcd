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
  | 'trade';

/**
 * Subjects of the brief's role table. `Money` stands for prices, costs, fees and balances;
 * apprentices never get it.
 */
export type SubjectName =
  | 'Coop'
  | 'Farm'
  | 'User'
  | 'Application'
  | 'AuditEvent'
  | 'Animal'
  | 'PedigreeCard'
  | 'ChoreLog'
  | 'StudListing'
  | 'Loan'
  | 'Trade'
  | 'ProcessingDay'
  | 'Booking'
  | 'ChatMessage'
  | 'Money'
  | 'Ledger';

export type AppAbility = MongoAbility<[Action, SubjectName | Record<string, unknown>]>;

/** Tags a plain object (a row, a DTO) with its subject type so `ability.can` can match conditions. */
export function subjectOf(type: SubjectName, object: Record<string, unknown>): Record<string, unknown> {
  return subject(type, { ...object }) as Record<string, unknown>;
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
  can('read', 'ProcessingDay', { coopId });
  can('read', 'StudListing', { coopId });
  can('read', 'Trade', { coopId });
  can('create', 'ChatMessage', { coopId });
  can('read', 'ChatMessage', { coopId });

  if (user.role === 'apprentice') {
    // An apprentice works on the mentor's farm: reads it, logs chores that wait for review.
    if (farmId) {
      can('read', 'Animal', { farmId });
      can('create', 'ChoreLog', { farmId, authorId: user.id });
      can('read', 'ChoreLog', { farmId, authorId: user.id });
    }
    cannot('read', 'Money');
    cannot('read', 'Ledger');
    return build();
  }

  // Members (and admins, who are members of their own farm with co-op powers on top)
  if (farmId) {
    can('update', 'Farm', { id: farmId });
    can('manage', 'Animal', { farmId });
    can(['read', 'review'], 'ChoreLog', { farmId });
    can('manage', 'StudListing', { farmId });
    can('lend', 'Animal', { farmId });
    can('trade', 'Animal', { farmId });
    can('read', 'Money', { farmId });
  }
  can('create', 'Loan', { coopId });
  can('create', 'Trade', { coopId });
  can('book', 'ProcessingDay', { coopId });
  can('manage', 'Booking', { userId: user.id });

  if (user.role === 'admin') {
    can('manage', 'Application', { coopId });
    can('update', 'Coop', { id: coopId });
    can('update', 'User', ['role', 'disabled'], { coopId });
    cannot('update', 'User', ['role', 'disabled'], { id: user.id }).because(
      'An admin cannot change their own role or disable themselves',
    );
    can('create', 'User', { coopId });
    can('read', 'AuditEvent', { coopId });
    can('read', 'Ledger', { coopId });
    can('read', 'Money', { coopId });
    can('moderate', 'ChatMessage', { coopId });
    can('manage', 'ProcessingDay', { coopId });
  }

  return build();
}
