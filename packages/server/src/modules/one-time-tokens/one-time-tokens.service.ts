import { createHash, randomBytes } from 'node:crypto';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { database } from '../../db/sequelize';
import { OneTimeToken, type TokenPurpose } from './one-time-token.model';

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** Issues a single-use link token; only its hash is stored. Returns the token to put in the e-mail. */
export async function issueToken(
  input: { userId: string; coopId: string; purpose: TokenPurpose; ttlMinutes: number },
  tx?: Transaction,
): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  // A new link replaces any older unused one of the same kind.
  await OneTimeToken.update(
    { usedAt: new Date() },
    { where: { userId: input.userId, purpose: input.purpose, usedAt: { [Op.is]: null } }, transaction: tx },
  );
  await OneTimeToken.create(
    {
      userId: input.userId,
      coopId: input.coopId,
      purpose: input.purpose,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + input.ttlMinutes * 60_000),
    },
    { transaction: tx },
  );
  return token;
}

/** Looks at a token without using it (to learn its co-op before the tenant transaction). */
export async function peekToken(token: string) {
  return OneTimeToken.findOne({
    where: { tokenHash: hashToken(token), usedAt: { [Op.is]: null }, expiresAt: { [Op.gt]: new Date() } },
  });
}

/** Marks the token used; only one of two concurrent attempts gets `true`. */
export async function consumeToken(token: string, tx: Transaction): Promise<boolean> {
  const rows = await database().query(
    `UPDATE one_time_tokens SET used_at = now()
     WHERE token_hash = $1 AND used_at IS NULL AND expires_at > now() RETURNING id`,
    { bind: [hashToken(token)], type: QueryTypes.SELECT, transaction: tx },
  );
  return rows.length === 1;
}
