/**
 * /api/stud-share — every body and query is the shared schema of the same name (stud-share.schema.ts).
 *
 * | method | path                                      | body / query                 | answers            |
 * |--------|-------------------------------------------|------------------------------|--------------------|
 * | GET    | /offers                                   | studOfferListQuerySchema     | BuckCardListDto    |
 * | POST   | /offers                                   | studOfferSchema              | 201 BuckCardDto    |
 * | GET    | /offers/:offerId                          |                              | BuckCardDto        |
 * | PUT    | /offers/:offerId                          | studOfferUpdateSchema        | BuckCardDto        |
 * | POST   | /offers/:offerId/withdraw                 | { version }                  | BuckCardDto        |
 * | POST   | /offers/:offerId/publish                  | { version }                  | BuckCardDto        |
 * | GET    | /offers/:offerId/availability             | studAvailabilityQuerySchema  | StudAvailabilityDto|
 * | GET    | /finder                                   | studFinderQuerySchema        | StudFinderDto      |
 * | GET    | /loans                                    | studLoanListQuerySchema      | StudLoanListDto    |
 * | POST   | /loans                                    | studRequestSchema            | 201 StudLoanDto    |
 * | GET    | /loans/:loanId                            |                              | StudLoanDto        |
 * | POST   | /loans/:loanId/accept                     | studVersionSchema            | StudLoanDto (409: dates taken) |
 * | POST   | /loans/:loanId/decline                    | studDeclineSchema            | StudLoanDto        |
 * | POST   | /loans/:loanId/propose                    | studProposeSchema            | StudLoanDto        |
 * | POST   | /loans/:loanId/proposal-answer            | studProposalAnswerSchema     | StudLoanDto        |
 * | POST   | /loans/:loanId/cancel                     | studVersionSchema            | StudLoanDto        |
 * | POST   | /loans/:loanId/hand-over                  | studCustodyStepSchema        | StudLoanDto        |
 * | POST   | /loans/:loanId/hand-over/confirm          | studVersionSchema            | StudLoanDto        |
 * | POST   | /loans/:loanId/return                     | studCustodyStepSchema        | StudLoanDto        |
 * | POST   | /loans/:loanId/return/confirm             | studVersionSchema            | StudLoanDto        |
 * | POST   | /loans/:loanId/service                    | studVersionSchema            | StudLoanDto (a visit served) |
 * | PUT    | /api/farms/:farmId/coordinates            | farmCoordinatesSchema        | { latitude, longitude } |
 */
import { Router } from 'express';
import { z } from 'zod';
import {
  studAvailabilityQuerySchema, studCustodyStepSchema, studDeclineSchema, studFinderQuerySchema, studLoanListQuerySchema,
  studOfferListQuerySchema, studOfferSchema, studOfferUpdateSchema, studProposalAnswerSchema, studProposeSchema, studRequestSchema,
  studVersionSchema, uuidParamSchema,
} from '@burrowline/shared';
import { actorOf, requireUser } from '../../http/ability';
import {
  getBuckCard, listBuckCards, offerBuck, setOfferPublished, studAvailability, updateOffer,
} from './stud-offers.service';
import { findStuds } from './stud-finder.service';
import {
  acceptRequest, answerProposal, cancelRequest, confirmCustodyStep, declineRequest, getLoan, listLoans, proposeDates, recordCustodyStep,
  recordServiceVisit, requestStud,
} from './stud-loans.service';

const versionOnly = z.strictObject({ version: z.number().int().min(0) });

export function studShareRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  const offerId = (req: { params: Record<string, string | undefined> }) => uuidParamSchema.parse(req.params.offerId);
  const loanId = (req: { params: Record<string, string | undefined> }) => uuidParamSchema.parse(req.params.loanId);

  router.get('/offers', async (req, res) => {
    res.json(await listBuckCards(actorOf(req), studOfferListQuerySchema.parse(req.query)));
  });
  router.post('/offers', async (req, res) => {
    res.status(201).json(await offerBuck(actorOf(req), studOfferSchema.parse(req.body)));
  });
  router.get('/offers/:offerId', async (req, res) => {
    res.json(await getBuckCard(actorOf(req), offerId(req)));
  });
  router.put('/offers/:offerId', async (req, res) => {
    res.json(await updateOffer(actorOf(req), offerId(req), studOfferUpdateSchema.parse(req.body)));
  });
  router.post('/offers/:offerId/withdraw', async (req, res) => {
    res.json(await setOfferPublished(actorOf(req), offerId(req), versionOnly.parse(req.body).version, false));
  });
  router.post('/offers/:offerId/publish', async (req, res) => {
    res.json(await setOfferPublished(actorOf(req), offerId(req), versionOnly.parse(req.body).version, true));
  });
  router.get('/offers/:offerId/availability', async (req, res) => {
    res.json(await studAvailability(actorOf(req), offerId(req), studAvailabilityQuerySchema.parse(req.query)));
  });
  router.get('/finder', async (req, res) => {
    res.json(await findStuds(actorOf(req), studFinderQuerySchema.parse(req.query)));
  });
  router.get('/loans', async (req, res) => {
    res.json(await listLoans(actorOf(req), studLoanListQuerySchema.parse(req.query)));
  });
  router.post('/loans', async (req, res) => {
    const { loan, created } = await requestStud(actorOf(req), studRequestSchema.parse(req.body));
    res.status(created ? 201 : 200).json(loan);
  });
  router.get('/loans/:loanId', async (req, res) => {
    res.json(await getLoan(actorOf(req), loanId(req)));
  });
  router.post('/loans/:loanId/accept', async (req, res) => {
    res.json(await acceptRequest(actorOf(req), loanId(req), studVersionSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/decline', async (req, res) => {
    res.json(await declineRequest(actorOf(req), loanId(req), studDeclineSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/propose', async (req, res) => {
    res.json(await proposeDates(actorOf(req), loanId(req), studProposeSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/proposal-answer', async (req, res) => {
    res.json(await answerProposal(actorOf(req), loanId(req), studProposalAnswerSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/cancel', async (req, res) => {
    res.json(await cancelRequest(actorOf(req), loanId(req), studVersionSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/hand-over', async (req, res) => {
    res.json(await recordCustodyStep(actorOf(req), loanId(req), 'hand_over', studCustodyStepSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/hand-over/confirm', async (req, res) => {
    res.json(await confirmCustodyStep(actorOf(req), loanId(req), 'hand_over', studVersionSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/return', async (req, res) => {
    res.json(await recordCustodyStep(actorOf(req), loanId(req), 'return', studCustodyStepSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/return/confirm', async (req, res) => {
    res.json(await confirmCustodyStep(actorOf(req), loanId(req), 'return', studVersionSchema.parse(req.body)));
  });
  router.post('/loans/:loanId/service', async (req, res) => {
    res.json(await recordServiceVisit(actorOf(req), loanId(req), studVersionSchema.parse(req.body)));
  });
  return router;
}
