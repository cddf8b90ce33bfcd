import type { ReactNode } from 'react';
import type { FarmDto } from '@burrowline/shared';
import { temperatureUnitLabels, weightUnitLabels } from '../farm-labels';
import { BreedTags } from './breed-tags';

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="space-y-1">
      <dt className="text-sm font-medium text-grey-600">{term}</dt>
      <dd>{children}</dd>
    </div>
  );
}

interface FarmFactsProps {
  farm: FarmDto;
  /** The profile page shows everything; the Commons card leaves out the time zone. */
  detailed?: boolean;
}

export function FarmFacts({ farm, detailed = false }: FarmFactsProps) {
  return (
    <dl className="grid gap-4 sm:grid-cols-2">
      <Fact term="Location">{farm.location}</Fact>
      {detailed && (
        <Fact term="Time zone">
          <span className="break-words">{farm.timeZone}</span>
        </Fact>
      )}
      <Fact term="Weight units">{weightUnitLabels[farm.weightUnit]}</Fact>
      <Fact term="Temperature units">{temperatureUnitLabels[farm.temperatureUnit]}</Fact>
      <div className="sm:col-span-2">
        <Fact term="Breeds kept">
          <BreedTags breeds={farm.breedsKept} />
        </Fact>
      </div>
    </dl>
  );
}
