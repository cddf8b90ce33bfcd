import { Badge } from '../../../components/ui/badge';
import { coiLevel, formatCoi } from '../herd-labels';

/** The coefficient of inbreeding as a percentage; zero stays quiet, anything else is tinted by how close. */
export function CoiValue({ coi }: { coi: number }) {
  if (coi === 0) return <span className="text-grey-600">0 %</span>;
  const level = coiLevel(coi);
  return (
    <Badge tone={level.tone}>
      <span className="sr-only">COI </span>
      {formatCoi(coi)}
    </Badge>
  );
}
