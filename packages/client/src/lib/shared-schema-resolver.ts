import { toNestErrors } from '@hookform/resolvers';
import type { FieldError, FieldErrors, FieldValues, Path, Resolver } from 'react-hook-form';

/** What the resolver needs of a shared zod schema (the client has no zod of its own to build one). */
interface SharedSchema {
  safeParse(value: unknown): { success: true } | { success: false; error: { issues: readonly { path: readonly PropertyKey[]; message: string; code?: string }[] } };
}

/**
 * A react-hook-form resolver that checks the request body with the API's own shared schema, so the form
 * refuses exactly what the server would, with the same words. `toBody` turns what was typed into the body
 * (numbers from text, a weight in the farm's units into grams) and may `refuse` a field it cannot convert;
 * `fieldOf` maps the body's paths back to the form's fields (by default the same names; it is given
 * the values, for a path whose field depends on a choice made in the form). An issue no field
 * shows lands on `root`, where the form's general message is. The submit handler receives the body.
 */
export function sharedSchemaResolver<TForm extends FieldValues, TBody>(
  schema: SharedSchema,
  toBody: (values: TForm, refuse: (field: Path<TForm> | 'root', message: string) => void) => TBody,
  fieldOf?: (path: string, values: TForm) => Path<TForm> | null,
): Resolver<TForm, unknown, TBody> {
  return async (values, _context, options) => {
    const flat: Record<string, FieldError> = {};
    const add = (field: string, type: string, message: string) => {
      flat[field] ??= { type, message };
    };
    const body = toBody(values, (field, message) => add(field, 'conversion', message));
    const result = schema.safeParse(body);
    if (!result.success) {
      for (const issue of result.error.issues) {
        const path = issue.path.map(String).join('.');
        const field = fieldOf ? fieldOf(path, values) : path.split('.')[0]! in values ? path.split('.')[0]! : null;
        add(field ?? 'root', issue.code ?? 'schema', issue.message);
      }
    }
    if (Object.keys(flat).length === 0) return { values: body, errors: {} };
    return { values: {}, errors: toNestErrors(flat as FieldErrors, options) };
  };
}
