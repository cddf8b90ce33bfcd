import { Columns3, SlidersHorizontal } from 'lucide-react';
import { useState } from 'react';
import { ageClasses, herdColumns, purities, type BreedDto, type HerdColumn, type HerdView } from '@burrowline/shared';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { SearchField } from '../../../components/ui/search-field';
import { SelectField } from '../../../components/ui/select-field';
import { ageClassLabels, purityLabels } from '../herd-labels';

export const columnLabels: Record<HerdColumn, string> = {
  tattoo: 'Tattoo', name: 'Name', sex: 'Sex', breed: 'Breed make-up', purity: 'Purity', ageClass: 'Age class', birthDate: 'Born',
  lifecycle: 'Status', cycle: 'In her cycle', hutch: 'Hutch', coi: 'COI', weight: 'Latest weight', custody: 'Custody',
};

const statusOptions = [
  { value: 'current', label: 'In the herd now' },
  { value: 'kit', label: 'Kits' },
  { value: 'junior', label: 'Juniors' },
  { value: 'breeding', label: 'Breeding stock' },
  { value: 'retired', label: 'Retired' },
  { value: 'gone', label: 'Gone (sold, processed, died, culled)' },
  { value: 'all', label: 'Everything on record' },
] as const;

interface HerdFiltersProps {
  view: HerdView;
  breeds: BreedDto[];
  onChange: (patch: Partial<HerdView>) => void;
}

/** Search, filters and column choice; every change lands in the address (and goes back to page 1). */
export function HerdFilters({ view, breeds, onChange }: HerdFiltersProps) {
  const visible = new Set(view.cols.split(',').filter(Boolean));
  // On a phone the filters fold away under one button, so the herd starts on the first screen.
  const [open, setOpen] = useState(false);
  const active = [view.sex, view.breedId, view.ageClass, view.purity, view.status !== 'current' ? view.status : undefined].filter(Boolean).length;
  const set = (patch: Partial<HerdView>) => onChange({ ...patch, page: 1 });
  const toggleColumn = (column: HerdColumn, on: boolean) => {
    const next = herdColumns.filter((c) => (c === column ? on : visible.has(c)));
    onChange({ cols: next.join(',') });
  };
  return (
    <div className="space-y-4 rounded-2xl border border-grey-200 bg-white p-4 shadow-sm">
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4 xl:grid-cols-7">
        <div className="sm:col-span-2">
          <SearchField label="Search" placeholder="Name, tattoo, hutch, colour…" value={view.search ?? ''} onSearch={(search) => set({ search: search || undefined })} />
        </div>
        <button
          type="button"
          aria-expanded={open}
          aria-controls="herd-filter-fields"
          onClick={() => setOpen(!open)}
          className="inline-flex min-h-11 items-center gap-2 self-end rounded-lg border-2 border-moss px-3 font-semibold text-moss-deep md:hidden"
        >
          <SlidersHorizontal className="size-5" aria-hidden="true" />
          Filters{active > 0 && ` (${active} on)`}
        </button>
        <div id="herd-filter-fields" className={`${open ? 'grid' : 'hidden'} gap-4 sm:col-span-2 sm:grid-cols-2 md:grid lg:col-span-2 xl:col-span-5 xl:grid-cols-5`}>
        <SelectField
          label="Sex"
          value={view.sex ?? ''}
          onChange={(e) => set({ sex: (e.target.value || undefined) as HerdView['sex'] })}
          options={[{ value: '', label: 'Both' }, { value: 'buck', label: 'Bucks' }, { value: 'doe', label: 'Does' }]}
        />
        <SelectField label="Status" value={view.status} onChange={(e) => set({ status: e.target.value as HerdView['status'] })} options={statusOptions} />
        <SelectField
          label="Breed"
          value={view.breedId ?? ''}
          onChange={(e) => set({ breedId: e.target.value || undefined })}
          options={[{ value: '', label: 'Any breed' }, ...breeds.map((b) => ({ value: b.id, label: b.name }))]}
        />
        <SelectField
          label="Age class"
          value={view.ageClass ?? ''}
          onChange={(e) => set({ ageClass: (e.target.value || undefined) as HerdView['ageClass'] })}
          options={[{ value: '', label: 'Any age' }, ...ageClasses.map((a) => ({ value: a, label: ageClassLabels[a] }))]}
        />
        <SelectField
          label="Purity"
          value={view.purity ?? ''}
          onChange={(e) => set({ purity: (e.target.value || undefined) as HerdView['purity'] })}
          options={[{ value: '', label: 'Any ancestry' }, ...purities.map((p) => ({ value: p, label: purityLabels[p] }))]}
        />
        </div>
      </div>
      <details className="hidden md:block">
        <summary className="inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-lg px-2 font-semibold text-moss-deep hover:bg-moss-wash">
          <Columns3 className="size-5" aria-hidden="true" />
          Columns
        </summary>
        <fieldset className="mt-2 grid grid-cols-2 gap-x-6 lg:grid-cols-4">
          <legend className="sr-only">Columns to show</legend>
          {herdColumns.map((column) => (
            <CheckboxField
              key={column}
              label={columnLabels[column]}
              checked={visible.has(column)}
              disabled={column === 'tattoo'}
              onChange={(e) => toggleColumn(column, e.target.checked)}
            />
          ))}
        </fieldset>
      </details>
    </div>
  );
}
