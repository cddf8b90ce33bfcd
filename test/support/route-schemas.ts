import { randomUUID } from 'node:crypto';
import * as shared from '@burrowline/shared';
import type { JsonSchema } from './fuzz-values';

/**
 * Which shared zod schema a route reads its body and its query with, found by asking the route itself:
 * every schema exported by @burrowline/shared is watched while one request is sent with a marked body and
 * query, and the schemas that receive the marks are the route's. Routes parse their input with the shared
 * schema first thing (DEVELOPERS.md, "Routes"), so a new route is covered without a table to keep; a route
 * that parses with a schema of its own is fuzzed with hostile bodies alone.
 */
export interface RouteSchemas {
  body?: { name: string; json: JsonSchema };
  query?: { name: string; json: JsonSchema };
}

interface ZodLike {
  parse: (data: unknown, params?: unknown) => unknown;
  safeParse: (data: unknown, params?: unknown) => unknown;
  toJSONSchema: (params: object) => JsonSchema;
}

const MARK = '__fuzzProbe';

function sharedSchemas(): [string, ZodLike][] {
  return (Object.entries(shared) as [string, unknown][]).filter((entry): entry is [string, ZodLike] => {
    const value = entry[1] as (Partial<ZodLike> & { _zod?: unknown }) | null;
    return Boolean(value && typeof value === 'object' && value._zod && typeof value.parse === 'function' && typeof value.toJSONSchema === 'function');
  });
}

/** The JSON Schema of what the schema accepts as input; transforms and refinements become "anything". */
function inputSchemaOf(schema: ZodLike): JsonSchema {
  return schema.toJSONSchema({ io: 'input', unrepresentable: 'any' });
}

/**
 * Sends `send(mark)` (which must put `{ [MARK]: mark }` in the body and `MARK=mark` in the query) while every
 * shared schema notes what it is asked to parse; answers the schemas that saw the marks. The watch ends
 * before this returns, whatever happens.
 */
export async function probeRouteSchemas(send: (body: object, query: string) => Promise<unknown>): Promise<RouteSchemas> {
  const mark = randomUUID();
  const found: RouteSchemas = {};
  const watched = sharedSchemas();
  const note = (name: string, schema: ZodLike, data: unknown) => {
    if (!data || typeof data !== 'object' || (data as Record<string, unknown>)[MARK] === undefined) return;
    const seen = (data as Record<string, unknown>)[MARK];
    const where = seen === `body-${mark}` ? 'body' : seen === `query-${mark}` || (Array.isArray(seen) && seen.includes(`query-${mark}`)) ? 'query' : null;
    if (!where || found[where]) return;
    try {
      found[where] = { name, json: inputSchemaOf(schema) };
    } catch {
      // A schema zod cannot describe leaves the route to hostile input alone.
    }
  };
  const originals = watched.map(([, schema]) => ({
    parse: Object.hasOwn(schema, 'parse') ? schema.parse : undefined,
    safeParse: Object.hasOwn(schema, 'safeParse') ? schema.safeParse : undefined,
  }));
  for (const [name, schema] of watched) {
    const { parse, safeParse } = schema;
    schema.parse = function watchedParse(this: ZodLike, data, params) {
      note(name, schema, data);
      return parse.call(this, data, params);
    };
    schema.safeParse = function watchedSafeParse(this: ZodLike, data, params) {
      note(name, schema, data);
      return safeParse.call(this, data, params);
    };
  }
  try {
    await send({ [MARK]: `body-${mark}` }, `${MARK}=query-${mark}`);
  } finally {
    watched.forEach(([, schema], i) => {
      const { parse, safeParse } = originals[i]!;
      if (parse) schema.parse = parse;
      else delete (schema as Partial<ZodLike>).parse;
      if (safeParse) schema.safeParse = safeParse;
      else delete (schema as Partial<ZodLike>).safeParse;
    });
  }
  return found;
}
