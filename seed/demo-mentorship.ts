import type { Transaction } from 'sequelize';
import { addDays } from '@burrowline/shared';
import { farmTodayOf } from '../packages/server/src/modules/farms/farm-clock';
import { coopHasChoreEntries, recordPastMentorshipIn } from '../packages/server/src/modules/mentorship/mentorship.service';

/** Two apprentices' weeks of chores (invented): most accepted, a few returned with the mentor's comment, the latest waiting. */
export interface DemoMentorshipContext {
  coopId: string;
  apprentices: { id: string; farmId: string; mentorId: string }[];
}

const week = [
  { kind: 'feeding', minutes: 30, notes: 'Morning round, pellets and hay' },
  { kind: 'cleaning', minutes: 60, notes: 'Scraped trays in the grow-out row' },
  { kind: 'health-check', minutes: 20, notes: 'Eyes, noses, droppings: all normal' },
  { kind: 'handling', minutes: 15, notes: 'Carried the does to the scale' },
  { kind: 'nest-box-check', minutes: 10, notes: 'Counted kits, removed one wet nest' },
];

export async function loadDemoMentorship(ctx: DemoMentorshipContext, tx: Transaction): Promise<void> {
  if (ctx.apprentices.length === 0 || (await coopHasChoreEntries(tx, ctx.coopId))) return;
  const entries: Parameters<typeof recordPastMentorshipIn>[2]['entries'] = [];
  const marks: Parameters<typeof recordPastMentorshipIn>[2]['marks'] = [];
  for (const [n, a] of ctx.apprentices.entries()) {
    const today = await farmTodayOf(tx, ctx.coopId, a.farmId);
    const weeks = n === 0 ? 4 : 3;
    for (let w = weeks; w >= 0; w--) {
      for (const [i, chore] of week.entries()) {
        const doneOn = addDays(today, -(w * 7 + i + 1));
        const latest = w === 0;
        const returned = (w === 1 && i === 2) || (n === 1 && w === 2 && i === 0);
        entries.push({
          apprenticeId: a.id, farmId: a.farmId, kind: chore.kind, doneOn, minutes: chore.minutes + (i * 5 + w * 3) % 20, notes: chore.notes,
          state: latest && i < 3 ? 'pending' : returned ? 'returned' : 'accepted', mentorId: a.mentorId,
          comment: returned ? 'Say which hutches; and note anything you did not check' : undefined,
          submittedAt: new Date(`${doneOn}T18:00:00Z`),
        });
      }
    }
    const started = addDays(today, -weeks * 7);
    marks.push(
      { apprenticeId: a.id, skillKey: 'handling', state: 'practising', on: started, comment: '', mentorId: a.mentorId, at: new Date(`${started}T12:00:00Z`) },
      { apprenticeId: a.id, skillKey: 'handling', state: 'signed-off', on: addDays(today, -10), comment: 'Calm and safe with the big does', mentorId: a.mentorId, at: new Date(`${addDays(today, -10)}T12:00:00Z`) },
      { apprenticeId: a.id, skillKey: 'nest-box', state: 'practising', on: addDays(today, -12), comment: '', mentorId: a.mentorId, at: new Date(`${addDays(today, -12)}T12:00:00Z`) },
    );
    if (n === 0) {
      marks.push(
        { apprenticeId: a.id, skillKey: 'weighing', state: 'signed-off', on: addDays(today, -5), comment: 'Tares the scale, records the same day', mentorId: a.mentorId, at: new Date(`${addDays(today, -5)}T12:00:00Z`) },
        { apprenticeId: a.id, skillKey: 'illness-heat', state: 'practising', on: addDays(today, -3), comment: '', mentorId: a.mentorId, at: new Date(`${addDays(today, -3)}T12:00:00Z`) },
      );
    }
  }
  await recordPastMentorshipIn(tx, ctx.coopId, { entries, marks });
}
