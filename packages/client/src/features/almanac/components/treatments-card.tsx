import { Card } from '../../../components/ui/card';
import { TextLink } from '../../../components/ui/text-link';
import { useBreedingStock } from '../api/get-breeding-stock';
import { useTreatments } from '../api/get-treatments';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';

/**
 * Beside a service: which breeding animals are under a medicine's withdrawal now (a warning, not a block).
 * Recording a treatment, and its caution, live in Health.
 */
export function TreatmentsCard() {
  const { data: stock } = useBreedingStock();
  const treatments = useTreatments();
  const current = (treatments.data?.treatments ?? []).filter((t) => t.withdrawalEndsOn >= stock.today && t.animal);
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Under withdrawal now</h2>
      {current.length > 0 ? (
        <ul className="space-y-1">
          {current.map((t) => (
            <li key={t.id}>
              <strong>{animalName(t.animal!)}</strong>: {t.treatment}, through {formatDate(t.withdrawalEndsOn)}
              {t.veterinarian ? ` (${t.veterinarian})` : ''}
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-grey-600">No doe or buck is under a medicine's withdrawal.</p>
      )}
      <p className="text-sm">
        Record a treatment in <TextLink to="/grow-out/health">Health</TextLink>.
      </p>
    </Card>
  );
}
