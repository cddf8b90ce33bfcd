import { useHeatCaution } from '../api/get-temperatures';
import { useTemperatureUnit } from '../hooks/use-temperature-unit';
import { HeatCautionCard } from './heat-caution-card';

/** Commons: the farm's heat caution when its latest reading of the last day is 85 °F / 29.4 °C or above. */
export function CommonsHeatCaution({ enabled }: { enabled: boolean }) {
  const heat = useHeatCaution(enabled);
  const unit = useTemperatureUnit();
  if (!heat.data) return null;
  return <HeatCautionCard heat={heat.data} unit={unit} />;
}
