import { ChevronDown, ThermometerSun } from 'lucide-react';
import { formatTemperature } from '@burrowline/shared';
import { useHeatCaution } from '../api/get-temperatures';
import { useTemperatureUnit } from '../hooks/use-temperature-unit';
import { HeatCautionCard } from './heat-caution-card';

/**
 * Commons: the farm's heat caution when its latest reading of the last day is 85 °F / 29.4 °C or above, as
 * one line that opens, so Today stays on a phone's first screen; the whole caution is one tap away.
 */
export function CommonsHeatCaution({ enabled }: { enabled: boolean }) {
  const heat = useHeatCaution(enabled);
  const unit = useTemperatureUnit();
  if (!heat.data?.hot || !heat.data.latest) return null;
  const atRisk = heat.data.dueToKindle.length + heat.data.youngLitters.length;
  return (
    <details className="group rounded-2xl border-2 border-clay/50 bg-clay-wash text-bark">
      <summary className="flex min-h-12 cursor-pointer list-none items-center gap-2 px-4 py-2 font-semibold text-clay-deep">
        <ThermometerSun className="size-6 shrink-0" aria-hidden="true" />
        <span className="flex-1">
          Heat caution: {formatTemperature(heat.data.latest.celsius, unit)}
          {atRisk > 0 ? ` · ${atRisk} to watch first` : ''}
        </span>
        <span className="text-sm font-medium underline">What to do</span>
        <ChevronDown className="size-5 shrink-0 transition-transform group-open:rotate-180" aria-hidden="true" />
      </summary>
      <div className="px-1 pb-1">
        <HeatCautionCard heat={heat.data} unit={unit} />
      </div>
    </details>
  );
}
