import type Stripe from 'stripe';
import {
  ErrorCode, RealtimeEvent, rooms, type CardCheckoutCreateInput, type CardCheckoutDto, type CardCheckoutStatus,
} from '@burrowline/shared';
import type { CardConfig } from '../../config/env';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { logger } from '../../lib/logger';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { getCoop } from '../coops/coops.service';
import { canSeeMoney } from '../farms/farm-access';
import { cents, selectRows } from './ledger-books';
import { duesOfFarms, duesPeriodOf, duesPeriods, owedToCoopOf, postTransfer } from './ledger.service';
import { cardClient } from './card-service';

/*
 * Paying the co-op by card through the card service's Checkout. The member's request opens a checkout
 * (its own row, then the service's session, created with an idempotency key); the redirect back only shows
 * "processing…"; the payment is posted by the verified webhook alone, once, with the event's id as the
 * transfer's id.
 */

interface CheckoutRow {
  id: string;
  farm_id: string;
  purpose: 'dues' | 'balance';
  dues_period_id: string | null;
  amount_cents: string;
  currency: string;
  status: CardCheckoutStatus;
  session_id: string | null;
  url: string | null;
  transfer_id: string | null;
  created_by: string;
}

function presentCheckout(row: CheckoutRow): CardCheckoutDto {
  return {
    id: row.id, status: row.status, purpose: row.purpose, amountCents: cents(row.amount_cents), currency: row.currency.trim(),
    url: row.status === 'open' ? row.url : null, transferId: row.transfer_id,
  };
}

function payingFarm(actor: SessionUser): string {
  if (!actor.farmId || !canSeeMoney(actor, actor.farmId)) throw new AppError(ErrorCode.forbidden, 403, 'The Ledger is for the farm\'s members and the co-op\'s admin');
  return actor.farmId;
}

function ensureCards(card: CardConfig | null): CardConfig {
  if (!card) throw new AppError(ErrorCode.unavailable, 503, 'Card payments are not set up for this co-op');
  return card;
}

/**
 * Opens a card checkout for the farm's dues of a year or its balance with the co-op. The client's
 * idempotency key makes a double click or a retry answer the same checkout and the same session.
 */
export async function openCardCheckout(actor: SessionUser, input: CardCheckoutCreateInput, card: CardConfig | null, appUrl: string): Promise<CardCheckoutDto> {
  const farmId = payingFarm(actor);
  const config = ensureCards(card);
  const prepared = await withTenant(actor, async (tx) => {
    const [existing] = await selectRows<CheckoutRow>(tx, 'SELECT * FROM card_checkouts WHERE idempotency_key = $1', [input.idempotencyKey]);
    if (existing) {
      if (existing.farm_id !== farmId) throw AppError.idTaken();
      return { row: existing, description: '' };
    }
    let amount: number;
    let periodId: string | null = null;
    let description: string;
    if (input.purpose === 'dues') {
      const period = input.duesYear ? await duesPeriodOf(tx, input.duesYear) : (await duesPeriods(tx))[0] ?? null;
      if (!period) throw AppError.validation({ duesYear: ['No dues are set for that year'] });
      amount = (await duesOfFarms(tx, [farmId])).get(farmId)?.find((d) => d.year === period.year)?.owedCents ?? 0;
      periodId = period.id;
      description = `${period.year} co-op dues`;
    } else {
      amount = await owedToCoopOf(tx, farmId);
      description = 'Balance with the co-op';
    }
    if (amount <= 0) throw AppError.conflict('Nothing is owed to the co-op for that; there is nothing to pay');
    const coop = await getCoop(actor.coopId, tx);
    const [row] = await selectRows<CheckoutRow>(
      tx,
      `INSERT INTO card_checkouts (coop_id, farm_id, idempotency_key, purpose, dues_period_id, amount_cents, currency, created_by)
       VALUES (current_coop_id(), $1, $2, $3, $4, $5, $6, $7) RETURNING *`,
      [farmId, input.idempotencyKey, input.purpose, periodId, amount, coop?.currency ?? 'USD', actor.id],
    );
    return { row: row!, description };
  });
  if (prepared.row.session_id) return presentCheckout(prepared.row);

  const row = prepared.row;
  let session: Stripe.Checkout.Session;
  try {
    session = await cardClient(config).checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [{ quantity: 1, price_data: { currency: row.currency.trim().toLowerCase(), unit_amount: cents(row.amount_cents), product_data: { name: prepared.description || 'Co-op payment' } } }],
        client_reference_id: row.id,
        customer_email: actor.email,
        success_url: `${appUrl}/ledger/card-return?checkout=${row.id}`,
        cancel_url: `${appUrl}/ledger/card-return?checkout=${row.id}&cancelled=1`,
        metadata: { coopId: actor.coopId, farmId, checkoutId: row.id, purpose: row.purpose, description: prepared.description || 'Co-op payment' },
      },
      // The same checkout always asks for the same session, however often the request is retried.
      { idempotencyKey: `burrowline-checkout-${row.id}` },
    );
  } catch (error) {
    logger.warn('card service did not open a checkout', { checkoutId: row.id, error: String(error) });
    throw new AppError(ErrorCode.unavailable, 503, 'The card service did not answer; try again in a moment');
  }
  return withTenant(actor, async (tx) => {
    const [updated] = await selectRows<CheckoutRow>(
      tx,
      `UPDATE card_checkouts SET session_id = COALESCE(session_id, $2), url = COALESCE(url, $3) WHERE id = $1 RETURNING *`,
      [row.id, session.id, session.url],
    );
    return presentCheckout(updated!);
  });
}

export async function getCardCheckout(actor: SessionUser, checkoutId: string): Promise<CardCheckoutDto> {
  const farmId = payingFarm(actor);
  return withTenant(actor, async (tx) => {
    const [row] = await selectRows<CheckoutRow>(tx, 'SELECT * FROM card_checkouts WHERE id = $1', [checkoutId]);
    if (!row || row.farm_id !== farmId) throw AppError.notFound('That card payment');
    return presentCheckout(row);
  });
}

/** A signature the SDK could not verify (bad, or older than its five-minute tolerance). */
export class UnverifiedWebhook extends AppError {
  constructor() {
    super(ErrorCode.validation, 400, 'The webhook signature could not be verified');
  }
}

/**
 * A webhook delivery from the card service. Only what `webhooks.constructEvent` verifies is read; the
 * co-op comes from the checkout's metadata, which was signed with it. A repeated or late event changes
 * nothing: the transfer's id is the event's, and a settled checkout stays settled.
 */
export async function receiveCardWebhook(rawBody: Buffer, signature: string | undefined, card: CardConfig | null): Promise<{ handled: string }> {
  const config = ensureCards(card);
  let event: Stripe.Event;
  try {
    event = cardClient(config).webhooks.constructEvent(rawBody, signature ?? '', config.webhookSecret);
  } catch {
    throw new UnverifiedWebhook();
  }
  if (event.type !== 'checkout.session.completed' && event.type !== 'checkout.session.expired') return { handled: 'ignored' };
  const session = event.data.object;
  const coopId = session.metadata?.coopId;
  const checkoutId = session.metadata?.checkoutId;
  if (!coopId || !checkoutId || !/^[0-9a-f-]{36}$/.test(coopId) || !/^[0-9a-f-]{36}$/.test(checkoutId)) return { handled: 'not ours' };
  return withTenant({ coopId }, async (tx) => {
    const [row] = await selectRows<CheckoutRow>(tx, 'SELECT * FROM card_checkouts WHERE id = $1 AND session_id = $2 FOR UPDATE', [checkoutId, session.id]);
    if (!row) return { handled: 'unknown checkout' };
    if (event.type === 'checkout.session.expired') {
      // Declined or abandoned; an expiry delivered after the payment (out of order) changes nothing.
      if (row.status !== 'open') return { handled: 'already settled' };
      await selectRows(tx, `UPDATE card_checkouts SET status = 'declined', settled_at = now() WHERE id = $1 RETURNING id`, [row.id]);
      tx.afterCommit(() => publish(rooms.user(row.created_by), RealtimeEvent.cardCheckoutSettled, { checkoutId: row.id, status: 'declined' }));
      return { handled: 'declined' };
    }
    if (session.payment_status !== 'paid') return { handled: 'not paid yet' };
    if (row.status === 'paid') return { handled: 'already paid' };
    if (session.amount_total !== cents(row.amount_cents) || (session.currency ?? '').toLowerCase() !== row.currency.trim().toLowerCase()) {
      logger.error('card payment differs from its checkout', { checkoutId: row.id, amount: session.amount_total, currency: session.currency });
      return { handled: 'amount differs' };
    }
    const period = row.dues_period_id;
    const transfer = await postTransfer(tx, {
      id: event.id, kind: 'payment', method: 'card', debit: { coop: 'coop_card_clearing' }, credit: { farmId: row.farm_id },
      amountCents: cents(row.amount_cents), sourceType: period ? 'dues_period' : 'card_checkout', sourceId: period ?? row.id,
      memo: period ? 'Dues paid by card' : 'Paid by card', postedBy: row.created_by,
    });
    // Paid even if an expiry came first (out of order): the money was taken.
    await selectRows(tx, `UPDATE card_checkouts SET status = 'paid', transfer_id = $2, settled_at = now() WHERE id = $1 RETURNING id`, [row.id, transfer.id]);
    tx.afterCommit(() => publish(rooms.user(row.created_by), RealtimeEvent.cardCheckoutSettled, { checkoutId: row.id, status: 'paid' }));
    return { handled: 'paid' };
  });
}
