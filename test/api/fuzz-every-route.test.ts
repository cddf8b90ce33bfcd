import { createHash } from 'node:crypto';
import http from 'node:http';
import fc from 'fast-check';
import supertest from 'supertest';
import { CSRF_HEADER } from '@burrowline/shared';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../packages/server/src/config/env';
import { authorizationMatrix, type MatrixRow, type Target } from './authorization-matrix';
import { matrixBody, matrixTargetIds, type MatrixTargetIds } from '../support/authorization-cells';
import { changedTables, fingerprintOf, type Fingerprint } from '../support/database-fingerprint';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import {
  encodeAny, FAR_DATES, hostileBody, idLike, mutated, oddString, queryStringOf, RAW_BODIES, RAW_QUERIES, valueOf, type KnownIds,
} from '../support/fuzz-values';
import { herdFilesSend } from '../support/herd-files-matrix';
import { nextTattoo } from '../support/herd';
import { HEADER, testImage } from '../support/herd-files';
import { probeRouteSchemas, type RouteSchemas } from '../support/route-schemas';
import { watchingWrites } from '../support/request-writes';
import { ROOMY_SIGN_IN, testApp, type Agent } from '../support/test-app';

/**
 * Every route of the authorization matrix, fuzzed: bodies and queries built from the route's shared zod schema
 * (found by asking the route, see route-schemas.ts) and from hostile values, its path ids swapped for another
 * co-op's, random or broken ones, sent as each kind of person. Whatever comes in, the API answers below 500,
 * and a refused request writes nothing. Each run takes a new seed, printed first;
 * `FUZZ_SEED=<seed>` replays a run and `FUZZ_ROWS=<regex>` (matched against "METHOD path target") one part of it;
 * `FUZZ_RUNS=<n>` sends more requests per row.
 */
const MIN_REQUESTS = 10_000;
const seed = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : Math.floor(Math.random() * 2 ** 31);
const rowFilter = process.env.FUZZ_ROWS ? new RegExp(process.env.FUZZ_ROWS) : null;

type Persona = 'anonymous' | 'apprentice' | 'member' | 'otherFarmMember' | 'admin' | 'otherCoopMember' | 'otherCoopAdmin';
const PERSONA_WEIGHTS: [Persona, number][] = [
  ['anonymous', 1], ['apprentice', 2], ['member', 3], ['otherFarmMember', 2], ['admin', 3], ['otherCoopMember', 1], ['otherCoopAdmin', 1],
];
/** The form field each upload row sends its file in. */
const UPLOAD_FIELDS: Partial<Record<NonNullable<MatrixRow['body']>, string>> = { photoUpload: 'photos', farmPhotoUpload: 'photo', csvUpload: 'file' };

type Body =
  | { kind: 'none' }
  | { kind: 'json'; value: unknown }
  | { kind: 'raw'; text: string }
  | { kind: 'example-upload' }
  | { kind: 'upload'; field: string; bytes: Uint8Array; filename: string; contentType: string; fields: Record<string, string> };

interface FuzzRequest {
  persona: Persona;
  /** Each path placeholder's segment, already %-encoded (or deliberately broken). */
  params: Record<string, string>;
  query: string | null;
  body: Body;
}

const rowKey = (row: MatrixRow) => `${row.method} ${row.path} ${row.target}`;
const rows = authorizationMatrix.filter((row) => !rowFilter || rowFilter.test(rowKey(row)));
// Enough per row that a full run sends at least MIN_REQUESTS, however many rows the matrix grows to;
// `FUZZ_RUNS=<n>` asks for more, to dig deeper into a few rows.
const perRow = Math.max(Math.ceil(MIN_REQUESTS / authorizationMatrix.length), Number(process.env.FUZZ_RUNS ?? 0));

/** The row's own seed, from the run's seed and the row alone: a row replays the same without the others. */
function seedOf(row: MatrixRow, index: number): number {
  return (seed ^ createHash('sha256').update(`${rowKey(row)}#${index}`).digest().readInt32BE(0)) | 0;
}

const short = (text: string, max = 300) => (text.length > max ? `${text.slice(0, max)}… (${text.length} chars)` : text);
const describeValue = (value: unknown) => {
  try {
    return short(JSON.stringify(value) ?? 'undefined');
  } catch {
    return short(String(value));
  }
};

const handle = testApp({
  signIn: ROOMY_SIGN_IN,
  membership: { linkTtlHours: 72, applyWindowSeconds: 60, applyMaxPerIp: 1_000_000, applyMaxPerEmail: 1_000_000 },
  uploads: { ...loadConfig().uploads, importsWaitingPerFarm: 100_000 },
});
// One listening server for the whole run (a bare app would get a server of its own for every request).
const watched = watchingWrites(handle.app);
const server = http.createServer(watched.handler);
let coop: TestCoop;
let foreign: TestCoop;
const agents = new Map<Persona, Agent>();
let sent = 0;
let pictures: Buffer[] = [];
const answers = new Map<number, number>();
const schemasFound = { body: 0, query: 0, none: [] as string[] };
const spent = { requests: 0, fingerprints: 0 };
const timed = async <T>(what: keyof typeof spent, work: () => Promise<T>): Promise<T> => {
  const start = performance.now();
  try {
    return await work();
  } finally {
    spent[what] += performance.now() - start;
  }
};

function personOf(persona: Exclude<Persona, 'anonymous'>) {
  if (persona === 'otherCoopMember') return foreign.member;
  if (persona === 'otherCoopAdmin') return foreign.admin;
  return coop[persona];
}

async function signIn(persona: Persona): Promise<void> {
  const agent = supertest.agent(server).set(CSRF_HEADER, '1');
  if (persona !== 'anonymous') {
    const { email } = personOf(persona);
    const res = await agent.post('/api/session').send({ email, password: TEST_PASSWORD });
    if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status}`);
  }
  agents.set(persona, agent);
}

/** Signing out is one of the routes: the person signs in again, so the rows after it still act as them. */
async function keepSignedIn(row: MatrixRow, persona: Persona, status: number): Promise<void> {
  if (row.method === 'DELETE' && row.path === '/api/session' && status < 300 && persona !== 'anonymous') await signIn(persona);
}

/** Targets are made once per kind and co-op (a fresh one per request would cost more than the request). */
const targets = new Map<string, Promise<MatrixTargetIds>>();
function targetIds(home: TestCoop, away: TestCoop, target: Target): Promise<MatrixTargetIds> {
  const key = `${home.id} ${target}`;
  let ids = targets.get(key);
  if (!ids) {
    const farmId = target === 'farmA' ? home.farms[0]!.id : target === 'farmB' ? home.farms[1]!.id : '';
    // A target another helper's area has not taught the builders yet still gets fuzzed, with random and hostile ids.
    ids = matrixTargetIds(home, away, target).catch(() => ({})).then((made) => ({ farmId, ...made }) as MatrixTargetIds);
    targets.set(key, ids);
  }
  return ids;
}

function placeholders(path: string): string[] {
  return [...path.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1]!);
}

const idText = (ids: object, name: string) => {
  const value = (ids as Record<string, unknown>)[name];
  return typeof value === 'string' && value !== '' ? value : null;
};

/** Path segments where an id belongs: the target's, another co-op's, random, and ones a router or a parser must refuse. */
function segmentFor(name: string, own: string | null, away: string | null, known: KnownIds): fc.Arbitrary<string> {
  const broken = fc.constantFrom(
    'not-a-uuid', '0', '-1', '1e9', 'null', '..', '%2e%2e%2f', '%2F', '%00', '%zz', '%E0%A4%A', '%E2%80%AE', '%C3%BC', '%F0%9F%90%87', '%20',
    'x'.repeat(3000), encodeURIComponent("' OR 1=1 --"), '00000000-0000-0000-0000-000000000000', 'ffffffff-ffff-ffff-ffff-ffffffffffff',
    ...(own ? [own.toUpperCase(), `${own}0`, own.slice(1), `%20${own}`, `${own}%00`, `{${own}}`] : []),
  );
  const choices: fc.WeightedArbitrary<string>[] = [
    { weight: 3, arbitrary: broken },
    { weight: 1, arbitrary: oddString.filter((s) => s.length > 0 && s.length < 4000).map(encodeAny) },
    { weight: 1, arbitrary: idLike(known).map(encodeAny) },
  ];
  if (own) choices.push({ weight: 8, arbitrary: fc.constant(own) });
  if (away) choices.push({ weight: 3, arbitrary: fc.constant(away) });
  // A year, a kind, a reaction: text the route reads as it is.
  if (!/Id$|Token$/.test(name)) choices.push({ weight: 2, arbitrary: fc.constantFrom('2026', '1900', '99999', 'chore', 'heart', '%F0%9F%98%80') });
  return fc.oneof(...choices);
}

function queryFor(row: MatrixRow, schemas: RouteSchemas, known: KnownIds): fc.Arbitrary<string | null> {
  const own = row.path.includes('?') ? row.path.slice(row.path.indexOf('?') + 1) : null;
  const choices: fc.WeightedArbitrary<string | null>[] = [
    { weight: 2, arbitrary: fc.constant(own) },
    { weight: 2, arbitrary: fc.constantFrom(...RAW_QUERIES).map((raw) => (own ? `${own}&${raw}` : raw)) },
    { weight: 2, arbitrary: hostileBody(known).map((value) => [own, queryStringOf(value)].filter(Boolean).join('&')) },
  ];
  if (schemas.query) {
    const sound = valueOf(schemas.query.json, known);
    choices.push({ weight: 4, arbitrary: sound.map(queryStringOf) });
    choices.push({ weight: 4, arbitrary: mutated(sound, known).map(queryStringOf) });
  }
  return fc.oneof(...choices);
}

function bodyFor(row: MatrixRow, schemas: RouteSchemas, example: object | undefined, known: KnownIds, csvPicture: fc.Arbitrary<Uint8Array>): fc.Arbitrary<Body> {
  const json = (value: fc.Arbitrary<unknown>) => value.map((v): Body => ({ kind: 'json', value: v }));
  const choices: fc.WeightedArbitrary<Body>[] = [
    { weight: 2, arbitrary: json(hostileBody(known)) },
    { weight: 1, arbitrary: fc.constantFrom(...RAW_BODIES).map((text): Body => ({ kind: 'raw', text })) },
    { weight: 1, arbitrary: fc.constant<Body>({ kind: 'none' }) },
  ];
  if (row.method === 'GET' || row.method === 'DELETE') {
    // A read or a removal takes no body; one sent anyway must change nothing.
    choices[0]!.weight = 1;
    choices.push({ weight: 6, arbitrary: fc.constant<Body>({ kind: 'none' }) });
  }
  if (schemas.body) {
    const sound = valueOf(schemas.body.json, known);
    choices.push({ weight: 3, arbitrary: json(sound) }, { weight: 5, arbitrary: json(mutated(sound, known)) });
  }
  if (example) {
    choices.push({ weight: 1, arbitrary: json(fc.constant(example)) }, { weight: 5, arbitrary: json(mutated(fc.constant(example), known)) });
  }
  const field = row.body ? UPLOAD_FIELDS[row.body] : undefined;
  if (field) {
    choices.push({ weight: 1, arbitrary: fc.constant<Body>({ kind: 'example-upload' }) });
    choices.push({
      weight: 5,
      arbitrary: fc.record({
        field: fc.oneof({ weight: 4, arbitrary: fc.constant(field) }, { weight: 1, arbitrary: fc.constantFrom('file', 'photos', 'photo', 'x', '') }),
        bytes: fc.oneof(csvPicture, fc.uint8Array({ maxLength: 3000 }), fc.constant(new Uint8Array())),
        filename: fc.oneof(fc.constantFrom('matrix.png', 'matrix.csv', 'a.jpg', '.htaccess', '../../x.png', 'x'.repeat(300), 'noext'), oddString.filter((s) => s.length < 200)),
        contentType: fc.constantFrom('image/png', 'image/jpeg', 'image/webp', 'text/csv', 'application/octet-stream', 'text/html', 'image/svg+xml'),
        fields: fc.dictionary(fc.constantFrom('caption', 'animalId', 'note', 'x'), oddString.filter((s) => s.length < 1500), { maxKeys: 3 }),
      }).map((upload): Body => ({ kind: 'upload', ...upload })),
    });
  }
  return fc.oneof(...choices);
}

async function send(row: MatrixRow, request: FuzzRequest): Promise<{ url: string; res: supertest.Response }> {
  const [pathPart] = row.path.split('?');
  const path = pathPart!.replace(/:([A-Za-z]+)/g, (_m, name: string) => request.params[name] ?? 'missing');
  const query = request.query?.replace(/:([A-Za-z]+)/g, (_m, name: string) => request.params[name] ?? 'missing');
  const url = query ? `${path}?${query}` : path;
  const agent = agents.get(request.persona)!;
  const test = agent[row.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete'](url);
  const { body } = request;
  let res: supertest.Response;
  switch (body.kind) {
    case 'none':
      res = await test;
      break;
    case 'json':
      res = body.value === undefined ? await test : await test.set('Content-Type', 'application/json').send(JSON.stringify(body.value));
      break;
    case 'raw':
      res = await test.set('Content-Type', 'application/json').send(body.text);
      break;
    case 'example-upload':
      res = await herdFilesSend(test, row.body, undefined);
      break;
    case 'upload': {
      let upload = test.attach(body.field, Buffer.from(body.bytes), { filename: body.filename, contentType: body.contentType });
      for (const [name, value] of Object.entries(body.fields)) upload = upload.field(name, value);
      res = await upload;
      break;
    }
  }
  return { url, res };
}

function describeRequest(row: MatrixRow, request: FuzzRequest): string {
  const { body } = request;
  const bodyText =
    body.kind === 'json' ? describeValue(body.value)
    : body.kind === 'raw' ? `raw ${describeValue(body.text)}`
    : body.kind === 'upload' ? `upload ${body.field}=${body.filename} (${body.contentType}, ${body.bytes.length} bytes) ${describeValue(body.fields)}`
    : body.kind;
  return `${request.persona} ${row.method} ${row.path} params=${describeValue(request.params)} query=${describeValue(request.query)} body=${bodyText}`;
}

beforeAll(async () => {
  console.info(`fuzzing every route with FUZZ_SEED=${seed} (${rows.length} rows × ${perRow} requests)`);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  [coop, foreign] = await Promise.all([createTestCoop(), createTestCoop()]);
  for (const [persona] of PERSONA_WEIGHTS) await signIn(persona);
  pictures = [await testImage('png', { width: 8, height: 8 }), await testImage('jpeg', { width: 8, height: 8 })];
});

afterAll(async () => {
  const statuses = [...answers].sort(([a], [b]) => a - b).map(([status, n]) => `${status}×${n}`).join(' ');
  console.info(`fuzzed ${sent} requests (${Math.round(spent.requests / 1000)} s in requests, ${Math.round(spent.fingerprints / 1000)} s in fingerprints): ${statuses}`);
  console.info(`shared schemas found: ${schemasFound.body} bodies, ${schemasFound.query} queries; none for ${schemasFound.none.length} rows: ${schemasFound.none.join('; ')}`);
  await new Promise((resolve) => server.close(resolve));
  await handle.close();
});

describe('fuzzing every route of the authorization matrix', () => {
  it('when a request writes, then both the watch on its statements and the fingerprint see it; when its schema refuses it, then neither does', async () => {
    const member = agents.get('member')!;
    const coopIds = [coop.id, foreign.id];
    const start = await fingerprintOf(coopIds);
    const refused = await member.post('/api/animals').send({ sex: 'rabbit' });
    expect(refused.status).toBe(400);
    expect(watched.lastRequest().mayHaveWritten).toBe(false);
    expect(changedTables(start, await fingerprintOf(coopIds))).toEqual([]);

    const added = await member.post('/api/animals').send({ tattoo: nextTattoo('FZ'), sex: 'doe', birthDate: '2024-03-01' });
    expect(added.status).toBe(201);
    expect(watched.lastRequest().mayHaveWritten).toBe(true);
    const afterAdd = await fingerprintOf(coopIds);
    expect(changedTables(start, afterAdd).join('\n')).toContain(' animals: ');

    // An edit keeps the count and writes a new row version: the fingerprint sees it too.
    const edited = await member.patch(`/api/animals/${added.body.id}`).send({ name: 'Fingerprinted', version: added.body.version });
    expect(edited.status).toBe(200);
    expect(changedTables(afterAdd, await fingerprintOf(coopIds)).join('\n')).toMatch(/ animals: (\d+):\d+ → \1:/);
  });

  rows.forEach((row, index) => {
    it(`when ${rowKey(row)} gets generated and hostile input from everyone, then it answers below 500 and a refusal writes nothing`, async () => {
      const ids = await targetIds(coop, foreign, row.target);
      const away = await targetIds(foreign, coop, row.target);
      const known: KnownIds = {
        ids: [...new Set([...Object.values(ids), ...Object.values(away), coop.farms[0]!.id, coop.farms[1]!.id, foreign.farms[0]!.id]
          .filter((v): v is string => typeof v === 'string' && /^[0-9a-f-]{36}$/.test(v)))],
      };
      const validParams = Object.fromEntries(placeholders(row.path).map((name) => [name, idText(ids, name) ?? (name === 'coopSlug' ? coop.slug : 'missing')]));

      // Which shared schemas the route reads; asked as each person in turn, as some routes refuse before they read.
      let schemas: RouteSchemas = {};
      for (const persona of ['admin', 'member', 'apprentice', 'otherFarmMember', 'anonymous'] as const) {
        schemas = await probeRouteSchemas(async (body, query) => {
          const { res } = await send(row, { persona, params: validParams, query: [row.path.split('?')[1], query].filter(Boolean).join('&'), body: row.method === 'GET' ? { kind: 'none' } : { kind: 'json', value: body } });
          await keepSignedIn(row, persona, res.status);
        });
        if (schemas.body || schemas.query) break;
      }
      if (schemas.body) schemasFound.body += 1;
      if (schemas.query) schemasFound.query += 1;
      if (!schemas.body && !schemas.query) schemasFound.none.push(rowKey(row));
      const examplePersona = (['member', 'admin', 'apprentice', 'otherFarmMember'] as const).find((p) => row.expect[p] < 300) ?? 'member';
      const example = row.body ? await matrixBody(coop, foreign, row.body, ids, examplePersona).catch(() => undefined) : undefined;
      const csvPicture = fc.oneof(
        fc.constantFrom(...pictures),
        fc.array(fc.oneof(oddString, fc.constantFrom(...FAR_DATES)).map((cell) => `"${cell.replaceAll('"', '""')}"`), { minLength: 1, maxLength: 9 })
          .map((cells) => Buffer.from(`${HEADER}\n${cells.join(',')}\n`)),
      );

      const request: fc.Arbitrary<FuzzRequest> = fc.record({
        persona: fc.oneof(...PERSONA_WEIGHTS.map(([persona, weight]) => ({ weight, arbitrary: fc.constant(persona) }))),
        params: fc.record(Object.fromEntries(placeholders(row.path).map((name) =>
          [name, name === 'coopSlug'
            ? fc.oneof(fc.constant(coop.slug), fc.constant(foreign.slug), oddString.filter((s) => s.length > 0 && s.length < 4000).map(encodeAny))
            : segmentFor(name, idText(ids, name), idText(away, name), known)]))),
        query: queryFor(row, schemas, known),
        body: bodyFor(row, schemas, example, known, csvPicture),
      }).map((r) => Object.assign(r, { [fc.toStringMethod]: () => describeRequest(row, r) }));

      const coopIds = [coop.id, foreign.id];
      let before: Fingerprint = await fingerprintOf(coopIds);
      try {
        await fc.assert(
          fc.asyncProperty(request, async (req) => {
            const { url, res } = await timed('requests', () => send(row, req));
            sent += 1;
            answers.set(res.status, (answers.get(res.status) ?? 0) + 1);
            const said = `${describeRequest(row, req)} → ${url} answered ${res.status} ${short(res.text ?? '')}`;
            expect(res.status, said).toBeLessThan(500);
            await keepSignedIn(row, req.persona, res.status);
            // A request that neither committed nor wrote outside a transaction wrote nothing: no need to look. A read
            // may write (a ledger account or the co-op's channel made on first sight, a feed's last use) when it answers.
            if (!watched.lastRequest().mayHaveWritten) return;
            const after = await timed('fingerprints', () => fingerprintOf(coopIds));
            if (res.status >= 400) expect(changedTables(before, after), `a refusal wrote rows: ${said}`).toEqual([]);
            before = after;
          }),
          { seed: seedOf(row, index), numRuns: perRow },
        );
      } catch (error) {
        throw new Error(`replay with FUZZ_SEED=${seed} FUZZ_ROWS='${rowKey(row).replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}'\n${(error as Error).message}`, { cause: error });
      }
    }, 300_000);
  });

  it.skipIf(rowFilter !== null)(`when every row has been fuzzed, then at least ${MIN_REQUESTS} generated requests were sent`, () => {
    expect(sent).toBeGreaterThanOrEqual(MIN_REQUESTS);
  });
});
