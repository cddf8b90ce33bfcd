import type { AccountKind, LedgerAccountDto, TransferDto } from '@burrowline/shared';
import { cents, type AccountRow, type TransferRow } from './ledger-books';

/** How the co-op's own accounts are named on screen and in statements. */
export const COOP_ACCOUNT_NAMES: Record<Exclude<AccountKind, 'farm'>, string> = {
  coop_dues: 'Co-op dues',
  coop_processing: 'Processing site',
  coop_card_clearing: 'Card payments',
  coop_cash: 'Co-op cash',
};

export interface LedgerNames {
  farmNames: Map<string, string>;
  accounts: Map<string, AccountRow>;
}

export function accountName(account: AccountRow | undefined, names: LedgerNames): string {
  if (!account) return 'Unknown account';
  if (account.kind === 'farm') return names.farmNames.get(account.farm_id!) ?? 'A former farm';
  return COOP_ACCOUNT_NAMES[account.kind];
}

export function presentAccount(row: AccountRow, names: LedgerNames): LedgerAccountDto {
  return {
    id: row.id,
    kind: row.kind,
    farmId: row.farm_id,
    name: accountName(row, names),
    balanceCents: cents(row.posted_cents),
    expectedInCents: cents(row.pending_credit_cents),
    expectedOutCents: cents(row.pending_debit_cents),
  };
}

export interface TransferPermissions {
  canConfirm: boolean;
  canVoid: boolean;
  canCorrect: boolean;
}

export function presentTransfer(row: TransferRow, names: LedgerNames, can: TransferPermissions): TransferDto {
  const side = (accountId: string) => {
    const account = names.accounts.get(accountId);
    return { accountId, name: accountName(account, names), farmId: account?.farm_id ?? null };
  };
  return {
    id: row.id,
    kind: row.kind,
    status: row.status,
    debit: side(row.debit_account_id),
    credit: side(row.credit_account_id),
    amountCents: cents(row.amount_cents),
    sourceType: row.source_type,
    sourceId: row.source_id,
    memo: row.memo,
    bookedOn: row.booked_on,
    postedBy: row.posted_by,
    createdAt: new Date(row.created_at).toISOString(),
    postedAt: row.posted_at ? new Date(row.posted_at).toISOString() : null,
    voidedAt: row.voided_at ? new Date(row.voided_at).toISOString() : null,
    correctsTransferId: row.corrects_transfer_id,
    correctionReason: row.correction_reason,
    awaitingFarmId: row.awaiting_farm_id,
    method: row.method,
    ...can,
  };
}
