import { useState } from 'react';
import type { LitterDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { animalName } from '../../../lib/names';
import { errorText, fieldErrors } from '../../../lib/form-errors';
import { useAddKeeper } from '../api/add-keeper';

/** A kit kept for breeding gets its own record; its sire, dam and birth date come from the litter it was born in. */
export function KeeperForm({ litter }: { litter: LitterDto }) {
  const add = useAddKeeper(litter.id);
  const [tattoo, setTattoo] = useState('');
  const [name, setName] = useState('');
  const [sex, setSex] = useState<'doe' | 'buck'>('doe');
  const [bornIn, setBornIn] = useState(litter.id);
  const errors = fieldErrors(add.error);
  return (
    <form
      noValidate
      aria-label="Keep a kit"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        add.mutate({ tattoo, name, sex, colour: '', ...(bornIn !== litter.id ? { bornInLitterId: bornIn } : {}) }, { onSuccess: () => { setTattoo(''); setName(''); } });
      }}
    >
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="Ear tattoo" value={tattoo} onChange={(e) => setTattoo(e.target.value)} error={errors.tattoo} />
        <TextField label="Name (optional)" value={name} onChange={(e) => setName(e.target.value)} error={errors.name} />
        <SelectField label="Sex" value={sex} onChange={(e) => setSex(e.target.value as 'doe' | 'buck')} options={[{ value: 'doe', label: 'Doe' }, { value: 'buck', label: 'Buck' }]} />
        {litter.fosteredInFrom.length > 0 && (
          <SelectField
            label="Born in"
            value={bornIn}
            onChange={(e) => setBornIn(e.target.value)}
            error={errors.bornInLitterId}
            options={[
              { value: litter.id, label: `This litter (${animalName(litter.dam)})` },
              ...litter.fosteredInFrom.map((l) => ({ value: l.id, label: `Fostered in: ${l.dam ? animalName(l.dam) : 'another doe'}'s litter` })),
            ]}
          />
        )}
      </div>
      {add.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(add.error)}</p>}
      <Button type="submit" variant="secondary" isBusy={add.isPending}>
        Keep this kit
      </Button>
    </form>
  );
}
