import { planArrivalQuarantine } from '../modules/almanac/quarantine.service';
import { groupNamesOfFarm } from '../modules/almanac/treatments.service';
import { damKindlingDays } from '../modules/animals/animal-validation';
import { onArrival } from '../modules/animals/custody-moves.service';
import { moveIntoHutch, placeByWrittenHutch } from '../modules/animals/animal-edits.service';
import { moveAnimalIntoHutchIn, placeByWrittenHutchIn } from '../modules/litters/housing.service';
import { feedTotalsByGroup } from '../modules/feed/feed-totals.service';
import { groupFeedTotals, processedHeadsOfGroups } from '../modules/grow-out/grow-out-context';
import { groupsOfFarm } from '../modules/grow-out/grow-out-facts.service';
import { kindlingDaysOfDams } from '../modules/litters/litter-facts.service';
import { processedHeadsOf } from '../modules/processing/processing.service';
import { sharedDaysOfFarm } from '../modules/almanac/shared-days';
import { processingDaysOfFarm } from '../modules/processing-days/processing-days.service';
import { photoPublishedTo } from '../modules/photos/photos.service';
import { isPhotoPublished } from '../modules/stud-share/stud-share-facts.service';
import { registerThreadSubject } from '../modules/chat/chat-subjects.service';
import { litterThreadSubject } from '../modules/litters/litter-thread.service';
import { processingDayThreadSubject } from '../modules/processing-days/day-thread.service';
import { loanThreadSubject } from '../modules/stud-share/loan-thread.service';

let plugged = false;

/**
 * Plugs each module's port into the module that provides it. Ports exist where the one-way direction
 * between module folders would otherwise be broken: the Almanac reads the herd, so the herd's arrivals
 * reach the Almanac here; the feed book reads grow-out, so grow-out's feed totals come in here; grow-out
 * reads the Almanac, so the Almanac's treatments learn the farm's groups here; processing reads grow-out,
 * so the heads processed from a group reach grow-out's head count here; litters build on the herd, so a
 * dam's kindling days reach the herd's kit birth-date check here; processing days build on the Almanac's
 * withdrawals, so the days a farm booked reach its Almanac here.
 */
export function plugModulePorts(): void {
  if (plugged) return;
  plugged = true;
  onArrival.plug(planArrivalQuarantine);
  moveIntoHutch.plug(moveAnimalIntoHutchIn);
  placeByWrittenHutch.plug(placeByWrittenHutchIn);
  damKindlingDays.plug(kindlingDaysOfDams);
  groupFeedTotals.plug(feedTotalsByGroup);
  processedHeadsOfGroups.plug(processedHeadsOf);
  sharedDaysOfFarm.plug(processingDaysOfFarm);
  photoPublishedTo.plug(isPhotoPublished);
  // Co-op Chat's threads beside subjects: who reads the subject reads its thread.
  registerThreadSubject('litter', litterThreadSubject);
  registerThreadSubject('processing-day', processingDayThreadSubject);
  registerThreadSubject('loan', loanThreadSubject);
  groupNamesOfFarm.plug(async (tx, coopId, farmId) => new Map((await groupsOfFarm(tx, coopId, farmId)).map((g) => [g.id, g.name])));
}
