import { useQuery } from '@tanstack/react-query';
import { animalListQuerySchema } from '@burrowline/shared';
import type { SelectOption } from '../../../components/ui/select-field';
import { animalName } from '../../../lib/names';
import { groupsQueryOptions } from '../../grow-out';
import { herdQueryOptions } from '../../herd';

const herdQuery = animalListQuerySchema.parse({ status: 'current', pageSize: 200 });

/** The farm's current animals and growing groups, as choices for the treatment and processing forms. */
export function useFarmSubjects(): { animals: SelectOption[]; groups: SelectOption[]; groupHeads: Map<string, number>; birthDates: Map<string, string | null> } {
  const herd = useQuery(herdQueryOptions(herdQuery));
  const groups = useQuery(groupsQueryOptions({ status: 'growing' }));
  const items = herd.data?.items ?? [];
  return {
    animals: items.map((a) => ({ value: a.id, label: animalName(a) })),
    groups: (groups.data?.groups ?? []).map((g) => ({ value: g.id, label: `${g.name} (${g.currentHeads} heads)` })),
    groupHeads: new Map((groups.data?.groups ?? []).map((g) => [g.id, g.currentHeads])),
    birthDates: new Map([...items.map((a) => [a.id, a.birthDate] as const), ...(groups.data?.groups ?? []).map((g) => [g.id, g.birthDate] as const)]),
  };
}
