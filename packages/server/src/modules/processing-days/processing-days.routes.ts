/**
 * /api/processing-days — routes (the screens rely on these paths and bodies; shapes in @burrowline/shared):
 *
 *   GET    /sites                                   ProcessingSiteDto[]            any member (apprentices too)
 *   POST   /sites                                   ProcessingSiteDto  201         admin
 *   PATCH  /sites/:siteId                           ProcessingSiteDto              admin
 *   PUT    /farm-settings/:farmId                   { apprenticesMayStaff }        the farm's members, admin
 *   GET    /farm-settings/:farmId                   { apprenticesMayStaff }        the farm's people, admin
 *   GET    /                ?when&page&pageSize     ProcessingDayListDto           any member
 *   POST   /                                        ProcessingDayDto  201          admin, or a member of a site's host farm the admin allows
 *   GET    /:dayId                                  ProcessingDayDto               any member
 *   PATCH  /:dayId                                  ProcessingDayDto               admin, the scheduling host
 *   GET    /:dayId/candidates?farmId                BookingCandidatesDto           the farm's members
 *   GET    /:dayId/bookings                         BookingListDto                 any member (fees only to who may see money)
 *   POST   /:dayId/bookings                         BookingDto 201 (200 on retry)  the farm's members; waitlisted when full
 *   PATCH  /:dayId/bookings/:bookingId              BookingDto                     the farm's members until the deadline, then admin
 *   POST   /:dayId/bookings/:bookingId/cancel       BookingDto                     the farm's members until the deadline, then admin
 *   POST   /:dayId/bookings/:bookingId/confirm      BookingDto                     the farm's members (an offered place)
 *   POST   /:dayId/bookings/:bookingId/check-in     BookingDto                     admin, the host farm's members
 *   POST   /:dayId/stations/:stationId/sign-up      ProcessingDayDto               members; apprentices if their farm allows; { userId } admin, host
 *   POST   /:dayId/stations/:stationId/leave        ProcessingDayDto               who is on the place; { userId } admin, host
 *   POST   /:dayId/equipment/:itemId/claim          ProcessingDayDto               a booked or host farm's members
 *   POST   /:dayId/equipment/:itemId/release        ProcessingDayDto               the claiming farm's members, admin, host
 *   POST   /:dayId/yields                           ProcessingRecordDto 201        admin, host, the booking farm's members
 *   POST   /:dayId/close                            ProcessingDaySummaryDto        admin, the scheduling host (after the day)
 *   GET    /:dayId/summary                          ProcessingDaySummaryDto        any member
 *   GET    /:dayId/sheet.pdf                        application/pdf                any member
 */
import { Router } from 'express';
import { z } from 'zod';
import {
  bookingCancelSchema, bookingChangeSchema, bookingConfirmSchema, bookingCreateSchema, candidatesQuerySchema, checkInSchema, dayCloseSchema,
  dayYieldCreateSchema, equipmentClaimSchema, processingDayCreateSchema, processingDayListQuerySchema, processingDayUpdateSchema,
  processingFarmSettingsSchema, processingSiteCreateSchema, processingSiteUpdateSchema, rosterSignUpSchema,
} from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import {
  bookingCandidates, bookPlaces, cancelBooking, changeBooking, checkIn, confirmOffer, listBookings,
} from './bookings.service';
import { closeDay, daySheet, daySummary, recordDayYield } from './day-close.service';
import {
  claimEquipment, createSite, getDay, getFarmSettings, leaveStation, listDays, listSites, releaseEquipment, scheduleDay, setFarmSettings,
  signUpForStation, updateDay, updateSite,
} from './processing-days.service';

const id = (what: string) => z.uuid({ message: `No such ${what}` });

export function processingDayRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/sites', async (req, res) => {
    res.json(await listSites(actorOf(req)));
  });
  router.post('/sites', async (req, res) => {
    res.status(201).json(await createSite(actorOf(req), processingSiteCreateSchema.parse(req.body)));
  });
  router.patch('/sites/:siteId', async (req, res) => {
    res.json(await updateSite(actorOf(req), id('site').parse(req.params.siteId), processingSiteUpdateSchema.parse(req.body)));
  });
  router.get('/farm-settings/:farmId', async (req, res) => {
    res.json(await getFarmSettings(actorOf(req), id('farm').parse(req.params.farmId)));
  });
  router.put('/farm-settings/:farmId', async (req, res) => {
    res.json(await setFarmSettings(actorOf(req), id('farm').parse(req.params.farmId), processingFarmSettingsSchema.parse(req.body)));
  });
  router.get('/', async (req, res) => {
    res.json(await listDays(actorOf(req), processingDayListQuerySchema.parse(req.query)));
  });
  router.post('/', async (req, res) => {
    res.status(201).json(await scheduleDay(actorOf(req), processingDayCreateSchema.parse(req.body)));
  });
  router.get('/:dayId', async (req, res) => {
    res.json(await getDay(actorOf(req), id('day').parse(req.params.dayId)));
  });
  router.patch('/:dayId', async (req, res) => {
    res.json(await updateDay(actorOf(req), id('day').parse(req.params.dayId), processingDayUpdateSchema.parse(req.body)));
  });
  router.get('/:dayId/candidates', async (req, res) => {
    res.json(await bookingCandidates(actorOf(req), id('day').parse(req.params.dayId), candidatesQuerySchema.parse(req.query).farmId));
  });
  router.get('/:dayId/bookings', async (req, res) => {
    res.json(await listBookings(actorOf(req), id('day').parse(req.params.dayId)));
  });
  router.post('/:dayId/bookings', async (req, res) => {
    const { booking, created } = await bookPlaces(actorOf(req), id('day').parse(req.params.dayId), bookingCreateSchema.parse(req.body));
    res.status(created ? 201 : 200).json(booking);
  });
  router.patch('/:dayId/bookings/:bookingId', async (req, res) => {
    res.json(await changeBooking(actorOf(req), id('day').parse(req.params.dayId), id('booking').parse(req.params.bookingId), bookingChangeSchema.parse(req.body)));
  });
  router.post('/:dayId/bookings/:bookingId/cancel', async (req, res) => {
    res.json(await cancelBooking(actorOf(req), id('day').parse(req.params.dayId), id('booking').parse(req.params.bookingId), bookingCancelSchema.parse(req.body)));
  });
  router.post('/:dayId/bookings/:bookingId/confirm', async (req, res) => {
    const { version } = bookingConfirmSchema.parse(req.body);
    res.json(await confirmOffer(actorOf(req), id('day').parse(req.params.dayId), id('booking').parse(req.params.bookingId), version));
  });
  router.post('/:dayId/bookings/:bookingId/check-in', async (req, res) => {
    res.json(await checkIn(actorOf(req), id('day').parse(req.params.dayId), id('booking').parse(req.params.bookingId), checkInSchema.parse(req.body)));
  });
  router.post('/:dayId/stations/:stationId/sign-up', async (req, res) => {
    res.json(await signUpForStation(actorOf(req), id('day').parse(req.params.dayId), id('station').parse(req.params.stationId), rosterSignUpSchema.parse(req.body ?? {})));
  });
  router.post('/:dayId/stations/:stationId/leave', async (req, res) => {
    res.json(await leaveStation(actorOf(req), id('day').parse(req.params.dayId), id('station').parse(req.params.stationId), rosterSignUpSchema.parse(req.body ?? {})));
  });
  router.post('/:dayId/equipment/:itemId/claim', async (req, res) => {
    res.json(await claimEquipment(actorOf(req), id('day').parse(req.params.dayId), id('item').parse(req.params.itemId), equipmentClaimSchema.parse(req.body).farmId));
  });
  router.post('/:dayId/equipment/:itemId/release', async (req, res) => {
    res.json(await releaseEquipment(actorOf(req), id('day').parse(req.params.dayId), id('item').parse(req.params.itemId)));
  });
  router.post('/:dayId/yields', async (req, res) => {
    res.status(201).json(await recordDayYield(actorOf(req), id('day').parse(req.params.dayId), dayYieldCreateSchema.parse(req.body)));
  });
  router.post('/:dayId/close', async (req, res) => {
    res.json(await closeDay(actorOf(req), id('day').parse(req.params.dayId), dayCloseSchema.parse(req.body)));
  });
  router.get('/:dayId/summary', async (req, res) => {
    res.json(await daySummary(actorOf(req), id('day').parse(req.params.dayId)));
  });
  router.get('/:dayId/sheet.pdf', async (req, res) => {
    const file = await daySheet(actorOf(req), id('day').parse(req.params.dayId));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
    res.setHeader('Content-Length', String(file.body.length));
    res.setHeader('Cache-Control', 'no-store');
    res.send(file.body);
  });
  return router;
}
