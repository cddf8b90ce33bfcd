import fc from 'fast-check';

/**
 * Values for fuzzing the API: ones built from a route's shared zod schema (through its JSON Schema, which zod
 * writes itself, so this follows every schema without knowing zod's insides) and hostile ones a schema should
 * refuse or a service should survive.
 */
export interface JsonSchema {
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  additionalProperties?: boolean | JsonSchema;
  items?: JsonSchema;
  prefixItems?: JsonSchema[];
  minItems?: number;
  maxItems?: number;
  enum?: unknown[];
  const?: unknown;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  format?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  $ref?: string;
  $defs?: Record<string, JsonSchema>;
}

/** Ids the fuzzer knows (the test co-op's records, another co-op's): an id field takes one of them as often as a random one. */
export interface KnownIds {
  ids: readonly string[];
}

const CONTROL_AND_ODD = [
  '', ' ', '\u0000', 'a\u0000b', '\r\n', 'two\nlines', '\t', '\u0007', '\u001b[31mred', '\u007f', '\u0085', '\u2028', '\u202eevil',
  '\ufeff', '\ud800', '\udfff', '\uffff', '\u200b', 'e\u0301', '🐇🐇', '👩‍👩‍👧', 'Ω≈ç√∫', 'ﷺ', '𝕳𝖔𝖑𝖑𝖔𝖜', 'İı', 'ß', '٣', '２０２４', 'ſ',
  "'; DROP TABLE animals; --", "O'Brien", '" OR 1=1 --', '<script>alert(1)</script>', '=HYPERLINK("http://x")', '+1', '-1', '@SUM(1)',
  '../../etc/passwd', '%00', '%', '%zz', '\\', '"', '{}', '[]', 'null', 'undefined', 'NaN', 'Infinity', '1e400', '0x10', 'true',
  '__proto__', 'constructor', '$where', '{"$gt": ""}', '*', '?', '#', '&', 'a'.repeat(255), 'a'.repeat(256),
];

/** Dates a breeder would never type: the edges of PostgreSQL's and JavaScript's calendars, impossible days, other shapes. */
export const FAR_DATES = [
  '0000-00-00', '0000-01-01', '0001-01-01', '1000-01-01', '1900-01-01', '1969-12-31', '1970-01-01', '2038-01-19', '2100-02-29', '2999-12-31',
  '9999-12-31', '10000-01-01', '99999-12-31', '275760-09-13', '275760-09-14', '-000001-01-01', '+010000-01-01', '2024-02-30', '2023-02-29',
  '2024-13-01', '2024-00-10', '2024-01-00', '2024-01-32', '2024-1-1', '24-01-01', '20240101', '2024/01/01', '01/02/2024', '2024-01-01T00:00:00Z',
  '2024-01-01T25:61:61', '9999-12-31T23:59:59.999Z', '2024-06-01 ', ' 2024-06-01', '2024-06-01\u0000', 'today', 'yesterday', 'infinity', '-infinity', 'epoch',
];

export const ODD_NUMBERS = [
  0, -0, -1, 1, 2, -1.5, 0.5, 0.1 + 0.2, 1e-7, Number.MIN_VALUE, Number.EPSILON, 2 ** 15, 2 ** 31 - 1, 2 ** 31, -(2 ** 31) - 1, 2 ** 32,
  2 ** 53 - 1, 2 ** 53 + 2, -(2 ** 53), 1e15, 1e21, 1e100, 1e308, -1e308, 123456789.12345679,
];

/** Lengths past every text limit, up to past the body limit. */
const HUGE_LENGTHS = [2_001, 10_001, 65_536, 99_000, 120_000];

export const hugeString: fc.Arbitrary<string> = fc
  .tuple(fc.constantFrom(...HUGE_LENGTHS), fc.constantFrom('x', '🐇', '\u0000', 'é', ' ', '\n', '%'))
  .map(([length, unit]) => unit.repeat(Math.ceil(length / unit.length)).slice(0, length));

export const oddString: fc.Arbitrary<string> = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...CONTROL_AND_ODD) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 2, arbitrary: fc.string({ unit: 'grapheme', maxLength: 40 }) },
  { weight: 1, arbitrary: hugeString },
  { weight: 1, arbitrary: fc.constantFrom(...FAR_DATES) },
);

/** Anything where something else was expected: wrong types, huge or odd strings, far dates, extreme numbers, deep nesting. */
export function hostileValue(known: KnownIds): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 5, arbitrary: oddString },
    { weight: 3, arbitrary: fc.constantFrom<unknown>(...ODD_NUMBERS) },
    { weight: 2, arbitrary: fc.constantFrom<unknown>(null, true, false, [], {}, [null], [[]], { '': '' }, ['a', 1, null], { id: null }) },
    { weight: 2, arbitrary: fc.oneof(fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.bigInt().map(String)) },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 2 }) },
    { weight: 2, arbitrary: idLike(known) },
    { weight: 1, arbitrary: fc.constantFrom(40, 400).map((depth) => nested(depth)) },
  );
}

function nested(depth: number): unknown {
  let value: unknown = 'deep';
  for (let i = 0; i < depth; i += 1) value = i % 2 === 0 ? [value] : { a: value };
  return value;
}

export function idLike(known: KnownIds): fc.Arbitrary<string> {
  const ids = known.ids.length > 0 ? [fc.constantFrom(...known.ids)] : [];
  return fc.oneof(
    ...ids,
    fc.uuid(),
    fc.constantFrom('00000000-0000-0000-0000-000000000000', 'ffffffff-ffff-ffff-ffff-ffffffffffff', 'FFFFFFFF-FFFF-4FFF-BFFF-FFFFFFFFFFFF', '{00000000-0000-4000-8000-000000000000}', '00000000000040008000000000000000', 'not-an-id', '1', '-1'),
  );
}

const DATE_KEY = /(On|Date|date|Deadline|Until|Since|Before|After|^from$|^to$|^day$|^month$|At$)$/;

function recentDate(): fc.Arbitrary<string> {
  return fc.date({ min: new Date('2015-01-01T00:00:00Z'), max: new Date('2027-12-31T00:00:00Z'), noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10));
}

function stringFor(schema: JsonSchema, key: string, known: KnownIds): fc.Arbitrary<string> {
  if (schema.format === 'uuid' || schema.format === 'guid') return idLike(known);
  if (schema.format === 'email') return fc.oneof(fc.emailAddress(), fc.constantFrom('a@b.test', 'A@EXAMPLE.TEST', 'x@localhost', 'a+b@example.test'));
  if (schema.format === 'date') return fc.oneof(recentDate(), fc.constantFrom(...FAR_DATES));
  if (schema.format === 'date-time') return fc.oneof(fc.date({ noInvalidDate: true }).map((d) => d.toISOString()), fc.constantFrom(...FAR_DATES));
  if (schema.format === 'uri' || schema.format === 'url') return fc.oneof(fc.webUrl(), fc.constantFrom('javascript:alert(1)', 'http://127.0.0.1:1/', 'file:///etc/passwd'));
  if (schema.pattern) {
    try {
      return fc.stringMatching(new RegExp(schema.pattern)).filter((s) => s.length <= (schema.maxLength ?? 500));
    } catch {
      // A pattern fast-check cannot read falls through to plain text.
    }
  }
  if (DATE_KEY.test(key)) return fc.oneof({ weight: 3, arbitrary: recentDate() }, { weight: 1, arbitrary: fc.constantFrom(...FAR_DATES) });
  const minLength = schema.minLength ?? 0;
  const maxLength = Math.max(minLength, Math.min(schema.maxLength ?? 60, 300));
  return fc.oneof(
    { weight: 4, arbitrary: fc.string({ minLength, maxLength }) },
    { weight: 1, arbitrary: fc.string({ unit: 'grapheme', minLength, maxLength }) },
    { weight: 1, arbitrary: fc.constantFrom(minLength, maxLength).map((n) => 'w'.repeat(n)) },
  );
}

function numberFor(schema: JsonSchema, integer: boolean): fc.Arbitrary<number> {
  const min = schema.minimum ?? (schema.exclusiveMinimum !== undefined ? schema.exclusiveMinimum + (integer ? 1 : 1e-9) : undefined);
  const max = schema.maximum ?? (schema.exclusiveMaximum !== undefined ? schema.exclusiveMaximum - (integer ? 1 : 1e-9) : undefined);
  if (integer) {
    const lo = Math.max(Math.ceil(min ?? -(2 ** 40)), Number.MIN_SAFE_INTEGER);
    const hi = Math.min(Math.floor(max ?? 2 ** 40), Number.MAX_SAFE_INTEGER);
    return lo <= hi ? fc.oneof(fc.integer({ min: Math.max(lo, -(2 ** 31)), max: Math.min(hi, 2 ** 31 - 1) }).filter((n) => n >= lo && n <= hi), fc.constantFrom(lo, hi)) : fc.constant(lo);
  }
  return fc.double({ min: min ?? -1e12, max: max ?? 1e12, noNaN: true, noDefaultInfinity: true });
}

/** Values the schema describes (as zod reads input), with known ids in id fields and dates in date-named fields. */
export function valueOf(schema: JsonSchema, known: KnownIds, root: JsonSchema = schema, key = '', depth = 0): fc.Arbitrary<unknown> {
  if (depth > 6) return fc.constant(null);
  if (schema.$ref) {
    const name = schema.$ref.replace(/^#\/\$defs\//, '');
    const target = schema.$ref === '#' ? root : root.$defs?.[name];
    return target ? valueOf(target, known, root, key, depth + 1) : hostileValue(known);
  }
  if (schema.const !== undefined) return fc.constant(schema.const);
  if (schema.enum) return fc.constantFrom(...schema.enum);
  const choices = schema.anyOf ?? schema.oneOf;
  if (choices && choices.length > 0) return fc.oneof(...choices.map((choice) => valueOf(choice, known, root, key, depth + 1)));
  if (schema.allOf && schema.allOf.length > 0) {
    const parts = schema.allOf.map((part) => valueOf(part, known, root, key, depth + 1));
    return fc.tuple(...parts).map((values) => (values.every((v) => v && typeof v === 'object' && !Array.isArray(v)) ? Object.assign({}, ...values) : values[0]));
  }
  const types = Array.isArray(schema.type) ? schema.type : schema.type ? [schema.type] : [];
  if (types.length > 1) return fc.oneof(...types.map((type) => valueOf({ ...schema, type }, known, root, key, depth + 1)));
  switch (types[0]) {
    case 'string':
      return stringFor(schema, key, known);
    case 'integer':
      return numberFor(schema, true);
    case 'number':
      return numberFor(schema, false);
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    case 'array': {
      if (schema.prefixItems) return fc.tuple(...schema.prefixItems.map((item) => valueOf(item, known, root, key, depth + 1)));
      const minLength = schema.minItems ?? 0;
      const maxLength = Math.max(minLength, Math.min(schema.maxItems ?? 4, 6));
      return fc.array(schema.items ? valueOf(schema.items, known, root, key, depth + 1) : hostileValue(known), { minLength, maxLength });
    }
    case 'object':
      return objectOf(schema, known, root, depth);
    default:
      return fc.jsonValue({ maxDepth: 2 });
  }
}

function objectOf(schema: JsonSchema, known: KnownIds, root: JsonSchema, depth: number): fc.Arbitrary<unknown> {
  const properties = schema.properties ?? {};
  const model: Record<string, fc.Arbitrary<unknown>> = {};
  for (const [name, property] of Object.entries(properties)) model[name] = valueOf(property, known, root, name, depth + 1);
  const required = (schema.required ?? []).filter((name) => name in model);
  if (Object.keys(model).length === 0) {
    return schema.additionalProperties && typeof schema.additionalProperties === 'object'
      ? fc.dictionary(fc.string({ maxLength: 12 }), valueOf(schema.additionalProperties, known, root, '', depth + 1), { maxKeys: 4 })
      : fc.constant({});
  }
  return fc.record(model, { requiredKeys: required });
}

/** Where in a value a change lands: the value itself or a path down to any of its fields or items. */
function pathsOf(value: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix);
  if (prefix.length >= 4 || value === null || typeof value !== 'object') return out;
  for (const [key, inner] of Object.entries(value as Record<string, unknown>)) pathsOf(inner, [...prefix, Array.isArray(value) ? Number(key) : key], out);
  return out;
}

const DROP = Symbol('drop');

function valueAt(value: unknown, path: (string | number)[]): unknown {
  return path.reduce<unknown>((inner, key) => (inner as Record<string | number, unknown>)[key], value);
}

/** A copy of `value` with the value at `path` set to `next` (or taken out). */
function setAt(value: unknown, path: (string | number)[], next: unknown): unknown {
  if (path.length === 0) return next === DROP ? undefined : next;
  const [head, ...rest] = path;
  if (Array.isArray(value)) {
    const copy = [...(value as unknown[])];
    if (rest.length === 0 && next === DROP) copy.splice(head as number, 1);
    else copy[head as number] = setAt(copy[head as number], rest, next);
    return copy;
  }
  const copy: Record<string, unknown> = { ...(value as Record<string, unknown>) };
  if (rest.length === 0 && next === DROP) delete copy[head as string];
  else copy[head as string] = setAt(copy[head as string], rest, next);
  return copy;
}

function replaceAt(value: unknown, path: (string | number)[], change: (old: unknown) => unknown): unknown {
  return setAt(value, path, change(valueAt(value, path)));
}


/**
 * A sound value with one thing wrong: a field (or the whole) swapped for a hostile value, a field dropped,
 * an unknown key added, a number pushed past its range, a text stretched past its limit.
 */
export function mutated(base: fc.Arbitrary<unknown>, known: KnownIds): fc.Arbitrary<unknown> {
  return fc
    .tuple(base, fc.nat(), fc.constantFrom('replace', 'replace', 'replace', 'drop', 'extra', 'stretch', 'twice'), hostileValue(known), fc.string({ maxLength: 20 }))
    .map(([value, pick, how, hostile, extraKey]) => {
      const paths = pathsOf(value);
      const path = paths[pick % paths.length]!;
      switch (how) {
        case 'drop':
          return path.length === 0 ? undefined : replaceAt(value, path, () => DROP);
        case 'extra':
          return replaceAt(value, path, (old) => (old && typeof old === 'object' && !Array.isArray(old) ? { ...old, [extraKey || 'extra']: hostile } : hostile));
        case 'stretch':
          return replaceAt(value, path, (old) =>
            typeof old === 'string' ? old.padEnd(old.length + 5_000, old || 'x') : typeof old === 'number' ? old * 1e12 + 1 : Array.isArray(old) ? Array.from({ length: 300 }, () => old[0] ?? hostile) : hostile);
        case 'twice':
          return replaceAt(value, path, (old) => (typeof old === 'number' ? -old - 1 : typeof old === 'string' ? `${old}${old}` : [old, old]));
        default:
          return replaceAt(value, path, () => hostile);
      }
    });
}

/** A body with no schema to go by: an object of odd keys and values, or something that is not an object. */
export function hostileBody(known: KnownIds): fc.Arbitrary<unknown> {
  const key = fc.oneof(fc.constantFrom('id', 'version', 'farmId', 'animalId', 'name', 'date', 'amountCents', 'kind', 'status', 'role', 'coopId', 'constructor', 'toString', ''), fc.string({ maxLength: 12 }));
  return fc.oneof(
    { weight: 5, arbitrary: fc.dictionary(key, hostileValue(known), { maxKeys: 6 }) },
    { weight: 1, arbitrary: hostileValue(known) },
  );
}

/** Bodies sent as raw text with a JSON content type: what `JSON.stringify` never writes. */
export const RAW_BODIES = [
  '', '{', '{"a":', 'null', '0', '"text"', '[]', 'true', '{"__proto__":{"admin":true},"version":0}', '{"constructor":{"prototype":{"x":1}}}',
  '{"a":1,"a":2}', '{"version":1e999}', '{"version":-1e999}', '{"amountCents":123456789012345678901234567890}', '\u0000', '{"a":"\\ud800"}',
  `{"a":${'['.repeat(5_000)}${']'.repeat(5_000)}}`, '{"a":"\\u0000"}', ' \n\t{}', '\ufeff{}',
];

/**
 * `encodeURIComponent` that does not throw on a lone surrogate: it goes out as the three bytes UTF-8 would
 * give it, which is not valid UTF-8 (exactly what a careless client sends).
 */
export function encodeAny(text: string): string {
  let out = '';
  for (const char of text) {
    const code = char.charCodeAt(0);
    if (char.length === 1 && code >= 0xd800 && code <= 0xdfff) {
      out += [0xe0 | (code >> 12), 0x80 | ((code >> 6) & 0x3f), 0x80 | (code & 0x3f)].map((b) => `%${b.toString(16).toUpperCase()}`).join('');
    } else {
      out += encodeURIComponent(char);
    }
  }
  return out;
}

/** A query string's values as Express reads them: text, repeated keys for lists. */
export function queryStringOf(value: unknown): string {
  // Objects go as JSON: one generated with its own `toString` key could not be made text otherwise.
  const text = (one: unknown) => (one === null || one === undefined ? '' : typeof one === 'object' ? (JSON.stringify(one) ?? '') : String(one));
  if (!value || typeof value !== 'object' || Array.isArray(value)) return `q=${encodeAny(text(value))}`;
  const parts: string[] = [];
  for (const [key, inner] of Object.entries(value as Record<string, unknown>)) {
    for (const one of Array.isArray(inner) ? inner : [inner]) parts.push(`${encodeAny(key)}=${encodeAny(text(one))}`);
  }
  return parts.join('&');
}

/** Query strings no client of ours writes. */
export const RAW_QUERIES = [
  'page=1&page=2', 'page[]=1', 'page[a]=1', 'sort=', 'dir=sideways', '=&&=&', '%', '%zz', '%E0%A4%A', '%00', 'a=%ED%A0%80', 'search=%F0%9F%90%87',
  `search=${'x'.repeat(10_000)}`, 'pageSize=1e9', 'page=-1', 'page=0x10', 'page=NaN', 'from=9999-12-31&to=0001-01-01', 'from=2024-02-30', 'farmId=not-an-id',
  '__proto__[admin]=1', 'constructor=1', 'toString=1',
];
