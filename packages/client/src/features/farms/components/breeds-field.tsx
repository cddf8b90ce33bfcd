import { useState } from 'react';
import { useController, type Control } from 'react-hook-form';
import type { FarmProfileInput } from '@burrowline/shared';
import { TextField } from '../../../components/ui/text-field';

/** "New Zealand, Californian , ,Rex" → ["New Zealand", "Californian", "Rex"], without repeats. */
export function parseBreeds(text: string): string[] {
  const seen = new Set<string>();
  const breeds: string[] = [];
  for (const part of text.split(',')) {
    const breed = part.trim().replace(/\s+/g, ' ');
    const key = breed.toLowerCase();
    if (!breed || seen.has(key)) continue;
    seen.add(key);
    breeds.push(breed);
  }
  return breeds;
}

/** The schema wants a list; people type a line. The text is kept as typed, the list goes to the form. */
export function BreedsField({ control }: { control: Control<FarmProfileInput> }) {
  const { field, fieldState } = useController({ control, name: 'breedsKept' });
  const [text, setText] = useState(() => field.value.join(', '));

  // A too-long single breed is reported on its index (breedsKept.2), not on the list.
  const error = fieldState.error?.message ?? (fieldState.invalid ? 'Keep each breed name under 60 characters' : undefined);

  return (
    <TextField
      label="Breeds kept"
      hint="Separate breeds with commas, for example: New Zealand, Californian, Silver Fox."
      autoComplete="off"
      error={error}
      name={field.name}
      ref={field.ref}
      value={text}
      onBlur={field.onBlur}
      onChange={(event) => {
        setText(event.target.value);
        field.onChange(parseBreeds(event.target.value));
      }}
    />
  );
}
