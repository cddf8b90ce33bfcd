import type { FarmDto } from '@burrowline/shared';
import { roleLabels } from '../../../lib/role-labels';

export function MemberList({ members }: { members: FarmDto['members'] }) {
  if (members.length === 0) return <p className="text-grey-600">No members yet.</p>;
  return (
    <ul className="space-y-2" aria-label="Farm members">
      {members.map((member) => (
        <li key={member.id} className="flex flex-wrap items-center gap-x-2 gap-y-1">
          <span className="font-medium">{member.name}</span>
          <span className="rounded-md bg-grey-100 px-2 py-0.5 text-sm text-grey-700">{roleLabels[member.role]}</span>
        </li>
      ))}
    </ul>
  );
}
