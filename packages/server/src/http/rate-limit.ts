import type { Request, RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { ErrorCode } from '@burrowline/shared';
import type { Config } from '../config/env';
import { AppError } from '../lib/app-error';

function limiter(opts: { windowSeconds: number; limit: number; key?: (req: Request) => string; message: string }): RequestHandler {
  return rateLimit({
    windowMs: opts.windowSeconds * 1000,
    limit: opts.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: opts.key,
    handler: (_req, _res, next) => next(new AppError(ErrorCode.rateLimited, 429, opts.message)),
  });
}

/** Every sign-in attempt from one address, right or wrong: a flood from one machine. */
export function signInAddressLimiter(config: Config): RequestHandler {
  const { windowSeconds, maxPerIp } = config.signIn;
  return limiter({ windowSeconds, limit: maxPerIp, message: `Too many sign-in attempts from this address; wait ${Math.ceil(windowSeconds / 60)} minutes` });
}

interface Counter {
  count: number;
  resetAt: number;
}

interface AccountRecord {
  /** Failures from addresses the account has not signed in from (a guess sprayed from many machines). */
  fromNewAddresses: Counter | null;
  byAddress: Map<string, Counter>;
  /** Where the account signed in before, with when it last did (milliseconds). */
  knownAddresses: Map<string, number>;
}

const KNOWN_ADDRESS_MS = 90 * 24 * 60 * 60 * 1000;
const KNOWN_ADDRESSES_PER_ACCOUNT = 20;
const SWEEP_ABOVE_ACCOUNTS = 10_000;

function accountOf(body: unknown): string | null {
  const email = (body as { email?: unknown } | undefined)?.email;
  if (typeof email !== 'string') return null;
  const account = email.trim().toLowerCase();
  return account === '' ? null : account;
}

/**
 * Failed sign-ins per account, kept apart per client address so that someone else's guesses never lock
 * the owner out: one address is refused after `maxFailuresPerAccount` failures for an account; guesses
 * from many addresses together are refused after `maxFailuresPerAccountAllAddresses`, except from an
 * address the account signed in from before. Only a refused password (401) counts, not a malformed
 * request; a signed-in address starts afresh, and a password reset clears the account. Kept in memory,
 * like the address limits: a restart forgets it, which errs towards letting people in.
 */
export class SignInThrottle {
  private readonly accounts = new Map<string, AccountRecord>();

  constructor(
    private readonly limits: Config['signIn'],
    private readonly now: () => number = Date.now,
  ) {}

  middleware(): RequestHandler {
    return (req, res, next) => {
      const account = accountOf(req.body);
      // Without an e-mail the request is refused as malformed; there is no account to count against.
      if (!account) return next();
      const address = req.ip ?? '';
      const refusal = this.refusal(account, address);
      if (refusal) return next(new AppError(ErrorCode.rateLimited, 429, refusal));
      // Counted from the start, so parallel guesses cannot all slip in under the limit; given back unless refused.
      const counted = this.count(account, address);
      res.on('finish', () => {
        if (res.statusCode === 401) return;
        for (const counter of counted) counter.count = Math.max(0, counter.count - 1);
        if (res.statusCode < 300) this.signedIn(account, address);
      });
      next();
    };
  }

  /** After a successful password reset: the owner has proved who they are, so earlier failures stop counting. */
  forgetFailures(email: string): void {
    const record = this.accounts.get(email.trim().toLowerCase());
    if (!record) return;
    record.byAddress.clear();
    record.fromNewAddresses = null;
  }

  private refusal(account: string, address: string): string | null {
    const record = this.accounts.get(account);
    if (!record) return null;
    const minutes = Math.ceil(this.limits.windowSeconds / 60);
    const here = this.live(record.byAddress.get(address));
    if (here && here.count >= this.limits.maxFailuresPerAccount) {
      return `Too many failed sign-ins for this account from this address; wait ${minutes} minutes or reset your password`;
    }
    const spread = this.live(record.fromNewAddresses);
    if (spread && spread.count >= this.limits.maxFailuresPerAccountAllAddresses && !this.isKnown(record, address)) {
      return `Too many failed sign-ins for this account; wait ${minutes} minutes, sign in where you have signed in before, or reset your password`;
    }
    return null;
  }

  private count(account: string, address: string): Counter[] {
    const record = this.recordOf(account);
    const here = this.live(record.byAddress.get(address)) ?? this.fresh();
    record.byAddress.set(address, here);
    here.count += 1;
    if (this.isKnown(record, address)) return [here];
    const spread = this.live(record.fromNewAddresses) ?? this.fresh();
    record.fromNewAddresses = spread;
    spread.count += 1;
    return [here, spread];
  }

  private signedIn(account: string, address: string): void {
    const record = this.recordOf(account);
    record.byAddress.delete(address);
    record.knownAddresses.delete(address);
    record.knownAddresses.set(address, this.now());
    if (record.knownAddresses.size > KNOWN_ADDRESSES_PER_ACCOUNT) {
      const oldest = record.knownAddresses.keys().next().value;
      if (oldest !== undefined) record.knownAddresses.delete(oldest);
    }
  }

  private isKnown(record: AccountRecord, address: string): boolean {
    const at = record.knownAddresses.get(address);
    return at !== undefined && this.now() - at < KNOWN_ADDRESS_MS;
  }

  private live(counter: Counter | null | undefined): Counter | null {
    return counter && counter.resetAt > this.now() ? counter : null;
  }

  private fresh(): Counter {
    return { count: 0, resetAt: this.now() + this.limits.windowSeconds * 1000 };
  }

  private recordOf(account: string): AccountRecord {
    let record = this.accounts.get(account);
    if (!record) {
      if (this.accounts.size >= SWEEP_ABOVE_ACCOUNTS) this.sweep();
      record = { fromNewAddresses: null, byAddress: new Map(), knownAddresses: new Map() };
      this.accounts.set(account, record);
    }
    return record;
  }

  /** Drops accounts with nothing left to remember, so guesses at many e-mails do not grow memory for ever. */
  private sweep(): void {
    for (const [account, record] of this.accounts) {
      for (const [address, counter] of record.byAddress) if (!this.live(counter)) record.byAddress.delete(address);
      for (const [address, at] of record.knownAddresses) if (this.now() - at >= KNOWN_ADDRESS_MS) record.knownAddresses.delete(address);
      if (!this.live(record.fromNewAddresses)) record.fromNewAddresses = null;
      if (record.byAddress.size === 0 && record.knownAddresses.size === 0 && !record.fromNewAddresses) this.accounts.delete(account);
    }
  }
}

export function passwordResetLimiter(config: Config): RequestHandler {
  return limiter({
    windowSeconds: config.signIn.windowSeconds,
    limit: config.signIn.maxResetsPerIp,
    message: 'Too many reset requests from this address; wait a while and try again',
  });
}

/**
 * The public application form: limited per address (a flood from one machine) and per e-mail (one
 * person re-sending under many addresses). Counted on every try, accepted or refused.
 */
export function applicationLimiters(config: Config): RequestHandler[] {
  const { applyWindowSeconds: windowSeconds, applyMaxPerIp, applyMaxPerEmail } = config.membership;
  const wait = windowSeconds >= 120 ? `${Math.ceil(windowSeconds / 60)} minutes` : `${windowSeconds} seconds`;
  return [
    limiter({
      windowSeconds,
      limit: applyMaxPerIp,
      message: `Too many applications from this address; wait ${wait} and try again, or write to the co-op's coordinator`,
    }),
    limiter({
      windowSeconds,
      limit: applyMaxPerEmail,
      key: (req) => `apply-email:${String((req.body as { email?: unknown })?.email ?? '').trim().toLowerCase()}`,
      message: `Too many applications for this e-mail address; wait ${wait} and try again`,
    }),
  ];
}
