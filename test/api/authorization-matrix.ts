import type { LoanStage } from '../support/lent-animal';
import type { StudTarget } from '../support/stud-share-matrix';
import type { SwapTarget } from '../support/swap-board-matrix';

/**
 * Who may call what, against whose object → expected status. The generated tests in
 * authorization-<area>.test.ts run every cell, one file per area of `matrixAreas` below. Personas: `member` and `apprentice` and `admin` belong to
 * farm A; `otherFarmMember` to farm B of the same co-op; `otherCoop` is an admin of another co-op.
 */
export type Persona = 'anonymous' | 'apprentice' | 'member' | 'otherFarmMember' | 'admin' | 'otherCoop' | 'farmMateNotMentor';
/**
 * Every row names these; `farmMateNotMentor` (a second member of farm A, who is not the apprentice's mentor)
 * is asked where being the mentor matters: reviews, the apprentice's record and skills.
 */
export type CorePersona = Exclude<Persona, 'farmMateNotMentor'>;
/**
 * Objects a row acts on. Membership targets are made fresh for every cell (a pending application,
 * a member of farm B, a turned-off member, one without a password yet, a pending invitee), so a
 * change that one persona may make never alters what the next persona is tested against.
 */
export type Target =
  | 'none'
  | 'farmA'
  | 'farmB'
  | 'application'
  | 'freshMember'
  | 'disabledMember'
  | 'awaitingMember'
  | 'invitee'
  | 'coopAdmin'
  // The Herd: a fresh doe of farm A (with a buck of farm B for trial matings), a doe of farm B, an apprentice's
  // pending weigh-in and note on farm A, an outside duplicate to merge.
  | 'animalA'
  | 'animalB'
  | 'weighInA'
  | 'noteA'
  | 'outsideDuplicate'
  // The Almanac and litters, all on farm A: a doe and buck, an open service 31 days old (with its
  // palpation task), a task an apprentice ticked, a nursing litter (with a second one to foster into), an
  // apprentice's pending loss, a hutch, a placement, the farm's calendar feed.
  | 'breedingPairA'
  | 'serviceA'
  | 'pendingTaskA'
  | 'litterA'
  | 'litterEventA'
  | 'housingA'
  | 'placementA'
  | 'feedA'
  // A planned processing mark of a farm-A doe.
  | 'processingMarkA'
  // Grow-out and feed: a growing group of farm A (with a litter that has free kits) and a feed purchase.
  | 'groupA'
  // A purchase of farm A with feed given from it to a group of farm A.
  | 'feedEntriesA'
  // Herd files: a photo of a fresh farm-A animal, a spreadsheet staged by farm A's member.
  | 'photoA'
  | 'importA'
  // The Ledger: a posted stud fee (farm A owes farm B), a posted processing charge of farm A to the co-op, a
  // cash payment farm A recorded to farm B (waiting for B), an open card checkout of farm A, a fresh dues year.
  | 'ledgerA'
  // A lent buck of farm A with private records of farm A (notes field, note, weigh-in, photo, treatment):
  // at home, lent to farm B (which records its own note, weigh-in and treatment), and back home.
  | LoanStage
  // A notification of farm A's member.
  | 'notificationA'
  // A processing day at a site of farm A in two weeks, with farm A's booking of 2 head and its member on the first station.
  | 'dayA'
  // Stud Share: a farm-A buck offered (with a fresh farm-A buck not offered yet, a doe of each farm) and a
  // farm-B request for him: waiting, accepted, hand-over recorded by A, lent, return recorded by B; or an
  // accepted stud-service visit.
  | StudTarget
  // Swap Board: a farm-A doe listed as a draft, or open with farm B's offer waiting for the seller, or that offer accepted.
  | SwapTarget
  // Mentorship: a pending chore entry of farm A's apprentice (her mentor is farm A's member), one returned to
  // her, her pending palpation of a serviced doe of farm A, the apprentice herself. The admin is of farm A but not her mentor.
  | 'choreA'
  | 'returnedChoreA'
  | 'palpationChoreA'
  | 'apprenticeA'
  // Co-op Chat: the channel with a message of farm A's member, a litter of farm A with its thread and a
  // message there, and a member of farm B the admin may mute.
  | 'chatA';
export type Body =
  | 'farmProfile'
  | 'application'
  | 'approval'
  | 'rejection'
  | 'withdrawal'
  | 'roleChange'
  | 'disable'
  | 'enable'
  | 'invitation'
  | 'rules'
  | 'animal'
  | 'animalEdit'
  | 'statusEvent'
  | 'custodyMove'
  | 'weighIn'
  | 'note'
  | 'review'
  | 'trialMating'
  | 'outsideAnimal'
  | 'merge'
  | 'breed'
  | 'cycleSettings'
  | 'service'
  | 'palpation'
  | 'closure'
  | 'taskDone'
  | 'taskSkip'
  | 'taskBulk'
  | 'taskReview'
  | 'treatment'
  | 'morningEmail'
  | 'kindling'
  | 'litterLoss'
  | 'fostering'
  | 'keeper'
  | 'litterReview'
  | 'housingUnit'
  | 'placement'
  | 'placementEnd'
  | 'photoUpload'
  | 'farmPhotoUpload'
  | 'photoCaption'
  | 'csvUpload'
  | 'importConfirmation'
  // Health and yield.
  | 'temperatureReading'
  | 'processingRecord'
  | 'processingMark'
  | 'markCancellation'
  | 'growOutGroup'
  | 'groupWeighIn'
  | 'groupClose'
  | 'weighingRound'
  | 'feedPurchase'
  | 'feedUse'
  | 'feedPurchaseCorrection'
  | 'feedUseCorrection'
  // The Ledger.
  | 'ledgerTransfer'
  | 'ledgerCorrection'
  | 'ledgerPayment'
  | 'dues'
  | 'cardCheckout'
  | 'cardWebhook'
  | 'notificationPreferences'
  | 'processingSite'
  | 'processingSiteEdit'
  | 'processingFarmSettings'
  | 'processingDay'
  | 'processingDayEdit'
  | 'processingBooking'
  | 'processingBookingEdit'
  | 'processingBookingVersion'
  | 'processingCheckIn'
  | 'processingRosterMember'
  | 'processingEquipmentClaim'
  | 'processingYield'
  | 'processingDayClose'
  // Stud Share.
  | 'studOffer'
  | 'studOfferUpdate'
  | 'studOfferVersion'
  | 'studRequest'
  | 'studLoanVersion'
  | 'studDecline'
  | 'studPropose'
  | 'studProposalAnswer'
  | 'studCustodyStep'
  | 'farmCoordinates'
  // Mentorship.
  | 'chore'
  | 'choreResubmit'
  | 'reviewAccept'
  | 'acceptMany'
  | 'skillMark'
  | 'mentorshipSettings'
  | 'chatTopic'
  | 'chatMessage'
  | 'chatEdit'
  | 'chatRead'
  | 'chatHide'
  | 'chatMute'
  // Swap Board.
  | 'swapWanted'
  | 'swapOffer'
  | 'swapListingVersion'
  | 'swapListingReason'
  | 'swapListingEdit'
  | 'swapCounter'
  | 'swapAccept'
  | 'swapOfferVersion'
  | 'swapOfferReason';

export interface MatrixRow {
  method: 'GET' | 'PATCH' | 'DELETE' | 'POST' | 'PUT';
  path: string;
  target: Target;
  body?: Body;
  expect: Record<CorePersona, number> & { farmMateNotMentor?: number };
}

export const authorizationMatrix: MatrixRow[] = [
  { method: 'GET', path: '/api/me', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/farms', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/farms/:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/farms/:farmId', target: 'farmA', body: 'farmProfile', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/farms/:farmId', target: 'farmB', body: 'farmProfile', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  // Membership: the public form answers everyone; the queue, roster, invitations and audit log are the admin's.
  { method: 'GET', path: '/api/apply/:coopSlug', target: 'none', expect: { anonymous: 200, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/apply/:coopSlug', target: 'none', body: 'application', expect: { anonymous: 201, apprentice: 201, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/applications', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/applications/unread-count', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/applications/:applicationId', target: 'application', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/applications/:applicationId/views', target: 'application', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 204, otherCoop: 404 } },
  { method: 'POST', path: '/api/applications/:applicationId/approval', target: 'application', body: 'approval', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/applications/:applicationId/rejection', target: 'application', body: 'rejection', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/applications/:applicationId/withdrawal', target: 'application', body: 'withdrawal', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/members', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/members/:userId', target: 'freshMember', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/members/:userId/role', target: 'freshMember', body: 'roleChange', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/members/:userId/role', target: 'coopAdmin', body: 'roleChange', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/members/:userId/disable', target: 'freshMember', body: 'disable', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/members/:userId/disable', target: 'coopAdmin', body: 'disable', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/members/:userId/enable', target: 'disabledMember', body: 'enable', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/members/:userId/set-password-link', target: 'awaitingMember', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/members/:userId/invitation', target: 'invitee', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/invitations', target: 'none', body: 'invitation', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/audit-events', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/coop', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  // The co-op is the session's own: the other co-op's admin edits their own co-op's rules, never ours.
  { method: 'PATCH', path: '/api/coop', target: 'none', body: 'rules', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  // The Herd: full rights on one's own farm's animals, pedigree cards for everyone in the co-op,
  // apprentices read and add entries that wait for review, admins add breeds and merge outside duplicates
  // but edit no other farm's herd; another co-op sees nothing.
  { method: 'GET', path: '/api/breeds', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/breeds', target: 'none', body: 'breed', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/animals', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/animals', target: 'none', body: 'animal', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/animals/:animalId', target: 'animalA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId', target: 'animalB', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/animals/:animalId', target: 'animalA', body: 'animalEdit', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/animals/:animalId', target: 'animalB', body: 'animalEdit', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/pedigree', target: 'animalB', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/weigh-ins', target: 'animalB', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/animals/:animalId/status-events', target: 'animalA', body: 'statusEvent', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/animals/:animalId/custody-events', target: 'animalA', body: 'custodyMove', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/animals/:animalId/notes', target: 'animalA', body: 'note', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/weigh-ins', target: 'animalA', body: 'weighIn', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  // Only the apprentice's mentor (farm A's member) reviews her entries: the admin of farm A is not her mentor.
  { method: 'POST', path: '/api/weigh-ins/:weighInId/review', target: 'weighInA', body: 'review', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'POST', path: '/api/animal-notes/:noteId/review', target: 'noteA', body: 'review', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'GET', path: '/api/pedigree-cards', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/pedigree-cards/:animalId', target: 'animalB', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  // Another co-op's ids are not there, so its trial names no doe: a field error, like any unknown id.
  { method: 'POST', path: '/api/trial-matings', target: 'animalA', body: 'trialMating', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 400 } },
  { method: 'GET', path: '/api/outside-animals', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/outside-animals', target: 'none', body: 'outsideAnimal', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'POST', path: '/api/outside-animals/:animalId/merge', target: 'outsideDuplicate', body: 'merge', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  // The Almanac and litters: members plan and record for their own farm; apprentices read the
  // mentor's, tick tasks and record litter counts (pending review), never plan; another farm's records are
  // not there (404); another co-op sees nothing. Ids of other farms' animals in a body are field errors (400).
  // The calendar feed is public at its secret address (a phone calendar has no session).
  { method: 'GET', path: '/api/almanac/tasks', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/almanac/summary', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/almanac/shared-days', target: 'dayA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/almanac/settings', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'PATCH', path: '/api/almanac/settings', target: 'none', body: 'cycleSettings', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  // The doe board is each farm's own (an apprentice's: her mentor's); a doe's breeding record is her farm's: another farm knows her card only.
  { method: 'GET', path: '/api/almanac/doe-board', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/almanac/does/:doeId/breeding-record', target: 'breedingPairA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/almanac/breeding-stock', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/almanac/calendar-feed', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/almanac/calendar-feed', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'DELETE', path: '/api/almanac/calendar-feed', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 204, otherFarmMember: 204, admin: 204, otherCoop: 204 } },
  { method: 'GET', path: '/api/calendar-feeds/:feedToken.ics', target: 'feedA', expect: { anonymous: 200, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/almanac/morning-email', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'PUT', path: '/api/almanac/morning-email', target: 'none', body: 'morningEmail', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'PATCH', path: '/api/almanac/tasks/:taskId', target: 'serviceA', body: 'taskDone', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/almanac/tasks/:taskId', target: 'serviceA', body: 'taskSkip', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/almanac/tasks/bulk', target: 'serviceA', body: 'taskBulk', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/almanac/tasks/:taskId/review', target: 'pendingTaskA', body: 'taskReview', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'GET', path: '/api/services', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/services', target: 'breedingPairA', body: 'service', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  { method: 'GET', path: '/api/services/:serviceId', target: 'serviceA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/services/:serviceId/palpations', target: 'serviceA', body: 'palpation', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/services/:serviceId/closure', target: 'serviceA', body: 'closure', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/treatments', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/treatments', target: 'breedingPairA', body: 'treatment', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  // Health and yield: the farm's own withdrawals, temperatures and processing; apprentices read and log
  // temperatures only; an animal of another farm (or co-op) in a body is a field error (400).
  { method: 'GET', path: '/api/withdrawals', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/temperature-readings', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/temperature-readings', target: 'none', body: 'temperatureReading', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/heat-caution', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/processing-records', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/processing-records', target: 'breedingPairA', body: 'processingRecord', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  { method: 'POST', path: '/api/processing-marks', target: 'breedingPairA', body: 'processingMark', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  { method: 'POST', path: '/api/processing-marks/:markId/cancellation', target: 'processingMarkA', body: 'markCancellation', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/litters', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/litters', target: 'serviceA', body: 'kindling', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  { method: 'GET', path: '/api/litters/:litterId', target: 'litterA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/litters/:litterId/events', target: 'litterA', body: 'litterLoss', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'GET', path: '/api/litters/:litterId/foster-candidates', target: 'litterA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/litters/:litterId/fosterings', target: 'litterA', body: 'fostering', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/litters/:litterId/keepers', target: 'litterA', body: 'keeper', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/litter-events/:eventId/review', target: 'litterEventA', body: 'litterReview', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'GET', path: '/api/housing-units', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/housing-units', target: 'none', body: 'housingUnit', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'POST', path: '/api/housing-units/:unitId/placements', target: 'housingA', body: 'placement', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/housing-placements/:placementId/end', target: 'placementA', body: 'placementEnd', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // Herd files: an animal's photos and papers are its own farm's (its apprentices see, do not change;
  // another farm of the co-op, which sees only the pedigree card, finds nothing: 404); farm profile photos are
  // seen by the co-op, changed by the farm; spreadsheets are imported by a farm's members into their own herd.
  { method: 'GET', path: '/api/animals/:animalId/photos', target: 'animalA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/animals/:animalId/photos', target: 'animalA', body: 'photoUpload', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'GET', path: '/api/photos/:photoId', target: 'photoA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/photos/:photoId/thumbnail', target: 'photoA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // A photo in a message of farm A's litter thread: the thread's readers alone see it; nobody edits it on its own.
  { method: 'GET', path: '/api/photos/:chatPhotoId', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/photos/:chatPhotoId/thumbnail', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/photos/:chatPhotoId', target: 'chatA', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 404, admin: 403, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/photos/:photoId', target: 'photoA', body: 'photoCaption', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/photos/:photoId', target: 'photoA', expect: { anonymous: 401, apprentice: 403, member: 204, otherFarmMember: 404, admin: 204, otherCoop: 404 } },
  { method: 'GET', path: '/api/farms/:farmId/photo', target: 'farmA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'PUT', path: '/api/farms/:farmId/photo', target: 'farmA', body: 'farmPhotoUpload', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/farms/:farmId/photo', target: 'farmA', expect: { anonymous: 401, apprentice: 403, member: 204, otherFarmMember: 403, admin: 204, otherCoop: 404 } },
  { method: 'POST', path: '/api/herd-imports', target: 'none', body: 'csvUpload', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/herd-imports/:importId', target: 'importA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/herd-imports/:importId/confirmation', target: 'importA', body: 'importConfirmation', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/herd-export', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/pedigree-certificates/:animalId', target: 'animalA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/pedigree-certificates/:animalId', target: 'animalB', expect: { anonymous: 401, apprentice: 404, member: 404, otherFarmMember: 200, admin: 404, otherCoop: 404 } },
  // Grow-out groups and the feed book: farm-private; apprentices read and weigh (pending review) but form,
  // close and record feed never; another farm's or co-op's group does not exist (404), their litters and groups are not ours (400).
  { method: 'GET', path: '/api/grow-out/groups', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/grow-out/litter-choices', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/grow-out/groups', target: 'groupA', body: 'growOutGroup', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  { method: 'GET', path: '/api/grow-out/groups/:groupId', target: 'groupA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/grow-out/groups/:groupId/weigh-ins', target: 'groupA', body: 'groupWeighIn', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  // A weighing round: the farm's heads to weigh and one batch of their weights; an apprentice's wait for review;
  // another farm's or co-op's group is not theirs to list (404) or weigh (400).
  { method: 'GET', path: '/api/weighing-rounds/candidates?set=group&groupId=:groupId', target: 'groupA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/weighing-rounds/candidates?set=growing', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/weighing-rounds', target: 'groupA', body: 'weighingRound', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  { method: 'POST', path: '/api/grow-out/groups/:groupId/close', target: 'groupA', body: 'groupClose', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/feed', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/feed/purchases', target: 'none', body: 'feedPurchase', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'POST', path: '/api/feed/uses', target: 'groupA', body: 'feedUse', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 400, admin: 201, otherCoop: 400 } },
  // Corrections reach only the farm's own entries: another farm's or co-op's member is told there is no such entry.
  { method: 'PUT', path: '/api/feed/purchases/:purchaseId', target: 'feedEntriesA', body: 'feedPurchaseCorrection', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/feed/uses/:useId?version=0', target: 'feedEntriesA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PUT', path: '/api/feed/uses/:useId', target: 'feedEntriesA', body: 'feedUseCorrection', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // The purchase still feeds the group: taking it out is refused until that feed given goes.
  { method: 'DELETE', path: '/api/feed/purchases/:purchaseId?version=0', target: 'feedEntriesA', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 404, admin: 409, otherCoop: 404 } },
  // Performance: read-only, the signed-in person's farm; another farm's or co-op's tables do not exist (404).
  { method: 'GET', path: '/api/performance', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/performance?period=all&farmId=:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // The Ledger: members see their farm's account, the admin the co-op's books; apprentices no money at all
  // (403 everywhere); another farm's account or transfer does not exist for a member (404), nor another co-op's.
  { method: 'GET', path: '/api/ledger/summary', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/summary?farmId=:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/ledger/coop', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/transfers', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/transfers?farmId=:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // Another co-op's admin names our farms: they are not in that co-op (a field error).
  { method: 'POST', path: '/api/ledger/transfers', target: 'ledgerA', body: 'ledgerTransfer', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 201, otherCoop: 400 } },
  { method: 'GET', path: '/api/ledger/transfers/:transferId', target: 'ledgerA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/ledger/transfers/:coopTransferId', target: 'ledgerA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // Only the receiving farm confirms a payment made to it; the payer and the admin may not.
  { method: 'POST', path: '/api/ledger/transfers/:paymentId/confirmation', target: 'ledgerA', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/ledger/transfers/:paymentId/void', target: 'ledgerA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/ledger/transfers/:transferId/void', target: 'ledgerA', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 409, admin: 409, otherCoop: 404 } },
  { method: 'POST', path: '/api/ledger/transfers/:transferId/corrections', target: 'ledgerA', body: 'ledgerCorrection', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/ledger/transfers/:coopTransferId/corrections', target: 'ledgerA', body: 'ledgerCorrection', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/ledger/payments', target: 'none', body: 'ledgerPayment', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/ledger/settle-up', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/statement?from=2026-01-01&to=2026-12-31', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/statement?from=2026-01-01&to=2026-12-31&format=csv&farmId=:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/ledger/statement?from=2026-01-01&to=2026-12-31&coop=true', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/fees-by-month', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/ledger/fees-by-month?coop=true', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'PUT', path: '/api/ledger/dues/:year', target: 'ledgerA', body: 'dues', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  // Each farm owes its co-op a processing charge and pays it by card.
  { method: 'POST', path: '/api/ledger/card-checkouts', target: 'ledgerA', body: 'cardCheckout', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/ledger/card-checkouts/:checkoutId', target: 'ledgerA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  // The card service's webhook answers no session: without its signature everyone gets 400.
  { method: 'POST', path: '/api/card-webhooks', target: 'none', body: 'cardWebhook', expect: { anonymous: 400, apprentice: 400, member: 400, otherFarmMember: 400, admin: 400, otherCoop: 400 } },
  { method: 'DELETE', path: '/api/session', target: 'none', expect: { anonymous: 204, apprentice: 204, member: 204, otherFarmMember: 204, admin: 204, otherCoop: 204 } },

  // A lent animal: its private records belong to the farm that recorded them. Farm B sees the pedigree card
  // before and after the loan, and during it the buck and what B records, never farm A's notes, weigh-ins,
  // photos, treatments or certificate; farm A never sees B's. Every 2xx answer is checked for the other
  // farm's ids and texts (test/support/authorization-cells.ts).
  { method: 'GET', path: '/api/animals/:animalId', target: 'beforeLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/weigh-ins', target: 'beforeLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/photos', target: 'beforeLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/photos/:photoId', target: 'beforeLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/pedigree-certificates/:animalId', target: 'beforeLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/treatments?animalId=:animalId', target: 'beforeLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/animals/:animalId', target: 'duringLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/weigh-ins', target: 'duringLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/photos', target: 'duringLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/photos/:photoId', target: 'duringLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/pedigree-certificates/:animalId', target: 'duringLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/treatments?animalId=:animalId', target: 'duringLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/animals/:animalId', target: 'afterLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/weigh-ins', target: 'afterLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/animals/:animalId/photos', target: 'afterLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/photos/:photoId', target: 'afterLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/pedigree-certificates/:animalId', target: 'afterLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/treatments?animalId=:animalId', target: 'afterLoan', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  // Stud Share: buck cards are the co-op's; only the buck's farm offers him (never apprentices); a loan is the two
  // farms' (a third farm, another co-op: 404), each step taken by its side; apprentices follow, never act.
  { method: 'PUT', path: '/api/farms/:farmId/coordinates', target: 'farmA', body: 'farmCoordinates', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/offers', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/stud-share/offers?scope=mine', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/stud-share/offers', target: 'studRequestA', body: 'studOffer', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/offers/:offerId', target: 'studRequestA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'PUT', path: '/api/stud-share/offers/:offerId', target: 'studRequestA', body: 'studOfferUpdate', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/offers/:offerId/withdraw', target: 'studRequestA', body: 'studOfferVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/offers/:offerId/publish', target: 'studRequestA', body: 'studOfferVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/offers/:offerId/availability?from=2026-01-01&to=2026-06-30', target: 'studRequestA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/finder?damId=:doeBId', target: 'studRequestA', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/finder?damId=:doeAId', target: 'studRequestA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/loans', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/stud-share/loans?side=offers&open=true', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/stud-share/loans', target: 'studRequestA', body: 'studRequest', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 201, admin: 403, otherCoop: 404 } },
  { method: 'GET', path: '/api/stud-share/loans/:loanId', target: 'studRequestA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/accept', target: 'studRequestA', body: 'studLoanVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/decline', target: 'studRequestA', body: 'studDecline', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/propose', target: 'studRequestA', body: 'studPropose', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/proposal-answer', target: 'studRequestA', body: 'studProposalAnswer', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 409, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/cancel', target: 'studAcceptedA', body: 'studLoanVersion', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/hand-over', target: 'studAcceptedA', body: 'studCustodyStep', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/hand-over/confirm', target: 'studHandOverRecordedA', body: 'studLoanVersion', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/return', target: 'studLentA', body: 'studCustodyStep', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/return/confirm', target: 'studReturnRecordedA', body: 'studLoanVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/stud-share/loans/:loanId/service', target: 'studVisitA', body: 'studLoanVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  // Swap Board: the board is the co-op's (apprentices see it without prices); only the listing farm changes its
  // listing; an offer is the two farms' (another co-op: 404), each answer taken by the side whose turn it is;
  // apprentices follow, never act.
  { method: 'GET', path: '/api/swap-board/listings', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/swap-board/listings?mine=true', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/swap-board/summary', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/swap-board/listings', target: 'none', body: 'swapWanted', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/swap-board/listings/:swapListingId', target: 'swapOfferedA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/swap-board/listings/:swapListingId', target: 'swapDraftA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/swap-board/listings/:swapListingId', target: 'swapDraftA', body: 'swapListingEdit', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/swap-board/listings/:swapListingId', target: 'swapOpenA', body: 'swapListingEdit', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/swap-board/listings/:swapListingId', target: 'swapOfferedA', body: 'swapListingEdit', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 403, admin: 409, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/listings/:swapListingId/publish', target: 'swapDraftA', body: 'swapListingVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/listings/:swapListingId/withdraw', target: 'swapOfferedA', body: 'swapListingReason', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/swap-board/offers', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/swap-board/offers?side=received&open=true', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/swap-board/offers', target: 'swapOfferedA', body: 'swapOffer', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 201, admin: 403, otherCoop: 404 } },
  { method: 'GET', path: '/api/swap-board/offers/:swapOfferId', target: 'swapOfferedA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/offers/:swapOfferId/counter', target: 'swapOfferedA', body: 'swapCounter', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/offers/:swapOfferId/accept', target: 'swapOfferedA', body: 'swapAccept', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/offers/:swapOfferId/decline', target: 'swapOfferedA', body: 'swapOfferReason', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/offers/:swapOfferId/withdraw', target: 'swapOfferedA', body: 'swapOfferReason', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/offers/:swapOfferId/collected', target: 'swapAcceptedA', body: 'swapOfferVersion', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/swap-board/offers/:swapOfferId/hand-over-failed', target: 'swapAcceptedA', body: 'swapOfferReason', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  // Hutch cards: each person prints their own farm's breeding does.
  { method: 'GET', path: '/api/hutch-cards?does=breeding', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  // The notification centre: everyone signed in has their own bell; one person's notification is nobody else's.
  { method: 'GET', path: '/api/notifications', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/notifications/unread', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/notifications/read', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/notifications/preferences', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'PUT', path: '/api/notifications/preferences', target: 'none', body: 'notificationPreferences', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/notifications/:notificationId/read', target: 'notificationA', expect: { anonymous: 401, apprentice: 404, member: 200, otherFarmMember: 404, admin: 404, otherCoop: 404 } },
  // Mentorship: the apprentice logs and corrects; only her mentor decides; the admin reads every apprentice; other co-ops see nothing.
  { method: 'GET', path: '/api/mentorship', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/mentorship/settings', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'PUT', path: '/api/mentorship/settings', target: 'none', body: 'mentorshipSettings', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/mentorship/choices', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/mentorship/chores', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 403, otherFarmMember: 403, admin: 403, otherCoop: 403 } },
  { method: 'POST', path: '/api/mentorship/chores', target: 'none', body: 'chore', expect: { anonymous: 401, apprentice: 201, member: 403, otherFarmMember: 403, admin: 403, otherCoop: 403 } },
  { method: 'PUT', path: '/api/mentorship/chores/:choreId', target: 'returnedChoreA', body: 'choreResubmit', expect: { anonymous: 401, apprentice: 200, member: 403, otherFarmMember: 403, admin: 403, otherCoop: 403 } },
  { method: 'POST', path: '/api/mentorship/chores/:choreId/photos', target: 'choreA', body: 'photoUpload', expect: { anonymous: 401, apprentice: 201, member: 403, otherFarmMember: 403, admin: 403, otherCoop: 403 } },
  { method: 'GET', path: '/api/mentorship/review', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200, farmMateNotMentor: 200 } },
  { method: 'POST', path: '/api/mentorship/review/accept-many', target: 'choreA', body: 'acceptMany', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'POST', path: '/api/mentorship/review/:kind/:choreId', target: 'choreA', body: 'reviewAccept', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  // A palpation chore is decided as its own kind; accepting it changes the doe's service.
  { method: 'POST', path: '/api/mentorship/review/:kind/:choreId', target: 'palpationChoreA', body: 'reviewAccept', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'POST', path: '/api/mentorship/review/accept-many', target: 'palpationChoreA', body: 'acceptMany', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'GET', path: '/api/mentorship/apprentices', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/mentorship/apprentices/:apprenticeId', target: 'apprenticeA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'PUT', path: '/api/mentorship/apprentices/:apprenticeId/skills/:skillKey', target: 'apprenticeA', body: 'skillMark', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 403, otherCoop: 404, farmMateNotMentor: 403 } },
  { method: 'GET', path: '/api/mentorship/apprentices/:apprenticeId/record-of-skills', target: 'apprenticeA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404, farmMateNotMentor: 403 } },
  // Co-op Chat: the channel and topics are the whole co-op's; a litter's thread is its farm's (the admin here is of farm A);
  // only the author edits or removes, only the admin hides and mutes.
  { method: 'GET', path: '/api/chat/threads', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/chat/threads', target: 'none', body: 'chatTopic', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 201 } },
  { method: 'GET', path: '/api/chat/threads/:channelId', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/chat/threads/:litterThreadId', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/chat/threads/:channelId/messages', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/chat/threads/:litterThreadId/messages', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/chat/threads/:litterThreadId/people', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/threads/:channelId/messages', target: 'chatA', body: 'chatMessage', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/threads/:litterThreadId/messages', target: 'chatA', body: 'chatMessage', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  // Photos are shared in a thread by who may write there; each image is served only to the thread's readers.
  { method: 'POST', path: '/api/chat/threads/:channelId/attachments', target: 'chatA', body: 'photoUpload', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 201, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/threads/:litterThreadId/attachments', target: 'chatA', body: 'photoUpload', expect: { anonymous: 401, apprentice: 201, member: 201, otherFarmMember: 404, admin: 201, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/threads/:litterThreadId/read', target: 'chatA', body: 'chatRead', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/subjects/litter/:litterId/open', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/chat/messages/:messageId', target: 'chatA', body: 'chatEdit', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 403, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/chat/messages/:litterMessageId', target: 'chatA', body: 'chatEdit', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 403, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/chat/messages/:messageId', target: 'chatA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 403, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/messages/:messageId/hide', target: 'chatA', body: 'chatHide', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/chat/messages/:litterMessageId/hide', target: 'chatA', body: 'chatHide', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PUT', path: '/api/chat/messages/:messageId/reactions/heart', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/chat/messages/:messageId/reactions/heart', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'PUT', path: '/api/chat/messages/:litterMessageId/reactions/heart', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/chat/search?q=matrix', target: 'chatA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/chat/mutes', target: 'none', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/chat/mutes', target: 'chatA', body: 'chatMute', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/chat/mutes/:chatMuteUserId', target: 'chatA', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  // Processing days: the whole co-op reads days and bookings; the admin keeps sites and schedules (the host only when
  // allowed); a farm's members book for it; the host runs the day; another co-op's days do not exist.
  { method: 'GET', path: '/api/processing-days/sites', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/processing-days/sites', target: 'none', body: 'processingSite', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 201, otherCoop: 400 } },
  { method: 'PATCH', path: '/api/processing-days/sites/:siteId', target: 'dayA', body: 'processingSiteEdit', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days/farm-settings/:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'PUT', path: '/api/processing-days/farm-settings/:farmId', target: 'farmA', body: 'processingFarmSettings', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 404, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days', target: 'dayA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'POST', path: '/api/processing-days', target: 'dayA', body: 'processingDay', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days/:dayId', target: 'dayA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/processing-days/:dayId', target: 'dayA', body: 'processingDayEdit', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days/:dayId/candidates?farmId=:farmId', target: 'dayA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days/:dayId/bookings', target: 'dayA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/bookings', target: 'dayA', body: 'processingBooking', expect: { anonymous: 401, apprentice: 403, member: 201, otherFarmMember: 403, admin: 201, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/processing-days/:dayId/bookings/:bookingId', target: 'dayA', body: 'processingBookingEdit', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/bookings/:bookingId/cancel', target: 'dayA', body: 'processingBookingVersion', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/bookings/:bookingId/confirm', target: 'dayA', body: 'processingBookingVersion', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 403, admin: 409, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/bookings/:bookingId/check-in', target: 'dayA', body: 'processingCheckIn', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 403, admin: 409, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/stations/:stationId/sign-up', target: 'dayA', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/stations/:stationId/leave', target: 'dayA', body: 'processingRosterMember', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/equipment/:itemId/claim', target: 'dayA', body: 'processingEquipmentClaim', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/equipment/:itemId/release', target: 'dayA', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/yields', target: 'dayA', body: 'processingYield', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 403, admin: 409, otherCoop: 404 } },
  { method: 'POST', path: '/api/processing-days/:dayId/close', target: 'dayA', body: 'processingDayClose', expect: { anonymous: 401, apprentice: 403, member: 409, otherFarmMember: 403, admin: 409, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days/:dayId/summary', target: 'dayA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'GET', path: '/api/processing-days/:dayId/sheet.pdf', target: 'dayA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
];

/**
 * Which file runs a row: each area has its own `authorization-<area>.test.ts`, so the matrix is shared among
 * the test workers instead of running in one. The first area whose paths match the row's path takes it; a row
 * no area takes fails authorization-membership.test.ts, which also checks that every area has its file.
 */
export const matrixAreas = [
  { area: 'herd-files', paths: /^\/api\/(animals\/:animalId\/photos|photos|farms\/:farmId\/photo|herd-imports|herd-export|pedigree-certificates|hutch-cards)\b/ },
  { area: 'membership', paths: /^\/api\/(me|session|farms|apply|applications|members|invitations|audit-events|coop)\b/ },
  { area: 'herd', paths: /^\/api\/(breeds|animals|weigh-ins|animal-notes|pedigree-cards|trial-matings|outside-animals)\b/ },
  { area: 'almanac', paths: /^\/api\/(almanac|calendar-feeds|services|treatments)\b/ },
  { area: 'litters-and-health', paths: /^\/api\/(litters|litter-events|housing-units|housing-placements|withdrawals|temperature-readings|heat-caution|processing-records|processing-marks)\b/ },
  { area: 'grow-out', paths: /^\/api\/(grow-out|feed|performance|weighing-rounds)\b/ },
  { area: 'ledger', paths: /^\/api\/(ledger|card-webhooks)\b/ },
  { area: 'notifications', paths: /^\/api\/notifications\b/ },
  { area: 'processing-days', paths: /^\/api\/processing-days\b/ },
  { area: 'stud-share', paths: /^\/api\/stud-share\b/ },
  { area: 'swap-board', paths: /^\/api\/swap-board\b/ },
  { area: 'mentorship', paths: /^\/api\/mentorship\b/ },
  { area: 'chat', paths: /^\/api\/chat\b/ },
] as const;

export type MatrixArea = (typeof matrixAreas)[number]['area'];

export function areaOf(row: MatrixRow): MatrixArea | null {
  return matrixAreas.find((a) => a.paths.test(row.path))?.area ?? null;
}
