import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useNavigate } from 'react-router-dom';
import { RealtimeEvent } from '@burrowline/shared';
import { leaveSignedInArea } from '../../auth';
import { almanacKeys } from '../../almanac';
import { applicationKeys } from '../../applications';
import { farmKeys } from '../../farms';
import { feedKeys } from '../../feed';
import { growOutKeys } from '../../grow-out';
import { healthKeys } from '../../health';
import { processingKeys } from '../../processing';
import { herdKeys } from '../../herd';
import { litterKeys } from '../../litters';
import { auditKeys, memberKeys } from '../../members';
import { performanceKeys } from '../../performance';
import { ledgerKeys } from '../../ledger';
import { mentorshipKeys } from '../../mentorship';
import { processingDayKeys } from '../../processing-days';
import { notificationKeys, type LatestNotification } from '../../notifications';
import { studShareKeys } from '../../stud-share';
import { swapBoardKeys } from '../../swap-board';
import { chatKeys } from '../../chat';

/**
 * The one place where server events become cache updates. Mounted by the signed-in layout, so the
 * socket exists exactly while someone is signed in.
 */
export function useRealtimeSync(): void {
  const queryClient = useQueryClient();
  const navigate = useNavigate();

  useEffect(() => {
    let unmounted = false;
    let stop = () => {};

    // Socket.IO loads after the first paint; the signed-out screens never download it.
    void import('../../../lib/socket').then(({ connectRealtime, disconnectRealtime }) => {
      if (unmounted) return;
      const socket = connectRealtime();
      const refreshFarms = () => void queryClient.invalidateQueries({ queryKey: farmKeys.all });
      // Admins only (the server sends these to the co-op's admin room): the queue, its badge, the roster, the log.
      const refreshApplications = () => {
        void queryClient.invalidateQueries({ queryKey: applicationKeys.all });
        void queryClient.invalidateQueries({ queryKey: auditKeys.all });
      };
      const refreshMembers = () => {
        void queryClient.invalidateQueries({ queryKey: memberKeys.all });
        void queryClient.invalidateQueries({ queryKey: auditKeys.all });
      };
      // A herd change (own farm) or recomputed pedigree figures (anywhere in the co-op): the Herd's queries.
      const refreshHerd = () => void queryClient.invalidateQueries({ queryKey: herdKeys.all });
      // The farm's Almanac (tasks, services, settings) or a litter changed; a litter's tasks live in the Almanac too.
      // The performance tables are computed from services, litters, groups, feed and processing.
      const refreshPerformance = () => void queryClient.invalidateQueries({ queryKey: performanceKeys.all });
      const refreshAlmanac = () => {
        void queryClient.invalidateQueries({ queryKey: almanacKeys.all });
        // The herd list shows where each doe stands in her cycle, read from services and litters.
        void queryClient.invalidateQueries({ queryKey: [...herdKeys.all, 'animals', 'list'] });
        refreshPerformance();
      };
      const refreshLitters = () => {
        void queryClient.invalidateQueries({ queryKey: litterKeys.all });
        refreshAlmanac();
      };
      // The farm's grow-out groups, their weigh-ins, or its feed book changed (a group's feed conversion follows the feed).
      const refreshGrowOut = () => {
        void queryClient.invalidateQueries({ queryKey: growOutKeys.all });
        void queryClient.invalidateQueries({ queryKey: feedKeys.all });
        refreshPerformance();
      };
      // Treatments and withdrawals (which also gate marks for processing), the barn's temperature (the heat caution),
      // processing records and marks (the performance tables read the yields).
      const refreshHealth = () => {
        void queryClient.invalidateQueries({ queryKey: healthKeys.all });
        void queryClient.invalidateQueries({ queryKey: processingKeys.all });
      };
      const refreshTemperature = () => void queryClient.invalidateQueries({ queryKey: healthKeys.all });
      const refreshProcessing = () => {
        void queryClient.invalidateQueries({ queryKey: processingKeys.all });
        refreshPerformance();
      };
      // A reviewed group weigh-in is announced as a herd change with no animal: the group's projection moves.
      const refreshGroupWeighIns = ({ animalId }: { animalId: string | null }) => {
        if (animalId === null) refreshGrowOut();
      };
      // The Ledger of the person's farm or (admins) the co-op changed, or a card payment was settled: refetch its figures.
      const refreshLedger = () => void queryClient.invalidateQueries({ queryKey: ledgerKeys.all });
      // A processing day was scheduled or changed, or its places, waiting list or roster moved: its screens refetch.
      const refreshProcessingDays = () => void queryClient.invalidateQueries({ queryKey: processingDayKeys.all });
      // A notification arrived or was read on another screen: the bell's count and list.
      const refreshNotifications = () => void queryClient.invalidateQueries({ queryKey: notificationKeys.all });
      const notificationsChanged = ({ unread, title, link }: { unread: number; title: string | null; link: string | null }) => {
        // The server's count at the event is the latest: a count asked for just before it must not land after it.
        void queryClient.cancelQueries({ queryKey: notificationKeys.unread() }).then(() => queryClient.setQueryData(notificationKeys.unread(), { unread }));
        void queryClient.invalidateQueries({ queryKey: notificationKeys.all, predicate: (query) => query.queryKey[1] !== 'unread' });
        if (title && link) queryClient.setQueryData<LatestNotification>(notificationKeys.latest(), { title, link, at: Date.now() });
      };
      // A buck was offered, changed or withdrawn (co-op room): the buck cards and the finder's ranking.
      const refreshStudOffers = () => {
        void queryClient.invalidateQueries({ queryKey: studShareKeys.offers() });
        void queryClient.invalidateQueries({ queryKey: studShareKeys.finders() });
      };
      // A request or loan of one of the person's farms changed (the two farms' rooms): the loans, the buck's
      // calendar and whereabouts; a hand-over or return also moves him between Herds and plans the quarantine.
      const refreshStudLoans = ({ state }: { state: string }) => {
        void queryClient.invalidateQueries({ queryKey: studShareKeys.all });
        if (state === 'handed_over' || state === 'returned' || state === 'served') {
          refreshHerd();
          refreshAlmanac();
        }
      };
      // A listing was published, changed or closed (co-op room), or an offer of one of the person's farms moved
      // (the two farms' rooms): the board, the listing pages and the offers. An accepted offer also moves animals
      // between Herds, which their own herd events refresh.
      const refreshSwapBoard = () => void queryClient.invalidateQueries({ queryKey: swapBoardKeys.all });
      // An apprentice's entry was sent or reviewed, or a skill marked: her log, the mentor's queue, the pages.
      const refreshMentorship = () => void queryClient.invalidateQueries({ queryKey: mentorshipKeys.all });
      const refreshAll = () => {
        refreshMentorship();
        refreshNotifications();
        refreshFarms();
        refreshLitters();
        refreshHerd();
        refreshApplications();
        refreshMembers();
        refreshGrowOut();
        refreshHealth();
        refreshProcessing();
        refreshLedger();
        refreshProcessingDays();
        void queryClient.invalidateQueries({ queryKey: studShareKeys.all });
        refreshSwapBoard();
      };
      const endSession = ({ reason }: { reason: string }) =>
        void leaveSignedInArea(
          queryClient,
          navigate,
          reason === 'signed_out' ? { notice: 'signed-out' } : { notice: 'session-ended', reason },
        );

      socket.on(RealtimeEvent.farmUpdated, refreshFarms);
      socket.on(RealtimeEvent.farmCreated, refreshFarms);
      socket.on(RealtimeEvent.applicationCreated, refreshApplications);
      socket.on(RealtimeEvent.applicationUpdated, refreshApplications);
      socket.on(RealtimeEvent.memberUpdated, refreshMembers);
      socket.on(RealtimeEvent.herdChanged, refreshHerd);
      socket.on(RealtimeEvent.pedigreeChanged, refreshHerd);
      socket.on(RealtimeEvent.almanacChanged, refreshAlmanac);
      socket.on(RealtimeEvent.litterChanged, refreshLitters);
      socket.on(RealtimeEvent.growOutChanged, refreshGrowOut);
      socket.on(RealtimeEvent.herdChanged, refreshGroupWeighIns);
      socket.on(RealtimeEvent.healthChanged, refreshHealth);
      socket.on(RealtimeEvent.temperatureRecorded, refreshTemperature);
      socket.on(RealtimeEvent.processingChanged, refreshProcessing);
      socket.on(RealtimeEvent.ledgerChanged, refreshLedger);
      socket.on(RealtimeEvent.cardCheckoutSettled, refreshLedger);
      socket.on(RealtimeEvent.processingDayChanged, refreshProcessingDays);
      socket.on(RealtimeEvent.notificationsChanged, notificationsChanged);
      socket.on(RealtimeEvent.studOfferChanged, refreshStudOffers);
      socket.on(RealtimeEvent.studLoanChanged, refreshStudLoans);
      socket.on(RealtimeEvent.mentorshipChanged, refreshMentorship);
      socket.on(RealtimeEvent.swapListingChanged, refreshSwapBoard);
      socket.on(RealtimeEvent.swapOfferChanged, refreshSwapBoard);
      // New chat messages somewhere the person reads (or their own read position moved): unread counts.
      const refreshChat = () => void queryClient.invalidateQueries({ queryKey: chatKeys.threads() });
      socket.on(RealtimeEvent.chatActivity, refreshChat);
      socket.on(RealtimeEvent.sessionEnded, endSession);
      // Events sent while the connection was down are lost; refetch what they would have refreshed.
      socket.io.on('reconnect', refreshAll);
      // The page says whether it is live (a person's screen, and the browser tests, can tell); a notification
      // told before the first connection is counted again once connected.
      const connected = () => {
        document.documentElement.dataset.live = 'connected';
        void queryClient.invalidateQueries({ queryKey: notificationKeys.unread() });
      };
      const disconnected = () => {
        document.documentElement.dataset.live = 'disconnected';
      };
      socket.on('connect', connected);
      socket.on('disconnect', disconnected);
      if (socket.connected) connected();
      stop = () => {
        socket.off(RealtimeEvent.farmUpdated, refreshFarms);
        socket.off(RealtimeEvent.chatActivity, refreshChat);
        socket.off(RealtimeEvent.farmCreated, refreshFarms);
        socket.off(RealtimeEvent.applicationCreated, refreshApplications);
        socket.off(RealtimeEvent.applicationUpdated, refreshApplications);
        socket.off(RealtimeEvent.memberUpdated, refreshMembers);
        socket.off(RealtimeEvent.herdChanged, refreshHerd);
        socket.off(RealtimeEvent.pedigreeChanged, refreshHerd);
        socket.off(RealtimeEvent.almanacChanged, refreshAlmanac);
        socket.off(RealtimeEvent.litterChanged, refreshLitters);
        socket.off(RealtimeEvent.growOutChanged, refreshGrowOut);
        socket.off(RealtimeEvent.herdChanged, refreshGroupWeighIns);
        socket.off(RealtimeEvent.healthChanged, refreshHealth);
        socket.off(RealtimeEvent.temperatureRecorded, refreshTemperature);
        socket.off(RealtimeEvent.processingChanged, refreshProcessing);
        socket.off(RealtimeEvent.ledgerChanged, refreshLedger);
        socket.off(RealtimeEvent.cardCheckoutSettled, refreshLedger);
        socket.off(RealtimeEvent.processingDayChanged, refreshProcessingDays);
        socket.off(RealtimeEvent.notificationsChanged, notificationsChanged);
        socket.off(RealtimeEvent.studOfferChanged, refreshStudOffers);
        socket.off(RealtimeEvent.studLoanChanged, refreshStudLoans);
        socket.off(RealtimeEvent.mentorshipChanged, refreshMentorship);
        socket.off(RealtimeEvent.swapListingChanged, refreshSwapBoard);
        socket.off(RealtimeEvent.swapOfferChanged, refreshSwapBoard);
        socket.off(RealtimeEvent.sessionEnded, endSession);
        socket.io.off('reconnect', refreshAll);
        socket.off('connect', connected);
        socket.off('disconnect', disconnected);
        delete document.documentElement.dataset.live;
        disconnectRealtime();
      };
    });

    return () => {
      unmounted = true;
      stop();
    };
  }, [queryClient, navigate]);
}
