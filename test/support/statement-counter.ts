import { AsyncLocalStorage } from 'node:async_hooks';
import type { IncomingMessage, ServerResponse } from 'node:http';
import pg from 'pg';
import supertest from 'supertest';
import { CSRF_HEADER } from '@burrowline/shared';
import type { AppHandle } from '../../packages/server/src/app';
import { testApp, type Agent } from './test-app';

/**
 * Every round trip to PostgreSQL is one `pg` client query, whichever pool sends it (the session store's
 * or the app's). The request's async context says which request sent it, so background work (the mail
 * worker, another file's requests) is never counted.
 */
const requestLog = new AsyncLocalStorage<string[]>();
let patched = false;

function countClientQueries(): void {
  if (patched) return;
  patched = true;
  const original = pg.Client.prototype.query;
  pg.Client.prototype.query = function countedQuery(this: pg.Client, ...args: unknown[]) {
    const log = requestLog.getStore();
    if (log) {
      const first = args[0] as string | { text?: string } | undefined;
      log.push(typeof first === 'string' ? first : (first?.text ?? '(query object)'));
    }
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof pg.Client.prototype.query;
}

/**
 * Round trips that carry nothing of the endpoint's own: reading the session and its person, touching its
 * expiry, opening the transaction and setting the tenant, committing. A round trip that also carries an
 * own statement (the tenant set in front of the first one) is the endpoint's own.
 */
const FIXED_STATEMENTS = [
  /^\s*(START TRANSACTION|BEGIN|COMMIT|ROLLBACK)\b[\s;]*$/i,
  /^\s*(START TRANSACTION|BEGIN)\b[^;]*;\s*SELECT set_config\('app\.coop_id'[^;]*;?\s*$/i,
  /^\s*SELECT set_config\('app\.coop_id'[^;]*;?\s*$/i,
  /\buser_sessions\b/i,
  /\bauth_user_by_id\b/i,
];

export interface StatementCount {
  /** Every round trip the request made, in order. */
  statements: string[];
  fixed: string[];
  own: string[];
}

export function classify(statements: string[]): StatementCount {
  const isFixed = (sql: string) => FIXED_STATEMENTS.some((pattern) => pattern.test(sql));
  return { statements, fixed: statements.filter(isFixed), own: statements.filter((sql) => !isFixed(sql)) };
}

export interface CountingAgent {
  agent: Agent;
  /** Sends one request and answers with it and the round trips it made to the database. */
  count(send: (agent: Agent) => PromiseLike<supertest.Response>): Promise<StatementCount & { res: supertest.Response }>;
  /** Sends any number of requests (at once, if `send` likes) and answers with each one's round trips. */
  countEach(send: (agent: Agent) => PromiseLike<unknown>): Promise<StatementCount[]>;
}

/**
 * A signed-in client whose requests are counted: every statement the app sends while serving one request,
 * classified as fixed cost (session, person, transaction, tenant) or the endpoint's own. Use it to hold
 * an endpoint to its budget and to show it makes the same number for 10 rows as for 1,000.
 */
export async function countingAgentFor(email: string, password: string, handle: AppHandle = testApp()): Promise<CountingAgent> {
  countClientQueries();
  let logs: string[][] = [];
  const app = (req: IncomingMessage, res: ServerResponse) => {
    const log: string[] = [];
    logs.push(log);
    requestLog.run(log, () => handle.app(req, res));
  };
  const agent = supertest.agent(app).set(CSRF_HEADER, '1');
  const signIn = await agent.post('/api/session').send({ email, password });
  if (signIn.status !== 200) throw new Error(`sign-in of ${email} failed: ${signIn.status}`);
  return {
    agent,
    async count(send) {
      logs = [];
      const res = await send(agent);
      // The session's expiry is written once the answer is sent; let that settle before counting.
      await new Promise((resolve) => setImmediate(resolve));
      if (logs.length !== 1) throw new Error(`expected one request, saw ${logs.length}`);
      return { res, ...classify(logs[0]!) };
    },
    async countEach(send) {
      logs = [];
      await send(agent);
      await new Promise((resolve) => setImmediate(resolve));
      return logs.map(classify);
    },
  };
}
