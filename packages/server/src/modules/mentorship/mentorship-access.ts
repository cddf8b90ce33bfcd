import { defineAbilityFor, ErrorCode, subjectOf } from '@burrowline/shared';
import type { Transaction } from 'sequelize';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { personOf, type PersonRow } from './mentorship-queries';

/** The apprentice a request is about, if the actor may read her record: her own, her mentor's, the admin's. */
export async function apprenticeFor(tx: Transaction, actor: SessionUser, apprenticeId: string, action: 'read' | 'review'): Promise<PersonRow> {
  const person = await personOf(tx, actor.coopId, apprenticeId);
  if (!person || person.role !== 'apprentice') throw AppError.notFound('That apprentice');
  const ability = defineAbilityFor(actor);
  const record = subjectOf('SkillRecord', { coopId: actor.coopId, apprenticeId: person.id, mentorId: person.mentor_id });
  if (!ability.can('read', record)) {
    throw new AppError(ErrorCode.forbidden, 403, "Only her mentor and the co-op's admin see an apprentice's record");
  }
  if (action === 'review' && !ability.can('review', record)) {
    throw new AppError(ErrorCode.forbidden, 403, actor.role === 'apprentice' ? 'Your mentor reviews your work' : 'Only her mentor reviews an apprentice\'s work');
  }
  return person;
}

/** Who the actor is in mentorship: an apprentice, a mentor (has apprentices), the admin (reads all), or none. */
export function isApprentice(actor: SessionUser): boolean {
  return actor.role === 'apprentice';
}
