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
 *   POST   /:dayId/roster/:placeId/sign-up          ProcessingDayDto               members; apprentices if their farm allows
 *   POST   /:dayId/roster/:placeId/leave            ProcessingDayDto               who is on the place, admin, host
 *   POST   /:dayId/equipment/:itemId/claim          ProcessingDayDto               a booked or host farm's members
 *   POST   /:dayId/equipment/:itemId/release        ProcessingDayDto               the claiming farm's members, admin, host
 *   POST   /:dayId/yields                           ProcessingRecordDto 201        admin, host, the booking farm's members
 *   POST   /:dayId/close                            ProcessingDaySummaryDto        admin, the scheduling host (after the day)
 *   GET    /:dayId/summary                          ProcessingDaySummaryDto        any member
 *   GET    /:dayId/sheet.pdf                        application/pdf                any member
 */
