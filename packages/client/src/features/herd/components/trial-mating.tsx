import { Check, Plus } from 'lucide-react';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { PedigreeCardDto, TrialLitterDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Card } from '../../../components/ui/card';
import { SearchField } from '../../../components/ui/search-field';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { Spinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { usePedigreeCards } from '../api/get-pedigree-cards';
import { useTrialMatings } from '../api/run-trial-matings';
import { coiLevel, formatCoi } from '../herd-labels';
import { BreedMakeupBar, breedMakeupText } from './breed-makeup';

interface BuckPickerProps {
  ownFarmId: string | null;
  chosen: string[];
  onToggle: (buckId: string) => void;
}

/** Bucks to try: the farm's own, or any buck alive on a co-op farm. */
export function BuckPicker({ ownFarmId, chosen, onToggle }: BuckPickerProps) {
  const [scope, setScope] = useState<'own' | 'coop'>(ownFarmId ? 'own' : 'coop');
  const [search, setSearch] = useState('');
  const cards = usePedigreeCards({ sex: 'buck', onFarm: true, breeding: true, pageSize: 30, farmId: scope === 'own' ? (ownFarmId ?? undefined) : undefined, search: search || undefined });
  return (
    <div className="space-y-3">
      {ownFarmId && (
        <SegmentedFilter
          label="Which bucks"
          value={scope}
          onChange={setScope}
          options={[{ value: 'own', label: 'On your farm' }, { value: 'coop', label: 'Across the co-op' }]}
        />
      )}
      <SearchField label="Find a buck" placeholder="Name or tattoo" value={search} onSearch={setSearch} />
      <ul className="max-h-[28rem] space-y-2 overflow-y-auto pr-1" aria-label="Bucks to compare">
        {(cards.data?.items ?? []).map((buck) => {
          const on = chosen.includes(buck.id);
          return (
            <li key={buck.id}>
              <button
                type="button"
                aria-pressed={on}
                onClick={() => onToggle(buck.id)}
                disabled={!on && chosen.length >= 12}
                className={cn(
                  'flex min-h-11 w-full items-start gap-3 rounded-lg border-2 px-3 py-2 text-left transition-colors disabled:opacity-50',
                  on ? 'border-moss bg-moss-wash' : 'border-grey-200 bg-white hover:border-moss',
                )}
              >
                {on ? <Check className="mt-1 size-5 shrink-0 text-moss-deep" aria-hidden="true" /> : <Plus className="mt-1 size-5 shrink-0 text-grey-500" aria-hidden="true" />}
                <span>
                  <span className="block font-semibold">
                    {buck.name || buck.tattoo} <span className="font-normal text-grey-700">({buck.tattoo})</span>
                  </span>
                  <span className="block text-sm text-grey-700">
                    {breedMakeupText(buck.breedMakeup)} · {buck.currentFarm?.name}
                  </span>
                </span>
              </button>
            </li>
          );
        })}
        {cards.data && cards.data.items.length === 0 && <li className="text-grey-600">No bucks match.</li>}
      </ul>
    </div>
  );
}

function LitterCard({ litter, damId, ownFarmId }: { litter: TrialLitterDto; damId: string; ownFarmId: string | null }) {
  const level = coiLevel(litter.coi);
  const elsewhere = litter.sire.currentFarm && litter.sire.currentFarm.id !== ownFarmId;
  return (
    <li>
      <Card className="h-full space-y-4" data-testid="trial-litter">
        <div className="space-y-1">
          <p className="text-sm font-semibold tracking-wide text-grey-600 uppercase">With</p>
          <h3 className="text-lg font-bold">
            <Link to={`/herd/${litter.sire.id}`} className="text-moss-deep underline decoration-2 underline-offset-4">
              {litter.sire.name || litter.sire.tattoo}
            </Link>{' '}
            <span className="font-normal text-grey-700">({litter.sire.tattoo})</span>
          </h3>
          <p className="text-sm text-grey-700">
            {litter.sire.currentFarm?.name} {elsewhere && <Badge tone="neutral">Another farm</Badge>}
          </p>
        </div>
        <div>
          <p className="text-sm text-grey-600">Litter's COI</p>
          <p className="text-3xl font-bold">{formatCoi(litter.coi)}</p>
          <Badge tone={level.tone}>{level.label}</Badge>
          <p className="mt-1">He is {litter.relationship === 'no shared ancestor on record' ? 'no relation on record' : litter.relationship.startsWith('her ') ? litter.relationship : `her ${litter.relationship}`}.</p>
        </div>
        <div className="space-y-2">
          <p className="text-sm text-grey-600">Litter's breed make-up</p>
          <BreedMakeupBar makeup={litter.breedMakeup} />
        </div>
        <div className="space-y-1">
          <p className="text-sm text-grey-600">Shared ancestors</p>
          {litter.commonAncestors.length === 0 ? (
            <p>None on record</p>
          ) : (
            <ul className="text-sm">
              {litter.commonAncestors.map((a) => (
                <li key={a.id}>
                  <Link to={`/herd/${a.id}`} className="underline decoration-1 underline-offset-2">
                    {a.name || a.tattoo}
                  </Link>
                  {a.tattoo && a.name ? ` (${a.tattoo})` : ''}
                </li>
              ))}
            </ul>
          )}
        </div>
        {litter.sire.currentFarm?.id === ownFarmId && (
          <Link
            to={`/almanac/services/new?doeId=${encodeURIComponent(damId)}&buckId=${encodeURIComponent(litter.sire.id)}`}
            className="inline-flex min-h-11 items-center rounded-lg border-2 border-moss px-3 font-semibold text-moss-deep hover:bg-moss-wash"
          >
            Record this service
          </Link>
        )}
      </Card>
    </li>
  );
}

/** Each litter side by side, least inbred first. */
export function TrialResults({ dam, sireIds, ownFarmId }: { dam: PedigreeCardDto; sireIds: string[]; ownFarmId: string | null }) {
  const trial = useTrialMatings(dam.id, sireIds);
  if (sireIds.length === 0) return <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-6 text-grey-600">Pick one or more bucks to see each litter side by side.</p>;
  if (trial.isError) return <Alert tone="error">{trial.error.message}</Alert>;
  if (!trial.data) return <Spinner label="Working out the litters…" />;
  const litters = [...trial.data.litters].sort((a, b) => a.coi - b.coi);
  return (
    <ul aria-label="Trial litters" className="grid gap-4 sm:grid-cols-2 2xl:grid-cols-3">
      {litters.map((litter) => (
        <LitterCard key={litter.sire.id} litter={litter} damId={dam.id} ownFarmId={ownFarmId} />
      ))}
    </ul>
  );
}
