import type { MemberStatus } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { memberStatusLabels, memberStatusTones } from '../member-labels';

export function MemberStatusBadge({ status }: { status: MemberStatus }) {
  return <Badge tone={memberStatusTones[status]}>{memberStatusLabels[status]}</Badge>;
}
