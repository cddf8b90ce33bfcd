import { useForm } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit, type ServerMutateOptions } from '../../../lib/use-server-submit';

interface SafeParser {
  safeParse: Parameters<typeof sharedSchemaResolver>[0]['safeParse'];
}

interface TaskActionFormProps<TBody> {
  /** The one input: its body field (where the schema's message for it lands), label and start value. */
  field: { name: string; label: string; initial: string; type?: 'date'; min?: string };
  button: string;
  schema: SafeParser;
  toBody: (value: string) => TBody;
  send: (body: TBody, options?: ServerMutateOptions<unknown>) => void;
  reset: () => void;
  error: unknown;
}

/**
 * A task moved or skipped, alone or several at once: one input and its button. The action's shared schema
 * checks it; a refusal that is not about the input shows in the task's own message line.
 */
export function TaskActionForm<TBody>({ field, button, schema, toBody, send, reset, error }: TaskActionFormProps<TBody>) {
  const form = useForm<{ value: string }, unknown, TBody>({
    resolver: sharedSchemaResolver(schema, ({ value }) => toBody(value), (path) => (path === field.name ? 'value' : null)),
    defaultValues: { value: field.initial },
  });
  const { submit } = useServerSubmit(form, { mutate: send, reset, error }, { fields: (path) => (path === field.name ? 'value' : null) });
  return (
    <form noValidate className="flex items-end gap-2" onSubmit={submit}>
      <TextField label={field.label} type={field.type ?? 'text'} min={field.min} className="flex-1" error={form.formState.errors.value?.message} {...form.register('value')} />
      <Button type="submit" variant="secondary">
        {button}
      </Button>
    </form>
  );
}
