import { countOf, formatTemperature, type HeatCautionDto, type TemperatureUnit } from '@burrowline/shared';
import { ThermometerSun } from 'lucide-react';
import { animalName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';
import { formatInstant } from '../health-format';

/**
 * The heat caution (brief, "Where the work can hurt": rabbits suffer above about 85 °F / 29 °C, heavily
 * pregnant does and young litters most). What to do is common practice; it names who is most at risk.
 */
export function HeatCautionCard({ heat, unit }: { heat: HeatCautionDto; unit: TemperatureUnit }) {
  if (!heat.hot || !heat.latest) return null;
  const threshold = unit === 'F' ? '85 °F' : '29.4 °C';
  return (
    <section aria-labelledby="heat-caution-title" className="space-y-3 rounded-2xl border-2 border-clay/50 bg-clay-wash p-5 text-bark shadow-sm sm:p-6">
      <h2 id="heat-caution-title" className="flex items-center gap-2 text-lg font-bold text-clay-deep">
        <ThermometerSun className="size-6 shrink-0" aria-hidden="true" />
        Heat caution: {formatTemperature(heat.latest.celsius, unit)}
        {heat.latest.place ? ` in the ${heat.latest.place}` : ''}
      </h2>
      <p>
        Read {formatInstant(heat.latest.takenAt)}, at or above {threshold}. Rabbits suffer in heat; heavily pregnant does and young litters most.
      </p>
      <ul className="list-disc space-y-1 pl-5">
        <li>Shade the hutches and keep air moving (open sides, a fan that does not blow straight on them).</li>
        <li>Plenty of cool, fresh water; check bottles and drinkers twice as often.</li>
        <li>Frozen water bottles or a cool tile in each hutch to lie against.</li>
        <li>Do the handling, moving and breeding in the cool of the morning or evening.</li>
      </ul>
      {(heat.dueToKindle.length > 0 || heat.youngLitters.length > 0) && (
        <div className="space-y-1">
          <p className="font-semibold">Watch these first:</p>
          <ul className="space-y-1">
            {heat.dueToKindle.map((d) => (
              <li key={d.doe.id}>
                <strong>{animalName(d.doe)}</strong>: due to kindle {formatDate(d.dueOn)}
              </li>
            ))}
            {heat.youngLitters.map((l) => (
              <li key={l.litterId}>
                <strong>{animalName(l.dam)}'s litter</strong>: {countOf(l.ageDays, 'day')} old{l.alive !== null ? `, ${countOf(l.alive, 'kit')}` : ''}
              </li>
            ))}
          </ul>
        </div>
      )}
      <p className="text-sm">Common practice, not veterinary advice: a rabbit lying stretched out, panting or wet at the nose needs cooling now and a veterinarian's call.</p>
    </section>
  );
}
