import { ConnectionError, UniqueConstraintError } from 'sequelize';

// PostgreSQL's connection exceptions (class 08) and shutdowns (57P01-57P03), and the socket errors of a lost server.
const lostConnectionCodes = /^(08...|57P0[123]|ECONNREFUSED|ECONNRESET|ETIMEDOUT|EPIPE|ENOTFOUND|EHOSTUNREACH)$/;
// What node-postgres says, without a code, when the server went away under a pooled connection.
const lostConnectionMessages = /Connection terminated|not queryable|connection ended/i;
// Serialization failure and deadlock: PostgreSQL asks for the whole transaction to be run again.
const rerunCodes = new Set(['40001', '40P01']);

function causesOf(error: unknown): unknown[] {
  return [error, (error as { parent?: unknown })?.parent, (error as { original?: unknown })?.original];
}

function codeOf(candidate: unknown): string | null {
  const code = (candidate as { code?: unknown } | null)?.code;
  return typeof code === 'string' ? code : null;
}

/**
 * A lost or refused database connection, as sequelize wraps it or as node-postgres throws it (the session
 * store). A bare socket error cannot say which server it lost, so one from elsewhere counts too: a retry is right.
 */
export function isLostConnection(error: unknown): boolean {
  if (error instanceof ConnectionError) return true;
  return causesOf(error).some((candidate) => {
    if (!(candidate instanceof Error)) return false;
    const code = codeOf(candidate);
    return (code !== null && lostConnectionCodes.test(code)) || lostConnectionMessages.test(candidate.message);
  });
}

/** A serialization failure or deadlock: the transaction did nothing and may simply be run again. */
export function isSerializationFailure(error: unknown): boolean {
  return causesOf(error).some((candidate) => {
    const code = codeOf(candidate);
    return code !== null && rerunCodes.has(code);
  });
}

export function isUniqueViolation(error: unknown): boolean {
  return error instanceof UniqueConstraintError || causesOf(error).some((candidate) => codeOf(candidate) === '23505');
}

/** A unique clash on a table's primary key: a client-chosen id that some row, of any co-op, already has. */
export function isPrimaryKeyClash(error: unknown): boolean {
  if (!(error instanceof UniqueConstraintError)) return false;
  const constraint = (error.parent as { constraint?: unknown } | undefined)?.constraint;
  if (typeof constraint === 'string') return constraint.endsWith('_pkey');
  return Object.keys(error.fields ?? {}).length === 1 && 'id' in (error.fields ?? {});
}

/** An exclusion constraint refused the row (e.g. two bookings of one buck over the same days); answers its name. */
export function exclusionViolationOf(error: unknown): string | null {
  for (const candidate of causesOf(error)) {
    if (codeOf(candidate) !== '23P01') continue;
    const constraint = (candidate as { constraint?: unknown }).constraint;
    return typeof constraint === 'string' ? constraint : '';
  }
  return null;
}
