import { Card } from '../../../components/ui/card';
import { TextLink } from '../../../components/ui/text-link';
import { MedicineCaution } from '../../health';
import { TreatmentForm } from '../../health';
import { useBreedingStock } from '../api/get-breeding-stock';
import { useTreatments } from '../api/get-treatments';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';

/** Treatments of the farm's breeding stock; a doe under one is flagged before she is bred (a warning, not a block). */
export function TreatmentsCard() {
  const { data: stock } = useBreedingStock();
  const treatments = useTreatments();
  const current = (treatments.data?.treatments ?? []).filter((t) => t.withdrawalEndsOn >= stock.today && t.animal);
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-bold">Treatments</h2>
      <MedicineCaution />
      {current.length > 0 && (
        <ul className="space-y-1">
          {current.map((t) => (
            <li key={t.id}>
              <strong>{animalName(t.animal!)}</strong>: {t.treatment}, {formatDate(t.startedOn)}, under withdrawal through {formatDate(t.withdrawalEndsOn)}
              {t.veterinarian ? ` (${t.veterinarian})` : ''}
            </li>
          ))}
        </ul>
      )}
      <TreatmentForm today={stock.today} animals={[...stock.does, ...stock.bucks].map((a) => ({ value: a.id, label: animalName(a) }))} />
      <p className="text-sm">
        Groups, past treatments and withdrawals: <TextLink to="/grow-out/health">Health</TextLink>
      </p>
    </Card>
  );
}
