import type { AccountKind, PaymentMethod, TransferKind, TransferStatus } from '../schemas/ledger.schema';

/** What the Ledger answers. Every field here is money: no route sends any of it to an apprentice. */

export interface LedgerAccountDto {
  id: string;
  kind: AccountKind;
  farmId: string | null;
  name: string;
  /** Posted credits less posted debits: positive is owed to the account. */
  balanceCents: number;
  /** Pending transfers: what is expected in and out, never in the balance. */
  expectedInCents: number;
  expectedOutCents: number;
}

export interface TransferDto {
  id: string;
  kind: TransferKind;
  status: TransferStatus;
  debit: { accountId: string; name: string; farmId: string | null };
  credit: { accountId: string; name: string; farmId: string | null };
  amountCents: number;
  sourceType: string;
  sourceId: string;
  memo: string;
  bookedOn: string;
  postedBy: string | null;
  createdAt: string;
  postedAt: string | null;
  voidedAt: string | null;
  correctsTransferId: string | null;
  correctionReason: string | null;
  /** The farm whose member must confirm it before it posts (a recorded payment, a farm-to-farm correction). */
  awaitingFarmId: string | null;
  method: PaymentMethod | null;
  /** What the asking person may do with it now. */
  canConfirm: boolean;
  canVoid: boolean;
  canCorrect: boolean;
}

export interface TransferListDto {
  items: TransferDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface FarmDuesDto {
  year: number;
  amountCents: number;
  dueOn: string;
  paidCents: number;
  owedCents: number;
}

/** The balance cards of one farm. */
export interface LedgerSummaryDto {
  farmId: string;
  farmName: string;
  currency: string;
  account: LedgerAccountDto;
  /** Positions with each counterparty (farms and the co-op), posted only. */
  owedToYouCents: number;
  youOweCents: number;
  expectedInCents: number;
  expectedOutCents: number;
  /** What the farm owes the co-op itself (dues, fees): what a card payment of the balance pays. */
  owedToCoopCents: number;
  dues: FarmDuesDto[];
  awaitingYourConfirmation: number;
  cardPaymentsEnabled: boolean;
}

export interface SettleUpDto {
  /** Net positions of farms from their farm-to-farm transfers. */
  positions: { farmId: string; farmName: string; netCents: number }[];
  payments: { fromFarmId: string; fromFarmName: string; toFarmId: string; toFarmName: string; amountCents: number }[];
  /** Greedy matching pays each farm off with at most n − 1 payments. */
  note: string;
}

export interface StatementLineDto {
  transferId: string;
  bookedOn: string;
  kind: TransferKind;
  counterparty: string;
  memo: string;
  /** Signed: positive credits the account. */
  amountCents: number;
  runningBalanceCents: number;
}

export interface StatementDto {
  title: string;
  accountNames: string[];
  currency: string;
  from: string;
  to: string;
  openingBalanceCents: number;
  closingBalanceCents: number;
  lines: StatementLineDto[];
}

export interface FeesByMonthDto {
  months: string[];
  kinds: TransferKind[];
  /** cents[kind][monthIndex] */
  cents: Record<string, number[]>;
}

export interface CoopLedgerDto {
  currency: string;
  accounts: LedgerAccountDto[];
  farms: { farmId: string; farmName: string; balanceCents: number; expectedInCents: number; expectedOutCents: number; dues: FarmDuesDto | null }[];
  duesPeriods: { year: number; amountCents: number; dueOn: string; reminderDaysBefore: number }[];
  /** The sum over every account: always zero. */
  booksTotalCents: number;
  awaitingYourConfirmation: number;
}

export type CardCheckoutStatus = 'open' | 'paid' | 'declined';

export interface CardCheckoutDto {
  id: string;
  status: CardCheckoutStatus;
  purpose: 'dues' | 'balance';
  amountCents: number;
  currency: string;
  /** The card service's page to pay on, while open. */
  url: string | null;
  transferId: string | null;
}
