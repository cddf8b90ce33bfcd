import { useState } from 'react';
import { useController, type Control, type FieldValues, type Path } from 'react-hook-form';
import { TextField } from './text-field';

interface ListTextFieldProps<T extends FieldValues> {
  control: Control<T>;
  /** A field whose value is a list of strings. */
  name: Path<T>;
  label: string;
  hint?: string;
  /** Turns what is typed into the list, e.g. "New Zealand, Rex" → ["New Zealand", "Rex"]. */
  parse: (text: string) => string[];
  /** For an error on one item (reported on `name.2`) rather than on the list. */
  itemError: string;
}

/** A list typed on one line: the text stays as typed, the parsed list goes to the form. */
export function ListTextField<T extends FieldValues>({ control, name, label, hint, parse, itemError }: ListTextFieldProps<T>) {
  const { field, fieldState } = useController({ control, name });
  const [text, setText] = useState(() => ((field.value as string[] | undefined) ?? []).join(', '));
  const error = fieldState.error?.message ?? (fieldState.invalid ? itemError : undefined);
  return (
    <TextField
      label={label}
      hint={hint}
      autoComplete="off"
      error={error}
      name={field.name}
      ref={field.ref}
      value={text}
      onBlur={field.onBlur}
      onChange={(event) => {
        setText(event.target.value);
        field.onChange(parse(event.target.value));
      }}
    />
  );
}
