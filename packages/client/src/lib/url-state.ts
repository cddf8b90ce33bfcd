import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';

/** What `useUrlState` needs of a (zod) object schema whose every field has a default or is optional. */
export interface UrlStateSchema<T> {
  shape: Record<string, unknown>;
  safeParse(value: unknown): { success: true; data: T } | { success: false; error: { issues: { path: PropertyKey[] }[] } };
}

/** Reads list state from the address: a value the schema refuses (a mistyped or stale link) falls back to its default. */
export function readUrlState<T>(schema: UrlStateSchema<T>, params: URLSearchParams): T {
  const raw = Object.fromEntries([...params].filter(([key]) => key in schema.shape));
  const first = schema.safeParse(raw);
  if (first.success) return first.data;
  const refused = new Set(first.error.issues.map((issue) => String(issue.path[0])));
  const kept = Object.fromEntries(Object.entries(raw).filter(([key]) => !refused.has(key)));
  const second = schema.safeParse(kept);
  if (second.success) return second.data;
  const defaults = schema.safeParse({});
  if (!defaults.success) throw new Error('A URL state schema needs a default for every field');
  return defaults.data;
}

/**
 * A list screen's filters, search, sort and page kept in the address, so a reload, the back button or
 * a shared link shows the same view. Values equal to their defaults are left out of the address.
 */
export function useUrlState<T extends Record<string, unknown>>(schema: UrlStateSchema<T>) {
  const [params, setParams] = useSearchParams();
  const state = useMemo(() => readUrlState(schema, params), [schema, params]);
  const update = useCallback(
    (patch: Partial<T>, opts: { replace?: boolean } = {}) => {
      setParams(
        (current) => {
          const next = { ...readUrlState(schema, current), ...patch };
          const defaults = readUrlState(schema, new URLSearchParams());
          const out = new URLSearchParams();
          for (const [key, value] of Object.entries(next)) {
            if (value === undefined || value === '' || String(value) === String(defaults[key])) continue;
            out.set(key, String(value));
          }
          return out;
        },
        { replace: opts.replace ?? false, preventScrollReset: true },
      );
    },
    [schema, setParams],
  );
  return [state, update] as const;
}
