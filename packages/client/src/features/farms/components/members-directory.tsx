import { ChevronRight, MapPin } from 'lucide-react';
import { Link } from 'react-router-dom';
import type { FarmDto } from '@burrowline/shared';
import { BreedTags } from './breed-tags';

function DirectoryEntry({ farm, isOwn }: { farm: FarmDto; isOwn: boolean }) {
  return (
    <li className="relative flex flex-col gap-3 rounded-2xl border border-grey-200 bg-white p-5 shadow-sm transition-shadow focus-within:shadow-md hover:shadow-md">
      {isOwn && <span className="self-start rounded-md bg-moss-wash px-2 py-0.5 text-xs font-semibold text-moss-deep">Yours</span>}
      <h3 className="pr-8 text-lg font-semibold">
        {/* The link's box covers the whole card, so a gloved tap anywhere on it opens the farm. */}
        <Link to={`/farms/${farm.id}`} className="rounded after:absolute after:inset-0 after:rounded-2xl after:content-['']">
          {farm.name}
        </Link>
      </h3>
      <ChevronRight className="absolute top-5 right-4 size-5 text-grey-500" aria-hidden="true" />
      <p className="flex items-center gap-1.5 text-grey-600">
        <MapPin className="size-4 shrink-0" aria-hidden="true" />
        {farm.location}
      </p>
      <BreedTags breeds={farm.breedsKept} limit={4} announceLabel />
      <p className="text-sm text-grey-600">
        {farm.members.length === 0 ? 'No members yet' : farm.members.map((member) => member.name).join(', ')}
      </p>
    </li>
  );
}

interface MembersDirectoryProps {
  farms: FarmDto[];
  ownFarmId: string | null;
}

export function MembersDirectory({ farms, ownFarmId }: MembersDirectoryProps) {
  const sorted = [...farms].sort((a, b) => a.name.localeCompare(b.name));
  return (
    <section aria-labelledby="members-directory-heading" className="space-y-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="members-directory-heading" className="text-2xl font-bold tracking-tight">
          Members directory
        </h2>
        <p className="text-grey-600">
          {farms.length} {farms.length === 1 ? 'farm' : 'farms'} in the co-op
        </p>
      </div>
      {sorted.length === 0 ? (
        <p className="text-grey-600">No farms have joined yet.</p>
      ) : (
        <ul aria-label="Members directory" className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
          {sorted.map((farm) => (
            <DirectoryEntry key={farm.id} farm={farm} isOwn={farm.id === ownFarmId} />
          ))}
        </ul>
      )}
    </section>
  );
}
