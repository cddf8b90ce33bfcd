import { planArrivalQuarantine } from '../modules/almanac/quarantine.service';
import { groupNamesOfFarm } from '../modules/almanac/treatments.service';
import { damKindlingDays } from '../modules/animals/animal-validation';
import { onArrival, onOwnershipEnded } from '../modules/animals/custody-moves.service';
import { moveIntoHutch, placeByWrittenHutch } from '../modules/animals/animal-edits.service';
import { moveAnimalIntoHutchIn, placeByWrittenHutchIn } from '../modules/litters/housing.service';
import { feedTotalsByGroup } from '../modules/feed/feed-totals.service';
import { groupFeedTotals, processedHeadsOfGroups } from '../modules/grow-out/grow-out-context';
import { groupsOfFarm } from '../modules/grow-out/grow-out-facts.service';
import { kindlingDaysOfDams } from '../modules/litters/litter-facts.service';
import { processedHeadsOf } from '../modules/processing/processing.service';
import { sharedDaysOfFarm } from '../modules/almanac/shared-days';
import { doeCycleFactsColumn as doeCycleFactsColumnOfAlmanac, doeCycleOfFacts as doeCycleOfFactsOfAlmanac } from '../modules/almanac/doe-board.service';
import { doeCycleFactsColumn, doeCycleOfFacts } from '../modules/animals/animals.service';
import { processingDaysOfFarm, stationRefusal } from '../modules/processing-days/processing-days.service';
import { stationRefusalFor } from '../modules/mentorship/mentorship-facts.service';
import { chatPhotoReadable, photoPublishedTo } from '../modules/photos/photos.service';
import { isPhotoPublished } from '../modules/stud-share/stud-share-facts.service';
import { registerThreadSubject } from '../modules/chat/chat-subjects.service';
import { mayReadChatPhoto } from '../modules/chat/chat.service';
import { litterThreadSubject } from '../modules/litters/litter-thread.service';
import { processingDayThreadSubject } from '../modules/processing-days/day-thread.service';
import { loanThreadSubject } from '../modules/stud-share/loan-thread.service';
import { listingThreadSubject } from '../modules/swap-board/listing-thread.service';
import { closeListingsOfAnimal } from '../modules/swap-board/swap-listings.service';
import { isPhotoListed } from '../modules/swap-board/swap-board-facts.service';

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
  // The Swap Board builds on the herd: an animal leaving its farm closes that farm's listings of it.
  onOwnershipEnded.plug(closeListingsOfAnimal);
  moveIntoHutch.plug(moveAnimalIntoHutchIn);
  placeByWrittenHutch.plug(placeByWrittenHutchIn);
  damKindlingDays.plug(kindlingDaysOfDams);
  groupFeedTotals.plug(feedTotalsByGroup);
  processedHeadsOfGroups.plug(processedHeadsOf);
  sharedDaysOfFarm.plug(processingDaysOfFarm);
  // A photo is published by a buck card or a loan's hand-over (Stud Share), or by a listing (Swap Board).
  photoPublishedTo.plug(async (tx, actor, photoId) => (await isPhotoPublished(tx, actor, photoId)) || isPhotoListed(tx, actor, photoId));
  chatPhotoReadable.plug(mayReadChatPhoto);
  // The herd list shows each doe's place in her cycle, which the Almanac reads.
  doeCycleFactsColumn.plug(doeCycleFactsColumnOfAlmanac);
  doeCycleOfFacts.plug(doeCycleOfFactsOfAlmanac);
  // A dangerous station on a processing day's roster waits for the apprentice's sign-off when the co-op asks.
  stationRefusal.plug(stationRefusalFor);
  // Co-op Chat's threads beside subjects: who reads the subject reads its thread.
  registerThreadSubject('litter', litterThreadSubject);
  registerThreadSubject('processing-day', processingDayThreadSubject);
  registerThreadSubject('loan', loanThreadSubject);
  registerThreadSubject('swap-listing', listingThreadSubject);
  groupNamesOfFarm.plug(async (tx, coopId, farmId) => new Map((await groupsOfFarm(tx, coopId, farmId)).map((g) => [g.id, g.name])));
}
