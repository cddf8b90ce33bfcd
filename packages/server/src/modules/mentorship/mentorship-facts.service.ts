import type { Transaction } from 'sequelize';
import { settingsOf } from './mentorship-settings';
import { mayTakeStation } from './skills.service';

/**
 * Why an apprentice may not take a processing-day station yet (null when she may): the co-op requires a
 * sign-off of the dangerous skills the station is named for ("Dispatch", "Skinning and evisceration"), and
 * her mentor has not signed one off. A station named for none of them ("Packing") needs none. Runs inside
 * the caller's transaction.
 */
export async function stationRefusalFor(tx: Transaction, coopId: string, apprenticeId: string, stationName: string): Promise<string | null> {
  const settings = await settingsOf(tx, coopId);
  if (!settings.requireDangerousSignOff) return null;
  const station = stationName.toLowerCase();
  const words = (text: string) => text.toLowerCase().split(/[^a-z]+/).filter((w) => w.length >= 4 && w !== 'humane');
  // The first five letters name a skill in a station's name ("Eviscerating" for evisceration, "Dispatching").
  const needed = settings.skills.filter((s) => s.dangerous && [s.key, ...words(s.name)].some((w) => station.includes(w.slice(0, 5))));
  for (const skill of needed) {
    const answer = await mayTakeStation(tx, coopId, apprenticeId, skill.key);
    if (!answer.allowed) return answer.reason;
  }
  return null;
}
