import type { ApplicationStatus } from './schemas/application.schema';
import type { StudLoanState } from './schemas/stud-share.schema';
import type { SwapListingState, SwapOfferState } from './schemas/swap-board.schema';
import type { ChatMessageDto } from './chat';

/** Socket.IO event names and payloads; the client maps each to TanStack Query invalidations. */
export const RealtimeEvent = {
  farmUpdated: 'farm:updated',
  sessionEnded: 'session:ended',
  /** An animal of the farm was added or changed (record, status, move, weigh-in); to the farm's room. */
  herdChanged: 'herd:changed',
  /** Pedigree figures (COI, breed make-up) were recomputed; to the co-op room, since pedigree cards are co-op-wide. */
  pedigreeChanged: 'pedigree:changed',
  /** A new farm joined the co-op (an approved application or an accepted invitation); to the co-op room. */
  farmCreated: 'farm:created',
  /** A new application arrived; to the co-op's admin room only. */
  applicationCreated: 'application:created',
  /** An application was approved, rejected or withdrawn; to the co-op's admin room only. */
  applicationUpdated: 'application:updated',
  /** A member's role, status or invitation changed; to the co-op's admin room only. */
  memberUpdated: 'member:updated',
  /** The farm's Almanac changed (a task planned, done, moved, skipped or re-planned; a service or setting); to the farm's room. */
  almanacChanged: 'almanac:changed',
  /** A litter of the farm changed (kindling, a kit-count event, a fostering, a keeper, a review); to the farm's room. */
  litterChanged: 'litter:changed',
  /** The farm's grow-out groups, their weigh-ins or its feed purchases and feed given changed; to the farm's room. */
  growOutChanged: 'grow-out:changed',
  /** A temperature reading was logged on the farm (the heat caution may change); to the farm's room. */
  temperatureRecorded: 'temperature:recorded',
  /** The farm's treatments and withdrawals changed; to the farm's room. */
  healthChanged: 'health:changed',
  /** A processing record or a mark for processing of the farm changed; to the farm's room. */
  processingChanged: 'processing:changed',
  /** The Ledger of a farm (to the farm's money room) or of the co-op (to its admins) changed; no amounts travel. */
  ledgerChanged: 'ledger:changed',
  /** A card checkout was settled by the card service; to the payer's user room. */
  cardCheckoutSettled: 'ledger:card-checkout-settled',
  /** A processing day was scheduled, changed or closed, or its bookings, roster or capacity changed; to the co-op room. */
  processingDayChanged: 'processing-day:changed',
  /** A buck was offered, his offer changed or was withdrawn; to the co-op room (buck cards are co-op-wide; no fees travel). */
  studOfferChanged: 'stud-share:offer-changed',
  /** A request or loan changed (requested, answered, handed over, returned…); to the two farms' rooms only (no fees travel). */
  studLoanChanged: 'stud-share:loan-changed',
  /** A Swap Board listing was published, changed or closed; to the co-op room (no prices travel). */
  swapListingChanged: 'swap-board:listing-changed',
  /** An offer was made, countered, answered or its hand-over recorded; to the two farms' rooms only (no prices travel). */
  swapOfferChanged: 'swap-board:offer-changed',
  /** A notification arrived for the person, or they read some; to their user room only. */
  notificationsChanged: 'notifications:changed',
  /** An apprentice's entry was sent, reviewed or a skill marked; to the apprentice's and her mentor's user rooms. */
  mentorshipChanged: 'mentorship:changed',
  /** A chat message was posted, edited, removed, hidden or reacted to; to the thread's room (joined after the read check). */
  chatMessage: 'chat:message',
  /** A thread has new messages (unread counts change); to the co-op room for the channel and topics, else to the subject's people. */
  chatActivity: 'chat:activity',
} as const;

export interface ServerToClientEvents {
  [RealtimeEvent.farmUpdated]: (payload: { farmId: string }) => void;
  [RealtimeEvent.sessionEnded]: (payload: { reason: string }) => void;
  [RealtimeEvent.herdChanged]: (payload: { farmId: string; animalId: string | null }) => void;
  [RealtimeEvent.pedigreeChanged]: (payload: { changedCount: number }) => void;
  [RealtimeEvent.farmCreated]: (payload: { farmId: string }) => void;
  [RealtimeEvent.applicationCreated]: (payload: { applicationId: string }) => void;
  [RealtimeEvent.applicationUpdated]: (payload: { applicationId: string; status: ApplicationStatus }) => void;
  [RealtimeEvent.memberUpdated]: (payload: { userId: string }) => void;
  [RealtimeEvent.almanacChanged]: (payload: { farmId: string }) => void;
  [RealtimeEvent.litterChanged]: (payload: { farmId: string; litterId: string }) => void;
  [RealtimeEvent.temperatureRecorded]: (payload: { farmId: string; readingId: string; celsius: number; hot: boolean }) => void;
  [RealtimeEvent.healthChanged]: (payload: { farmId: string }) => void;
  [RealtimeEvent.processingChanged]: (payload: { farmId: string }) => void;
  [RealtimeEvent.growOutChanged]: (payload: { farmId: string; groupId: string | null }) => void;
  [RealtimeEvent.ledgerChanged]: (payload: { farmIds: string[] }) => void;
  [RealtimeEvent.cardCheckoutSettled]: (payload: { checkoutId: string; status: 'paid' | 'declined' }) => void;
  [RealtimeEvent.processingDayChanged]: (payload: ProcessingDayChangedPayload) => void;
  [RealtimeEvent.studOfferChanged]: (payload: { offerId: string; buckId: string; farmId: string }) => void;
  [RealtimeEvent.studLoanChanged]: (payload: { loanId: string; buckId: string; farmIds: string[]; state: StudLoanState }) => void;
  [RealtimeEvent.swapListingChanged]: (payload: { listingId: string; farmId: string; state: SwapListingState }) => void;
  [RealtimeEvent.swapOfferChanged]: (payload: { offerId: string; listingId: string; farmIds: string[]; state: SwapOfferState }) => void;
  [RealtimeEvent.notificationsChanged]: (payload: { unread: number; title: string | null; link: string | null }) => void;
  [RealtimeEvent.mentorshipChanged]: (payload: { apprenticeId: string; what: 'submitted' | 'reviewed' | 'skill' }) => void;
  [RealtimeEvent.chatMessage]: (payload: ChatMessageDto) => void;
  [RealtimeEvent.chatActivity]: (payload: { threadId: string; seq: number }) => void;
}

/** The answer to a client's request over the socket: like an HTTP response, a refusal carries the error body. */
export type SocketAck = { ok: true } | { ok: false; error: { code: string; message: string } };

export const ClientEvent = {
  /** Join a chat thread's room; the server checks the person may read the thread first. */
  chatJoin: 'chat:join',
  chatLeave: 'chat:leave',
} as const;

export interface ClientToServerEvents {
  [ClientEvent.chatJoin]: (payload: { threadId: string }, ack: (result: SocketAck) => void) => void;
  [ClientEvent.chatLeave]: (payload: { threadId: string }, ack: (result: SocketAck) => void) => void;
}

/** No money and no names travel: the screens refetch the day. */
export interface ProcessingDayChangedPayload {
  dayId: string;
  what: 'scheduled' | 'changed' | 'capacity' | 'roster' | 'closed';
  capacity: { capacityHead: number; bookedHead: number; offeredHead: number; waitlistedHead: number; freeHead: number };
}


/** Room names: a socket joins only the rooms its ability allows. */
export const rooms = {
  coop: (coopId: string) => `coop:${coopId}`,
  coopAdmins: (coopId: string) => `coop:${coopId}:admins`,
  farm: (farmId: string) => `farm:${farmId}`,
  /** A farm's members who may see money (never its apprentices). */
  farmLedger: (farmId: string) => `farm:${farmId}:ledger`,
  user: (userId: string) => `user:${userId}`,
  /** A chat thread's readers: joined only through the read check of `chat:join`. */
  chatThread: (threadId: string) => `chat-thread:${threadId}`,
};
