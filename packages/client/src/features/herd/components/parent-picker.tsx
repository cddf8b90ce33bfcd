import { X } from 'lucide-react';
import { useState } from 'react';
import type { BreedDto, PedigreeCardDto, Sex } from '@burrowline/shared';
import { ageWords, formatDate } from '../../../lib/days';
import { useFarmToday } from '../../farms';
import { Button } from '../../../components/ui/button';
import { SearchField } from '../../../components/ui/search-field';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { usePedigreeCards } from '../api/get-pedigree-cards';
import { breedMakeupText } from './breed-makeup';

export interface PapersParent {
  name: string;
  tattoo: string;
  registrationNumber: string;
  breedId: string;
}

export type ParentChoice =
  | { mode: 'unknown' }
  | { mode: 'animal'; card: PedigreeCardDto | null }
  | { mode: 'papers'; papers: PapersParent };

interface ParentPickerProps {
  role: 'sire' | 'dam';
  value: ParentChoice;
  onChange: (choice: ParentChoice) => void;
  breeds: BreedDto[];
  /** Server messages by key: `sireId`, `sireFromPapers`, `sireFromPapers.name`… */
  errors: Record<string, string[]>;
}

const emptyPapers: PapersParent = { name: '', tattoo: '', registrationNumber: '', breedId: '' };

/** Sire or dam: unknown, any animal of the co-op (any farm's, or an outside one), or a new one from papers. */
export function ParentPicker({ role, value, onChange, breeds, errors }: ParentPickerProps) {
  const sex: Sex = role === 'sire' ? 'buck' : 'doe';
  const label = role === 'sire' ? 'Sire' : 'Dam';
  const [search, setSearch] = useState('');
  const today = useFarmToday();
  const cards = usePedigreeCards({ search: search || undefined, sex, pageSize: 8 }, value.mode === 'animal' && !value.card);
  const idError = errors[`${role}Id`]?.[0];
  const papersError = (field: string) => errors[`${role}FromPapers.${field}`]?.[0];

  return (
    <fieldset className="space-y-3 rounded-xl border border-grey-200 p-4">
      <legend className="px-1 text-lg font-semibold">{label}</legend>
      <SegmentedFilter
        label={`How the ${role} is known`}
        value={value.mode}
        onChange={(mode) => onChange(mode === 'unknown' ? { mode } : mode === 'animal' ? { mode, card: null } : { mode, papers: emptyPapers })}
        options={[
          { value: 'unknown', label: 'Unknown' },
          { value: 'animal', label: 'In the co-op' },
          { value: 'papers', label: 'From papers' },
        ]}
      />
      {value.mode === 'animal' &&
        (value.card ? (
          <div className="flex items-start justify-between gap-3 rounded-lg bg-moss-wash p-3">
            <div>
              <p className="font-semibold">
                {value.card.name || value.card.tattoo} {value.card.tattoo && <span className="font-normal">({value.card.tattoo})</span>}
              </p>
              <p className="text-sm">{breedMakeupText(value.card.breedMakeup)} · born {value.card.birthDate ? `${formatDate(value.card.birthDate)} (${ageWords(value.card.birthDate, today)})` : 'unknown'}</p>
              <p className="text-sm text-grey-700">{value.card.isOutside ? 'Outside animal, from papers' : (value.card.currentFarm?.name ?? value.card.breedingFarm?.name)}</p>
            </div>
            <Button variant="quiet" onClick={() => onChange({ mode: 'animal', card: null })} aria-label={`Choose another ${role}`}>
              <X className="size-5" aria-hidden="true" />
              Change
            </Button>
          </div>
        ) : (
          <div className="space-y-2">
            <SearchField label={`Find the ${role} (any farm, or an outside animal)`} placeholder="Name, tattoo or registration" value={search} onSearch={setSearch} />
            <ul className="max-h-72 space-y-1 overflow-y-auto" aria-label={`${label} candidates`}>
              {(cards.data?.items ?? []).map((card) => (
                <li key={card.id}>
                  <button
                    type="button"
                    onClick={() => onChange({ mode: 'animal', card })}
                    className="flex min-h-11 w-full flex-col items-start rounded-lg border border-grey-200 px-3 py-2 text-left hover:border-moss hover:bg-moss-wash"
                  >
                    <span className="font-semibold">
                      {card.name || card.tattoo} {card.tattoo && <span className="font-normal text-grey-700">({card.tattoo})</span>}
                    </span>
                    <span className="text-sm text-grey-700">
                      {[
                        card.sex === 'doe' ? 'Doe' : card.sex === 'buck' ? 'Buck' : 'Sex unknown',
                        card.birthDate ? ageWords(card.birthDate, today) : 'age unknown',
                        breedMakeupText(card.breedMakeup),
                        card.isOutside ? 'from papers' : (card.currentFarm?.name ?? 'no longer on a farm'),
                      ].join(' · ')}
                    </span>
                  </button>
                </li>
              ))}
              {cards.data && cards.data.items.length === 0 && <li className="text-grey-600">No {sex} matches.</li>}
            </ul>
          </div>
        ))}
      {value.mode === 'papers' && (
        <div className="grid gap-3 sm:grid-cols-2">
          {(['name', 'tattoo', 'registrationNumber'] as const).map((field) => (
            <TextField
              key={field}
              label={{ name: 'Name on the papers', tattoo: 'Ear tattoo', registrationNumber: 'Registration number' }[field]}
              value={value.papers[field]}
              onChange={(e) => onChange({ mode: 'papers', papers: { ...value.papers, [field]: e.target.value } })}
              error={papersError(field)}
            />
          ))}
          <SelectField
            label="Breed"
            value={value.papers.breedId}
            onChange={(e) => onChange({ mode: 'papers', papers: { ...value.papers, breedId: e.target.value } })}
            options={[{ value: '', label: 'Unknown' }, ...breeds.map((b) => ({ value: b.id, label: b.name }))]}
            error={papersError('breedId')}
          />
          <p className="text-sm text-grey-600 sm:col-span-2">
            If another farm already entered this ancestor (same registration number, or same tattoo and name), it is matched to that record.
          </p>
        </div>
      )}
      {(idError || errors[`${role}FromPapers`]?.[0]) && (
        <p className="text-sm font-medium text-clay-deep" role="alert">
          {idError ?? errors[`${role}FromPapers`]?.[0]}
        </p>
      )}
    </fieldset>
  );
}
