import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import { applyServerFieldErrors, confirmWarnings, errorText, type FieldOf } from './form-errors';

/** The callbacks the hook passes to `mutate`. */
export interface ServerMutateOptions<TResult> {
  onSuccess?: (result: TResult) => void;
  onError?: (error: unknown) => void;
}

/** What the hook needs of a TanStack mutation (or a wrapper that adds an id or a version to the body). */
export interface ServerMutation<TBody, TResult> {
  mutate: (body: TBody, options?: ServerMutateOptions<TResult>) => void;
  reset: () => void;
  error: unknown;
}

interface ServerSubmitOptions<TForm extends FieldValues, TBody, TResult> {
  /** Where the server's field messages go; by default the form field of the same (top-level) name. */
  fields?: readonly Path<TForm>[] | FieldOf<TForm>;
  onSuccess?: (result: TResult, body: TBody) => void;
}

/**
 * The one way a form sends its body to the server. `submit` checks the form and sends; a 400's field
 * messages are put under their inputs. A 422 `confirmation_required` comes back as `warnings` the breeder
 * may override: `confirm` checks the form again and resends what is typed now with `confirm: true`.
 * `failure` is the message no field shows (a network error, a refused date of another record).
 */
export function useServerSubmit<TForm extends FieldValues, TBody, TResult>(
  form: UseFormReturn<TForm, unknown, TBody>,
  mutation: ServerMutation<TBody, TResult>,
  { fields, onSuccess }: ServerSubmitOptions<TForm, TBody, TResult> = {},
) {
  const fieldOf: readonly Path<TForm>[] | FieldOf<TForm> = fields ?? ((path) => {
    const top = path.split('.')[0]!;
    return top in form.getValues() ? (top as Path<TForm>) : null;
  });
  const send = (confirm: boolean) =>
    form.handleSubmit((body) =>
      mutation.mutate(confirm ? ({ ...body, confirm: true } as TBody) : body, {
        onSuccess: (result) => onSuccess?.(result, body),
        onError: (error) => {
          if (applyServerFieldErrors(error, form.setError, fieldOf)) mutation.reset();
        },
      }),
    );
  const warnings = confirmWarnings(mutation.error);
  const rootMessage = form.formState.errors.root?.message;
  return {
    submit: send(false),
    confirm: send(true),
    warnings,
    failure: mutation.error && !warnings ? errorText(mutation.error) : (rootMessage ?? null),
  };
}
