/** The address of a weighing round of a group, a litter, the growing stock or chosen animals. */
export function weighingRoundLink(set: { groupId: string } | { litterId: string } | { growing: true } | { animalIds: string[] }): string {
  if ('groupId' in set) return `/weighing-round?set=group&groupId=${set.groupId}`;
  if ('litterId' in set) return `/weighing-round?set=litter&litterId=${set.litterId}`;
  if ('animalIds' in set) return `/weighing-round?set=animals&animalIds=${set.animalIds.join(',')}`;
  return '/weighing-round?set=growing';
}
