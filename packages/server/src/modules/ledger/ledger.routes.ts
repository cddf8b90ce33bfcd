import express, { Router } from 'express';
import { z } from 'zod';
import {
  cardCheckoutCreateSchema, correctionCreateSchema, duesSetSchema, paymentCreateSchema, statementQuerySchema, transferCreateSchema,
  transferIdSchema, transferListQuerySchema, yearParamSchema,
} from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import { getCardCheckout, openCardCheckout, receiveCardWebhook } from './card-payments.service';
import { setDues } from './dues.service';
import {
  confirmTransfer, coopLedger, correctTransfer, createTransfer, feesByMonth, getTransfer, ledgerSummary, listTransfers, recordPayment,
  settleUpFor, voidTransfer,
} from './ledger.service';
import { statementFor } from './statements.service';

const farmQuerySchema = z.strictObject({ farmId: z.uuid().optional() });
const feesQuerySchema = z.strictObject({
  farmId: z.uuid().optional(),
  coop: z.enum(['true']).optional(),
  through: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the last day as YYYY-MM-DD').optional(),
});

/** /api/ledger: a farm's account, the co-op's books, statements, settling up, payments and dues. Never for apprentices. */
export function ledgerRoutes(config: Config): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/summary', async (req, res) => {
    res.json(await ledgerSummary(actorOf(req), farmQuerySchema.parse(req.query).farmId, { cardPayments: config.card !== null }));
  });
  router.get('/coop', async (req, res) => {
    res.json(await coopLedger(actorOf(req)));
  });
  router.get('/transfers', async (req, res) => {
    res.json(await listTransfers(actorOf(req), transferListQuerySchema.parse(req.query)));
  });
  router.post('/transfers', async (req, res) => {
    const { transfer, created } = await createTransfer(actorOf(req), transferCreateSchema.parse(req.body));
    res.status(created ? 201 : 200).json(transfer);
  });
  router.get('/transfers/:transferId', async (req, res) => {
    res.json(await getTransfer(actorOf(req), transferIdSchema.parse(req.params.transferId)));
  });
  router.post('/transfers/:transferId/confirmation', async (req, res) => {
    res.json(await confirmTransfer(actorOf(req), transferIdSchema.parse(req.params.transferId)));
  });
  router.post('/transfers/:transferId/void', async (req, res) => {
    res.json(await voidTransfer(actorOf(req), transferIdSchema.parse(req.params.transferId)));
  });
  router.post('/transfers/:transferId/corrections', async (req, res) => {
    const { transfer, created } = await correctTransfer(actorOf(req), transferIdSchema.parse(req.params.transferId), correctionCreateSchema.parse(req.body));
    res.status(created ? 201 : 200).json(transfer);
  });
  router.post('/payments', async (req, res) => {
    const { transfer, created } = await recordPayment(actorOf(req), paymentCreateSchema.parse(req.body));
    res.status(created ? 201 : 200).json(transfer);
  });
  router.get('/settle-up', async (req, res) => {
    res.json(await settleUpFor(actorOf(req)));
  });
  router.get('/statement', async (req, res) => {
    const result = await statementFor(actorOf(req), statementQuerySchema.parse(req.query));
    if ('fileName' in result) {
      res.setHeader('Content-Type', result.contentType);
      res.setHeader('Content-Disposition', `attachment; filename="${result.fileName}"`);
      res.send(result.body);
      return;
    }
    res.json(result);
  });
  router.get('/fees-by-month', async (req, res) => {
    const q = feesQuerySchema.parse(req.query);
    res.json(await feesByMonth(actorOf(req), { farmId: q.farmId, coop: q.coop === 'true', through: q.through ?? new Date().toISOString().slice(0, 10) }));
  });
  router.put('/dues/:year', async (req, res) => {
    res.json(await setDues(actorOf(req), yearParamSchema.parse(req.params.year), duesSetSchema.parse(req.body), config.appUrl));
  });
  router.post('/card-checkouts', async (req, res) => {
    res.status(201).json(await openCardCheckout(actorOf(req), cardCheckoutCreateSchema.parse(req.body), config.card, config.appUrl));
  });
  router.get('/card-checkouts/:checkoutId', async (req, res) => {
    res.json(await getCardCheckout(actorOf(req), z.uuid().parse(req.params.checkoutId)));
  });
  return router;
}

/**
 * /api/card-webhooks: the card service's deliveries. No session and no CSRF header (the signature is the
 * proof), and the raw body, since the signature covers the exact bytes. Mounted before the JSON parser.
 */
export function cardWebhookRoutes(config: Config): Router {
  const router = Router();
  router.post('/', express.raw({ type: '*/*', limit: '256kb' }), async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    res.json(await receiveCardWebhook(body, req.get('stripe-signature'), config.card));
  });
  return router;
}
