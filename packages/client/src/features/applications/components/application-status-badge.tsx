import type { ApplicationStatus } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { statusLabels, statusTones } from '../application-labels';

export function ApplicationStatusBadge({ status }: { status: ApplicationStatus }) {
  return <Badge tone={statusTones[status]}>{statusLabels[status]}</Badge>;
}
