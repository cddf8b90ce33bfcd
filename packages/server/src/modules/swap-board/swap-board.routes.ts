/**
 * /api/swap-board — every body and query is the shared schema of the same name (swap-board.schema.ts).
 *
 * | method | path                               | body / query             | answers                         |
 * |--------|------------------------------------|--------------------------|---------------------------------|
 * | GET    | /listings                          | swapListingQuerySchema   | SwapListingListDto              |
 * | POST   | /listings                          | swapListingSchema        | 201 SwapListingDto (200: same id)|
 * | GET    | /listings/:listingId               |                          | SwapListingPageDto              |
 * | PATCH  | /listings/:listingId               | swapListingEditSchema    | SwapListingDto (409: stale, closed)|
 * | POST   | /listings/:listingId/publish       | swapVersionSchema        | SwapListingDto                  |
 * | POST   | /listings/:listingId/withdraw      | swapReasonSchema         | SwapListingDto                  |
 * | GET    | /summary                           |                          | SwapBoardSummaryDto             |
 * | GET    | /offers                            | swapOfferListQuerySchema | SwapOfferListDto                |
 * | POST   | /offers                            | swapOfferSchema          | 201 SwapOfferDto (200: same id) |
 * | GET    | /offers/:offerId                   |                          | SwapOfferDto                    |
 * | POST   | /offers/:offerId/counter           | swapCounterSchema        | SwapOfferDto                    |
 * | POST   | /offers/:offerId/accept            | swapAcceptSchema         | SwapOfferDto (409: sold already)|
 * | POST   | /offers/:offerId/decline           | swapReasonSchema         | SwapOfferDto                    |
 * | POST   | /offers/:offerId/withdraw          | swapReasonSchema         | SwapOfferDto                    |
 * | POST   | /offers/:offerId/collected         | swapVersionSchema        | SwapOfferDto                    |
 * | POST   | /offers/:offerId/hand-over-failed  | swapReasonSchema         | SwapOfferDto                    |
 */
import { Router } from 'express';
import {
  swapAcceptSchema, swapCounterSchema, swapListingEditSchema, swapListingQuerySchema, swapListingSchema, swapOfferListQuerySchema, swapOfferSchema, swapReasonSchema,
  swapVersionSchema, uuidParamSchema,
} from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import { createListing, editListing, getListingPage, listListings, publishListing, swapBoardSummary, withdrawListing } from './swap-listings.service';
import {
  acceptOffer, confirmCollection, counterOffer, declineOffer, getOffer, listOffers, makeOffer, reportHandOverFailed, withdrawOffer,
} from './swap-offers.service';

export function swapBoardRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  const listingId = (req: { params: Record<string, string | undefined> }) => uuidParamSchema.parse(req.params.listingId);
  const offerId = (req: { params: Record<string, string | undefined> }) => uuidParamSchema.parse(req.params.offerId);

  router.get('/listings', async (req, res) => {
    res.json(await listListings(actorOf(req), swapListingQuerySchema.parse(req.query)));
  });
  router.post('/listings', async (req, res) => {
    const { listing, created } = await createListing(actorOf(req), swapListingSchema.parse(req.body));
    res.status(created ? 201 : 200).json(listing);
  });
  router.get('/listings/:listingId', async (req, res) => {
    res.json(await getListingPage(actorOf(req), listingId(req)));
  });
  router.patch('/listings/:listingId', async (req, res) => {
    res.json(await editListing(actorOf(req), listingId(req), swapListingEditSchema.parse(req.body)));
  });
  router.post('/listings/:listingId/publish', async (req, res) => {
    res.json(await publishListing(actorOf(req), listingId(req), swapVersionSchema.parse(req.body)));
  });
  router.post('/listings/:listingId/withdraw', async (req, res) => {
    res.json(await withdrawListing(actorOf(req), listingId(req), swapReasonSchema.parse(req.body)));
  });
  router.get('/summary', async (req, res) => {
    res.json(await swapBoardSummary(actorOf(req)));
  });
  router.get('/offers', async (req, res) => {
    res.json(await listOffers(actorOf(req), swapOfferListQuerySchema.parse(req.query)));
  });
  router.post('/offers', async (req, res) => {
    const { offer, created } = await makeOffer(actorOf(req), swapOfferSchema.parse(req.body));
    res.status(created ? 201 : 200).json(offer);
  });
  router.get('/offers/:offerId', async (req, res) => {
    res.json(await getOffer(actorOf(req), offerId(req)));
  });
  router.post('/offers/:offerId/counter', async (req, res) => {
    res.json(await counterOffer(actorOf(req), offerId(req), swapCounterSchema.parse(req.body)));
  });
  router.post('/offers/:offerId/accept', async (req, res) => {
    res.json(await acceptOffer(actorOf(req), offerId(req), swapAcceptSchema.parse(req.body)));
  });
  router.post('/offers/:offerId/decline', async (req, res) => {
    res.json(await declineOffer(actorOf(req), offerId(req), swapReasonSchema.parse(req.body)));
  });
  router.post('/offers/:offerId/withdraw', async (req, res) => {
    res.json(await withdrawOffer(actorOf(req), offerId(req), swapReasonSchema.parse(req.body)));
  });
  router.post('/offers/:offerId/collected', async (req, res) => {
    res.json(await confirmCollection(actorOf(req), offerId(req), swapVersionSchema.parse(req.body)));
  });
  router.post('/offers/:offerId/hand-over-failed', async (req, res) => {
    res.json(await reportHandOverFailed(actorOf(req), offerId(req), swapReasonSchema.parse(req.body)));
  });
  return router;
}
