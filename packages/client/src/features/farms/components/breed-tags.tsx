interface BreedTagsProps {
  breeds: string[];
  /** On a directory card, a few breeds say enough; the profile lists them all. */
  limit?: number;
  /** Where no visible "Breeds kept" label sits beside the tags (the directory cards). */
  announceLabel?: boolean;
}

/** Tags, not a list: inside the directory, each <li> should be one farm and nothing else. */
export function BreedTags({ breeds, limit, announceLabel = false }: BreedTagsProps) {
  if (breeds.length === 0) return <p className="text-grey-600">No breeds listed yet</p>;
  const shown = limit === undefined ? breeds : breeds.slice(0, limit);
  const hidden = breeds.length - shown.length;
  return (
    <p className="flex flex-wrap gap-2">
      {announceLabel && <span className="sr-only">Breeds kept: </span>}
      {shown.map((breed, index) => (
        <span key={breed} className="rounded-full bg-straw-wash px-3 py-1 text-sm font-medium text-bark">
          {breed}
          {index < shown.length - 1 && <span className="sr-only">,</span>}
        </span>
      ))}
      {hidden > 0 && <span className="px-1 py-1 text-sm text-grey-600">and {hidden} more</span>}
    </p>
  );
}
